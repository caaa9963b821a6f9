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

/** Reps possible to failure at `percent` of 1RM, interpolated linearly between table rows. */
export function maxRepsAtPercent(percent: number): number {
  const t = NSCA_PERCENT_BY_REPS;
  if (percent >= t[0][1]) return 1;
  for (let i = 1; i < t.length; i++) {
    const [r0, p0] = t[i - 1];
    const [r1, p1] = t[i];
    if (percent >= p1) return r0 + ((p0 - percent) / (p0 - p1)) * (r1 - r0);
  }
  // Below 65 %: extend the last segment's slope (about 1.5 reps per percent), an extrapolation.
  const [rA, pA] = t[t.length - 2];
  const [rB, pB] = t[t.length - 1];
  return rB + ((pB - percent) * (rB - rA)) / (pA - pB);
}

/** %1RM that allows exactly `reps` to failure (the table, interpolated). */
export function percentForReps(reps: number): number {
  const t = NSCA_PERCENT_BY_REPS;
  if (reps <= 1) return 100;
  for (let i = 1; i < t.length; i++) {
    const [r0, p0] = t[i - 1];
    const [r1, p1] = t[i];
    if (reps <= r1) return p0 - ((reps - r0) / (r1 - r0)) * (p0 - p1);
  }
  return t[t.length - 1][1];
}

/**
 * Estimated RPE of a set of `reps` at `percent` of 1RM: RPE = 10 − reps in reserve (Zourdos et al.
 * 2016), reps in reserve = reps possible − reps planned. Rounded to the nearest half step, 1–10;
 * more reps than possible reads as 10.
 */
export function estimateRpe(percent: number, reps: number): number {
  const rir = maxRepsAtPercent(percent) - reps;
  const rpe = 10 - Math.max(0, rir);
  return Math.min(10, Math.max(1, Math.round(rpe * 2) / 2));
}
