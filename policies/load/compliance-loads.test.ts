import { describe, expect, it } from 'vitest';
import { checkSets } from './compliance';
import { ctx, hinge60, plan, rules, set, stage } from './compliance-fixtures';
import type { PlanInput } from './in-force';
import type { ParticipationStatus } from './patterns';

// The compliance engine, one block per check that stops a set outright or caps its load (fixtures in compliance-fixtures.ts).
describe('status Out', () => {
  it('Out with no stage in force blocks every set, and nothing else is checked for it', () => {
    const statusOn = (): ParticipationStatus => 'out';
    const [b, ...rest] = checkSets([set({ reps: 50 })], ctx([], {}, { statusOn }));
    expect(rest).toEqual([]);
    expect(b).toMatchObject({ rule: 'status_out', pattern: null, fits: null, fittingKg: null, planned: 'Deadlift' });
    expect(b.message).toBe(
      'The athlete is Out on Mon 2 Mar 2026 and no restriction plan says what they may train. Ask the clinician for a plan or an exception.',
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
    expect(b.message).toBe('Hinge is blocked on Tue 10 Mar 2026: Deadlift cannot be programmed. Swap to an exercise that fits.');
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
  it('a % load against a % cap: 65% of 140 kg = 91 kg breaches max 60% = 84 kg; 82.5 kg fits (common practice: under a cap, round down)', () => {
    const [b, ...rest] = checkSets([set({ load: { kind: 'percent', value: 65 } })], ctx(hinge60, { dl: 140 }));
    expect(rest).toEqual([]);
    expect(b).toMatchObject({
      rule: 'percent_1rm',
      pattern: 'hinge',
      limit: 'max 60% of 140 kg = 84 kg',
      planned: '91 kg',
      fits: '82.5 kg fits on 2.5 kg increments',
      fittingKg: 82.5,
    });
    expect(b.message).toBe('Hinge: max 60% of 140 kg = 84 kg: planned 91 kg; 82.5 kg fits on 2.5 kg increments.');
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
    expect(b.fits).toBe('181.88 lb fits on 2.5 kg increments');
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
      fits: '82.5 kg fits on 2.5 kg increments',
      fittingKg: 82.5,
    });
    expect(b.message).toBe('Horizontal push: max 84 kg: planned 85 kg; 82.5 kg fits on 2.5 kg increments.');
  });

  it('a pound load against a kg cap, on 5 lb increments: 190 lb (86.18 kg) over 84 kg; 185 lb fits (NIST SP 811)', () => {
    const [b] = checkSets([set({ exerciseId: 'bplb', load: { kind: 'lb', value: 190 } })], ctx(cap84, {}, { unit: 'lb' }));
    expect(b).toMatchObject({ rule: 'absolute_load', limit: 'max 185.18 lb', planned: '190 lb', fits: '185 lb fits on 5 lb increments' });
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
