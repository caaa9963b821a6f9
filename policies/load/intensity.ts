import { isFiniteNumber } from './guard';

/**
 * %1RM ↔ repetitions, NSCA Essentials of Strength Training and Conditioning (Baechle & Earle 2008):
 * the load, as a share of 1RM, that allows a given number of reps to failure. People vary widely
 * around it (Nuzzo et al. 2024): an estimate, used only when a set has no target RPE.
 */
export const NSCA_PERCENT_BY_REPS: [reps: number, percent: number][] = [
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

/**
 * Beyond the last row (15 reps at 65 %) the table says nothing. Both directions extend its last
 * segment (12 → 15 reps over 67 → 65 %: 1.5 reps per percent), an extrapolation, so that reading the
 * table one way and back the other lands where it started — a load suggested for 20 reps is then
 * estimated at 20 reps, not at the 15 the last row would give. The line reaches 0 % at 112.5 reps.
 */
const [LAST_REPS, LAST_PERCENT] = NSCA_PERCENT_BY_REPS[NSCA_PERCENT_BY_REPS.length - 1];
const [PREV_REPS, PREV_PERCENT] = NSCA_PERCENT_BY_REPS[NSCA_PERCENT_BY_REPS.length - 2];
const REPS_PER_PERCENT = (LAST_REPS - PREV_REPS) / (PREV_PERCENT - LAST_PERCENT);
export const MAX_EXTRAPOLATED_REPS = LAST_REPS + LAST_PERCENT * REPS_PER_PERCENT;

/**
 * Reps possible to failure at `percent` of 1RM, interpolated linearly between table rows; one rep at
 * or above 100 %. Null (cannot compute) for a percent that is not a finite number or is below 0.
 */
export function maxRepsAtPercent(percent: number): number | null {
  if (!isFiniteNumber(percent) || percent < 0) return null;
  const t = NSCA_PERCENT_BY_REPS;
  if (percent >= t[0][1]) return 1;
  for (let i = 1; i < t.length; i++) {
    const [r0, p0] = t[i - 1];
    const [r1, p1] = t[i];
    if (percent >= p1) return r0 + ((p0 - percent) / (p0 - p1)) * (r1 - r0);
  }
  return LAST_REPS + (LAST_PERCENT - percent) * REPS_PER_PERCENT;
}

/**
 * %1RM that allows exactly `reps` to failure (the table, interpolated; the same line as
 * maxRepsAtPercent beyond the last row). Null (cannot compute) for reps that are not a finite number
 * of at least 1, or so many that no load is light enough (beyond 112.5 reps).
 */
export function percentForReps(reps: number): number | null {
  if (!isFiniteNumber(reps) || reps < 1 || reps > MAX_EXTRAPOLATED_REPS) return null;
  const t = NSCA_PERCENT_BY_REPS;
  for (let i = 1; i < t.length; i++) {
    const [r0, p0] = t[i - 1];
    const [r1, p1] = t[i];
    if (reps <= r1) return p0 - ((reps - r0) / (r1 - r0)) * (p0 - p1);
  }
  return Math.max(0, LAST_PERCENT - (reps - LAST_REPS) / REPS_PER_PERCENT);
}

/**
 * Estimated RPE of a set of `reps` at `percent` of 1RM: RPE = 10 − reps in reserve (Zourdos et al.
 * 2016), reps in reserve = reps possible − reps planned. Rounded to the nearest half step, 1–10;
 * more reps than possible reads as 10. Null (cannot compute) when the percent or the reps (a finite
 * number of at least 1) cannot be read.
 */
export function estimateRpe(percent: number, reps: number): number | null {
  const possible = maxRepsAtPercent(percent);
  if (possible === null || !isFiniteNumber(reps) || reps < 1) return null;
  const rpe = 10 - Math.max(0, possible - reps);
  return Math.min(10, Math.max(1, Math.round(rpe * 2) / 2));
}
