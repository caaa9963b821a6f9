import { describe, expect, it } from 'vitest';
import fc from 'fast-check';
import {
  blockingBreaches,
  checkSets,
  HARD_SET_RPE,
  plannedKg,
  suggestSwaps,
  weekOf,
  type Breach,
  type EngineContext,
  type EngineExercise,
  type EngineSet,
} from './compliance';
import { inForceOn, type PlanInput, type PlanStage } from './in-force';
import { MOVEMENT_PATTERNS, type ParticipationStatus } from './patterns';
import { KETTLEBELL_KG } from './steps';

// Extends compliance.test.ts: one block per check kind, plus order independence and a large input.
const kg25 = { kind: 'increment' as const, step: 2.5, unit: 'kg' as const };
const ex = (id: string, name: string, patterns: EngineExercise['patterns'], more: Partial<EngineExercise> = {}): EngineExercise => ({
  id,
  name,
  patterns,
  ballistic: false,
  steps: kg25,
  ...more,
});
const deadlift = ex('dl', 'Deadlift', ['hinge']);
const rdl = ex('rdl', 'Romanian deadlift', ['hinge'], { referenceId: 'dl' });
const squat = ex('sq', 'Back squat', ['squat']);
const trapBar = ex('tb', 'Trap-bar deadlift', ['hinge', 'squat']);
const sumo = ex('sumo', 'Sumo deadlift', ['hinge', 'squat']);
const bench = ex('bp', 'Bench press', ['horizontal_push']);
const benchLb = ex('bplb', 'Bench press (lb plates)', ['horizontal_push'], { steps: { kind: 'increment', step: 5, unit: 'lb' } });
const boxJump = ex('bj', 'Box jump', ['jump'], { ballistic: true });
const kbSwing = ex('kbs', 'Kettlebell swing', ['swing', 'hinge'], { ballistic: true, steps: { kind: 'list', valuesKg: KETTLEBELL_KG } });
const library = [deadlift, rdl, squat, trapBar, sumo, bench, benchLb, boxJump, kbSwing];
const exercises = Object.fromEntries(library.map((e) => [e.id, e]));

const stage = (patterns: PlanStage['patterns'], startDate = '2026-03-02', endDate = '2026-03-29'): PlanStage => ({
  id: `${startDate}`,
  startDate,
  endDate,
  painCeiling: 5,
  patterns,
});
const plan = (...stages: PlanStage[]): PlanInput[] => [{ planId: 'p', caseId: 'c', version: 1, stages }];
let nextId = 0;
const set = (over: Partial<EngineSet> = {}): EngineSet => ({
  id: `s${nextId++}`,
  sessionId: 'mon',
  date: '2026-03-02',
  exerciseId: 'dl',
  reps: 5,
  load: { kind: 'kg', value: 60 },
  targetRpe: 6,
  order: 0,
  ...over,
});
const ctx = (plans: PlanInput[], baselines: Record<string, number> = {}, more: Partial<EngineContext> = {}): EngineContext => ({
  plans,
  exercises,
  baselines,
  ...more,
});
const rules = (bs: Breach[]) => bs.map((b) => b.rule);
const hinge60 = plan(stage({ hinge: { mode: 'capped', caps: { maxPercent1RM: 60 } } }));

