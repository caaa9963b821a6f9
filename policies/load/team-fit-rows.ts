import type { PlannedSetInput, SessionContent } from '../schemas/programs';
import type { EngineContext } from './compliance';
import type { EngineExercise, ExerciseRules } from './exercise-rules';
import type { PreparedRules } from './prepared-rules';
import { unreadableFields } from './check-support';
import type { EngineSet } from './sets';
import { resolveLoad } from './team-fit-support';

/**
 * The working rows of one athlete's version of a team session (team-fit.ts): each team row's sets as
 * written for the athlete (a % of 1RM resolved on the exercise's steps), as they stand while fitting,
 * and the session content and engine sets read back from them.
 */
export interface Slot {
  team: PlannedSetInput;
  /** The team's set resolved for this athlete (a % of 1RM as a load on the steps): the set unchanged. */
  asWritten: PlannedSetInput;
  /** The set as it stands now; null once removed. */
  set: PlannedSetInput | null;
  removed: 'sets_cut' | 'dropped' | null;
  repsCut: boolean;
  /** Why it changed; NO_NOTES (shared, frozen) until a note is added with addNotes. */
  notes: readonly string[];
}

export interface Row {
  id: string;
  teamExerciseId: string;
  exerciseId: string;
  ex: EngineExercise | undefined;
  notes: string | null | undefined;
  slots: Slot[];
  swaps: string[] | null;
  swapNotes: string[];
}

export const NO_NOTES: readonly string[] = Object.freeze([]);
export const addNotes = (slot: Slot, notes: readonly string[]) => {
  if (notes.length > 0) slot.notes = slot.notes.concat(notes);
};

/**
 * The team's sets of one row resolved for this athlete (a % of 1RM as a load on the steps): each set as
 * written. A set whose load needs no resolving is its own version (sets are never changed in place).
 */
export function asWrittenOf(ex: EngineExercise | undefined, baselines: Record<string, number>): (s: PlannedSetInput) => PlannedSetInput {
  // A row's sets usually share their % of 1RM: resolved once per value.
  let lastPercent: number | null = null;
  let lastLoad: PlannedSetInput['load'] | null = null;
  const resolve = (load: PlannedSetInput['load']) => {
    if (!ex || load.kind !== 'percent') return ex ? resolveLoad(load, ex, baselines) : load;
    if (load.value !== lastPercent || lastLoad === null) {
      lastPercent = load.value;
      lastLoad = resolveLoad(load, ex, baselines);
    }
    return lastLoad;
  };
  return (s) => {
    const load = resolve(s.load);
    return load === s.load ? s : { ...s, load };
  };
}

/**
 * The session as written for this athlete (what finish returns when nothing changed), or null when an
 * exercise is unknown or a set cannot be read (the fitting loop then says why). Only for a calendar day.
 */
export function asWrittenContent(content: SessionContent, ctx: EngineContext): SessionContent | null {
  const exercises: SessionContent['exercises'] = [];
  for (const r of content.exercises) {
    const ex = ctx.exercises[r.exerciseId];
    if (!ex) return null;
    const asWritten = asWrittenOf(ex, ctx.baselines);
    const sets: PlannedSetInput[] = [];
    for (const s of r.sets) {
      const set = asWritten(s);
      if (unreadableFields(set) !== null) return null;
      sets.push(set);
    }
    if (sets.length > 0) exercises.push({ id: r.id, exerciseId: r.exerciseId, ...(r.notes !== undefined ? { notes: r.notes } : {}), sets });
  }
  return { exercises };
}

export function newRow(r: SessionContent['exercises'][number], ctx: EngineContext): Row {
  const ex = ctx.exercises[r.exerciseId];
  const asWrittenSet = asWrittenOf(ex, ctx.baselines);
  return {
    id: r.id,
    teamExerciseId: r.exerciseId,
    exerciseId: r.exerciseId,
    ex,
    notes: r.notes,
    slots: r.sets.map((s) => {
      const asWritten = asWrittenSet(s);
      return { team: s, asWritten, set: asWritten, removed: null, repsCut: false, notes: NO_NOTES };
    }),
    swaps: null,
    swapNotes: [],
  };
}

/** Every exercise known and every set readable on the date, as the engine reads them (check-support's unreadable). */
export function allReadable(team: { id: string; date: string }, rows: Row[], prepared: PreparedRules): boolean {
  return prepared.on(team.date) !== null && rows.every((r) => r.ex && rowReadable(r));
}

/** Every set of the row readable, as the engine reads them (its date already known to be a calendar day). */
export const rowReadable = (row: Row) => row.slots.every((slot) => slot.set === null || unreadableFields(slot.set) === null);

/**
 * The session's sets as the engine reads them: sessionEngineSets(contentOf(rows)) without building the
 * content. `skip` leaves out a row's sets (numbered all the same, so the others keep their order).
 */
export function engineSetsOf(team: { id: string; date: string }, rows: Row[], skip?: (row: Row) => boolean): EngineSet[] {
  const out: EngineSet[] = [];
  let order = 0;
  for (const r of rows) {
    const skipped = skip?.(r) ?? false;
    for (const slot of r.slots) {
      const s = slot.set;
      if (s === null) continue;
      if (skipped) {
        order++;
        continue;
      }
      out.push({
        id: s.id,
        sessionId: team.id,
        date: team.date,
        exerciseId: r.exerciseId,
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
 * An exercise no rule in force touches (exerciseRules): not blocked, no impact rule it could break, no
 * cap on load, % of 1RM, RPE or reps, no counted limit. The engine can find nothing against its
 * readable sets, and they count toward no limit (only capped patterns are counted), so they need not
 * be checked; a set that cannot be read is still checked (the engine says why).
 */
export function untouched(ex: EngineExercise, r: ExerciseRules): boolean {
  return (
    r.blocked === null &&
    (r.impactOff === null || !ex.ballistic) &&
    r.pct === null &&
    r.abs === null &&
    r.rpe === null &&
    r.reps === null &&
    r.capped.every((c) => c.maxSets === undefined && c.maxHard === undefined)
  );
}

export function contentOf(rows: Row[]): SessionContent {
  const exercises: SessionContent['exercises'] = [];
  for (const r of rows) {
    const sets = r.slots.filter((s) => s.set !== null).map((s) => s.set!);
    if (sets.length > 0) exercises.push({ id: r.id, exerciseId: r.exerciseId, ...(r.notes !== undefined ? { notes: r.notes } : {}), sets });
  }
  return { exercises };
}
