import type { SessionContent } from '../../../../../policies/schemas/programs';
import type { FitChange } from '../../../../../policies/load/team-fit-types';

type Row = SessionContent['exercises'][number];

export interface VersionLine {
  team: Row | null;
  mine: Row | null;
  changes: FitChange[];
}

/**
 * The team session and one athlete's version, row beside row. A fitted version keeps the team's order
 * and leaves out only the rows dropped whole, so the rows pair up in order skipping those. A version
 * edited by hand may be anything: its rows are then listed after the team's, unpaired.
 */
export function versionLines(team: SessionContent, mine: SessionContent, changes: FitChange[], overridden: boolean): VersionLine[] {
  const changesOf = (rowId: string) => changes.filter((c) => c.teamExerciseRowId === rowId);
  if (overridden)
    return [
      ...team.exercises.map((r) => ({ team: r, mine: null, changes: changesOf(r.id) })),
      ...mine.exercises.map((r) => ({ team: null, mine: r, changes: [] })),
    ];
  const lines: VersionLine[] = [];
  let j = 0;
  for (const r of team.exercises) {
    const rowChanges = changesOf(r.id);
    const dropped = rowChanges.filter((c) => c.kind === 'dropped');
    const droppedWhole = dropped.some((c) => c.teamSetId === null) || r.sets.every((s) => dropped.some((c) => c.teamSetId === s.id));
    if (droppedWhole || j >= mine.exercises.length) lines.push({ team: r, mine: null, changes: rowChanges });
    else lines.push({ team: r, mine: mine.exercises[j++], changes: rowChanges });
  }
  for (; j < mine.exercises.length; j++) lines.push({ team: null, mine: mine.exercises[j], changes: [] });
  return lines;
}
