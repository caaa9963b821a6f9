import { describe, expect, it } from 'vitest';
import fc from 'fast-check';
import { checkSets, suggestSwaps, weekOf, type EngineContext, type EngineExercise, type EngineSet } from './compliance';
import type { PlanInput, PlanStage } from './in-force';
import { largestFitting, KETTLEBELL_KG } from './steps';
import { inForceOn } from './in-force';

const squat: EngineExercise = {
  id: 'squat',
  name: 'Back squat',
  patterns: ['squat'],
  ballistic: false,
  steps: { kind: 'increment', step: 2.5, unit: 'kg' },
};
const rdl: EngineExercise = {
  id: 'rdl',
  name: 'Romanian deadlift',
  patterns: ['hinge'],
  ballistic: false,
  steps: { kind: 'increment', step: 2.5, unit: 'kg' },
};
const clean: EngineExercise = {
  id: 'clean',
  name: 'Power clean',
  patterns: ['hinge', 'jump'],
  ballistic: true,
  steps: { kind: 'increment', step: 2.5, unit: 'kg' },
};
const boxJump: EngineExercise = {
  id: 'box',
  name: 'Box jump',
  patterns: ['jump'],
  ballistic: true,
  steps: { kind: 'increment', step: 2.5, unit: 'kg' },
};
const swingKb: EngineExercise = {
  id: 'kbs',
  name: 'Kettlebell swing',
  patterns: ['swing', 'hinge'],
  ballistic: true,
  steps: { kind: 'list', valuesKg: KETTLEBELL_KG },
};
const exercises = Object.fromEntries([squat, rdl, clean, boxJump, swingKb].map((e) => [e.id, e]));

const stage = (patterns: PlanStage['patterns'], startDate = '2026-03-02', endDate = '2026-03-15'): PlanStage => ({
  id: startDate,
  startDate,
  endDate,
  painCeiling: 5,
  patterns,
});
const plan = (...stages: PlanStage[]): PlanInput[] => [{ planId: 'p', caseId: 'c', version: 1, stages }];
const set = (over: Partial<EngineSet>): EngineSet => ({
  id: 's1',
  sessionId: 'sess',
  date: '2026-03-03',
  exerciseId: 'rdl',
  reps: 5,
  load: { kind: 'kg', value: 80 },
  order: 0,
  ...over,
});
const ctx = (plans: PlanInput[], baselines: Record<string, number> = {}, more: Partial<EngineContext> = {}): EngineContext => ({
  plans,
  exercises,
  baselines,
  ...more,
});

