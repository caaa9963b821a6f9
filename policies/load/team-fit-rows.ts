import type { PlannedSetInput, SessionContent } from '../schemas/programs';
import type { EngineContext } from './compliance';
import type { EngineExercise, ExerciseRules } from './exercise-rules';
import type { PreparedRules, StageRules } from './prepared-rules';
import { unreadableFields } from './check-support';
import type { EngineSet, PlannedLoad } from './sets';
import { floorOfPrescription, resolveLoad } from './team-fit-support';

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
  /** The set as it last passed the engine, and the exercise it passed as (see engineSetsOf's onlyChanged). */
  passed: PlannedSetInput | null;
  passedAs: string | null;
}

export interface Row {
  id: string;
  teamExerciseId: string;
  exerciseId: string;
  ex: EngineExercise | undefined;
  notes: string | null | undefined;
  slots: Slot[];
  /**
   * The sets as written of a row no rule in force touches (every set readable): never checked nor
   * changed, so kept as they are, with no slots; null for every other row.
   */
  fixed: PlannedSetInput[] | null;
  swaps: string[] | null;
  /** Why the row was swapped; NO_NOTES until a swap (most rows have none). */
  swapNotes: readonly string[];
}

export const NO_NOTES: readonly string[] = Object.freeze([]);
/**
 * The slots of a row kept as written (`fixed`): none, one empty array shared by all of them (never
 * added to: newRow fills a row's own array). Not frozen: a loop over a frozen array is not optimised
 * as one over a plain array, and every row's slots are looped over.
 */
const NO_SLOTS: Slot[] = [];
export const addNotes = (slot: Slot, notes: readonly string[]) => {
  if (notes.length > 0) slot.notes = slot.notes.concat(notes);
};

/**
 * One athlete's % of 1RM loads resolved on each exercise's steps (resolveLoad), kept per exercise and
 * % across all the sessions fitted to them: a squad's program repeats the same few percentages. The
 * answer depends only on the exercise, the % and the athlete's baselines, which this holds by
 * reference (loadsFor makes a new one for other baselines). A % that cannot be resolved comes back as
 * the very load passed in, as resolveLoad returns it.
 */
export class ResolvedLoads {
  private readonly byExercise = new Map<EngineExercise, Map<number, PlannedLoad>>();
  private readonly floors = new Map<EngineExercise, Map<number, number | null>>();
  constructor(readonly baselines: Record<string, number>) {}

  of(load: PlannedLoad, ex: EngineExercise): PlannedLoad {
    if (load.kind !== 'percent') return load;
    let byPercent = this.byExercise.get(ex);
    if (!byPercent) this.byExercise.set(ex, (byPercent = new Map()));
    let r = byPercent.get(load.value);
    if (r === undefined) byPercent.set(load.value, (r = resolveLoad(load, ex, this.baselines)));
    return r.kind === 'percent' ? load : r;
  }

  /** floorOfPrescription, kept the same way (a load that is not a % has none: plannedKg of it is its own kg, not kept). */
  floorOf(load: PlannedLoad, ex: EngineExercise): number | null {
    if (load.kind !== 'percent') return floorOfPrescription(load, ex, this.baselines);
    let byPercent = this.floors.get(ex);
    if (!byPercent) this.floors.set(ex, (byPercent = new Map()));
    let f = byPercent.get(load.value);
    if (f === undefined) byPercent.set(load.value, (f = floorOfPrescription(load, ex, this.baselines)));
    return f;
  }
}

/** The resolved loads kept with an athlete's prepared rules (one squad fitting), for these baselines. */
const kept = new WeakMap<PreparedRules, ResolvedLoads>();
export function loadsFor(prepared: PreparedRules, baselines: Record<string, number>): ResolvedLoads {
  let loads = kept.get(prepared);
  if (loads?.baselines !== baselines) kept.set(prepared, (loads = new ResolvedLoads(baselines)));
  return loads;
}

/**
 * A team set resolved for this athlete (a % of 1RM as a load on the steps): the set as written. A set
 * whose load needs no resolving is its own version (sets are never changed in place).
 */
export function asWrittenSet(s: PlannedSetInput, ex: EngineExercise | undefined, loads: ResolvedLoads): PlannedSetInput {
  if (!ex) return s;
  const load = loads.of(s.load, ex);
  return load === s.load ? s : { ...s, load };
}

/**
 * The session as written for this athlete (what finish returns when nothing changed), or null when an
 * exercise is unknown or a set cannot be read (the fitting loop then says why). Only for a calendar day.
 */
export function asWrittenContent(content: SessionContent, ctx: EngineContext, loads: ResolvedLoads): SessionContent | null {
  const exercises: SessionContent['exercises'] = [];
  for (const r of content.exercises) {
    const ex = ctx.exercises[r.exerciseId];
    if (!ex) return null;
    const sets = asWrittenSets(r.sets, ex, loads);
    if (sets === null) return null;
    if (sets.length > 0) exercises.push(contentRow(r.id, r.exerciseId, r.notes, sets));
  }
  return { exercises };
}

