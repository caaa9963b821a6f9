import { describe, expect, it } from 'vitest';
import fc from 'fast-check';
import { inForceOn, mergeRules, ruleForPatterns, stageIssues, stageOn, type PlanInput, type PlanStage } from './in-force';
import { DEFAULT_PAIN_CEILING, MOVEMENT_PATTERNS, type Caps, type PatternRule } from './patterns';

const stage = (startDate: string, endDate: string, extra: Partial<PlanStage> = {}): PlanStage => ({
  id: `${startDate}/${endDate}`,
  startDate,
  endDate,
  painCeiling: DEFAULT_PAIN_CEILING,
  patterns: {},
  ...extra,
});

/** Day n after 2026-01-01 as 'YYYY-MM-DD' (UTC arithmetic, so no time zone moves a day). */
const day = (n: number) => new Date(Date.UTC(2026, 0, 1 + n)).toISOString().slice(0, 10);

const RANK = { free: 0, capped: 1, blocked: 2 } as const;

describe('stageIssues: stage dates on their own and against each other', () => {
  it("an end before the start is refused on that stage's endDate (common practice)", () => {
    expect(stageIssues([stage('2026-02-10', '2026-02-09')])).toEqual([
      { path: [0, 'endDate'], message: 'must be on or after the start date' },
    ]);
  });

  it('a one-day stage (start = end) is fine: a date-only end is inclusive (HL7 FHIR R4, confirmed only through a reproduction)', () => {
    expect(stageIssues([stage('2026-02-10', '2026-02-10')])).toEqual([]);
  });

  it('stages that touch on one day overlap, because both ends are inclusive (HL7 FHIR R4)', () => {
    const issues = stageIssues([stage('2026-02-01', '2026-02-10'), stage('2026-02-10', '2026-02-20')]);
    expect(issues).toHaveLength(1);
    expect(issues[0].path).toEqual([1, 'startDate']);
    expect(issues[0].message).toMatch(/overlaps stage 1/);
  });

  it('back-to-back stages (end one day, start the next) do not overlap (common practice)', () => {
    expect(stageIssues([stage('2026-02-01', '2026-02-10'), stage('2026-02-11', '2026-02-20')])).toEqual([]);
  });

  it('names the stage as the clinician entered it, whatever the order in the list (common practice)', () => {
    // Listed later-first: the overlap is reported on the later-starting stage, at its own index.
    const issues = stageIssues([stage('2026-03-05', '2026-03-20'), stage('2026-03-01', '2026-03-06')]);
    expect(issues).toEqual([{ path: [0, 'startDate'], message: expect.stringMatching(/overlaps stage 2 \(which ends Fri 6 Mar 2026\)/) }]);
  });

  it('property: no overlap issue exactly when no day belongs to two stages (common practice)', () => {
    const span = fc.tuple(fc.integer({ min: 0, max: 60 }), fc.integer({ min: 0, max: 10 })).map(([s, len]) => stage(day(s), day(s + len)));
    fc.assert(
      fc.property(fc.array(span, { minLength: 1, maxLength: 6 }), (stages) => {
        const shareADay = stages.some((a, i) => stages.some((b, j) => i < j && a.startDate <= b.endDate && b.startDate <= a.endDate));
        const overlapIssues = stageIssues(stages).filter((x) => x.path[1] === 'startDate');
        expect(overlapIssues.length > 0).toBe(shareADay);
      }),
    );
  });
});