describe('status Out', () => {
  it('Out with no stage in force blocks every set, and nothing else is checked for it', () => {
    const statusOn = (): ParticipationStatus => 'out';
    const [b, ...rest] = checkSets([set({ reps: 50 })], ctx([], {}, { statusOn }));
    expect(rest).toEqual([]);
    expect(b).toMatchObject({ rule: 'status_out', pattern: null, fits: null, fittingKg: null, planned: 'Deadlift' });
    expect(b.message).toBe(
      'The athlete is Out on 2026-03-02 and no restriction plan says what they may train. Ask the clinician for a plan or an exception.',
    );
  });

  it('Out with a stage in force: the stage says what is allowed (a free pattern passes)', () => {
    const statusOn = (): ParticipationStatus => 'out';
    const plans = plan(stage({ squat: { mode: 'blocked' } }));
    expect(checkSets([set({ exerciseId: 'dl' })], ctx(plans, {}, { statusOn }))).toEqual([]);
    expect(rules(checkSets([set({ exerciseId: 'sq' })], ctx(plans, {}, { statusOn })))).toEqual(['blocked']);
  });

  it('is read per date: Out from Wednesday blocks Wednesday, not Monday', () => {
    const statusOn = (d: string): ParticipationStatus => (d >= '2026-03-04' ? 'out' : 'limited');
    const bs = checkSets(
      [set({ id: 'mon', date: '2026-03-02' }), set({ id: 'wed', sessionId: 'wed', date: '2026-03-04' })],
      ctx([], {}, { statusOn }),
    );
    expect(bs.map((b) => [b.setId, b.rule])).toEqual([['wed', 'status_out']]);
  });
});

describe('blocked and impact', () => {
  it('a blocked pattern names the pattern and the date, with nothing that fits', () => {
    const [b] = checkSets([set({ date: '2026-03-10' })], ctx(plan(stage({ hinge: { mode: 'blocked' } }))));
    expect(b).toMatchObject({ rule: 'blocked', pattern: 'hinge', limit: 'Hinge is blocked', planned: 'Deadlift', fits: null });
    expect(b.message).toBe('Hinge is blocked on 2026-03-10: Deadlift cannot be programmed. Swap to an exercise that fits.');
  });

  it('impact off stops a ballistic exercise only; a non-ballistic lift of the same pattern passes', () => {
    const plans = plan(stage({ jump: { mode: 'capped', caps: { impactAllowed: false } } }));
    const [b] = checkSets([set({ exerciseId: 'bj', load: { kind: 'bodyweight' } })], ctx(plans));
    expect(b).toMatchObject({ rule: 'impact', pattern: 'jump', limit: 'no impact', planned: 'Box jump (impact)' });
    expect(
      checkSets(
        [set({ exerciseId: 'bj', load: { kind: 'bodyweight' } })],
        ctx(plan(stage({ jump: { mode: 'capped', caps: { impactAllowed: true } } }))),
      ),
    ).toEqual([]);
  });

  it('two plans in force: impact is allowed only if both allow it (Shrier 2015, most restrictive)', () => {
    const plans: PlanInput[] = [
      { planId: 'knee', caseId: 'c1', version: 1, stages: [stage({ jump: { mode: 'capped', caps: { impactAllowed: true } } })] },
      { planId: 'ankle', caseId: 'c2', version: 1, stages: [stage({ jump: { mode: 'capped', caps: { impactAllowed: false } } })] },
    ];
    expect(rules(checkSets([set({ exerciseId: 'bj', load: { kind: 'bodyweight' } })], ctx(plans)))).toEqual(['impact']);
  });
});

