import { describe, expect, it } from 'vitest';
import { AGE_OF_MAJORITY, ageOn, isMinor, todayIso } from './roles';

describe('age on a date (common practice: whole years, counted from the birthday)', () => {
  it('born 2010-06-15 → 14 on 2025-06-14 and 15 on 2025-06-15: the birthday is the first day of the new age (common practice)', () => {
    expect(ageOn('2010-06-15', '2025-06-14')).toBe(14);
    expect(ageOn('2010-06-15', '2025-06-15')).toBe(15);
    expect(ageOn('2010-06-15', '2025-06-16')).toBe(15);
  });

  it('month boundaries count: a day in an earlier month is before the birthday (common practice)', () => {
    expect(ageOn('2010-06-15', '2025-05-31')).toBe(14);
    expect(ageOn('2010-06-15', '2025-07-01')).toBe(15);
    expect(ageOn('2010-12-31', '2025-01-01')).toBe(14);
  });

  it('born on 29 February: one year older from 1 March in a common year (from memory: the usual legal reading)', () => {
    expect(ageOn('2008-02-29', '2026-02-28')).toBe(17);
    expect(ageOn('2008-02-29', '2026-03-01')).toBe(18);
    expect(ageOn('2008-02-29', '2028-02-29')).toBe(20);
  });
});

describe("minors (common practice: guardian consent plus the athlete's assent)", () => {
  it('the age of majority is 18 (from memory: most US states; jurisdictions differ)', () => {
    expect(AGE_OF_MAJORITY).toBe(18);
  });

  it('a minor until the 18th birthday, an adult on it (common practice: the birthday is the first day of the new age)', () => {
    expect(isMinor('2007-06-15', '2025-06-14')).toBe(true);
    expect(isMinor('2007-06-15', '2025-06-15')).toBe(false);
  });

  it('the test factory athlete (born 2010-03-14) is a minor today (common practice)', () => {
    expect(isMinor('2010-03-14', todayIso())).toBe(true);
  });

  it('no date of birth → not treated as a minor (common practice: nothing to compute from)', () => {
    expect(isMinor(null, '2025-06-15')).toBe(false);
    expect(isMinor(undefined, '2025-06-15')).toBe(false);
  });
});

describe('todayIso', () => {
  it('is the UTC calendar date (common practice)', () => {
    expect(todayIso(new Date('2025-06-14T23:59:59.999Z'))).toBe('2025-06-14');
    expect(todayIso(new Date('2025-06-15T00:00:00Z'))).toBe('2025-06-15');
  });
});