describe('stageOn: the stage in force on a date', () => {
  const stages = [stage('2026-01-05', '2026-01-18'), stage('2026-01-25', '2026-02-07')];

  it.each([
    ['2026-01-04', null, 'the day before the plan'],
    ['2026-01-05', 0, 'the first day (inclusive start)'],
    ['2026-01-10', 0, 'inside stage 1'],
    ['2026-01-18', 0, "stage 1's end date: a date-only end is still in force that day (HL7 FHIR R4)"],
    ['2026-01-19', null, 'the first day of the gap'],
    ['2026-01-24', null, 'the last day of the gap'],
    ['2026-01-25', 1, 'the first day of stage 2'],
    ['2026-02-07', 1, "stage 2's end date (inclusive, FHIR R4)"],
    ['2026-02-08', null, 'after the plan'],
  ])('%s → %s (%s)', (date, index, _why) => {
    expect(stageOn(stages, date)).toBe(index === null ? null : stages[index]);
  });

  it('crosses month and year ends as calendar dates (common practice)', () => {
    const s = [stage('2025-12-30', '2026-01-02')];
    expect(stageOn(s, '2025-12-31')).toBe(s[0]);
    expect(stageOn(s, '2026-01-02')).toBe(s[0]);
    expect(stageOn(s, '2026-01-03')).toBeNull();
  });

  it('property: returns a stage that contains the date, or null only when none does (common practice)', () => {
    const span = fc.tuple(fc.integer({ min: 0, max: 400 }), fc.integer({ min: 0, max: 30 })).map(([s, len]) => stage(day(s), day(s + len)));
    fc.assert(
      fc.property(fc.array(span, { maxLength: 6 }), fc.integer({ min: -5, max: 440 }), (list, n) => {
        const date = day(n);
        const found = stageOn(list, date);
        const covering = list.filter((s) => s.startDate <= date && date <= s.endDate);
        if (found === null) expect(covering).toEqual([]);
        else {
          expect(list).toContain(found);
          expect(found.startDate <= date && date <= found.endDate).toBe(true);
        }
      }),
    );
  });
});