describe('checkSets', () => {
  it('a clinician cap of 60% of a 140 kg 1RM = 84 kg: 87.5 kg breaches; 82.5 kg fits on 2.5 kg increments (common practice: under a cap, round down)', () => {
    const plans = plan(stage({ hinge: { mode: 'capped', caps: { maxPercent1RM: 60 } } }));
    const [b, ...rest] = checkSets([set({ load: { kind: 'kg', value: 87.5 }, targetRpe: 6 })], ctx(plans, { rdl: 140 }));
    expect(rest).toEqual([]);
    expect(b.rule).toBe('percent_1rm');
    expect(b.fittingKg).toBe(82.5);
    expect(b.message).toBe('Hinge: max 60% of 140 kg = 84 kg: planned 87.5 kg; 82.5 kg fits on 2.5 kg increments.');
    expect(checkSets([set({ load: { kind: 'kg', value: 82.5 }, targetRpe: 6 })], ctx(plans, { rdl: 140 }))).toEqual([]);
  });

  it('a capped intensity with no baseline is a breach, never a pass', () => {
    const plans = plan(stage({ hinge: { mode: 'capped', caps: { maxPercent1RM: 60 } } }));
    const breaches = checkSets([set({})], ctx(plans));
    expect(breaches.map((b) => b.rule)).toEqual(['no_baseline']);
    expect(breaches[0].message).toContain('no baseline — enter a tested max or use a load cap');
  });

  it('checks each set on its own date: outside every stage nothing applies', () => {
    const plans = plan(stage({ hinge: { mode: 'blocked' } }, '2026-03-02', '2026-03-08'));
    expect(checkSets([set({ date: '2026-03-08' })], ctx(plans)).map((b) => b.rule)).toEqual(['blocked']); // inclusive end (FHIR R4 date-only periods)
    expect(checkSets([set({ date: '2026-03-09' })], ctx(plans))).toEqual([]);
  });

  it('an exercise with several patterns takes the most restrictive rule (Shrier 2015, BJSM 49:1311–1315)', () => {
    const plans = plan(stage({ hinge: { mode: 'capped', caps: { maxLoadKg: 60 } }, jump: { mode: 'blocked' } }));
    expect(checkSets([set({ exerciseId: 'clean', load: { kind: 'kg', value: 50 } })], ctx(plans)).map((b) => b.rule)).toEqual(['blocked']);
  });

  it('refuses impact when the stage allows none, and suggests non-impact swaps from the library', () => {
    const plans = plan(stage({ hinge: { mode: 'capped', caps: { impactAllowed: false } }, swing: { mode: 'free' } }));
    const breaches = checkSets([set({ exerciseId: 'kbs', load: { kind: 'kg', value: 16 } })], ctx(plans));
    expect(breaches.map((b) => b.rule)).toEqual(['impact']);
    const swaps = suggestSwaps(swingKb, Object.values(exercises), inForceOn(plans, '2026-03-03'));
    expect(swaps.map((e) => e.id)).toEqual(['rdl']);
  });

  it('absolute load caps convert pounds exactly (NIST SP 811: 1 lb = 0.45359237 kg) and fit on kettlebell sizes', () => {
    const plans = plan(stage({ hinge: { mode: 'capped', caps: { maxLoadKg: 20 } }, swing: { mode: 'free' } }));
    const lb = checkSets([set({ load: { kind: 'lb', value: 45 } })], ctx(plans));
    expect(lb.map((b) => b.rule)).toEqual(['absolute_load']); // 45 lb = 20.41 kg > 20 kg
    const kb = checkSets([set({ exerciseId: 'kbs', load: { kind: 'kg', value: 24 } })], ctx(plans));
    expect(kb[0].fittingKg).toBe(20);
  });

  it('estimates RPE from % and reps with the NSCA table when no target is given (Baechle & Earle 2008; RIR per Zourdos et al. 2016)', () => {
    const plans = plan(stage({ squat: { mode: 'capped', caps: { maxRpe: 7 } } }));
    // 85% of 1RM allows 6 reps; 6 planned → 0 in reserve → RPE 10.
    const [b] = checkSets([set({ exerciseId: 'squat', load: { kind: 'percent', value: 85 }, reps: 6 })], ctx(plans, { squat: 120 }));
    expect(b.rule).toBe('rpe');
    expect(b.planned).toBe('RPE 10 (estimated from 85% × 6)');
    // RPE 7 with 6 reps = 9 reps possible → 77% (NSCA) of 120 = 92.4 kg. The suggestion is the heaviest load the check
    // itself lets through: 92.5 kg is 77.08%, 8.97 reps possible, RPE 7.03 → 7 on half steps; 95 kg reads 7.5.
    expect(b.fittingKg).toBe(92.5);
    expect(checkSets([set({ exerciseId: 'squat', load: { kind: 'kg', value: 92.5 }, reps: 6 })], ctx(plans, { squat: 120 }))).toEqual([]);
    expect(checkSets([set({ exerciseId: 'squat', load: { kind: 'kg', value: 95 }, reps: 6 })], ctx(plans, { squat: 120 }))).toHaveLength(1);
    // No target and no baseline: unknown is never a pass.
    expect(checkSets([set({ exerciseId: 'squat', load: { kind: 'kg', value: 60 } })], ctx(plans)).map((x) => x.rule)).toEqual(['rpe']);
  });

  it('counts sets per session per pattern and flags only the sets beyond the cap', () => {
    const plans = plan(stage({ hinge: { mode: 'capped', caps: { maxSetsPerSession: 3 } } }));
    const sets = [0, 1, 2, 3, 4].map((i) => set({ id: `s${i}`, order: i }));
    expect(checkSets(sets, ctx(plans)).map((b) => b.setId)).toEqual(['s3', 's4']);
  });

  it('counts hard sets (RPE ≥ 7, common practice) per ISO week across sessions', () => {
    const plans = plan(stage({ hinge: { mode: 'capped', caps: { maxHardSetsPerWeek: 4 } } }));
    const sets = [
      ...[0, 1, 2].map((i) => set({ id: `mon${i}`, sessionId: 'mon', date: '2026-03-02', order: i, targetRpe: 8 })),
      set({ id: 'easy', sessionId: 'wed', date: '2026-03-04', order: 0, targetRpe: 6 }),
      ...[0, 1].map((i) => set({ id: `fri${i}`, sessionId: 'fri', date: '2026-03-06', order: i + 1, targetRpe: 7 })),
      set({ id: 'nextweek', sessionId: 'mon2', date: '2026-03-09', order: 0, targetRpe: 9 }),
    ];
    expect(checkSets(sets, ctx(plans)).map((b) => b.setId)).toEqual(['fri1']);
    expect(weekOf('2026-03-08')).toBe('2026-03-02');
  });

  it('reps per set, and waived breaches stay visible but marked', () => {
    const plans = plan(stage({ hinge: { mode: 'capped', caps: { maxRepsPerSet: 5 } } }));
    const [b] = checkSets([set({ reps: 8 })], ctx(plans, {}, { waivedSetIds: new Set(['s1']) }));
    expect(b).toMatchObject({ rule: 'reps_per_set', waived: true });
  });

  it('an athlete who is Out with no stage in force cannot be programmed', () => {
    const breaches = checkSets([set({})], ctx([], {}, { statusOn: () => 'out' }));
    expect(breaches.map((b) => b.rule)).toEqual(['status_out']);
  });
});