describe('% of 1RM caps', () => {
  it('a % load against a % cap: 65% of 140 kg = 91 kg breaches max 60% = 84 kg; 82.5 kg fits (REFERENCES 9)', () => {
    const [b, ...rest] = checkSets([set({ load: { kind: 'percent', value: 65 } })], ctx(hinge60, { dl: 140 }));
    expect(rest).toEqual([]);
    expect(b).toMatchObject({
      rule: 'percent_1rm',
      pattern: 'hinge',
      limit: 'max 60% of 140 kg = 84 kg',
      planned: '91 kg',
      fits: '82.5 kg fits on 2.5 kg steps',
      fittingKg: 82.5,
    });
    expect(b.message).toBe('Hinge: max 60% of 140 kg = 84 kg: planned 91 kg; 82.5 kg fits on 2.5 kg steps.');
  });

  it('exactly at the cap is allowed (60% of 140 kg; 84 kg)', () => {
    expect(checkSets([set({ load: { kind: 'percent', value: 60 } })], ctx(hinge60, { dl: 140 }))).toEqual([]);
    expect(checkSets([set({ load: { kind: 'kg', value: 84 } })], ctx(hinge60, { dl: 140 }))).toEqual([]);
  });

  it('a pound load against a % cap: 190 lb = 86.18 kg is 61.6% of 140 kg (NIST SP 811), and reads in lb for a lb user', () => {
    const [b] = checkSets([set({ load: { kind: 'lb', value: 190 } })], ctx(hinge60, { dl: 140 }, { unit: 'lb' }));
    expect(b.rule).toBe('percent_1rm');
    // 140 kg = 308.65 lb; 84 kg = 185.188 lb, shown rounded down so the cap never reads higher than it is.
    expect(b.limit).toBe('max 60% of 308.65 lb = 185.18 lb');
    expect(b.planned).toBe('190 lb');
    expect(b.fittingKg).toBe(82.5);
    expect(b.fits).toBe('181.88 lb fits on 2.5 kg steps');
    expect(checkSets([set({ load: { kind: 'lb', value: 185 } })], ctx(hinge60, { dl: 140 }))).toEqual([]); // 83.91 kg
  });

  it("an exercise tied to a reference lift is capped from that lift's 1RM (RDL → deadlift 140 kg)", () => {
    const [b] = checkSets([set({ exerciseId: 'rdl', load: { kind: 'kg', value: 87.5 } })], ctx(hinge60, { dl: 140, rdl: 200 }));
    expect(b.limit).toBe('max 60% of 140 kg = 84 kg');
    expect(b.message).toContain('Hinge: max 60% of 140 kg = 84 kg: planned 87.5 kg');
  });

  it('no baseline: a % cap cannot be checked, and is a breach whatever the load (a bodyweight set too)', () => {
    const bs = checkSets([set({ id: 'kg' }), set({ id: 'bw', order: 1, load: { kind: 'bodyweight' } })], ctx(hinge60));
    expect(bs.map((b) => [b.setId, b.rule, b.planned])).toEqual([
      ['kg', 'no_baseline', '60 kg'],
      ['bw', 'no_baseline', 'bodyweight'],
    ]);
  });
});

describe('absolute load caps', () => {
  const cap84 = plan(stage({ horizontal_push: { mode: 'capped', caps: { maxLoadKg: 84 } } }));

  it("a kg load over a kg cap, with the fitting load on the exercise's steps", () => {
    const [b] = checkSets([set({ exerciseId: 'bp', load: { kind: 'kg', value: 85 } })], ctx(cap84));
    expect(b).toMatchObject({
      rule: 'absolute_load',
      pattern: 'horizontal_push',
      limit: 'max 84 kg',
      planned: '85 kg',
      fits: '82.5 kg fits on 2.5 kg steps',
      fittingKg: 82.5,
    });
    expect(b.message).toBe('Horizontal push: max 84 kg: planned 85 kg; 82.5 kg fits on 2.5 kg steps.');
  });

  it('a pound load against a kg cap, on 5 lb steps: 190 lb (86.18 kg) over 84 kg; 185 lb fits (NIST SP 811)', () => {
    const [b] = checkSets([set({ exerciseId: 'bplb', load: { kind: 'lb', value: 190 } })], ctx(cap84, {}, { unit: 'lb' }));
    expect(b).toMatchObject({ rule: 'absolute_load', limit: 'max 185.18 lb', planned: '190 lb', fits: '185 lb fits on 5 lb steps' });
    expect(b.fittingKg!).toBeCloseTo(185 * 0.45359237, 5);
    const kgView = checkSets([set({ exerciseId: 'bplb', load: { kind: 'lb', value: 190 } })], ctx(cap84))[0];
    expect(kgView.planned).toBe('86.18 kg');
    expect(checkSets([set({ exerciseId: 'bplb', load: { kind: 'lb', value: 185 } })], ctx(cap84))).toEqual([]);
  });

  it('a % load under a load cap needs a baseline to be checked: without one it is a breach; with one it is converted', () => {
    const pct = set({ exerciseId: 'bp', load: { kind: 'percent', value: 70 } });
    const [b] = checkSets([pct], ctx(cap84));
    expect(b).toMatchObject({ rule: 'no_baseline', limit: 'max 84 kg', planned: '70%' });
    // 70% of 120 kg = 84 kg (at the cap) passes; 75% = 90 kg does not.
    expect(checkSets([pct], ctx(cap84, { bp: 120 }))).toEqual([]);
    expect(rules(checkSets([set({ exerciseId: 'bp', load: { kind: 'percent', value: 75 } })], ctx(cap84, { bp: 120 })))).toEqual([
      'absolute_load',
    ]);
  });

  it('on kettlebells, the cap picks a bell: 20 kg cap, 24 kg planned → 20 kg fits', () => {
    const plans = plan(stage({ hinge: { mode: 'capped', caps: { maxLoadKg: 22 } } }));
    const [b] = checkSets([set({ exerciseId: 'kbs', load: { kind: 'kg', value: 24 } })], ctx(plans));
    expect(b).toMatchObject({ rule: 'absolute_load', fittingKg: 20, fits: '20 kg fits on the available implements' });
  });
});

