import type { Unit } from '../schemas/common';
import type { PlannedSetInput } from '../schemas/programs';
import { plannedKg } from './sets';
import type { ResolvedLoads, Row } from './team-fit-rows';
import { contentOf } from './team-fit-rows';
import { sameSet, setWords } from './team-fit-support';
import type { FitChange, FitChangeKind, FittedSession } from './team-fit-types';
import type { EngineContext } from './compliance';

/** The team fitting's answer (team-fit.ts): the version's content, its line-by-line changes with their words, its state. */

export function finish(rows: Row[], unit: Unit, ctx: EngineContext, loads: ResolvedLoads): FittedSession {
  const changes: FitChange[] = [];
  // The sets of a row are mostly alike: the words of the last set are kept for the next one like it.
  for (const row of rows) {
    const teamEx = ctx.exercises[row.teamExerciseId];
    const swapped = row.exerciseId !== row.teamExerciseId;
    const ex = ctx.exercises[row.exerciseId];
    // Made for a row with a change only (most rows have none).
    let beforeWords: LastWords | null = null;
    let afterWords: LastWords | null = null;
    const rowNote = swapped ? notesOf(row.swapNotes) : '';
    for (const slot of row.slots) {
      // Untouched since it was resolved: as written (the words below are built only for a change).
      if (!swapped && slot.set === slot.asWritten) continue;
      const asWritten = slot.asWritten;
      const set = slot.set;
      if (!swapped && set !== null) {
        if (sameSet(set, asWritten)) continue;
        // A % prescription resolved to the step below the nearest one (to stay under a cap) is still the prescription.
        const floor = teamEx ? loads.floorOf(slot.team.load, teamEx) : null;
        const kgNow = plannedKg(set.load, undefined);
        const onlyRounded =
          floor !== null &&
          kgNow !== null &&
          kgNow >= floor - 1e-6 &&
          set.reps === asWritten.reps &&
          (set.targetRpe ?? null) === (asWritten.targetRpe ?? null);
        if (onlyRounded) continue;
      }
      const before = `${swapped ? `${teamEx?.name ?? 'Unknown exercise'}: ` : ''}${(beforeWords ??= new LastWords(unit)).of(asWritten)}`;
      const note = slot.notes.length === 0 ? rowNote : notesOf(swapped ? [...row.swapNotes, ...slot.notes] : slot.notes);
      // Written out rather than spread from a common part: this runs for every changed set of a squad.
      const teamExerciseRowId = row.id;
      const teamSetId = slot.team.id;
      const exerciseId = row.teamExerciseId;
      if (set === null) {
        const kind = slot.removed ?? 'dropped';
        changes.push({
          teamExerciseRowId,
          teamSetId,
          exerciseId,
          before,
          kind,
          after: null,
          note: note || 'Nothing allowed fits this set',
        });
        continue;
      }
      if (swapped) {
        const after = `${ex?.name ?? 'Unknown exercise'}: ${(afterWords ??= new LastWords(unit)).of(set)}`;
        changes.push({
          teamExerciseRowId,
          teamSetId,
          exerciseId,
          before,
          kind: 'swapped',
          swappedToExerciseId: row.exerciseId,
          after,
          note,
        });
        continue;
      }
      const kind: FitChangeKind = slot.repsCut || set.reps < asWritten.reps ? 'reps_cut' : 'load_lowered';
      changes.push({ teamExerciseRowId, teamSetId, exerciseId, before, kind, after: (afterWords ??= new LastWords(unit)).of(set), note });
    }
  }
  const state = changes.some((c) => c.kind === 'dropped') ? 'needs_decision' : changes.length > 0 ? 'fitted' : 'as_written';
  return { content: contentOf(rows), changes, state };
}

/** The notes, each once, in order, joined ("a; b"); one note is itself (most changed sets have one). */
function notesOf(notes: readonly string[]): string {
  if (notes.length === 1) return notes[0];
  // A few notes at most: each kept at its first place, as a Set would keep them, without making one.
  let out = '';
  for (let i = 0; i < notes.length; i++) if (notes.indexOf(notes[i]) === i) out = i === 0 ? notes[i] : `${out}; ${notes[i]}`;
  return out;
}

/** The words of a set; the sets of a row are mostly alike, so the words of the last set are kept for the next one like it. */
class LastWords {
  private last: PlannedSetInput | null = null;
  private words = '';
  constructor(private readonly unit: Unit) {}
  of(set: PlannedSetInput): string {
    if (this.last === null || !sameSet(this.last, set)) this.words = setWords((this.last = set), this.unit);
    return this.words;
  }
}
