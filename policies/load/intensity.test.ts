import { describe, expect, it } from 'vitest';
import fc from 'fast-check';
import { estimateRpe, MAX_EXTRAPOLATED_REPS, maxRepsAtPercent, NSCA_PERCENT_BY_REPS, percentForReps } from './intensity';

// NSCA %1RM ↔ repetitions, Essentials of Strength Training and Conditioning (Baechle & Earle 2008),
// confirmed only through a reproduction. An estimate: people vary widely around it (Nuzzo et al. 2024, Sports Med).
const NSCA_TABLE: [number, number][] = [
  [1, 100],
  [2, 95],
  [3, 93],
  [4, 90],
  [5, 87],
  [6, 85],
  [7, 83],
  [8, 80],
  [9, 77],
  [10, 75],
  [11, 70],
  [12, 67],
  [15, 65],
];

describe('the NSCA %1RM ↔ reps table (Baechle & Earle 2008, secondary)', () => {
  it('is the published table, row for row', () => {
    expect(NSCA_PERCENT_BY_REPS).toEqual(NSCA_TABLE);
  });

  it('1RM 120 kg → 6 reps at 102 kg (85%), 10 reps at 90 kg (75%), 15 reps at 78 kg (65%)', () => {
    expect((percentForReps(6)! / 100) * 120).toBeCloseTo(102, 9);
    expect((percentForReps(10)! / 100) * 120).toBeCloseTo(90, 9);
    expect((percentForReps(15)! / 100) * 120).toBeCloseTo(78, 9);
    expect(maxRepsAtPercent((102 / 120) * 100)).toBeCloseTo(6, 9);
    expect(maxRepsAtPercent((90 / 120) * 100)).toBeCloseTo(10, 9);
    expect(maxRepsAtPercent((78 / 120) * 100)).toBeCloseTo(15, 9);
  });

  it('reads every row in both directions', () => {
    for (const [reps, percent] of NSCA_TABLE) {
      expect(percentForReps(reps), `${reps} reps`).toBe(percent);
      expect(maxRepsAtPercent(percent), `${percent}%`).toBe(reps);
    }
  });

  it('interpolates linearly between rows (12 reps 67%, 15 reps 65%: the table skips 13 and 14)', () => {
    expect(percentForReps(13)).toBeCloseTo(67 - 2 / 3, 9);
    expect(percentForReps(14)).toBeCloseTo(67 - 4 / 3, 9);
    expect(maxRepsAtPercent(66)).toBeCloseTo(13.5, 9);
    // Half-way between 6 reps (85%) and 7 reps (83%).
    expect(maxRepsAtPercent(84)).toBeCloseTo(6.5, 9);
  });

  it('at or above 100% one rep is possible; beyond the last row both directions extend its slope (1.5 reps per %, an extrapolation)', () => {
    expect(maxRepsAtPercent(100)).toBe(1);
    expect(maxRepsAtPercent(110)).toBe(1);
    expect(percentForReps(1)).toBe(100);
    expect(maxRepsAtPercent(60)).toBeCloseTo(22.5, 9);
    // The same line read the other way: 20 reps is 65 − 5/1.5 %, and 22.5 reps is 60 %.
    expect(percentForReps(20)).toBeCloseTo(65 - 5 / 1.5, 9);
    expect(percentForReps(22.5)).toBeCloseTo(60, 9);
    // The line reaches 0 % at 112.5 reps: no load is light enough for more.
    expect(MAX_EXTRAPOLATED_REPS).toBe(112.5);
    expect(maxRepsAtPercent(0)).toBe(112.5);
    expect(percentForReps(112.5)).toBe(0);
    expect(percentForReps(113)).toBeNull();
  });

  it('more reps never need a heavier load, and a heavier load never allows more reps (property)', () => {
    fc.assert(
      fc.property(fc.double({ min: 30, max: 110, noNaN: true }), fc.double({ min: 30, max: 110, noNaN: true }), (a, b) => {
        const [lo, hi] = a < b ? [a, b] : [b, a];
        expect(maxRepsAtPercent(hi)).toBeLessThanOrEqual(maxRepsAtPercent(lo)! + 1e-9);
      }),
    );
    fc.assert(
      fc.property(fc.integer({ min: 1, max: 30 }), fc.integer({ min: 1, max: 30 }), (a, b) => {
        const [lo, hi] = a < b ? [a, b] : [b, a];
        expect(percentForReps(hi)).toBeLessThanOrEqual(percentForReps(lo)!);
      }),
    );
  });

  it('percentForReps and maxRepsAtPercent are inverses over the whole line, inside the table and beyond its last row (property)', () => {
    fc.assert(
      fc.property(fc.double({ min: 1, max: MAX_EXTRAPOLATED_REPS, noNaN: true }), (reps) => {
        expect(maxRepsAtPercent(percentForReps(reps)!)).toBeCloseTo(reps, 6);
      }),
    );
    fc.assert(
      fc.property(fc.double({ min: 0, max: 100, noNaN: true }), (percent) => {
        expect(percentForReps(maxRepsAtPercent(percent)!)).toBeCloseTo(percent, 6);
      }),
    );
  });
});

describe('estimateRpe: RPE = 10 − reps in reserve (Zourdos et al. 2016, JSCR 30:267–275)', () => {
  it('0 in reserve is RPE 10 and 1 in reserve is RPE 9 (confirmed); 2 → 8 and 3 → 7 (secondary)', () => {
    // 85% of 1RM allows 6 reps (NSCA).
    expect(estimateRpe(85, 6)).toBe(10);
    expect(estimateRpe(85, 5)).toBe(9);
    expect(estimateRpe(85, 4)).toBe(8);
    expect(estimateRpe(85, 3)).toBe(7);
    // 75% allows 10 reps: 7 planned leaves 3 in reserve.
    expect(estimateRpe(75, 7)).toBe(7);
  });

  it('round trips: a load chosen for reps + RIR reads back as RPE 10 − RIR', () => {
    for (let reps = 1; reps <= 12; reps++) {
      for (let rir = 0; rir + reps <= 15 && rir <= 5; rir++) {
        expect(estimateRpe(percentForReps(reps + rir)!, reps), `${reps} reps, ${rir} in reserve`).toBe(10 - rir);
      }
    }
  });

  it('rounds to the nearest half step (86% allows 5.5 reps: 5 planned → RPE 9.5)', () => {
    expect(maxRepsAtPercent(86)).toBeCloseTo(5.5, 9);
    expect(estimateRpe(86, 5)).toBe(9.5);
  });

  it('more reps than possible reads as 10, never above; very light work floors at 1', () => {
    expect(estimateRpe(85, 9)).toBe(10);
    expect(estimateRpe(100, 3)).toBe(10);
    expect(estimateRpe(30, 1)).toBe(1);
  });

  it('stays on 1–10 in half steps, and rises with load and with reps (property)', () => {
    fc.assert(
      fc.property(
        fc.double({ min: 20, max: 110, noNaN: true }),
        fc.integer({ min: 1, max: 40 }),
        fc.integer({ min: 0, max: 10 }),
        (percent, reps, more) => {
          const rpe = estimateRpe(percent, reps)!;
          expect(rpe).toBeGreaterThanOrEqual(1);
          expect(rpe).toBeLessThanOrEqual(10);
          expect(Number.isInteger(rpe * 2)).toBe(true);
          expect(estimateRpe(percent, reps + more)).toBeGreaterThanOrEqual(rpe);
          expect(estimateRpe(Math.min(110, percent + more), reps)).toBeGreaterThanOrEqual(rpe);
        },
      ),
    );
  });
});