describe('RPE caps', () => {
  const rpe7 = plan(stage({ squat: { mode: 'capped', caps: { maxRpe: 7 } } }));

  it('estimated when no target (NSCA table, Baechle & Earle 2008; RPE = 10 − RIR, Zourdos 2016): 100 kg × 5 of 120 kg is RPE 8', () => {
    // 83.33% allows 6.83 reps → 1.83 in reserve → RPE 8.17 → 8 on half steps.
    const [b] = checkSets([set({ exerciseId: 'sq', load: { kind: 'kg', value: 100 }, targetRpe: null })], ctx(rpe7, { sq: 120 }));
    expect(b).toMatchObject({ rule: 'rpe', pattern: 'squat', limit: 'max RPE 7', planned: 'RPE 8 (estimated from 83.33% × 5)' });
    // RPE 7 with 5 reps = 8 reps possible = 80% of 120 = 96 kg → 95 kg on 2.5 kg steps.
    expect(b.fittingKg).toBe(95);
    expect(b.fits).toBe('95 kg × 5 fits');
    expect(checkSets([set({ exerciseId: 'sq', load: { kind: 'kg', value: 95 }, targetRpe: null })], ctx(rpe7, { sq: 120 }))).toEqual([]);
  });

  it('a target RPE is taken as planned, over any estimate', () => {
    const heavy = set({ exerciseId: 'sq', load: { kind: 'kg', value: 110 }, targetRpe: 7 });
    expect(checkSets([heavy], ctx(rpe7, { sq: 120 }))).toEqual([]);
    const [b] = checkSets([{ ...heavy, targetRpe: 8 }], ctx(rpe7, { sq: 120 }));
    expect(b).toMatchObject({ rule: 'rpe', planned: 'RPE 8', fits: 'target RPE 7 or lower', fittingKg: null });
  });

  it('the fitting load under an RPE cap also respects a % cap on the same pattern', () => {
    const plans = plan(stage({ squat: { mode: 'capped', caps: { maxRpe: 7, maxPercent1RM: 70 } } }));
    const bs = checkSets([set({ exerciseId: 'sq', load: { kind: 'kg', value: 100 }, targetRpe: null })], ctx(plans, { sq: 120 }));
    expect(rules(bs)).toEqual(['percent_1rm', 'rpe']);
    // 70% of 120 = 84 kg is tighter than the 96 kg RPE limit.
    expect(bs.find((b) => b.rule === 'rpe')!.fittingKg).toBe(82.5);
  });
});

