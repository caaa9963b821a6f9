import type { SessionContent } from '../schemas/programs';
import { isFiniteNumber, isIsoDate, LoadInputError } from './guard';
import { KG_PER_LB } from './units';

/** What a planned set asks the athlete to lift. */
export type PlannedLoad =
  { kind: 'kg'; value: number } | { kind: 'lb'; value: number } | { kind: 'percent'; value: number } | { kind: 'bodyweight' };

export interface EngineSet {
  id: string;
  sessionId: string;
  date: string;
  exerciseId: string;
  reps: number;
  load: PlannedLoad;
  targetRpe?: number | null;
  /** Marked by the coach as a warm-up: checked like any set, but not counted as a hard set. */
  warmUp?: boolean;
  /** Position within its session, for "the sets beyond the cap". */
  order: number;
}

/**
 * A hard set, for the weekly limit: a working set taken to within three reps of failure, i.e. RPE 7
 * or higher (common practice; RPE = 10 − reps in reserve, Zourdos et al. 2016, JSCR 30:267–275).
 */
export const HARD_SET_RPE = 7;

/** The definition the builder shows beside the warm-up toggle, so coach and engine mean the same thing. */
export const HARD_SET_DEFINITION =
  'A hard set is a set at RPE 7 or higher (3 or fewer reps in reserve) — common practice. A set with no target RPE and no baseline to estimate one counts as hard. Warm-ups do not count, unless they are that hard.';

/**
 * Whether a set counts toward the weekly hard-set limit. An unknown RPE counts as hard (unknown is
 * never a pass) except on a warm-up; a warm-up at RPE 7 or higher is hard whatever it is called, so
 * marking a working set as a warm-up cannot hide it from the limit.
 */
export function isHardSet(rpe: number | null, warmUp: boolean | undefined): boolean {
  if (rpe === null) return !warmUp;
  return rpe >= HARD_SET_RPE;
}

/** Monday of the ISO week containing `date` (YYYY-MM-DD), on the calendar in UTC; a LoadInputError for a date that is not one. */
export function weekOf(date: string): string {
  if (!isIsoDate(date)) throw new LoadInputError('date', 'out_of_range', `date must be a calendar day as YYYY-MM-DD, got ${String(date)}`);
  return mondayOf(date);
}

/** weekOf for a date already known to be a calendar day (the engine checks each date once). */
export function mondayOf(date: string): string {
  const d = new Date(`${date}T00:00:00Z`);
  const dow = (d.getUTCDay() + 6) % 7;
  d.setUTCDate(d.getUTCDate() - dow);
  return d.toISOString().slice(0, 10);
}

/**
 * The planned load in kg: kg as is, lb exactly (NIST SP 811), % of the 1RM. Null when it cannot be
 * known: bodyweight, a % with no usable 1RM, or a value that is not a finite number of 0 or more.
 */
export function plannedKg(load: PlannedLoad, oneRmKg: number | undefined): number | null {
  if (load.kind === 'bodyweight') return null;
  if (!isFiniteNumber(load.value) || load.value < 0) return null;
  switch (load.kind) {
    case 'kg':
      return load.value;
    case 'lb':
      return load.value * KG_PER_LB;
    case 'percent':
      return isFiniteNumber(oneRmKg) && oneRmKg > 0 ? (load.value / 100) * oneRmKg : null;
  }
}

/** A session's sets in the engine's shape, numbered in session order: one builder for the server and the program builder. */
export function sessionEngineSets(session: { id: string; date: string; content: SessionContent }): EngineSet[] {
  const out: EngineSet[] = [];
  let order = 0;
  for (const ex of session.content.exercises) {
    for (const s of ex.sets) {
      out.push({
        id: s.id,
        sessionId: session.id,
        date: session.date,
        exerciseId: ex.exerciseId,
        reps: s.reps,
        load: s.load,
        targetRpe: s.targetRpe ?? null,
        warmUp: s.warmUp ?? false,
        order: order++,
      });
    }
  }
  return out;
}

/**
 * What a granted exception is tied to: the set as granted (exercise, date, reps, load, RPE, and the
 * warm-up mark, which changes how the set counts). The mark is added only when set, so a grant made
 * before warm-ups existed still matches its unchanged set.
 */
export function setFingerprintText(
  exerciseId: string,
  set: { reps: number; load: PlannedLoad; targetRpe?: number | null; warmUp?: boolean },
  date: string,
): string {
  const parts: unknown[] = [exerciseId, date, set.reps, set.load, set.targetRpe ?? null];
  if (set.warmUp) parts.push('warm-up');
  return JSON.stringify(parts);
}
