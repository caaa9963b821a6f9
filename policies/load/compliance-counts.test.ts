import { describe, expect, it } from 'vitest';
import { blockingBreaches, checkSets, HARD_SET_RPE, plannedKg, suggestSwaps, weekOf } from './compliance';
import { bench, boxJump, ctx, ex, kbSwing, library, plan, rules, set, stage, trapBar } from './compliance-fixtures';
import { inForceOn } from './in-force';
import type { ParticipationStatus } from './patterns';

// The compliance engine: effort, reps and set counts, several patterns, gaps between stages, helpers (fixtures in compliance-fixtures.ts).
describe('RPE caps', () => {
  const rpe7 = plan(stage({ squat: { mode: 'capped', caps: { maxRpe: 7 } } }));

  it('estimated when no target (NSCA table, Baechle & Earle 2008; RPE = 10 − RIR, Zourdos 2016): 100 kg × 5 of 120 kg is RPE 8', () => {
    // 83.33% allows 6.83 reps → 1.83 in reserve → RPE 8.17 → 8 on half steps.
    const [b] = checkSets([set({ exerciseId: 'sq', load: { kind: 'kg', value: 100 }, targetRpe: null })], ctx(rpe7, { sq: 120 }));
    expect(b).toMatchObject({ rule: 'rpe', pattern: 'squat', limit: 'max RPE 7', planned: 'RPE 8 (estimated from 83.33% × 5)' });
    // RPE 7 with 5 reps = 8 reps possible = 80% of 120 = 96 kg → 95 kg on 2.5 kg increments.
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
      planned: 'hard set 2 of the week of Mon 2 Mar 2026',
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

  it('suggestSwaps: the exercise’s "use instead" list first in its order, and a no-pattern exercise only through it', () => {
    const bike = ex('bike', 'Bike intervals', []);
    const rower = ex('row', 'Rower', []);
    const withCardio = [...library, bike, rower];
    const plans = plan(stage({ hinge: { mode: 'capped', caps: { impactAllowed: false } }, jump: { mode: 'blocked' } }));
    const day = inForceOn(plans, '2026-03-03');
    // Without a list, nothing that has no pattern is offered: it shares nothing to judge it by.
    expect(suggestSwaps(kbSwing, withCardio, day, 10).map((e) => e.id)).toEqual(['dl', 'rdl', 'sumo', 'tb']);
    // The list comes first in the coach's order (the rower before the squat-and-hinge lifts), then the family.
    const named = { ...kbSwing, useInstead: ['row', 'sumo', 'bike'] };
    expect(suggestSwaps(named, withCardio, day, 10).map((e) => e.id)).toEqual(['row', 'sumo', 'bike', 'dl', 'rdl', 'tb']);
    expect(suggestSwaps(named, withCardio, day).map((e) => e.id)).toEqual(['row', 'sumo', 'bike']);
    // A listed exercise that is blocked that day, unknown to the library, or the exercise itself is skipped.
    const jumpy = { ...kbSwing, useInstead: ['bj', 'gone', 'kbs', 'bike'] };
    expect(suggestSwaps(jumpy, withCardio, day, 2).map((e) => e.id)).toEqual(['bike', 'dl']);
    expect(suggestSwaps(boxJump, withCardio, day)).toEqual([]);
    expect(suggestSwaps({ ...boxJump, useInstead: ['bike'] }, withCardio, day).map((e) => e.id)).toEqual(['bike']);
  });
});
