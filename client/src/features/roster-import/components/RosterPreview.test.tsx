import { describe, expect, it, vi } from 'vitest';
import { fireEvent, screen, within } from '@testing-library/react';
import type { RosterPreviewDto, RosterPreviewRowDto } from '../../../../../policies/dto';
import { ApiError } from '../../../lib/api-client';
import { renderWithProviders } from '../../../test/render';
import { RosterPreview } from './RosterPreview';
import { importDto } from './roster-fixtures';

/** Bringing a roster: the preview shows each row's problems before anything is written. */

const row = (line: number, over: Partial<RosterPreviewRowDto>): RosterPreviewRowDto => ({
  line,
  name: `Person ${line}`,
  email: `p${line}@x.test`,
  outcome: 'create',
  problems: [],
  does: ['adds the athlete and sends an invitation'],
  ...over,
});

const preview = (rows: RosterPreviewRowDto[]): RosterPreviewDto => {
  const count = (o: string) => rows.filter((r) => r.outcome === o).length;
  return {
    import: importDto({ totalRows: rows.length }),
    counts: { rows: rows.length, create: count('create'), update: count('update'), unchanged: count('unchanged'), skip: count('skip') },
    rows,
  };
};

const MIXED = preview([
  row(2, { does: ['adds the athlete and sends an invitation', 'adds guardian Pat Parent and sends an invitation'] }),
  row(3, { outcome: 'skip', email: 'not-an-address', problems: [{ field: 'email', message: 'must be a valid e-mail address' }], does: [] }),
  row(4, {
    outcome: 'skip',
    problems: [{ field: 'guardian1_email', message: 'is required: the athlete is under 18 on 2026-12-05' }],
    does: [],
  }),
  row(5, {
    outcome: 'skip',
    problems: [{ field: 'coach_emails', message: 'nobody@x.test is not a coach in this organization' }],
    does: [],
  }),
  row(6, { outcome: 'unchanged', does: [] }),
  row(7, { outcome: 'update', does: ['puts coach@x.test on the care team as coach'] }),
]);

const counts = () => within(screen.getByTestId('roster-counts'));

describe('the roster preview', () => {
  it('counts new, already here and problem rows, and names each problem’s column in a sentence', () => {
    renderWithProviders(<RosterPreview preview={MIXED} onImport={() => {}} importing={false} error={null} />);
    expect(counts().getByText('New athletes').nextSibling).toHaveTextContent('1');
    expect(counts().getByText('Already here, with something to add').nextSibling).toHaveTextContent('1');
    expect(counts().getByText('Already here, unchanged').nextSibling).toHaveTextContent('1');
    expect(counts().getByText('With problems').nextSibling).toHaveTextContent('3');
    expect(screen.getByText('3 rows have problems and will be left out')).toBeInTheDocument();

    // Rows with problems are shown first, each problem as a sentence that starts with its column.
    expect(screen.queryByTestId('roster-row-2')).toBeNull();
    expect(screen.getByTestId('roster-row-3')).toHaveTextContent('E-mail must be a valid e-mail address.');
    expect(screen.getByTestId('roster-row-3')).toHaveTextContent('Left out: has problems');
    expect(screen.getByTestId('roster-row-4')).toHaveTextContent('Guardian 1 e-mail is required: the athlete is under 18 on 2026-12-05.');
    expect(screen.getByTestId('roster-row-5')).toHaveTextContent('Coach e-mails: nobody@x.test is not a coach in this organization.');
  });

  it('shows every row with what importing it does, and imports the rows without problems', () => {
    const onImport = vi.fn();
    renderWithProviders(<RosterPreview preview={MIXED} onImport={onImport} importing={false} error={null} />);
    fireEvent.click(screen.getByRole('radio', { name: 'All rows (6)' }));
    expect(screen.getByTestId('roster-row-2')).toHaveTextContent('New');
    expect(screen.getByTestId('roster-row-2')).toHaveTextContent('Adds guardian Pat Parent and sends an invitation.');
    expect(screen.getByTestId('roster-row-6')).toHaveTextContent('Already here, nothing to changeNothing to change.');
    expect(screen.getByTestId('roster-row-7')).toHaveTextContent('Puts coach@x.test on the care team as coach.');
    const button = screen.getByRole('button', { name: 'Import 3 rows' });
    expect(button).toBeEnabled();
    fireEvent.click(button);
    expect(onImport).toHaveBeenCalledTimes(1);
  });

  it('a file whose every row has a problem cannot be imported, and says why', () => {
    const bad = preview([row(2, { outcome: 'skip', problems: [{ field: 'name', message: 'is required' }], does: [] })]);
    renderWithProviders(<RosterPreview preview={bad} onImport={() => {}} importing={false} error={null} />);
    expect(screen.getByRole('button', { name: 'Import 0 rows' })).toBeDisabled();
    expect(screen.getByText('Every row has a problem: fix the file and upload it again.')).toBeInTheDocument();
    expect(screen.getByTestId('roster-row-2')).toHaveTextContent('Name is required.');
  });

  it('a clean file shows all rows at once; a refused start reads as the server’s sentence', () => {
    const clean = preview([row(2, {}), row(3, { outcome: 'unchanged', does: [] })]);
    const refusal = new ApiError({ status: 409, code: 'conflict', message: 'This file has already been imported.' });
    renderWithProviders(<RosterPreview preview={clean} onImport={() => {}} importing={false} error={refusal} />);
    expect(screen.getByRole('radio', { name: 'All rows (2)' })).toBeChecked();
    expect(screen.getByTestId('roster-row-2')).toBeInTheDocument();
    expect(screen.getByRole('button', { name: 'Import 2 rows' })).toBeEnabled();
    expect(screen.getByRole('alert')).toHaveTextContent('This file has already been imported.');
  });
});