describe('reps per set', () => {
  it('flags a set beyond the cap, not one at it', () => {
    const plans = plan(stage({ hinge: { mode: 'capped', caps: { maxRepsPerSet: 5 } } }));
    const [b, ...rest] = checkSets([set({ id: 'at', reps: 5 }), set({ id: 'over', order: 1, reps: 6 })], ctx(plans));
    expect(rest).toEqual([]);
    expect(b).toMatchObject({ setId: 'over', rule: 'reps_per_set', limit: 'max 5 reps per set', planned: '6 reps', fits: '5 reps' });
    expect(b.message).toBe('Hinge: max 5 reps per set: planned 6; 5 reps fits.');
  });
});

describe('sets per session and hard sets per week', () => {
  it('sets per session count per pattern across exercises, within one session only', () => {
    const plans = plan(stage({ hinge: { mode: 'capped', caps: { maxSetsPerSession: 3 } } }));
    const sets = [
      set({ id: 'dl1', order: 0 }),
      set({ id: 'dl2', order: 1 }),
      set({ id: 'kb1', exerciseId: 'kbs', order: 2, load: { kind: 'kg', value: 16 } }),
      set({ id: 'kb2', exerciseId: 'kbs', order: 3, load: { kind: 'kg', value: 16 } }),
      set({ id: 'pm1', sessionId: 'mon-pm', order: 0 }),
    ];
    const bs = checkSets(sets, ctx(plans));
    expect(bs.map((b) => [b.setId, b.rule, b.planned])).toEqual([['kb2', 'sets_per_session', 'set 4']]);
  });

  it(`a set with no knowable RPE counts as hard (RPE ≥ ${HARD_SET_RPE}, common practice); an estimated RPE 6.5 does not`, () => {
    const plans = plan(stage({ hinge: { mode: 'capped', caps: { maxHardSetsPerWeek: 1 } } }));
    // No target, no baseline: unknown counts as hard.
    const unknown = [set({ id: 'u1', targetRpe: null }), set({ id: 'u2', order: 1, targetRpe: null })];
    expect(checkSets(unknown, ctx(plans)).map((b) => [b.setId, b.rule])).toEqual([['u2', 'hard_sets_per_week']]);
    // 95 kg × 5 of 120 kg: 79.17% allows 8.28 reps → RPE 6.72 → 6.5: easy.
    const easy = [
      set({ id: 'e1', load: { kind: 'kg', value: 95 }, targetRpe: null }),
      set({ id: 'e2', order: 1, load: { kind: 'kg', value: 95 }, targetRpe: null }),
    ];
    expect(checkSets(easy, ctx(plans, { dl: 120 }))).toEqual([]);
    // A target of exactly 7 is hard.
    const seven = [set({ id: 'h1', targetRpe: 7 }), set({ id: 'h2', order: 1, targetRpe: 7 })];
    const [b] = checkSets(seven, ctx(plans));
    expect(b).toMatchObject({
      setId: 'h2',
      rule: 'hard_sets_per_week',
      limit: 'max 1 hard sets per week',
      planned: 'hard set 2 of the week of 2026-03-02',
    });
  });

  it('a max of 0 hard sets makes every hard set a breach, and easy ones pass', () => {
    const plans = plan(stage({ hinge: { mode: 'capped', caps: { maxHardSetsPerWeek: 0 } } }));
    expect(checkSets([set({ id: 'h', targetRpe: 8 }), set({ id: 'e', order: 1, targetRpe: 5 })], ctx(plans)).map((b) => b.setId)).toEqual([
      'h',
    ]);
  });

  it('weeks are ISO weeks (Monday first), across month and year ends', () => {
    expect(weekOf('2026-03-02')).toBe('2026-03-02'); // a Monday
    expect(weekOf('2026-03-08')).toBe('2026-03-02'); // Sunday belongs to the week before
    expect(weekOf('2027-01-01')).toBe('2026-12-28');
    expect(weekOf('2028-02-29')).toBe('2028-02-28');
  });
});

