import { describe, expect, it } from 'vitest';
import fc from 'fast-check';
import { brzycki, epley, estimateOneRm, RELIABLE_REPS } from './one-rm';

describe('estimated 1RM equations (Epley 1985, from memory; Brzycki 1993, JOPERD 64:88–90)', () => {
  it.each([
    ['Epley 1985 (from memory): 100 kg × 5 → 116.67', () => epley(100, 5), 116.67],
    ['Epley 1985 (from memory): 100 kg × 10 → 133.33', () => epley(100, 10), 133.33],
    ['Brzycki 1993, JOPERD 64:88–90: 100 kg × 5 → 112.50', () => brzycki(100, 5), 112.5],
    ['Brzycki 1993, JOPERD 64:88–90: 100 kg × 10 → 133.33', () => brzycki(100, 10), 133.33],
  ])('%s', (_label, compute, expected) => {
    expect(compute()).toBeCloseTo(expected, 2);
  });

  it('one rep is the load itself, for both equations (common practice: Epley read literally gives 103.33)', () => {
    expect(epley(100, 1)).toBe(100);
    expect(epley(100, 1)).not.toBeCloseTo(103.33, 1);
    expect(brzycki(100, 1)).toBe(100);
    expect(estimateOneRm(140, 1)).toMatchObject({ value: 140, reps: 1, lowReliability: false });
  });

  it('Brzycki is undefined at 37 reps or more: null (cannot compute) rather than divide by zero or go negative (Brzycki 1993)', () => {
    expect(brzycki(100, 37)).toBeNull();
    expect(brzycki(100, 40)).toBeNull();
    expect(brzycki(100, 36)).toBeCloseTo(3600, 6);
  });

  it('estimateOneRm refuses 37 reps or more with either formula: null (Brzycki 1993: 37 − r reaches 0)', () => {
    expect(estimateOneRm(100, 37)).toBeNull();
    expect(estimateOneRm(100, 37, null, 'brzycki')).toBeNull();
    expect(estimateOneRm(100, 36)).not.toBeNull();
  });

  it('60 kg × 15: Epley 90.0 (from memory), marked low reliability (Reynolds et al. 2006, JSCR 20:584–592; LeSuer et al. 1997, JSCR 11:211–213)', () => {
    const e = estimateOneRm(60, 15);
    expect(e).not.toBeNull();
    expect(e!.value).toBeCloseTo(90.0, 2);
    expect(e).toMatchObject({ formula: 'epley', reps: 15, lowReliability: true });
  });

  it('10 reps is still reliable, 11 is not (Reynolds et al. 2006: reliable for r ≤ 10)', () => {
    expect(RELIABLE_REPS).toBe(10);
    expect(estimateOneRm(100, 10)!.lowReliability).toBe(false);
    expect(estimateOneRm(100, 11)!.lowReliability).toBe(true);
  });

  it('RIR-adjusted: 100 kg × 5 at RPE 8 (2 in reserve) → 7 reps possible → Epley 123.33 (common practice; Zourdos et al. 2016, JSCR 30:267–275: RPE 8 = 2 RIR)', () => {
    const e = estimateOneRm(100, 5, 8);
    expect(e!.reps).toBe(7);
    expect(e!.value).toBeCloseTo(123.33, 2);
    // RPE 10 = no reps in reserve (Zourdos et al. 2016): same as no RPE.
    expect(estimateOneRm(100, 5, 10)!.value).toBeCloseTo(116.67, 2);
    expect(estimateOneRm(100, 5, null)!.value).toBeCloseTo(116.67, 2);
  });

  it('RIR adjustment can push an estimate past 10 reps (low reliability) or to 37 (refused) (common practice; Reynolds et al. 2006)', () => {
    expect(estimateOneRm(100, 9, 8)).toMatchObject({ reps: 11, lowReliability: true });
    expect(estimateOneRm(50, 30, 3)).toBeNull();
  });

  it('Brzycki can be chosen: 100 kg × 5 → 112.50 (Brzycki 1993)', () => {
    expect(estimateOneRm(100, 5, null, 'brzycki')).toMatchObject({ formula: 'brzycki', reps: 5 });
    expect(estimateOneRm(100, 5, null, 'brzycki')!.value).toBeCloseTo(112.5, 2);
  });

  it('no load, no reps or part reps give no estimate (common practice)', () => {
    expect(estimateOneRm(0, 5)).toBeNull();
    expect(estimateOneRm(-20, 5)).toBeNull();
    expect(estimateOneRm(100, 0)).toBeNull();
    expect(estimateOneRm(100, 2.5)).toBeNull();
    expect(estimateOneRm(Number.NaN, 5)).toBeNull();
  });

  it('property: an estimate is never below the load lifted, and more reps never estimate less (Epley and Brzycki formulas)', () => {
    fc.assert(
      fc.property(
        fc.double({ min: 1, max: 400, noNaN: true }),
        fc.integer({ min: 1, max: 35 }),
        fc.constantFrom('epley' as const, 'brzycki' as const),
        (w, r, f) => {
          const a = estimateOneRm(w, r, null, f)!;
          const b = estimateOneRm(w, r + 1, null, f)!;
          expect(a.value).toBeGreaterThanOrEqual(w);
          expect(b.value).toBeGreaterThan(a.value);
        },
      ),
    );
  });
});
