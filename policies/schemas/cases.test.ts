import { describe, expect, it } from 'vitest';
import fc from 'fast-check';
import {
  CapsSchema,
  CaseCloseSchema,
  CaseCreateSchema,
  CaseUpdateSchema,
  PlanCreateSchema,
  PlanStageSchema,
  PlanUpdateSchema,
  StatusChangeSchema,
} from './cases';

const ID1 = '11111111-1111-4111-8111-111111111111';
const ID2 = '22222222-2222-4222-8222-222222222222';
const ATHLETE = '33333333-3333-4333-8333-333333333333';

const stage = (id: string, startDate: string, endDate: string, extra: Record<string, unknown> = {}) => ({
  id,
  startDate,
  endDate,
  patterns: { hinge: { mode: 'capped', caps: { maxPercent1RM: 60 } } },
  ...extra,
});

/** The zod issue paths of a failed parse, joined the way the API reports them ('stages.1.startDate'). */
function issuePaths(result: { success: boolean; error?: { issues: { path: PropertyKey[] }[] } }): string[] {
  expect(result.success).toBe(false);
  return result.error!.issues.map((i) => i.path.map(String).join('.'));
}

describe('PlanCreateSchema', () => {
  it('accepts two back-to-back stages and fills the defaults (common practice)', () => {
    const r = PlanCreateSchema.safeParse({ stages: [stage(ID1, '2026-01-05', '2026-01-18'), stage(ID2, '2026-01-19', '2026-02-07')] });
    expect(r.success, JSON.stringify(r.error?.issues)).toBe(true);
    expect(r.data!.guidance).toBe('');
  });

  it('painCeiling defaults to 5 (Silbernagel et al. 2007, AJSM 35:897–906)', () => {
    const r = PlanCreateSchema.parse({ stages: [stage(ID1, '2026-01-05', '2026-01-18')] });
    expect(r.stages[0].painCeiling).toBe(5);
  });

  it.each([
    [0, true, '0 is the bottom of the 0–10 scale (Silbernagel 2007)'],
    [10, true, '10 is the top of the 0–10 scale (Silbernagel 2007)'],
    [11, false, 'past the 0–10 scale (Silbernagel 2007; LOINC 72514-3: 11 rejected)'],
    [-1, false, 'below the scale (Silbernagel 2007)'],
    [4.5, false, 'the scale is whole numbers (LOINC 72514-3, integer 0–10)'],
  ])('painCeiling %s accepted: %s (%s)', (painCeiling, ok, _why) => {
    const r = PlanStageSchema.safeParse(stage(ID1, '2026-01-05', '2026-01-18', { painCeiling }));
    if (ok) expect(r.success).toBe(true);
    else expect(issuePaths(r)).toEqual(['painCeiling']);
  });

  it("overlapping stages are refused on the later stage's start, naming the stage it overlaps (both ends inclusive, as HL7 FHIR R4 Period)", () => {
    const r = PlanCreateSchema.safeParse({ stages: [stage(ID1, '2026-01-05', '2026-01-18'), stage(ID2, '2026-01-18', '2026-02-07')] });
    expect(issuePaths(r)).toEqual(['stages.1.startDate']);
    expect(r.error!.issues[0].message).toMatch(/overlaps stage 1/);
  });

  it("an end before the start is refused on that stage's endDate (common practice)", () => {
    const r = PlanCreateSchema.safeParse({ stages: [stage(ID1, '2026-01-18', '2026-01-05')] });
    expect(issuePaths(r)).toEqual(['stages.0.endDate']);
  });

  it('a capped pattern with no caps is refused, naming the pattern (common practice)', () => {
    const r = PlanCreateSchema.safeParse({ stages: [stage(ID1, '2026-01-05', '2026-01-18', { patterns: { squat: { mode: 'capped' } } })] });
    expect(issuePaths(r)).toEqual(['stages.0.patterns.squat.caps']);
    const empty = PlanCreateSchema.safeParse({
      stages: [stage(ID1, '2026-01-05', '2026-01-18', { patterns: { squat: { mode: 'capped', caps: {} } } })],
    });
    expect(issuePaths(empty)).toEqual(['stages.0.patterns.squat.caps']);
  });

  it.each(['blocked', 'free'])('caps on a %s pattern are refused: caps only mean something when capped (common practice)', (mode) => {
    const r = PlanCreateSchema.safeParse({
      stages: [stage(ID1, '2026-01-05', '2026-01-18', { patterns: { jump: { mode, caps: { maxRpe: 6 } } } })],
    });
    expect(issuePaths(r)).toEqual(['stages.0.patterns.jump.caps']);
    expect(r.error!.issues[0].message).toContain(mode);
  });

  it('a pattern not on the list, an unknown key, or no stages at all are refused (ASVS 5.0 V2.2.1: unknown keys refused)', () => {
    expect(
      PlanCreateSchema.safeParse({ stages: [stage(ID1, '2026-01-05', '2026-01-18', { patterns: { deadlift: { mode: 'blocked' } } })] })
        .success,
    ).toBe(false);
    expect(issuePaths(PlanCreateSchema.safeParse({ stages: [stage(ID1, '2026-01-05', '2026-01-18')], organizationId: ID2 }))).toEqual(['']);
    expect(issuePaths(PlanCreateSchema.safeParse({ stages: [] }))).toEqual(['stages']);
  });

  it('an update must carry the version it was made against (optimistic locking, common practice: a stale version is refused, never silently overwritten)', () => {
    expect(issuePaths(PlanUpdateSchema.safeParse({ stages: [stage(ID1, '2026-01-05', '2026-01-18')], guidance: '' }))).toEqual(['version']);
    expect(PlanUpdateSchema.safeParse({ stages: [stage(ID1, '2026-01-05', '2026-01-18')], version: 2 }).success).toBe(true);
  });

  it('property: any two stages sharing a day are refused, and the issue names a stage index (HL7 FHIR R4 Period; common practice)', () => {
    const day = (n: number) => new Date(Date.UTC(2026, 0, 1 + n)).toISOString().slice(0, 10);
    fc.assert(
      fc.property(
        fc.integer({ min: 0, max: 100 }),
        fc.integer({ min: 0, max: 20 }),
        fc.integer({ min: 0, max: 20 }),
        fc.integer({ min: 0, max: 20 }),
        (a, lenA, offset, lenB) => {
          // Stage B starts somewhere inside stage A: they share at least that day.
          const b = a + Math.min(offset, lenA);
          const r = PlanCreateSchema.safeParse({ stages: [stage(ID1, day(a), day(a + lenA)), stage(ID2, day(b), day(b + lenB))] });
          const paths = issuePaths(r);
          expect(paths.every((p) => /^stages\.[01]\.startDate$/.test(p))).toBe(true);
        },
      ),
    );
  });
});

