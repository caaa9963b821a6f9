import type { MovementPattern } from './patterns';

export type BreachRule =
  | 'unreadable'
  | 'status_out'
  | 'blocked'
  | 'impact'
  | 'no_baseline'
  | 'percent_1rm'
  | 'absolute_load'
  | 'rpe'
  | 'reps_per_set'
  | 'sets_per_session'
  | 'hard_sets_per_week';

export interface Breach {
  setId: string;
  sessionId: string;
  date: string;
  exerciseId: string;
  rule: BreachRule;
  pattern: MovementPattern | null;
  /** The limit, the planned value and what would fit, in words (loads in the reader's unit). */
  limit: string;
  planned: string;
  fits: string | null;
  message: string;
  /**
   * The heaviest load (kg) on the exercise's steps with which this set passes every load cap (% of
   * 1RM, absolute, and RPE when the RPE is estimated from the load), when a load cap was breached.
   */
  fittingKg: number | null;
  /** Present when no load fits at the planned reps: the most reps at which `fittingKg` fits. */
  fittingReps?: number;
  /** Covered by a granted exception: shown, but does not stop publishing. */
  waived: boolean;
}

/** A session may be published only when none of its breaches is unwaived. */
export function blockingBreaches(breaches: Breach[]): Breach[] {
  return breaches.filter((b) => !b.waived);
}