describe('largestFitting (round down under a cap, never to nearest — common practice)', () => {
  const stepsArb = fc.oneof(
    fc.record({
      kind: fc.constant('increment' as const),
      step: fc.constantFrom(0.5, 1, 1.25, 2.5, 5),
      unit: fc.constantFrom('kg' as const, 'lb' as const),
    }),
    fc.constant({ kind: 'list' as const, valuesKg: KETTLEBELL_KG }),
  );
  it('never exceeds the limit and is the largest step that fits', () => {
    fc.assert(
      fc.property(fc.double({ min: 0, max: 400, noNaN: true }), stepsArb, (limit, steps) => {
        const fit = largestFitting(limit, steps);
        if (fit === null) return true;
        expect(fit).toBeLessThanOrEqual(limit + 1e-6);
        if (steps.kind === 'list') {
          expect(steps.valuesKg.filter((v) => v <= limit + 1e-9 && v > fit)).toEqual([]);
        } else {
          const stepKg = steps.unit === 'kg' ? steps.step : steps.step * 0.45359237;
          expect(fit + stepKg).toBeGreaterThan(limit - 1e-6);
        }
        return true;
      }),
    );
  });

  it('a suggested fitting load never breaches when planned', () => {
    fc.assert(
      fc.property(
        fc.integer({ min: 40, max: 250 }),
        fc.integer({ min: 30, max: 95 }),
        fc.double({ min: 20, max: 300, noNaN: true }),
        (oneRm, pct, planned) => {
          const plans = plan(stage({ hinge: { mode: 'capped', caps: { maxPercent1RM: pct } } }));
          const [b] = checkSets([set({ load: { kind: 'kg', value: planned }, targetRpe: 5 })], ctx(plans, { rdl: oneRm }));
          if (!b || b.fittingKg === null) return true;
          expect(checkSets([set({ load: { kind: 'kg', value: b.fittingKg }, targetRpe: 5 })], ctx(plans, { rdl: oneRm }))).toEqual([]);
          return true;
        },
      ),
    );
  });
});
