/**
 * Estimated one-repetition maximum from a set of `reps` at `load`. Reps here are the reps the lifter
 * could have done: reps completed plus reps in reserve (RIR = 10 − RPE, Zourdos et al. 2016) when an
 * RPE is given — a common-practice adjustment.
 */
export type OneRmFormula = 'epley' | 'brzycki';

/** Epley 1985: w(1 + r/30). One rep is defined as the load itself. */
export function epley(load: number, reps: number): number {
  if (reps === 1) return load;
  return load * (1 + reps / 30);
}

/** Brzycki 1993 (JOPERD 64:88–90): 36w / (37 − r). Undefined at r ≥ 37. */
export function brzycki(load: number, reps: number): number {
  if (reps >= 37) throw new RangeError('Brzycki is undefined at 37 or more reps');
  if (reps === 1) return load;
  return (36 * load) / (37 - reps);
}

export interface OneRmEstimate {
  value: number;
  formula: OneRmFormula;
  /** Reps the estimate is based on (after any RIR adjustment). */
  reps: number;
  /** Estimates from more than 10 reps are much less reliable (Reynolds et al. 2006; LeSuer et al. 1997). */
  lowReliability: boolean;
}

export const RELIABLE_REPS = 10;

export function estimateOneRm(load: number, reps: number, rpe?: number | null, formula: OneRmFormula = 'epley'): OneRmEstimate | null {
  if (!(load > 0) || !(reps >= 1) || !Number.isInteger(reps)) return null;
  const rir = rpe != null ? Math.max(0, 10 - rpe) : 0;
  const total = reps + rir;
  if (total >= 37) return null;
  const value = formula === 'epley' ? epley(load, total) : brzycki(load, total);
  return { value, formula, reps: total, lowReliability: total > RELIABLE_REPS };
}