describe('mergeRules: the most restrictive rule decides (Shrier 2015, BJSM 49:1311–1315, StARRT)', () => {
  it('blocked beats capped and free', () => {
    expect(mergeRules([{ mode: 'free' }, { mode: 'capped', caps: { maxRpe: 7 } }, { mode: 'blocked' }])).toEqual({ mode: 'blocked' });
  });

  it('capped beats free, and keeps the caps of the capped rule', () => {
    expect(mergeRules([{ mode: 'free' }, { mode: 'capped', caps: { maxPercent1RM: 60, maxRpe: 7 } }])).toEqual({
      mode: 'capped',
      caps: { maxPercent1RM: 60, maxRpe: 7 },
    });
  });

  it('nothing said, or only free, is free', () => {
    expect(mergeRules([])).toEqual({ mode: 'free' });
    expect(mergeRules([undefined, undefined])).toEqual({ mode: 'free' });
    expect(mergeRules([{ mode: 'free' }, undefined])).toEqual({ mode: 'free' });
  });

  it('takes the lowest number of each cap, from whichever rule sets it', () => {
    const a: PatternRule = { mode: 'capped', caps: { maxPercent1RM: 60, maxRpe: 8, maxSetsPerSession: 4 } };
    const b: PatternRule = { mode: 'capped', caps: { maxPercent1RM: 75, maxRpe: 6.5, maxLoadKg: 40, maxHardSetsPerWeek: 0 } };
    expect(mergeRules([a, b])).toEqual({
      mode: 'capped',
      caps: { maxPercent1RM: 60, maxRpe: 6.5, maxSetsPerSession: 4, maxLoadKg: 40, maxHardSetsPerWeek: 0 },
    });
  });

  it('impact is allowed only if every rule that speaks of it allows it', () => {
    const yes: PatternRule = { mode: 'capped', caps: { impactAllowed: true } };
    const no: PatternRule = { mode: 'capped', caps: { impactAllowed: false } };
    const silent: PatternRule = { mode: 'capped', caps: { maxRpe: 7 } };
    expect(mergeRules([yes, no]).caps?.impactAllowed).toBe(false);
    expect(mergeRules([no, yes]).caps?.impactAllowed).toBe(false);
    expect(mergeRules([yes, yes]).caps?.impactAllowed).toBe(true);
    expect(mergeRules([silent, no]).caps?.impactAllowed).toBe(false);
    expect(mergeRules([silent, yes]).caps?.impactAllowed).toBe(true);
  });

  const capsArb: fc.Arbitrary<Caps> = fc.record(
    {
      maxPercent1RM: fc.integer({ min: 1, max: 100 }),
      maxLoadKg: fc.integer({ min: 1, max: 300 }),
      maxRpe: fc.integer({ min: 2, max: 20 }).map((x) => x / 2),
      maxSetsPerSession: fc.integer({ min: 1, max: 50 }),
      maxRepsPerSet: fc.integer({ min: 1, max: 100 }),
      maxHardSetsPerWeek: fc.integer({ min: 0, max: 100 }),
      impactAllowed: fc.boolean(),
    },
    { requiredKeys: [] },
  );
  const ruleArb: fc.Arbitrary<PatternRule | undefined> = fc.oneof(
    fc.constant(undefined),
    fc.constant<PatternRule>({ mode: 'free' }),
    fc.constant<PatternRule>({ mode: 'blocked' }),
    capsArb.map((caps): PatternRule => ({ mode: 'capped', caps })),
  );

  it('property: the order of the rules does not matter', () => {
    fc.assert(
      fc.property(
        fc
          .array(ruleArb, { maxLength: 6 })
          .chain((rules) => fc.tuple(fc.constant(rules), fc.shuffledSubarray(rules, { minLength: rules.length, maxLength: rules.length }))),
        ([rules, shuffled]) => {
          expect(mergeRules(shuffled)).toEqual(mergeRules(rules));
        },
      ),
    );
  });

  it('property: never less restrictive than any input', () => {
    fc.assert(
      fc.property(fc.array(ruleArb, { maxLength: 6 }), (rules) => {
        const merged = mergeRules(rules);
        for (const r of rules) {
          if (!r) continue;
          expect(RANK[merged.mode]).toBeGreaterThanOrEqual(RANK[r.mode]);
          if (merged.mode !== 'capped' || r.mode !== 'capped') continue;
          for (const [key, value] of Object.entries(r.caps ?? {})) {
            const mergedValue = merged.caps?.[key as keyof Caps];
            if (typeof value === 'number') expect(mergedValue as number).toBeLessThanOrEqual(value);
            if (value === false) expect(mergedValue).toBe(false);
          }
        }
      }),
    );
  });
});

