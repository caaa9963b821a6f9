import { describe, expect, it } from 'vitest';
import { ceilingWarning, evaluatePain, isWeeklyRise, MODEL_PAIN_CEILING, withoutJudged } from './pain-rule';
import { DEFAULT_PAIN_CEILING } from './patterns';

const kinds = (r: ReturnType<typeof evaluatePain>) => r.flags.map((f) => f.kind);

// Source of every check below unless said otherwise: Silbernagel et al. 2007, AJSM 35:897–906, the
// pain-monitoring model (the conditions confirmed against the paper, the thresholds from secondary sources).
// Its title, "Continued sports activity, using a pain-monitoring model, during rehabilitation in patients
// with Achilles tendinopathy", is quoted from memory.
describe('pain-monitoring model (Silbernagel et al. 2007, AJSM 35:897–906; thresholds confirmed only through a reproduction)', () => {
  it('the default ceiling and the model ceiling are both 5 (Silbernagel et al. 2007)', () => {
    expect(DEFAULT_PAIN_CEILING).toBe(5);
    expect(MODEL_PAIN_CEILING).toBe(5);
  });

  it('4 during and next morning at baseline → keep, no flags (Silbernagel et al. 2007)', () => {
    const r = evaluatePain({ during: 4, before: 2, nextMorning: 2 });
    expect(r.action).toBe('keep');
    expect(r.flags).toEqual([]);
    expect(r.athleteMessage).toMatch(/keep going/i);
  });

  it('5 during is at the ceiling, not over it → keep (Silbernagel et al. 2007: ≤ 5 allowed)', () => {
    expect(evaluatePain({ during: 5, before: 0, nextMorning: null }).action).toBe('keep');
  });

  it('6 during with the default ceiling → reduce, and the athlete is told to stop the set (Silbernagel et al. 2007)', () => {
    const r = evaluatePain({ during: 6, before: 1, nextMorning: null });
    expect(r.action).toBe('reduce');
    expect(kinds(r)).toEqual(['during_over_ceiling']);
    expect(r.flags[0].message).toContain('6/10');
    expect(r.flags[0].message).toContain('ceiling of 5');
    expect(r.athleteMessage).toMatch(/^Stop the set/);
    expect(r.athleteMessage).toContain('5/10');
  });

  it('3 during but next morning 2 above baseline → reduce (Silbernagel et al. 2007)', () => {
    const r = evaluatePain({ during: 3, before: 1, nextMorning: 3 });
    expect(r.action).toBe('reduce');
    expect(kinds(r)).toEqual(['next_morning_above_baseline']);
    expect(r.flags[0].message).toBe('Next-morning pain was 3/10, above the 1/10 before the session.');
    expect(r.athleteMessage).not.toMatch(/stop the set/i);
    expect(r.athleteMessage).toMatch(/ease off|lighter/i);
  });

  it('next morning below or at the pre-session level is settled → keep (Silbernagel et al. 2007)', () => {
    expect(evaluatePain({ during: 3, before: 2, nextMorning: 1 }).action).toBe('keep');
    expect(evaluatePain({ during: 3, before: 2, nextMorning: 2 }).action).toBe('keep');
  });

  it('a clinician ceiling of 3 makes 4 during a breach (Silbernagel et al. 2007 was built for tendon and knee pain: for the back the clinician sets the ceiling, often lower)', () => {
    const r = evaluatePain({ ceiling: 3, during: 4, before: 0, nextMorning: null });
    expect(r.action).toBe('reduce');
    expect(r.flags[0].message).toContain('ceiling of 3');
    expect(r.athleteMessage).toContain('3/10');
    // The same 4 under the default ceiling is fine: the ceiling is what changed the answer.
    expect(evaluatePain({ during: 4, before: 0, nextMorning: null }).action).toBe('keep');
  });

  it('a higher clinician ceiling (7) lets 6 during pass (Silbernagel et al. 2007, with the ceiling the clinician sets)', () => {
    expect(evaluatePain({ ceiling: 7, during: 6, before: 0, nextMorning: null }).action).toBe('keep');
  });

  it('pain not reported yet (null or absent) is not read as a breach (common practice)', () => {
    expect(evaluatePain({ during: null, before: null, nextMorning: null }).action).toBe('keep');
    expect(evaluatePain({ during: 2, before: null, nextMorning: 6 }).action).toBe('keep');
    expect(evaluatePain({ during: 2, before: 1, after: null, nextMorning: null }).action).toBe('keep');
  });
});

