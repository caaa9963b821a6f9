import { describe, expect, it, vi } from 'vitest';
import { fireEvent, screen, within } from '@testing-library/react';
import type { GridCellDto, TeamGridDto, TeamPublishProblemDto } from '../../../../../policies/dto/teams';
import { ApiError } from '../../../lib/api-client';
import { renderWithProviders } from '../../../test/render';
import { publishProblems } from '../api/team-programs';
import { cellNeedsAttention, cellWords, reviewedLine } from './grid-words';
import { PublishProblems } from './PublishProblems';
import { ReviewGrid } from './ReviewGrid';

const cell = (over: Partial<GridCellDto>): GridCellDto => ({
  athleteId: 'a1',
  teamSessionId: 's1',
  versionId: 'v',
  state: 'as_written',
  changes: 0,
  overridden: false,
  needsReview: false,
  reviewed: false,
  published: false,
  held: false,
  ...over,
});

const grid: TeamGridDto = {
  programId: 'p1',
  programName: 'Pre-season',
  groupName: 'First team',
  sessions: [
    { id: 's1', date: '2027-01-05', title: 'Squad strength', status: 'draft', version: 1, setCount: 6 },
    { id: 's2', date: '2027-01-07', title: 'Speed', status: 'published', version: 2, setCount: 4 },
  ],
  athletes: [
    { id: 'a1', name: 'Ada Stone', statusToday: 'full' },
    { id: 'a2', name: 'Ben Hale', statusToday: 'limited' },
    { id: 'a3', name: 'Cy Moor', statusToday: 'out' },
  ],
  cells: [
    cell({ athleteId: 'a1', teamSessionId: 's1' }),
    cell({ athleteId: 'a1', teamSessionId: 's2', published: true }),
    cell({ athleteId: 'a2', teamSessionId: 's1', state: 'fitted', changes: 2 }),
    cell({
      athleteId: 'a2',
      teamSessionId: 's2',
      state: 'fitted',
      changes: 1,
      needsReview: true,
      overridden: true,
      held: true,
      published: true,
    }),
    cell({ athleteId: 'a3', teamSessionId: 's1', state: 'out' }),
    cell({ athleteId: 'a3', teamSessionId: 's2', state: 'needs_decision', versionId: null }),
  ],
};

/** The same grid with Ada's first session a drop the coach accepted, and her second a fit she reviewed. */
const reviewedGrid: TeamGridDto = {
  ...grid,
  cells: grid.cells.map((c) =>
    c.athleteId !== 'a1'
      ? c
      : c.teamSessionId === 's1'
        ? { ...c, state: 'needs_decision', changes: 4, reviewed: true }
        : { ...c, state: 'fitted', changes: 1, reviewed: true },
  ),
};

function renderGrid(onPublish = vi.fn(), onChoose = vi.fn(), shown: TeamGridDto = grid) {
  renderWithProviders(
    <ReviewGrid
      grid={shown}
      hrefFor={(s, a) => `/coach/team-programs/p1/sessions/${s}/athletes/${a}`}
      chosen={new Set(['s1'])}
      onChoose={onChoose}
      onPublish={onPublish}
      publishing={false}
      canPublish
    />,
  );
  return { onPublish, onChoose };
}

describe('cellWords', () => {
  it('says each state in our words, with the number of changes when fitted', () => {
    expect(cellWords(cell({})).state).toBe('As written');
    expect(cellWords(cell({ state: 'fitted', changes: 1 })).state).toBe('Fitted (1 change)');
    expect(cellWords(cell({ state: 'fitted', changes: 3 })).state).toBe('Fitted (3 changes)');
    expect(cellWords(cell({ state: 'needs_decision' })).state).toBe('Needs a decision');
    expect(cellWords(cell({ state: 'out' })).state).toBe('Out');
  });

  it('lists the markers most pressing first', () => {
    expect(cellWords(cell({ needsReview: true, overridden: true, held: true, published: true })).markers).toEqual([
      'held',
      'needs_review',
      'overridden',
      'published',
    ]);
  });
});

describe('a version the coach accepted', () => {
  it('an accepted drop no longer reads "Needs a decision": it says what is left and "Drop accepted"', () => {
    const dropped = cell({ state: 'needs_decision', changes: 4, reviewed: true });
    expect(cellWords(dropped)).toEqual({ state: 'Fitted, part left out', markers: ['drop_accepted'] });
    expect(cellNeedsAttention(dropped)).toBe(false);
    expect(cellNeedsAttention(cell({ state: 'needs_decision' }))).toBe(true);
    expect(cellWords(cell({ state: 'fitted', changes: 2, reviewed: true, published: true })).markers).toEqual(['reviewed', 'published']);
  });

  it('a hand edit says "Edited by hand" alone, and a version that needs review again is not reviewed', () => {
    expect(cellWords(cell({ overridden: true, reviewed: true })).markers).toEqual(['overridden']);
    const again = cell({ state: 'needs_decision', reviewed: true, needsReview: true });
    expect(cellWords(again)).toEqual({ state: 'Needs a decision', markers: ['needs_review'] });
    expect(reviewedLine(again)).toBeNull();
  });

  it('the version screen’s lasting line says which decision was made', () => {
    expect(reviewedLine({ state: 'needs_decision', reviewed: true, needsReview: false, overridden: false })?.title).toBe('Drop accepted');
    expect(reviewedLine({ state: 'fitted', reviewed: true, needsReview: false, overridden: false })?.title).toBe('Reviewed');
    expect(reviewedLine({ state: 'fitted', reviewed: false, needsReview: false, overridden: false })).toBeNull();
  });

  it('the grid shows the marker in words beside its glyph, in the cell’s name, and without the attention border', () => {
    renderGrid(vi.fn(), vi.fn(), reviewedGrid);
    const dropped = screen.getByRole('link', { name: 'Ada Stone, Squad strength: Fitted, part left out · Drop accepted' });
    expect(dropped.textContent).toBe('◐Fitted, part left out⊖Drop accepted');
    expect(dropped.className).not.toContain('border-2');
    const reviewed = screen.getByRole('link', { name: 'Ada Stone, Speed: Fitted (1 change) · Reviewed · Published' });
    expect(within(reviewed).getByText('Reviewed')).toBeInTheDocument();
    expect(reviewed.textContent).toContain('☑Reviewed');
  });
});

