import { describe, expect, it } from 'vitest';
import { checkSets, HARD_SET_DEFINITION, HARD_SET_RPE, isHardSet } from './compliance';
import { ctx, plan, rules, set, stage } from './compliance-fixtures';
import { sessionEngineSets, setFingerprintText } from './sets';
import { PlannedSetSchema } from '../schemas/programs';

// "Hard set" = RPE 7 or higher, 3 or fewer reps in reserve: common practice (RPE = 10 − RIR, Zourdos et al. 2016,
// JSCR 30:267–275). Warm-ups are marked by the coach; whether they count is our rule, tested here.
const hardCap = (maxHardSetsPerWeek: number) => plan(stage({ hinge: { mode: 'capped', caps: { maxHardSetsPerWeek } } }));

describe('what a hard set is (common practice)', () => {
  it('RPE 7 or higher; an unknown RPE counts as hard on a working set, not on a warm-up; a warm-up at RPE 7+ is hard', () => {
    expect(HARD_SET_RPE).toBe(7);
    expect(isHardSet(7, false)).toBe(true);
    expect(isHardSet(6.5, false)).toBe(false);
    expect(isHardSet(null, false)).toBe(true);
    expect(isHardSet(null, undefined)).toBe(true);
    expect(isHardSet(null, true)).toBe(false);
    expect(isHardSet(5, true)).toBe(false);
    expect(isHardSet(8, true)).toBe(true);
  });

  it('the definition the builder shows names RPE 7, 3 reps in reserve, common practice, and warm-ups', () => {
    expect(HARD_SET_DEFINITION).toMatch(/RPE 7 or higher/);
    expect(HARD_SET_DEFINITION).toMatch(/3 or fewer reps in reserve/);
    expect(HARD_SET_DEFINITION).toMatch(/common practice/);
    expect(HARD_SET_DEFINITION).toMatch(/Warm-ups do not count/);
  });
});

describe('warm-up sets in the weekly hard-set count (common practice)', () => {
  it('warm-ups with no RPE to know do not count; the working sets after them do', () => {
    const sets = [
      set({ id: 'w1', order: 0, targetRpe: null, warmUp: true, load: { kind: 'kg', value: 20 } }),
      set({ id: 'w2', order: 1, targetRpe: null, warmUp: true, load: { kind: 'kg', value: 40 } }),
      set({ id: 'h1', order: 2, targetRpe: 8 }),
      set({ id: 'h2', order: 3, targetRpe: 8 }),
    ];
    expect(checkSets(sets, ctx(hardCap(2)))).toEqual([]);
    // Unmarked, the same two sets have no knowable RPE and count as hard: the last working set is the third.
    const unmarked = sets.map((s) => ({ ...s, warmUp: false }));
    expect(checkSets(unmarked, ctx(hardCap(2))).map((b) => [b.setId, b.rule])).toEqual([
      ['h1', 'hard_sets_per_week'],
      ['h2', 'hard_sets_per_week'],
    ]);
  });

  it('a warm-up planned at RPE 7 or more, or estimated there, is hard whatever it is called', () => {
    const targeted = [set({ id: 'a', warmUp: true, targetRpe: 8 }), set({ id: 'b', order: 1, targetRpe: 8 })];
    expect(checkSets(targeted, ctx(hardCap(1))).map((b) => b.setId)).toEqual(['b']);
    // 100 kg × 5 of a 120 kg deadlift: estimated RPE 8 (NSCA table, Baechle & Earle 2008).
    const estimated = [
      set({ id: 'c', warmUp: true, targetRpe: null, load: { kind: 'kg', value: 100 } }),
      set({ id: 'd', order: 1, targetRpe: 8 }),
    ];
    expect(checkSets(estimated, ctx(hardCap(1), { dl: 120 })).map((b) => b.setId)).toEqual(['d']);
  });
});

describe('warm-ups are checked against every other rule', () => {
  it('load caps: a warm-up over 60% of 1RM breaches, with the same fix as any set', () => {
    const plans = plan(stage({ hinge: { mode: 'capped', caps: { maxPercent1RM: 60 } } }));
    const [b] = checkSets([set({ warmUp: true, load: { kind: 'kg', value: 87.5 } })], ctx(plans, { dl: 140 }));
    expect(b).toMatchObject({ rule: 'percent_1rm', fittingKg: 82.5 });
  });

  it('blocked patterns and impact', () => {
    expect(rules(checkSets([set({ warmUp: true })], ctx(plan(stage({ hinge: { mode: 'blocked' } })))))).toEqual(['blocked']);
    const noImpact = plan(stage({ jump: { mode: 'capped', caps: { impactAllowed: false } } }));
    expect(rules(checkSets([set({ exerciseId: 'bj', warmUp: true, load: { kind: 'bodyweight' } })], ctx(noImpact)))).toEqual(['impact']);
  });

  it('RPE, reps per set and sets per session: a warm-up is still a set the athlete does', () => {
    const plans = plan(stage({ hinge: { mode: 'capped', caps: { maxRpe: 6, maxRepsPerSet: 5, maxSetsPerSession: 1 } } }));
    const bs = checkSets(
      [set({ id: 'w', warmUp: true, targetRpe: 7 }), set({ id: 'x', order: 1, warmUp: true, reps: 8, targetRpe: 5 })],
      ctx(plans),
    );
    expect(bs.map((b) => [b.setId, b.rule])).toEqual([
      ['w', 'rpe'],
      ['x', 'reps_per_set'],
      ['x', 'sets_per_session'],
    ]);
  });
});

describe('the warm-up mark on the planned set', () => {
  const planned = { id: '55555555-5555-4555-8555-555555555555', reps: 5, load: { kind: 'kg', value: 40 } };

  it('is an optional yes/no on the set: absent means a working set', () => {
    expect(PlannedSetSchema.safeParse(planned).success).toBe(true);
    expect(PlannedSetSchema.safeParse({ ...planned, warmUp: true }).success).toBe(true);
    expect(PlannedSetSchema.safeParse({ ...planned, warmUp: false }).success).toBe(true);
    const refused = PlannedSetSchema.safeParse({ ...planned, warmUp: 'yes' });
    expect(refused.success).toBe(false);
    expect(refused.error?.issues[0]).toMatchObject({ path: ['warmUp'], message: 'must be yes or no' });
  });

  it("reaches the engine from a session's content, false when absent", () => {
    const content = {
      exercises: [
        {
          id: 'e',
          exerciseId: 'dl',
          sets: [
            { ...planned, warmUp: true },
            { ...planned, id: 's2' },
          ],
        },
      ],
    } as const;
    const sets = sessionEngineSets({ id: 'sess', date: '2026-03-02', content: structuredClone(content) as never });
    expect(sets.map((s) => [s.id, s.warmUp, s.order])).toEqual([
      [planned.id, true, 0],
      ['s2', false, 1],
    ]);
  });

  it('changes what a granted exception is tied to only when set, so grants made before the mark still match', () => {
    const load = { kind: 'kg' as const, value: 40 };
    expect(setFingerprintText('dl', { reps: 5, load }, '2026-03-02')).toBe(JSON.stringify(['dl', '2026-03-02', 5, load, null]));
    expect(setFingerprintText('dl', { reps: 5, load, warmUp: false }, '2026-03-02')).toBe(
      setFingerprintText('dl', { reps: 5, load }, '2026-03-02'),
    );
    expect(setFingerprintText('dl', { reps: 5, load, warmUp: true }, '2026-03-02')).not.toBe(
      setFingerprintText('dl', { reps: 5, load }, '2026-03-02'),
    );
  });
});
