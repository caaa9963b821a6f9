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

export function fitStateWords(state: FitState, changes: number, reviewed = false): string {
  switch (state) {
    case 'as_written':
      return 'As written';
    case 'fitted':
      return `Fitted (${changes} ${changes === 1 ? 'change' : 'changes'})`;
    case 'needs_decision':
      // Once the coach accepted what was dropped, the decision is made: the cell says what is left.
      return reviewed ? 'Fitted, part left out' : 'Needs a decision';
    case 'out':
      return 'Out';
  }
}

export type CellMarker = 'needs_review' | 'drop_accepted' | 'reviewed' | 'overridden' | 'held' | 'published';

export const MARKER_WORDS: Record<CellMarker, string> = {
  needs_review: 'Needs review',
  drop_accepted: 'Drop accepted',
  reviewed: 'Reviewed',
  overridden: 'Edited by hand',
  held: 'On hold',
  published: 'Published',
};

export const MARKER_GLYPHS: Record<CellMarker, string> = {
  needs_review: '◆',
  drop_accepted: '⊖',
  reviewed: '☑',
  overridden: '✎',
  held: '‖',
  published: '✓',
};

type CellFacts = Pick<GridCellDto, 'state' | 'changes' | 'needsReview' | 'reviewed' | 'overridden' | 'held' | 'published'>;

/**
 * What one grid cell says, most pressing first: the state, then the markers that apply. The coach's
 * acceptance shows as "Drop accepted" (a needs-a-decision fit) or "Reviewed"; a hand edit already is
 * the coach's decision, so it says "Edited by hand" alone.
 */
export function cellWords(cell: CellFacts): {
  state: string;
  markers: CellMarker[];
} {
  const markers: CellMarker[] = [];
  const reviewed = cell.reviewed && !cell.needsReview;
  if (cell.held) markers.push('held');
  if (cell.needsReview) markers.push('needs_review');
  if (reviewed && !cell.overridden) markers.push(cell.state === 'needs_decision' ? 'drop_accepted' : 'reviewed');
  if (cell.overridden) markers.push('overridden');
  if (cell.published) markers.push('published');
  return { state: fitStateWords(cell.state, cell.changes, reviewed), markers };
}

/** The state's glyph: an accepted drop is a fitted version with something left out, no longer a question. */
export function stateGlyph(cell: Pick<GridCellDto, 'state' | 'reviewed' | 'needsReview'>): string {
  return cell.state === 'needs_decision' && cell.reviewed && !cell.needsReview ? FIT_STATE_GLYPHS.fitted : FIT_STATE_GLYPHS[cell.state];
}

/** The version screen's lasting line once the coach accepted the current fit (null while nothing was accepted). */
export function reviewedLine(
  v: Pick<GridCellDto, 'state' | 'reviewed' | 'needsReview' | 'overridden'>,
): { marker: CellMarker; title: string; words: string } | null {
  if (!v.reviewed || v.needsReview) return null;
  if (v.overridden)
    return {
      marker: 'reviewed',
      title: 'Reviewed',
      words: 'You kept this hand edit as it stands. A change to the team session asks you to look again.',
    };
  if (v.state === 'needs_decision')
    return {
      marker: 'drop_accepted',
      title: 'Drop accepted',
      words: 'This version goes out without what was left out. A new fit (the team session or the limits change) asks you again.',
    };
  return {
    marker: 'reviewed',
    title: 'Reviewed',
    words: 'You accepted this fit. A new fit (the team session or the limits change) asks you again.',
  };
}

/** The whole cell as one sentence, for the link's accessible name. */
export function cellSentence(athleteName: string, sessionTitle: string, cell: CellFacts): string {
  const { state, markers } = cellWords(cell);
  return [`${athleteName}, ${sessionTitle}: ${state}`, ...markers.map((m) => MARKER_WORDS[m])].join(' · ');
}

/** A cell that asks the coach to look before (or after) publishing. */
export function cellNeedsAttention(cell: Pick<GridCellDto, 'state' | 'needsReview' | 'reviewed' | 'held'>): boolean {
  return (cell.state === 'needs_decision' && !cell.reviewed) || cell.needsReview || cell.held;
}
