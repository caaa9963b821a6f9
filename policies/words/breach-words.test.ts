import { describe, expect, it } from 'vitest';
import type { Breach } from '../load/breach';
import { breachHeadline } from './breach-words';

const base: Breach = {
  setId: 's1',
  sessionId: 'x',
  date: '2026-03-02',
  exerciseId: 'e',
  rule: 'absolute_load',
  pattern: 'squat',
  limit: 'max 100 kg',
  planned: '120 kg',
  fits: '100 kg fits on 2.5 kg increments',
  fittingKg: 100,
  waived: false,
  message: 'Squat: max 100 kg: planned 120 kg; 100 kg fits on 2.5 kg increments.',
};

describe('what is over which limit, for the coach', () => {
  it('names the exercise, the load × reps, the limit and the movement', () => {
    expect(breachHeadline(base, 'Back squat', 5)).toBe('Back squat 120 kg × 5 is over the 100 kg limit for squatting.');
  });

  it('a % of 1RM cap reads as its load, with the % beside it (60% of 140 kg = 84 kg)', () => {
    const pct: Breach = { ...base, rule: 'percent_1rm', pattern: 'hinge', limit: 'max 60% of 140 kg = 84 kg', planned: '87.5 kg' };
    expect(breachHeadline(pct, 'Deadlift', 5)).toBe('Deadlift 87.5 kg × 5 is over the 84 kg limit (60% of 140 kg) for hinging.');
  });

  it('counts and efforts say their own limit; blocked and impact need no headline', () => {
    const rpe: Breach = { ...base, rule: 'rpe', pattern: 'hinge', limit: 'max RPE 7', planned: 'RPE 9' };
    expect(breachHeadline(rpe, 'Deadlift')).toBe('Deadlift: RPE 9 is over the limit for hinging (max RPE 7).');
    expect(breachHeadline({ ...base, rule: 'blocked' }, 'Deadlift')).toBeNull();
    expect(breachHeadline({ ...base, planned: '60%' }, 'Deadlift')).toBeNull();
  });
});
