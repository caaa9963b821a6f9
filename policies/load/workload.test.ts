import { describe, expect, it } from 'vitest';
import fc from 'fast-check';
import { acuteChronic, acuteChronicSeed, describeRatio, ewmaLambda, ewmaSeries, sessionLoad, weekSummary } from './workload';

/** Foster's example week (Foster 1998, MSSE 30:1164–1168): Mon 5×60, Tue 6×75, Wed rest, Thu 5×80, Fri 7×50, Sat 8×75, Sun rest. */
const FOSTER_WEEK = [sessionLoad(5, 60), sessionLoad(6, 75), 0, sessionLoad(5, 80), sessionLoad(7, 50), sessionLoad(8, 75), 0];

describe('session load (Foster et al. 2001, JSCR 15:109–115)', () => {
  it('is session RPE × minutes, in arbitrary units', () => {
    expect(FOSTER_WEEK).toEqual([300, 450, 0, 400, 350, 600, 0]);
    expect(sessionLoad(0, 90)).toBe(0); // CR-10 0 = rest (Foster et al. 2001)
  });
});

describe('weekly monotony and strain (Foster 1998, MSSE 30:1164–1168)', () => {
  const week = weekSummary(FOSTER_WEEK);

  it('total 2100 AU and mean 300 AU (Foster 1998)', () => {
    expect(week.total).toBe(2100);
    expect(week.mean).toBe(300);
  });

  it('population SD 208.74, not the sample SD 225.46 (Foster 1998; the choice of SD is documented in the code)', () => {
    expect(week.sd).toBeCloseTo(208.74, 2);
    expect(week.sd).not.toBeCloseTo(225.46, 0);
  });

  it('monotony = mean / SD = 1.44 and strain = total × monotony = 3018 (Foster 1998)', () => {
    expect(week.monotony).toBeCloseTo(1.44, 2);
    expect(week.strain).toBeCloseTo(3018, 0);
    // The sample-SD figures are the other convention; they must not be what we report.
    expect(week.monotony).not.toBeCloseTo(1.33, 2);
    expect(week.strain).not.toBeCloseTo(2794, -1);
  });

  it('rest days count as 0: the order of the days does not change the week (Foster 1998)', () => {
    const shuffled = weekSummary([0, 600, 350, 0, 400, 450, 300]);
    expect(shuffled.total).toBe(2100);
    expect(shuffled.monotony).toBeCloseTo(week.monotony!, 10);
  });

  it('SD 0 (every day the same) → monotony and strain undefined, shown as null, never Infinity (Foster 1998)', () => {
    for (const load of [0, 300]) {
      const flat = weekSummary(Array(7).fill(load));
      expect(flat.sd).toBe(0);
      expect(flat.monotony).toBeNull();
      expect(flat.strain).toBeNull();
      expect(flat.total).toBe(load * 7);
    }
  });

  it('a week is exactly seven days (common practice)', () => {
    expect(() => weekSummary(FOSTER_WEEK.slice(0, 6))).toThrow(/seven/);
    expect(() => weekSummary([...FOSTER_WEEK, 100])).toThrow(/seven/);
  });
});