describe('an exercise with several patterns: the most restrictive rule decides (Shrier 2015, BJSM 49:1311–1315)', () => {
  it('the lowest cap of each kind wins, and names the pattern it comes from', () => {
    const plans = plan(
      stage({
        hinge: { mode: 'capped', caps: { maxPercent1RM: 60, maxRepsPerSet: 8 } },
        squat: { mode: 'capped', caps: { maxPercent1RM: 50, maxRepsPerSet: 10 } },
      }),
    );
    const bs = checkSets([set({ exerciseId: 'tb', reps: 9, load: { kind: 'kg', value: 75 } })], ctx(plans, { tb: 140 }));
    expect(bs.map((b) => [b.rule, b.pattern, b.limit])).toEqual([
      ['percent_1rm', 'squat', 'max 50% of 140 kg = 70 kg'],
      ['reps_per_set', 'hinge', 'max 8 reps per set'],
    ]);
  });

  it('a free pattern does not loosen a capped one', () => {
    const plans = plan(stage({ hinge: { mode: 'capped', caps: { maxLoadKg: 60 } }, squat: { mode: 'free' } }));
    expect(rules(checkSets([set({ exerciseId: 'tb', load: { kind: 'kg', value: 70 } })], ctx(plans)))).toEqual(['absolute_load']);
  });

  it("a set counts toward each of its patterns' session limits", () => {
    const plans = plan(
      stage({ hinge: { mode: 'capped', caps: { maxSetsPerSession: 1 } }, squat: { mode: 'capped', caps: { maxSetsPerSession: 5 } } }),
    );
    const bs = checkSets(
      [set({ id: 'sq', exerciseId: 'sq' }), set({ id: 'tb', exerciseId: 'tb', order: 1 }), set({ id: 'dl', order: 2 })],
      ctx(plans),
    );
    expect(bs.map((b) => [b.setId, b.pattern])).toEqual([['dl', 'hinge']]);
  });
});

describe('gap days between stages', () => {
  const plans = plan(
    stage({ hinge: { mode: 'blocked' } }, '2026-03-02', '2026-03-08'),
    stage({ hinge: { mode: 'capped', caps: { maxLoadKg: 40 } } }, '2026-03-16', '2026-03-29'),
  );
  it('on a day between two stages no stage is in force, so nothing is capped', () => {
    expect(checkSets([set({ date: '2026-03-09' }), set({ date: '2026-03-15', sessionId: 'sun' })], ctx(plans))).toEqual([]);
  });
  it('each stage applies from its first day (both ends inclusive)', () => {
    const bs = checkSets([set({ id: 'a', date: '2026-03-08' }), set({ id: 'b', date: '2026-03-16', sessionId: 'x' })], ctx(plans));
    expect(bs.map((b) => [b.setId, b.rule])).toEqual([
      ['a', 'blocked'],
      ['b', 'absolute_load'],
    ]);
  });
  it('an athlete who is Out on a gap day, with no stage in force, cannot be programmed that day', () => {
    const statusOn = (): ParticipationStatus => 'out';
    expect(rules(checkSets([set({ date: '2026-03-10' })], ctx(plans, {}, { statusOn })))).toEqual(['status_out']);
  });
});