describe('ReviewGrid', () => {
  it('shows each cell as words, links it to the athlete’s version, and names it in full for a screen reader', () => {
    renderGrid();
    const ben = screen.getByRole('link', {
      name: 'Ben Hale, Speed: Fitted (1 change) · On hold · Needs review · Edited by hand · Published',
    });
    expect(ben).toHaveAttribute('href', '/coach/team-programs/p1/sessions/s2/athletes/a2');
    // Visible text, not colour: each word is on the page beside its glyph.
    for (const words of ['On hold', 'Needs review', 'Edited by hand']) expect(within(ben).getByText(words)).toBeInTheDocument();
    expect(screen.getByRole('link', { name: 'Ada Stone, Squad strength: As written' })).toBeInTheDocument();
    expect(screen.getByRole('link', { name: 'Ben Hale, Squad strength: Fitted (2 changes)' })).toBeInTheDocument();
    expect(screen.getByRole('link', { name: 'Cy Moor, Squad strength: Out' })).toBeInTheDocument();
    // A cell without a version yet is said, not linked.
    expect(screen.getByText('Not fitted yet')).toBeInTheDocument();
  });

  it('a session with no sets yet says so instead of "As written" in every cell', () => {
    renderGrid(vi.fn(), vi.fn(), { ...grid, sessions: [{ ...grid.sessions[0], setCount: 0 }, grid.sessions[1]] });
    expect(screen.getByText('No sets yet: open the session to write them')).toBeInTheDocument();
    expect(screen.getAllByText('Nothing written yet')).toHaveLength(3);
    expect(screen.queryByRole('link', { name: /Squad strength: As written/ })).not.toBeInTheDocument();
  });

  it('each cell carries a glyph as well as its words, so it reads without colour', () => {
    renderGrid();
    const out = screen.getByRole('link', { name: 'Cy Moor, Squad strength: Out' });
    expect(out.textContent).toBe('○Out');
    const fitted = screen.getByRole('link', { name: 'Ben Hale, Squad strength: Fitted (2 changes)' });
    expect(fitted.textContent).toBe('◐Fitted (2 changes)');
  });

  it('shows each athlete’s participation status today with its shape', () => {
    renderGrid();
    expect(screen.getByRole('rowheader', { name: /Ben Hale/ })).toHaveTextContent('Limited');
  });

  it('publishes one session to the group, and chooses sessions for one publish', () => {
    const { onPublish, onChoose } = renderGrid();
    fireEvent.click(screen.getByRole('button', { name: 'Publish Squad strength to the group' }));
    expect(onPublish).toHaveBeenCalledWith(['s1']);
    expect(screen.getByRole('checkbox', { name: 'Choose Squad strength' })).toBeChecked();
    fireEvent.click(screen.getByRole('checkbox', { name: 'Choose Speed' }));
    expect(onChoose).toHaveBeenCalledWith('s2', true);
  });
});

describe('a refused group publish (422)', () => {
  const problems: TeamPublishProblemDto[] = [
    {
      athleteId: 'a2',
      athleteName: 'Ben Hale',
      teamSessionId: 's1',
      date: '2027-01-05',
      title: 'Squad strength',
      problems: ['Hinge: max 60 % of 1RM: planned 75 %.', 'Something could not be made to fit and was dropped: Sprint blocked.'],
    },
    { athleteId: 'a3', athleteName: 'Cy Moor', teamSessionId: 's2', date: '2027-01-07', title: 'Speed', problems: ['Nothing is left.'] },
  ];

  it('reads the problems from the error body and lists every athlete, session and problem', () => {
    const error = new ApiError({
      status: 422,
      code: 'unprocessable',
      message: 'Nothing was published: 2 athlete versions need attention first.',
      details: { problems },
    });
    const read = publishProblems(error);
    expect(read).toEqual(problems);
    renderWithProviders(<PublishProblems message={error.message} problems={read!} hrefFor={(s, a) => `/v/${s}/${a}`} />);
    const list = screen.getByRole('list', { name: 'Problems to resolve before publishing' });
    const items = within(list)
      .getAllByRole('listitem')
      .filter((li) => li.parentElement === list);
    expect(items).toHaveLength(2);
    expect(items[0]).toHaveTextContent('Ben Hale — Squad strength, Tue 5 Jan 2027');
    expect(items[0]).toHaveTextContent('Hinge: max 60 % of 1RM: planned 75 %.');
    expect(items[0]).toHaveTextContent('Sprint blocked');
    expect(items[1]).toHaveTextContent('Cy Moor — Speed, Thu 7 Jan 2027');
    expect(within(items[1]).getByRole('link', { name: 'Cy Moor' })).toHaveAttribute('href', '/v/s2/a3');
    expect(screen.getByRole('alert')).toHaveTextContent('Nothing was published');
  });

  it('is not read from other errors', () => {
    expect(publishProblems(new ApiError({ status: 409, code: 'version_conflict', message: 'x' }))).toBeNull();
    expect(publishProblems(new ApiError({ status: 422, code: 'unprocessable', message: 'empty' }))).toBeNull();
    expect(publishProblems(new Error('x'))).toBeNull();
  });
});