describe('EWMA acute:chronic (Williams et al. 2017, BJSM 51:209)', () => {
  it('λ = 2/(N+1): 0.25 for the 7-day acute window and 0.0690 for the 28-day chronic window (Williams et al. 2017)', () => {
    expect(ewmaLambda(7)).toBe(0.25);
    expect(ewmaLambda(28)).toBeCloseTo(0.069, 4);
  });

  it('seeded at 100, one day at 300 → acute 150.00, chronic 113.79, ratio 1.32 (Williams et al. 2017)', () => {
    const [acute] = ewmaSeries([300], 7, 100);
    const [chronic] = ewmaSeries([300], 28, 100);
    expect(acute).toBeCloseTo(150.0, 2);
    expect(chronic).toBeCloseTo(113.79, 2);
    expect(acute / chronic).toBeCloseTo(1.32, 2);
  });

  it('seeded at 100, seven days at 200 → acute 186.65, chronic 139.36, ratio 1.34 (Williams et al. 2017)', () => {
    const days = Array(7).fill(200);
    const acute = ewmaSeries(days, 7, 100);
    const chronic = ewmaSeries(days, 28, 100);
    expect(acute).toHaveLength(7);
    expect(acute.at(-1)).toBeCloseTo(186.65, 2);
    expect(chronic.at(-1)).toBeCloseTo(139.36, 2);
    expect(acute.at(-1)! / chronic.at(-1)!).toBeCloseTo(1.34, 2);
  });

  it('seeded at 0, 28 steady days at 100 → acute 99.97, chronic 86.48, ratio 1.16: the bias a zero start gives (Williams et al. 2017)', () => {
    const ac = acuteChronic(Array(28).fill(100), 0);
    expect(ac.acute).toBeCloseTo(99.97, 2);
    expect(ac.chronic).toBeCloseTo(86.48, 2);
    expect(ac.ratio).toBeCloseTo(1.16, 2);
  });

  it('the ratio is hidden (null) before 28 days of data, though acute and chronic are still computed (common practice: 28 days is the chronic window, Williams et al. 2017)', () => {
    const one = acuteChronic([300], 100);
    expect(one.acute).toBeCloseTo(150.0, 2);
    expect(one.chronic).toBeCloseTo(113.79, 2);
    expect(one.ratio).toBeNull();
    expect(acuteChronic(Array(27).fill(100)).ratio).toBeNull();
    expect(acuteChronic(Array(28).fill(100)).ratio).not.toBeNull();
  });

  it('no history, or a chronic load of 0, gives no ratio rather than a division by zero (common practice)', () => {
    expect(acuteChronic([])).toEqual({ acute: 0, chronic: 0, ratio: null });
    expect(acuteChronic(Array(30).fill(0)).ratio).toBeNull();
  });

  it('seeded at 0, 28 days at 300 → acute 299.90, chronic 259.43, ratio 1.16: a flat load read as a rise (Williams et al. 2017 formula)', () => {
    const ac = acuteChronic(Array(28).fill(300), 0);
    expect(ac.acute).toBeCloseTo(299.9, 2);
    expect(ac.chronic).toBeCloseTo(259.43, 2);
    expect(ac.ratio).toBeCloseTo(1.16, 2);
  });

  it('by default both averages start at the mean of the first 28 days: 28 days at 300 → acute 300, chronic 300, ratio 1.00 (common practice seeding)', () => {
    const ac = acuteChronic(Array(28).fill(300));
    expect(ac.acute).toBeCloseTo(300, 9);
    expect(ac.chronic).toBeCloseTo(300, 9);
    expect(ac.ratio).toBeCloseTo(1, 9);
    expect(acuteChronicSeed(Array(28).fill(300))).toBe(300);
  });

  it('the seed is the mean of the first 28 days only (later days do not move it), or of all days when fewer (common practice)', () => {
    expect(acuteChronicSeed([...Array(28).fill(100), ...Array(10).fill(900)])).toBe(100);
    expect(acuteChronicSeed([100, 200, 300])).toBe(200);
    expect(acuteChronicSeed([])).toBe(0);
  });

  it('a rise after a steady start still reads as a rise: 28 days at 300, then 7 at 450 → 429.98 / 359.04 / 1.20 (Williams et al. 2017 formula, computed here)', () => {
    const ac = acuteChronic([...Array(28).fill(300), ...Array(7).fill(450)]);
    expect(ac.acute).toBeCloseTo(429.98, 2);
    expect(ac.chronic).toBeCloseTo(359.04, 2);
    expect(ac.ratio).toBeCloseTo(1.2, 2);
    expect(describeRatio(ac.ratio)).toMatch(/above the recent average/);
  });

  it('property: any perfectly steady load, for any number of days from 28, reads exactly 1.00 (common practice seeding)', () => {
    fc.assert(
      fc.property(fc.integer({ min: 1, max: 3000 }), fc.integer({ min: 28, max: 200 }), (load, days) => {
        const ac = acuteChronic(Array(days).fill(load));
        expect(ac.acute).toBeCloseTo(load, 6);
        expect(ac.chronic).toBeCloseTo(load, 6);
        expect(ac.ratio).toBeCloseTo(1, 9);
        expect(describeRatio(ac.ratio)).toMatch(/about the same/);
      }),
    );
  });

  it('property: a steady load stays steady — seeded at that load, the EWMA never moves (Williams et al. 2017 formula)', () => {
    fc.assert(
      fc.property(fc.integer({ min: 0, max: 3000 }), fc.integer({ min: 1, max: 60 }), fc.constantFrom(7, 28), (load, days, n) => {
        for (const v of ewmaSeries(Array(days).fill(load), n, load)) expect(v).toBeCloseTo(load, 6);
      }),
    );
  });
});

describe('describing the ratio, never as injury risk (Impellizzeri et al. 2020, Sports Med; Gabbett 2016, BJSM 50:273–280)', () => {
  it('1.5 → "50% above the recent average" (common practice wording; Impellizzeri et al. 2020: a description, not a risk)', () => {
    expect(describeRatio(1.5)).toBe('This week is 50% above the recent average.');
  });

  it('0.7 → "30% below"; within 5% → "about the same" (common practice wording)', () => {
    expect(describeRatio(0.7)).toBe('This week is 30% below the recent average.');
    expect(describeRatio(1.02)).toMatch(/about the same/);
    expect(describeRatio(0.97)).toMatch(/about the same/);
    expect(describeRatio(1.06)).toMatch(/6% above/);
  });

  it('null → not enough history, naming the 28 days (common practice)', () => {
    expect(describeRatio(null)).toMatch(/not enough training history/i);
    expect(describeRatio(null)).toMatch(/28 days/);
  });

  it('property: no description of any ratio speaks of risk, injury or danger zones (Impellizzeri et al. 2020)', () => {
    fc.assert(
      fc.property(fc.option(fc.double({ min: 0, max: 5, noNaN: true }), { nil: null }), (ratio) => {
        expect(describeRatio(ratio)).not.toMatch(/risk|injur|danger|sweet spot|zone/i);
      }),
    );
  });
});
