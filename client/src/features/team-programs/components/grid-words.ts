import type { GridCellDto } from '../../../../../policies/dto/teams';
import type { FitState } from '../../../../../policies/load/team-fit-types';

/**
 * The review grid's words. Each cell says one state and any markers in words, each with its own
 * glyph, so a cell reads the same in greyscale, printed, or to a screen reader.
 */
export const FIT_STATE_GLYPHS: Record<FitState, string> = {
  as_written: '●',
  fitted: '◐',
  needs_decision: '▲',
  out: '○',
};

export function fitStateWords(state: FitState, changes: number): string {
  switch (state) {
    case 'as_written':
      return 'As written';
    case 'fitted':
      return `Fitted (${changes} ${changes === 1 ? 'change' : 'changes'})`;
    case 'needs_decision':
      return 'Needs a decision';
    case 'out':
      return 'Out';
  }
}

export type CellMarker = 'needs_review' | 'overridden' | 'held' | 'published';

export const MARKER_WORDS: Record<CellMarker, string> = {
  needs_review: 'Needs review',
  overridden: 'Edited by hand',
  held: 'On hold',
  published: 'Published',
};

export const MARKER_GLYPHS: Record<CellMarker, string> = {
  needs_review: '◆',
  overridden: '✎',
  held: '‖',
  published: '✓',
};

/** What one grid cell says, most pressing first: the state, then the markers that apply. */
export function cellWords(cell: Pick<GridCellDto, 'state' | 'changes' | 'needsReview' | 'overridden' | 'held' | 'published'>): {
  state: string;
  markers: CellMarker[];
} {
  const markers: CellMarker[] = [];
  if (cell.held) markers.push('held');
  if (cell.needsReview) markers.push('needs_review');
  if (cell.overridden) markers.push('overridden');
  if (cell.published) markers.push('published');
  return { state: fitStateWords(cell.state, cell.changes), markers };
}

/** The whole cell as one sentence, for the link's accessible name. */
export function cellSentence(athleteName: string, sessionTitle: string, cell: Parameters<typeof cellWords>[0]): string {
  const { state, markers } = cellWords(cell);
  return [`${athleteName}, ${sessionTitle}: ${state}`, ...markers.map((m) => MARKER_WORDS[m])].join(' · ');
}

/** A cell that asks the coach to look before (or after) publishing. */
export function cellNeedsAttention(cell: Pick<GridCellDto, 'state' | 'needsReview' | 'held'>): boolean {
  return cell.state === 'needs_decision' || cell.needsReview || cell.held;
}