describe('CapsSchema', () => {
  it.each([
    [{ maxRpe: 7.5 }, true, 'half steps on the RIR-based RPE scale (Zourdos et al. 2016, JSCR 30:267–275)'],
    [{ maxRpe: 10 }, true, 'RPE 10 = 0 in reserve, the top (Zourdos 2016)'],
    [{ maxRpe: 11 }, false, 'past the top of the scale (Zourdos 2016; Foster 2001 CR-10 rejects 11)'],
    [{ maxRpe: 7.25 }, false, 'quarter steps are not on the scale (Zourdos 2016; common practice)'],
    [{ maxPercent1RM: 100 }, true, '100% of 1RM is the 1-rep load (NSCA, Baechle & Earle 2008)'],
    [{ maxPercent1RM: 101 }, false, 'above 1RM makes no sense as a cap (NSCA, Baechle & Earle 2008)'],
    [{ maxPercent1RM: 0 }, false, 'a 0% cap is a block: use mode blocked (common practice)'],
    [{ maxHardSetsPerWeek: 0 }, true, 'no hard sets this week (common practice)'],
    [{ maxSetsPerSession: 2.5 }, false, 'sets are whole (common practice)'],
    [{ impactAllowed: 'no' }, false, 'yes or no only (common practice)'],
  ])('%j accepted: %s (%s)', (caps, ok, _why) => {
    expect(CapsSchema.safeParse(caps).success).toBe(ok);
  });
});

describe('case schemas', () => {
  const create = {
    athleteId: ATHLETE,
    bodyRegions: ['lower_back'],
    onsetDate: '2026-01-02',
    status: 'limited',
    statusEffectiveFrom: '2026-01-03',
  };

  it('a case needs at least one body region from the list (common practice)', () => {
    expect(CaseCreateSchema.safeParse(create).success).toBe(true);
    expect(issuePaths(CaseCreateSchema.safeParse({ ...create, bodyRegions: [] }))).toEqual(['bodyRegions']);
    expect(issuePaths(CaseCreateSchema.safeParse({ ...create, bodyRegions: ['spleen'] }))).toEqual(['bodyRegions.0']);
  });

  it('status is Out, Limited or Full (Ardern et al. 2016, BJSM 50:853–864: a return-to-sport continuum)', () => {
    expect(issuePaths(CaseCreateSchema.safeParse({ ...create, status: 'injured' }))).toEqual(['status']);
    expect(issuePaths(StatusChangeSchema.safeParse({ status: 'cleared', effectiveFrom: '2026-01-05', version: 1 }))).toEqual(['status']);
    expect(StatusChangeSchema.safeParse({ status: 'out', effectiveFrom: '2026-01-05', version: 1 }).success).toBe(true);
  });

  it('a write cannot move a case or widen rights: organizationId and athleteId are not accepted fields (ASVS 5.0 V8.2.3; 45 CFR 164.502(b))', () => {
    expect(CaseCreateSchema.safeParse({ ...create, organizationId: ID1 }).success).toBe(false);
    expect(CaseUpdateSchema.safeParse({ version: 1, organizationId: ID1 }).success).toBe(false);
    expect(CaseUpdateSchema.safeParse({ version: 1, athleteId: ID1 }).success).toBe(false);
    expect(CaseUpdateSchema.safeParse({ version: 1, diagnosis: null, clinicalNotes: null }).success).toBe(true);
  });

  it('updates, status changes and closing carry the version (optimistic locking, common practice: a stale version is refused, never silently overwritten)', () => {
    expect(issuePaths(CaseUpdateSchema.safeParse({ diagnosis: 'x' }))).toEqual(['version']);
    expect(issuePaths(StatusChangeSchema.safeParse({ status: 'out', effectiveFrom: '2026-01-05' }))).toEqual(['version']);
    expect(issuePaths(CaseCloseSchema.safeParse({ closedOn: '2026-01-05' }))).toEqual(['version']);
  });

  it('dates are calendar dates YYYY-MM-DD (HL7 FHIR R4 date)', () => {
    expect(issuePaths(CaseCloseSchema.safeParse({ closedOn: '2026-02-30', version: 1 }))).toEqual(['closedOn']);
    expect(issuePaths(CaseCloseSchema.safeParse({ closedOn: '05/01/2026', version: 1 }))).toEqual(['closedOn']);
  });
});