describe('pain after the session, that evening (Silbernagel et al. 2007: after activity ≤ 5 and settled by the next morning)', () => {
  it('5 that evening is at the ceiling → keep; 6 → reduce, explained (Silbernagel et al. 2007)', () => {
    expect(evaluatePain({ during: 3, before: 1, after: 5, nextMorning: null })).toMatchObject({ action: 'keep', flags: [] });
    const r = evaluatePain({ during: 3, before: 1, after: 6, nextMorning: null });
    expect(r.action).toBe('reduce');
    expect(kinds(r)).toEqual(['after_over_ceiling']);
    expect(r.flags[0].message).toBe('Pain after the session (that evening) was 6/10, above the ceiling of 5.');
    // Only pain during the session tells the athlete to stop a set; the evening tells them to ease off.
    expect(r.athleteMessage).toMatch(/ease off/);
  });

  it('the clinician ceiling applies to the evening too: ceiling 3, evening 4 → reduce (Silbernagel et al. 2007, with the ceiling the clinician sets)', () => {
    expect(kinds(evaluatePain({ ceiling: 3, during: 2, before: 1, after: 4, nextMorning: null }))).toEqual(['after_over_ceiling']);
  });

  it('worked sequence: before 1, during 3, evening 5, next morning 1 → settled, keep at every step (Silbernagel et al. 2007)', () => {
    const steps = [
      { during: 3, before: 1, nextMorning: null },
      { during: 3, before: 1, after: 5, nextMorning: null },
      { during: 3, before: 1, after: 5, nextMorning: 1 },
    ];
    expect(steps.map((s) => evaluatePain(s).action)).toEqual(['keep', 'keep', 'keep']);
  });

  it('worked sequence: before 1, during 3, evening 5, next morning 3 → not settled, explained with both scores (Silbernagel et al. 2007)', () => {
    const r = evaluatePain({ during: 3, before: 1, after: 5, nextMorning: 3 });
    expect(r.action).toBe('reduce');
    expect(kinds(r)).toEqual(['not_settled_next_morning']);
    expect(r.flags[0].message).toBe(
      'Pain after the session (5/10 that evening) had not settled by the next morning: 3/10, above the 1/10 before the session.',
    );
  });

  it('worked sequence: evening 7 over the ceiling and not settled → both conditions flagged (Silbernagel et al. 2007)', () => {
    expect(kinds(evaluatePain({ during: 4, before: 2, after: 7, nextMorning: 4 }))).toEqual([
      'after_over_ceiling',
      'not_settled_next_morning',
    ]);
  });

  it('an evening off the scale is a LoadInputError naming "pain after" (0–10 numeric rating scale)', () => {
    expect(() => evaluatePain({ during: 3, before: 1, after: 11, nextMorning: null })).toThrow(/pain after/);
  });
});

describe('week to week (Silbernagel et al. 2007: no rise from week to week — one rise is enough)', () => {
  it('worked sequence: weekly means 1 then 2 → one rise → reduce, explained with both means (Silbernagel et al. 2007)', () => {
    const r = evaluatePain({ during: 2, before: 1, nextMorning: null, weeklyMeans: [1, 2] });
    expect(r.action).toBe('reduce');
    expect(kinds(r)).toEqual(['weekly_rise']);
    expect(r.flags[0].message).toBe(
      'Pain during training rose from week to week: an average of 2/10 this week against 1/10 the week before.',
    );
  });

  it('worked sequence: means 3, 2.5 (falling), then 2.5, 2.5 (flat) → keep; 2.5 → 2.67 → reduce, shown to one decimal (Silbernagel et al. 2007)', () => {
    expect(evaluatePain({ during: 2, before: 1, nextMorning: null, weeklyMeans: [3, 2.5] }).action).toBe('keep');
    expect(evaluatePain({ during: 2, before: 1, nextMorning: null, weeklyMeans: [2.5, 2.5] }).action).toBe('keep');
    const r = evaluatePain({ during: 2, before: 1, nextMorning: null, weeklyMeans: [2.5, 8 / 3] });
    expect(r.flags[0].message).toContain('2.7/10 this week against 2.5/10');
  });

  it('all four conditions failing at once are each flagged, and "stop the set" leads (Silbernagel et al. 2007)', () => {
    const r = evaluatePain({ during: 7, before: 1, after: 6, nextMorning: 4, weeklyMeans: [2, 3] });
    expect(kinds(r)).toEqual(['during_over_ceiling', 'after_over_ceiling', 'not_settled_next_morning', 'weekly_rise']);
    expect(r.athleteMessage).toMatch(/^Stop the set/);
  });
});

describe('isWeeklyRise (Silbernagel et al. 2007: no rise from week to week)', () => {
  it('one rise between the last two weeks is a rise; three weeks in a row are not needed', () => {
    expect(isWeeklyRise([1, 2])).toBe(true);
    expect(isWeeklyRise([0, 0.5])).toBe(true);
    expect(isWeeklyRise([3, 1, 2])).toBe(true);
  });

  it('one week, no weeks, flat or falling last step → no rise', () => {
    expect(isWeeklyRise([2])).toBe(false);
    expect(isWeeklyRise([])).toBe(false);
    expect(isWeeklyRise([2, 2])).toBe(false);
    expect(isWeeklyRise([1, 2, 3, 2])).toBe(false);
  });
});

describe('the stage ceiling warning (Silbernagel et al. 2007, AJSM 35:897–906: the model allows pain up to 5/10)', () => {
  it('a ceiling above 5 warns and names the model ceiling of 5; the value is kept, not refused', () => {
    expect(ceilingWarning(6)).toBe(
      "A ceiling of 6/10 is above the pain-monitoring model's ceiling of 5/10 (Silbernagel et al. 2007). Loadline will use 6, as you set it.",
    );
    expect(ceilingWarning(10)).toContain('ceiling of 5/10');
  });

  it('5 or under, or no ceiling yet, → no warning', () => {
    expect(ceilingWarning(5)).toBeNull();
    expect(ceilingWarning(0)).toBeNull();
    expect(ceilingWarning(null)).toBeNull();
    expect(ceilingWarning(undefined)).toBeNull();
    expect(ceilingWarning(Number.NaN)).toBeNull();
  });
});

describe('withoutJudged (a later report does not raise a finding twice)', () => {
  it('the evening over the ceiling, already flagged, is dropped at the next morning; settled → keep (Silbernagel et al. 2007)', () => {
    const full = evaluatePain({ during: null, before: 1, after: 6, nextMorning: 1 });
    expect(kinds(full)).toEqual(['after_over_ceiling']);
    expect(withoutJudged(full, ['after_over_ceiling'], 5)).toMatchObject({ action: 'keep', flags: [] });
    const notSettled = withoutJudged(evaluatePain({ during: null, before: 1, after: 6, nextMorning: 3 }), ['after_over_ceiling'], 5);
    expect(notSettled.action).toBe('reduce');
    expect(kinds(notSettled)).toEqual(['not_settled_next_morning']);
  });
});