/**
 * A team row's sets as written for this athlete (asWrittenSet), or null when one cannot be read. When
 * no load needed resolving this is the team's own array: sets are never changed in place, and most
 * rows of a squad's versions (loads in kg, body weight) are the team's as they stand.
 */
function asWrittenSets(teamSets: PlannedSetInput[], ex: EngineExercise, loads: ResolvedLoads): PlannedSetInput[] | null {
  if (!teamRowReadable(teamSets)) return null;
  let out: PlannedSetInput[] | null = null;
  for (let i = 0; i < teamSets.length; i++) {
    const s = teamSets[i];
    const set = asWrittenSet(s, ex, loads);
    if (out === null && set !== s) out = teamSets.slice(0, i);
    if (out !== null) out.push(set);
  }
  return out ?? teamSets;
}

/**
 * Whether every set of a team row reads (unreadableFields), kept per row's array of sets: a squad's
 * athletes share the team's rows. A set as written for an athlete reads exactly when the team's set
 * does: resolving a % changes only its load, into a load on the steps (a finite kg or lb, not
 * negative), which reads, and a % that does not read (not a finite number of at least 0) is never
 * resolved (plannedKg). Team content is not changed in place (the server reads it afresh).
 */
const readableRows = new WeakMap<readonly PlannedSetInput[], boolean>();
function teamRowReadable(sets: readonly PlannedSetInput[]): boolean {
  let readable = readableRows.get(sets);
  if (readable === undefined) {
    readable = true;
    for (const s of sets) if (unreadableFields(s) !== null) readable = false;
    readableRows.set(sets, readable);
  }
  return readable;
}

/** One exercise row of session content; `notes` only when given. Written out, not spread: this runs for every row of a squad's versions. */
function contentRow(id: string, exerciseId: string, notes: string | null | undefined, sets: PlannedSetInput[]) {
  return notes !== undefined ? { id, exerciseId, notes, sets } : { id, exerciseId, sets };
}

/**
 * A working row of the team's row. With `untouchedIn` (the stages of a calendar day), a row whose
 * exercise no rule in force touches and whose sets all read is kept as its sets as written (`fixed`):
 * engineSetsOf would leave it out of every check, so nothing in it can breach or change.
 */
export function newRow(
  r: SessionContent['exercises'][number],
  ctx: EngineContext,
  loads: ResolvedLoads,
  untouchedIn: { stages: StageRules; prepared: PreparedRules } | null = null,
): Row {
  const ex = ctx.exercises[r.exerciseId];
  // A row no rule touches keeps its sets as written, with no slots (and no array made for them).
  const fixed =
    ex && untouchedIn && untouched(ex, untouchedIn.prepared.rulesFor(untouchedIn.stages, ex)) ? asWrittenSets(r.sets, ex, loads) : null;
  const slots: Slot[] = fixed === null ? [] : NO_SLOTS;
  if (fixed === null)
    for (const s of r.sets) {
      const asWritten = asWrittenSet(s, ex, loads);
      slots.push({ team: s, asWritten, set: asWritten, removed: null, repsCut: false, notes: NO_NOTES, passed: null, passedAs: null });
    }
  return {
    id: r.id,
    teamExerciseId: r.exerciseId,
    exerciseId: r.exerciseId,
    ex,
    notes: r.notes,
    slots,
    fixed,
    swaps: null,
    swapNotes: NO_NOTES,
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
 * content. `untouchedIn` leaves out the sets of a row no rule in force on the day touches, `onlyChanged` the sets that passed the engine as they stand
 * (numbered all the same, so the others keep their order).
 */
export function engineSetsOf(
  team: { id: string; date: string },
  rows: Row[],
  untouchedIn: { stages: StageRules; prepared: PreparedRules } | null,
  onlyChanged = false,
): EngineSet[] {
  const out: EngineSet[] = [];
  let order = 0;
  for (const r of rows) {
    if (r.fixed !== null) {
      order += r.fixed.length;
      continue;
    }
    // Worked out for the row only when one of its sets is still to be checked (after the first round, most have passed).
    let skipped: boolean | undefined;
    for (const slot of r.slots) {
      const s = slot.set;
      if (s === null) continue;
      if (
        (onlyChanged && slot.passed === s && slot.passedAs === r.exerciseId) ||
        (skipped ??= untouchedIn !== null && rowUntouched(r, untouchedIn.stages, untouchedIn.prepared))
      ) {
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

/** A row whose exercise no rule in force touches and whose sets all read: the engine can find nothing against it. */
function rowUntouched(row: Row, stages: StageRules, prepared: PreparedRules): boolean {
  return row.ex !== undefined && untouched(row.ex, prepared.rulesFor(stages, row.ex)) && rowReadable(row);
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
    let sets = r.fixed;
    if (sets === null) {
      sets = [];
      for (const slot of r.slots) if (slot.set !== null) sets.push(slot.set);
    }
    if (sets.length > 0) exercises.push(contentRow(r.id, r.exerciseId, r.notes, sets));
  }
  return { exercises };
}

/** Whether a rule in force counts sets (per session or hard sets per week): a set's breaches may then depend on the other sets. */
export const counts = (r: ExerciseRules) => r.capped.some((c) => c.maxSets !== undefined || c.maxHard !== undefined);