describe('helpers', () => {
  it('plannedKg: kg as is, lb exactly (NIST SP 811), % of the 1RM, unknown without a 1RM or for bodyweight', () => {
    expect(plannedKg({ kind: 'kg', value: 80 }, undefined)).toBe(80);
    expect(plannedKg({ kind: 'lb', value: 45 }, undefined)).toBeCloseTo(20.41, 2);
    expect(plannedKg({ kind: 'percent', value: 60 }, 140)).toBeCloseTo(84, 9);
    expect(plannedKg({ kind: 'percent', value: 60 }, undefined)).toBeNull();
    expect(plannedKg({ kind: 'bodyweight' }, 140)).toBeNull();
  });

  it('blockingBreaches keeps exactly the unwaived ones', () => {
    const plans = plan(stage({ hinge: { mode: 'capped', caps: { maxRepsPerSet: 5 } } }));
    const bs = checkSets(
      [set({ id: 'w', reps: 8 }), set({ id: 'x', order: 1, reps: 8 })],
      ctx(plans, {}, { waivedSetIds: new Set(['w']) }),
    );
    expect(bs.map((b) => [b.setId, b.waived])).toEqual([
      ['w', true],
      ['x', false],
    ]);
    expect(blockingBreaches(bs).map((b) => b.setId)).toEqual(['x']);
  });

  it('suggestSwaps: shares a pattern, skips blocked and impact work, most shared patterns first, then by name', () => {
    const plans = plan(
      stage({ hinge: { mode: 'capped', caps: { impactAllowed: false } }, squat: { mode: 'free' }, horizontal_push: { mode: 'blocked' } }),
    );
    const day = inForceOn(plans, '2026-03-03');
    expect(suggestSwaps(kbSwing, library, day).map((e) => e.id)).toEqual(['dl', 'rdl', 'sumo']);
    expect(suggestSwaps(kbSwing, library, day, 1).map((e) => e.id)).toEqual(['dl']);
    // Sumo shares both patterns with the trap-bar lift; then one pattern each, by name.
    expect(suggestSwaps(trapBar, library, day).map((e) => e.id)).toEqual(['sumo', 'sq', 'dl']);
    expect(suggestSwaps(bench, library, day)).toEqual([]);
  });
});

