import { isFiniteNumber } from './guard';

/**
 * Estimated one-repetition maximum from a set of `reps` at `load`. Reps here are the reps the lifter
 * could have done: reps completed plus reps in reserve (RIR = 10 − RPE, Zourdos et al. 2016) when an
 * RPE is given — a common-practice adjustment.
 */
export type OneRmFormula = 'epley' | 'brzycki';

/** The equations break down here: Brzycki divides by 37 − r (Brzycki 1993, JOPERD 64:88–90). */
export const MAX_ONE_RM_REPS = 36;

/** Reps possible may be fractional (reps done + reps in reserve at a half-step RPE), but never below 1. */
const usable = (load: number, reps: number) => isFiniteNumber(load) && load > 0 && isFiniteNumber(reps) && reps >= 1;

/** Epley 1985: w(1 + r/30). One rep is defined as the load itself. Null (cannot compute) for a load not above 0 or reps below 1. */
export function epley(load: number, reps: number): number | null {
  if (!usable(load, reps)) return null;
  if (reps === 1) return load;
  return load * (1 + reps / 30);
}

/**
 * Brzycki 1993 (JOPERD 64:88–90): 36w / (37 − r). Null (cannot compute) past 36 reps, where it
 * divides by zero or goes negative, and for a load not above 0 or reps below 1.
 */
export function brzycki(load: number, reps: number): number | null {
  if (!usable(load, reps) || reps > MAX_ONE_RM_REPS) return null;
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

/** Why no estimate can be made, naming the field and saying it in a sentence the preview can show. */
export interface OneRmProblem {
  field: 'load' | 'reps' | 'rpe' | 'formula';
  message: string;
}

/**
 * What stops an estimate, or null when one can be made: a load above 0, whole reps of at least 1,
 * an RPE (when given) from 1 to 10 on the reps-in-reserve scale (Zourdos et al. 2016), and no more
 * than 36 reps counting reps in reserve.
 */
export function oneRmProblem(load: number, reps: number, rpe?: number | null, formula: OneRmFormula = 'epley'): OneRmProblem | null {
  if (!isFiniteNumber(load) || load <= 0) return { field: 'load', message: 'Type a load above 0 to see the 1RM.' };
  if (!isFiniteNumber(reps) || !Number.isInteger(reps) || reps < 1)
    return { field: 'reps', message: 'Type the reps as a whole number of at least 1 to see the 1RM.' };
  if (rpe != null && !(isFiniteNumber(rpe) && rpe >= 1 && rpe <= 10))
    return { field: 'rpe', message: 'The RPE must be a number from 1 to 10 (or left empty) to estimate the 1RM.' };
  if (formula !== 'epley' && formula !== 'brzycki') return { field: 'formula', message: 'The formula must be Epley or Brzycki.' };
  const total = reps + (rpe != null ? 10 - rpe : 0);
  if (total > MAX_ONE_RM_REPS)
    return {
      field: 'reps',
      message: `No estimate past ${MAX_ONE_RM_REPS} reps, counting reps in reserve (here ${total}): the formulas break down. A heavier set gives a number.`,
    };
  return null;
}

/** The estimate, or null (cannot compute) exactly when oneRmProblem names a problem. */
export function estimateOneRm(load: number, reps: number, rpe?: number | null, formula: OneRmFormula = 'epley'): OneRmEstimate | null {
  if (oneRmProblem(load, reps, rpe, formula)) return null;
  const total = reps + (rpe != null ? 10 - rpe : 0);
  const value = (formula === 'epley' ? epley(load, total) : brzycki(load, total))!;
  return { value, formula, reps: total, lowReliability: total > RELIABLE_REPS };
}
