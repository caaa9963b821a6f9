import { describe, expect, it } from 'vitest';
import { evaluatePain, isRisingTrend } from './pain-rule';
import { DEFAULT_PAIN_CEILING } from './patterns';

const kinds = (r: ReturnType<typeof evaluatePain>) => r.flags.map((f) => f.kind);

describe('pain-monitoring model (Silbernagel et al. 2007, AJSM 35:897–906; thresholds confirmed only through a reproduction)', () => {
  it('the default ceiling during activity is 5 (Silbernagel et al. 2007)', () => {
    expect(DEFAULT_PAIN_CEILING).toBe(5);
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
    expect(r.flags[0].message).toMatch(/3\/10.*1\/10/);
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

  it('three rising weekly means → reduce with a rising-trend flag (Silbernagel et al. 2007: no rising trend week to week)', () => {
    const r = evaluatePain({ during: 2, before: 1, nextMorning: null, weeklyMeans: [1, 2, 3] });
    expect(r.action).toBe('reduce');
    expect(kinds(r)).toEqual(['rising_trend']);
  });

  it('pain not reported yet (null) is not read as a breach (common practice)', () => {
    expect(evaluatePain({ during: null, before: null, nextMorning: null }).action).toBe('keep');
    expect(evaluatePain({ during: 2, before: null, nextMorning: 6 }).action).toBe('keep');
  });

  it('all three breaches at once are each flagged, and "stop the set" leads (Silbernagel et al. 2007)', () => {
    const r = evaluatePain({ during: 7, before: 1, nextMorning: 4, weeklyMeans: [2, 3, 4] });
    expect(kinds(r).sort()).toEqual(['during_over_ceiling', 'next_morning_above_baseline', 'rising_trend']);
    expect(r.athleteMessage).toMatch(/^Stop the set/);
  });
});

describe('rising trend (common practice reading of Silbernagel et al. 2007: three weeks, each higher than the last)', () => {
  it('three strictly rising weeks are a trend', () => {
    expect(isRisingTrend([1, 2, 3])).toBe(true);
    expect(isRisingTrend([0, 0.5, 0.6])).toBe(true);
  });

  it('two weeks are not a trend, however steep', () => {
    expect(isRisingTrend([1, 6])).toBe(false);
    expect(isRisingTrend([2])).toBe(false);
    expect(isRisingTrend([])).toBe(false);
  });

  it('flat or falling in any step is not a trend', () => {
    expect(isRisingTrend([2, 2, 3])).toBe(false);
    expect(isRisingTrend([1, 3, 3])).toBe(false);
    expect(isRisingTrend([3, 2, 4])).toBe(false);
  });

  it('only the last three weeks count', () => {
    expect(isRisingTrend([9, 1, 2, 3])).toBe(true);
    expect(isRisingTrend([1, 2, 3, 2])).toBe(false);
  });
});