describe('determinism', () => {
  const capsArb = fc.record(
    {
      maxPercent1RM: fc.integer({ min: 40, max: 90 }),
      maxLoadKg: fc.integer({ min: 20, max: 150 }),
      maxRpe: fc.constantFrom(6, 7, 8, 9),
      maxSetsPerSession: fc.integer({ min: 1, max: 5 }),
      maxRepsPerSet: fc.integer({ min: 3, max: 12 }),
      maxHardSetsPerWeek: fc.integer({ min: 0, max: 8 }),
      impactAllowed: fc.boolean(),
    },
    { requiredKeys: [] },
  );
  const ruleArb = fc.oneof(
    fc.constant({ mode: 'blocked' as const }),
    fc.constant({ mode: 'free' as const }),
    capsArb.map((caps) => ({ mode: 'capped' as const, caps })),
  );
  const plansArb = fc
    .array(fc.tuple(fc.constantFrom(...MOVEMENT_PATTERNS), ruleArb), { maxLength: 5 })
    .map((entries) => plan(stage(Object.fromEntries(entries), '2026-03-02', '2026-03-22')));
  const loadArb = fc.oneof(
    fc.integer({ min: 0, max: 200 }).map((v) => ({ kind: 'kg' as const, value: v })),
    fc.integer({ min: 0, max: 400 }).map((v) => ({ kind: 'lb' as const, value: v })),
    fc.integer({ min: 30, max: 100 }).map((v) => ({ kind: 'percent' as const, value: v })),
    fc.constant({ kind: 'bodyweight' as const }),
  );
  const setsArb = fc
    .array(
      fc.record({
        day: fc.integer({ min: 0, max: 27 }),
        session: fc.constantFrom('a', 'b'),
        exerciseId: fc.constantFrom(...library.map((e) => e.id)),
        reps: fc.integer({ min: 1, max: 15 }),
        load: loadArb,
        targetRpe: fc.option(fc.constantFrom(5, 6, 7, 8, 9, 10), { nil: null }),
      }),
      { maxLength: 40 },
    )
    .map((rows) =>
      rows.map((r, i): EngineSet => {
        const d = new Date(Date.UTC(2026, 2, 2 + r.day)).toISOString().slice(0, 10);
        // Positions are unique within a session, as the server numbers them.
        return {
          id: `set${i}`,
          sessionId: `${d}-${r.session}`,
          date: d,
          exerciseId: r.exerciseId,
          reps: r.reps,
          load: r.load,
          targetRpe: r.targetRpe,
          order: i,
        };
      }),
    );
  const baselinesArb = fc.dictionary(fc.constantFrom(...library.map((e) => e.id)), fc.integer({ min: 40, max: 250 }));

  it('the same sets give the same breaches, in any input order (property)', () => {
    fc.assert(
      fc.property(
        setsArb,
        plansArb,
        baselinesArb,
        fc.infiniteStream(fc.double({ min: 0, max: 1, noNaN: true })),
        (sets, plans, baselines, rand) => {
          const c = ctx(plans, baselines, { statusOn: (d) => (d >= '2026-03-23' ? 'out' : 'limited') });
          const first = checkSets(sets, c);
          expect(checkSets(sets, c)).toEqual(first);
          const shuffled = sets
            .map((s) => [rand.next().value, s] as const)
            .sort((a, b) => a[0] - b[0])
            .map(([, s]) => s);
          expect(checkSets(shuffled, c)).toEqual(first);
          expect(checkSets([...sets].reverse(), c)).toEqual(first);
          // Every breach is about a set that was planned, and waived only when told.
          const ids = new Set(sets.map((s) => s.id));
          for (const b of first) {
            expect(ids.has(b.setId)).toBe(true);
            expect(b.waived).toBe(false);
          }
        },
      ),
      { numRuns: 150 },
    );
  });

  it('2,000 sets over 16 weeks against a 4-stage plan are all checked (a size sanity run, no timing)', () => {
    const plans = plan(
      stage({ hinge: { mode: 'blocked' }, jump: { mode: 'capped', caps: { impactAllowed: false } } }, '2026-03-02', '2026-03-29'),
      stage(
        { hinge: { mode: 'capped', caps: { maxPercent1RM: 50, maxSetsPerSession: 3, maxHardSetsPerWeek: 6 } } },
        '2026-03-30',
        '2026-04-26',
      ),
      stage(
        { hinge: { mode: 'capped', caps: { maxPercent1RM: 70, maxRpe: 8 } }, squat: { mode: 'capped', caps: { maxLoadKg: 100 } } },
        '2026-04-27',
        '2026-05-24',
      ),
      stage({ hinge: { mode: 'capped', caps: { maxPercent1RM: 85 } } }, '2026-05-25', '2026-06-21'),
    );
    const ids = library.map((e) => e.id);
    const sets: EngineSet[] = Array.from({ length: 2000 }, (_, i) => {
      const day = i % 112;
      const d = new Date(Date.UTC(2026, 2, 2 + day)).toISOString().slice(0, 10);
      return {
        id: `big${i}`,
        sessionId: `sess-${day}`,
        date: d,
        exerciseId: ids[i % ids.length],
        reps: 3 + (i % 8),
        load: { kind: 'percent', value: 50 + (i % 40) },
        targetRpe: null,
        order: Math.floor(i / 112),
      };
    });
    const bs = checkSets(sets, ctx(plans, Object.fromEntries(ids.map((id) => [id, 150]))));
    expect(bs.length).toBeGreaterThan(0);
    // Each set is checked once: no set is reported twice for the same rule and pattern.
    const keys = bs.map((b) => `${b.setId}|${b.rule}|${b.pattern}`);
    expect(new Set(keys).size).toBe(keys.length);
    // Stage 1 blocks the hinge: every hinge set of those four weeks is blocked, none after.
    const hingeIds = new Set(library.filter((e) => e.patterns.includes('hinge')).map((e) => e.id));
    const firstStageHinge = sets
      .filter((s) => s.date <= '2026-03-29' && hingeIds.has(s.exerciseId))
      .map((s) => s.id)
      .sort();
    expect(
      bs
        .filter((b) => b.rule === 'blocked')
        .map((b) => b.setId)
        .sort(),
    ).toEqual(firstStageHinge);
  });
});
