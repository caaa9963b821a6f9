import type { SessionContent } from '../schemas/programs';

/**
 * The shape of one athlete's version of a team session (team programming). The fitting itself is in
 * team-fit.ts; these types are shared by the server (stored on `program_sessions`), the review grid
 * and the floor sheet.
 *
 * - `as_written`: the team session fits this athlete as the coach wrote it (% of 1RM resolved to a
 *   load on the exercise's increments is not a change).
 * - `fitted`: one or more sets were changed to fit the athlete's limits (see `changes`).
 * - `needs_decision`: something in the session could not be made to fit and was dropped; the coach
 *   decides (edit, accept the drop, or ask the clinician for an exception).
 * - `out`: the athlete is Out on the session's date; nothing is planned for them.
 */
export const FIT_STATES = ['as_written', 'fitted', 'needs_decision', 'out'] as const;
export type FitState = (typeof FIT_STATES)[number];

/** What was done to one planned set (or exercise) of the team session, in the order the fitting tries. */
export const FIT_CHANGE_KINDS = ['load_lowered', 'reps_cut', 'sets_cut', 'swapped', 'dropped'] as const;
export type FitChangeKind = (typeof FIT_CHANGE_KINDS)[number];

export interface FitChange {
  kind: FitChangeKind;
  /** The team session's exercise row (SessionContent.exercises[].id) the change is about. */
  teamExerciseRowId: string;
  /** The team session's set the change is about; null when the change is about the whole exercise row. */
  teamSetId: string | null;
  /** The exercise as written, and the one used instead (a swap), by library id. */
  exerciseId: string;
  swappedToExerciseId?: string;
  /** Short words for the line-by-line difference: "80 kg × 5" → "72.5 kg × 5". */
  before: string;
  after: string | null;
  /** Why, in the coach's words, naming the limit: "Hinge capped at 60 % of 1RM". */
  note: string;
}

export interface FittedSession {
  content: SessionContent;
  changes: FitChange[];
  state: FitState;
}
