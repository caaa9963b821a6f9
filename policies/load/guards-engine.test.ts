import { describe, expect, it } from 'vitest';
import fc from 'fast-check';
import { checkSets, plannedKg, weekOf } from './compliance';
import { ctx, plan, rules, set, stage } from './compliance-fixtures';
import { LoadInputError } from './guard';
import { inForceOn, mergeRules, readPainCeiling } from './in-force';
import { evaluatePain, isWeeklyRise } from './pain-rule';
import type { ParticipationStatus } from './patterns';
import { mostRestrictive } from './status-on';
import { acuteChronic, describeRatio, ewmaLambda, ewmaSeries, RATIO_CANNOT_COMPUTE, sessionLoad, weekSummary } from './workload';

// Engine-side guards: stored data gone wrong, or a value typed halfway, must never read as a pass (common practice:
// unknown is never a pass) and never come out as NaN.
const NAN = Number.NaN;
const INF = Number.POSITIVE_INFINITY;

describe('workload (Foster et al. 2001, JSCR 15:109–115; Foster 1998; Williams et al. 2017, BJSM 51:209)', () => {
  it('session load refuses an RPE off the CR-10 scale (0–10, Foster et al. 2001) or minutes that are not a number', () => {
    for (const [rpe, minutes] of [
      [NAN, 60],
      [11, 60],
      [-1, 60],
      [5, NAN],
      [5, INF],
      [5, -10],
    ])
      expect(() => sessionLoad(rpe, minutes)).toThrow(LoadInputError);
    expect(sessionLoad(10, 60)).toBe(600);
  });

  it('a week, EWMA or ratio over loads that are not numbers is a LoadInputError, never a NaN average', () => {
    expect(() => weekSummary([300, NAN, 0, 0, 0, 0, 0])).toThrow(LoadInputError);
    expect(() => weekSummary([300, -1, 0, 0, 0, 0, 0])).toThrow(/daily load 2/);
    expect(() => ewmaSeries([100, INF], 7)).toThrow(LoadInputError);
    expect(() => ewmaSeries([100], 7, NAN)).toThrow(/seed/);
    expect(() => ewmaLambda(0)).toThrow(LoadInputError);
    expect(() => ewmaLambda(NAN)).toThrow(LoadInputError);
    expect(() => acuteChronic([...Array(27).fill(300), NAN])).toThrow(LoadInputError);
  });

  it('a ratio that is not a finite number of 0 or more is described as "cannot be worked out", never "NaN% above"', () => {
    for (const r of [NAN, INF, -0.5]) expect(describeRatio(r)).toBe(RATIO_CANNOT_COMPUTE);
  });
});

describe('pain rule (Silbernagel et al. 2007, AJSM 35:897–906: a 0–10 scale)', () => {
  it('a score or ceiling off the 0–10 scale, or not a number, is a LoadInputError rather than a silent "keep"', () => {
    expect(() => evaluatePain({ during: NAN, before: 2, nextMorning: null })).toThrow(LoadInputError);
    expect(() => evaluatePain({ during: 11, before: 2, nextMorning: null })).toThrow(/pain during/);
    expect(() => evaluatePain({ during: 3, before: -1, nextMorning: null })).toThrow(/pain before/);
    expect(() => evaluatePain({ during: 3, before: 2, nextMorning: INF })).toThrow(/next-morning pain/);
    expect(() => evaluatePain({ during: 3, before: 2, nextMorning: null, ceiling: NAN })).toThrow(/pain ceiling/);
    expect(() => evaluatePain({ during: 3, before: 2, nextMorning: null, weeklyMeans: [1, NAN, 3] })).toThrow(/weekly mean 2/);
    expect(() => isWeeklyRise([1, 2, 12])).toThrow(LoadInputError);
    expect(evaluatePain({ during: null, before: null, nextMorning: null }).action).toBe('keep');
  });

  it('a stored ceiling that cannot be read counts as 0, the strictest; one off the scale is brought onto it', () => {
    expect(readPainCeiling(NAN)).toBe(0);
    expect(readPainCeiling(12)).toBe(10);
    expect(readPainCeiling(-2)).toBe(0);
    expect(inForceOn(plan({ ...stage({}), painCeiling: NAN }), '2026-03-03').painCeiling).toBe(0);
  });
});