describe('inForceOn: what is in force across several plans (Shrier 2015, BJSM 49:1311–1315: the most restrictive outcome decides)', () => {
  const plan = (planId: string, stages: PlanStage[], version = 1): PlanInput => ({ planId, caseId: `case-${planId}`, version, stages });
  const back = plan(
    'back',
    [
      stage('2026-01-05', '2026-01-18', {
        painCeiling: 3,
        patterns: { hinge: { mode: 'capped', caps: { maxPercent1RM: 60, maxRpe: 7 } }, jump: { mode: 'blocked' } },
      }),
      stage('2026-01-25', '2026-02-07', { painCeiling: 4, patterns: { hinge: { mode: 'capped', caps: { maxPercent1RM: 80 } } } }),
    ],
    3,
  );
  const knee = plan('knee', [
    stage('2026-01-10', '2026-01-31', {
      painCeiling: 5,
      patterns: { hinge: { mode: 'capped', caps: { maxPercent1RM: 70, maxRpe: 6, impactAllowed: false } }, squat: { mode: 'blocked' } },
    }),
  ]);

  it('inside one stage of one plan: that stage, with its plan and version (common practice)', () => {
    const f = inForceOn([back, knee], '2026-01-06');
    expect(f.stages).toEqual([{ planId: 'back', caseId: 'case-back', planVersion: 3, stage: back.stages[0] }]);
    expect(f.patterns.hinge).toEqual({ mode: 'capped', caps: { maxPercent1RM: 60, maxRpe: 7 } });
    expect(f.patterns.jump).toEqual({ mode: 'blocked' });
    expect(f.patterns.squat).toEqual({ mode: 'free' });
    expect(f.painCeiling).toBe(3);
    expect(f.restricted).toBe(true);
    expect(f.date).toBe('2026-01-06');
  });

  it('two plans at once: the most restrictive of each pattern and the lowest pain ceiling (Shrier 2015, BJSM 49:1311–1315)', () => {
    const f = inForceOn([back, knee], '2026-01-12');
    expect(f.stages.map((s) => s.planId).sort()).toEqual(['back', 'knee']);
    expect(f.patterns.hinge).toEqual({ mode: 'capped', caps: { maxPercent1RM: 60, maxRpe: 6, impactAllowed: false } });
    expect(f.patterns.squat).toEqual({ mode: 'blocked' });
    expect(f.patterns.jump).toEqual({ mode: 'blocked' });
    expect(f.painCeiling).toBe(3);
  });

  it('in a gap of one plan, the other still applies (common practice)', () => {
    const f = inForceOn([back, knee], '2026-01-20');
    expect(f.stages.map((s) => s.planId)).toEqual(['knee']);
    expect(f.patterns.jump).toEqual({ mode: 'free' });
    expect(f.painCeiling).toBe(5);
  });

  it('outside every stage: all patterns free, not restricted, default pain ceiling 5 (Silbernagel et al. 2007, AJSM 35:897–906)', () => {
    const f = inForceOn([back, knee], '2026-02-08');
    expect(f.stages).toEqual([]);
    for (const p of MOVEMENT_PATTERNS) expect(f.patterns[p]).toEqual({ mode: 'free' });
    expect(f.restricted).toBe(false);
    expect(f.painCeiling).toBe(5);
    expect(inForceOn([], '2026-01-12').restricted).toBe(false);
  });

  it('a stage that sets only a pain ceiling is in force but restricts no pattern (common practice)', () => {
    const f = inForceOn([plan('p', [stage('2026-01-01', '2026-01-31', { painCeiling: 2 })])], '2026-01-15');
    expect(f.stages).toHaveLength(1);
    expect(f.restricted).toBe(false);
    expect(f.painCeiling).toBe(2);
  });
});

describe('ruleForPatterns: an exercise that trains several patterns takes the most restrictive (Shrier 2015, BJSM 49:1311–1315)', () => {
  const f = inForceOn(
    [
      {
        planId: 'p',
        caseId: 'c',
        version: 1,
        stages: [
          stage('2026-01-01', '2026-01-31', {
            patterns: {
              hinge: { mode: 'capped', caps: { maxPercent1RM: 60, maxRpe: 7 } },
              squat: { mode: 'capped', caps: { maxPercent1RM: 70, maxRpe: 6 } },
              jump: { mode: 'blocked' },
            },
          }),
        ],
      },
    ],
    '2026-01-10',
  );

  it('a clean (hinge + squat + jump) is blocked by the jump', () => {
    expect(ruleForPatterns(f, ['hinge', 'squat', 'jump'])).toEqual({ mode: 'blocked' });
  });

  it('a deadlift-to-squat combination takes the lower cap of each kind', () => {
    expect(ruleForPatterns(f, ['hinge', 'squat'])).toEqual({ mode: 'capped', caps: { maxPercent1RM: 60, maxRpe: 6 } });
  });

  it('a free pattern adds nothing; only free patterns are free', () => {
    expect(ruleForPatterns(f, ['hinge', 'vertical_pull'])).toEqual({ mode: 'capped', caps: { maxPercent1RM: 60, maxRpe: 7 } });
    expect(ruleForPatterns(f, ['vertical_pull', 'carry'])).toEqual({ mode: 'free' });
  });
});