describe('rules in force and status', () => {
  it('a cap that is not a finite number of 0 or more reads as 0, so nothing passes it (Shrier 2015: the most restrictive decides)', () => {
    expect(mergeRules([{ mode: 'capped', caps: { maxPercent1RM: NAN, maxLoadKg: -5, maxRpe: INF } }])).toEqual({
      mode: 'capped',
      caps: { maxPercent1RM: 0, maxLoadKg: 0, maxRpe: 0 },
    });
    const plans = plan(stage({ hinge: { mode: 'capped', caps: { maxLoadKg: NAN } } }));
    expect(rules(checkSets([set({ load: { kind: 'kg', value: 20 } })], ctx(plans)))).toEqual(['absolute_load']);
  });

  it('an unknown participation status reads as Out, never as Full', () => {
    expect(mostRestrictive(['full', 'benched' as ParticipationStatus])).toBe('out');
    expect(mostRestrictive(['limited', 'full'])).toBe('limited');
  });
});

describe('sets the engine cannot read', () => {
  it('weekOf a date that is not a calendar day is a LoadInputError', () => {
    expect(() => weekOf('2026-02-30')).toThrow(LoadInputError);
    expect(() => weekOf('abc')).toThrow(/calendar day/);
  });

  it('plannedKg is null for a value that is not a finite number of 0 or more, or a % with no usable 1RM', () => {
    for (const value of [NAN, INF, -1]) {
      expect(plannedKg({ kind: 'kg', value }, undefined)).toBeNull();
      expect(plannedKg({ kind: 'lb', value }, undefined)).toBeNull();
    }
    expect(plannedKg({ kind: 'percent', value: 60 }, NAN)).toBeNull();
    expect(plannedKg({ kind: 'percent', value: 60 }, 0)).toBeNull();
  });

  it('a set with reps, load, date or target RPE that cannot be read is an "unreadable" breach, even with no plan in force', () => {
    const cases: [Partial<Parameters<typeof set>[0]>, RegExp][] = [
      [{ reps: NAN }, /reps are not a whole number/],
      [{ reps: 0 }, /reps are not a whole number/],
      [{ reps: 2.5 }, /reps are not a whole number/],
      [{ load: { kind: 'kg', value: NAN } }, /load is not a number/],
      [{ load: { kind: 'percent', value: INF } }, /load is not a number/],
      [{ date: '2026-02-30' }, /date is not a calendar day/],
      [{ targetRpe: 0 }, /target RPE is not from 1 to 10/],
      [{ targetRpe: NAN }, /target RPE is not from 1 to 10/],
    ];
    for (const [over, words] of cases) {
      const [b, ...rest] = checkSets([set(over)], ctx([]));
      expect(rest).toEqual([]);
      expect(b).toMatchObject({ rule: 'unreadable', fittingKg: null });
      expect(b.message).toMatch(words);
    }
  });

  it('a baseline that is not a positive number is no baseline: a % cap then reports it missing', () => {
    const plans = plan(stage({ hinge: { mode: 'capped', caps: { maxPercent1RM: 60 } } }));
    for (const oneRm of [NAN, 0, -100, INF]) expect(rules(checkSets([set()], ctx(plans, { dl: oneRm })))).toEqual(['no_baseline']);
  });

  it('property: no breach message, for any doubles in a set, says NaN or Infinity', () => {
    const plans = plan(stage({ hinge: { mode: 'capped', caps: { maxPercent1RM: 60, maxLoadKg: 100, maxRpe: 7, maxRepsPerSet: 8 } } }));
    fc.assert(
      fc.property(fc.double(), fc.double(), fc.option(fc.double(), { nil: null }), fc.double(), (reps, value, targetRpe, oneRm) => {
        for (const b of checkSets([set({ reps, load: { kind: 'kg', value }, targetRpe })], ctx(plans, { dl: oneRm }))) {
          expect(`${b.message} ${b.limit} ${b.planned} ${b.fits ?? ''}`).not.toMatch(/NaN|Infinity/);
          if (b.fittingKg !== null) expect(Number.isFinite(b.fittingKg)).toBe(true);
        }
      }),
    );
  });
});

describe('a set of an exercise the engine does not know', () => {
  it('is a breach (fail closed), not a silent pass (OWASP ASVS 5.0 V16.5.3: fail securely)', () => {
    const breaches = checkSets(
      [
        {
          id: 's1',
          sessionId: 'x',
          date: '2026-12-03',
          exerciseId: 'not-in-library',
          reps: 5,
          load: { kind: 'kg', value: 60 },
          targetRpe: 6,
          order: 0,
        },
      ],
      { plans: [], exercises: {}, baselines: {}, unit: 'kg' },
    );
    expect(breaches.map((b) => b.rule)).toEqual(['unreadable']);
  });
});
