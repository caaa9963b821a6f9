import { afterEach, beforeEach, describe, expect, it, vi } from 'vitest';
import { fireEvent, screen, within } from '@testing-library/react';
import type { RosterImportDto } from '../../../../../policies/dto';
import { jsonResponse, renderWithProviders } from '../../../test/render';
import { RosterImportFlow } from './RosterImportFlow';
import { RosterImportProgress } from './RosterImportProgress';
import { importDto } from './roster-fixtures';

/** Bringing a roster: a large file imports in the background, with progress, and ends with its counts. */

const ORG = '11111111-1111-4111-8111-111111111111';
const show = (state: RosterImportDto, onResume = () => {}) =>
  renderWithProviders(<RosterImportProgress state={state} onResume={onResume} resuming={false} resumeError={null} />);

describe('a started roster import', () => {
  it('waits for the queue, then shows the rows done as a bar with the count in words', () => {
    const { rerender } = show(importDto({ status: 'queued', totalRows: 2000 }));
    expect(screen.getByRole('status')).toHaveTextContent('Waiting for the import to start…');
    rerender(
      <RosterImportProgress
        state={importDto({ status: 'running', totalRows: 2000, processed: 125 })}
        onResume={() => {}}
        resuming={false}
        resumeError={null}
      />,
    );
    const bar = screen.getByRole('progressbar', { name: 'Rows imported' });
    expect(bar).toHaveAttribute('aria-valuenow', '125');
    expect(bar).toHaveAttribute('aria-valuemax', '2000');
    expect(screen.getByText('6%')).toBeInTheDocument();
    expect(screen.getByRole('status')).toHaveTextContent('125 of 2,000 rows imported');
  });

  it('when done, sums up what was created, left unchanged and left out, and the invitations queued', () => {
    show(importDto({ status: 'done', totalRows: 6, processed: 6, created: 4, updated: 1, unchanged: 0, skipped: 1, invitations: 5 }));
    expect(screen.getByRole('status')).toHaveTextContent('The import of roster.csv is done');
    const summary = within(screen.getByTestId('roster-summary'));
    const value = (label: string) => summary.getByText(label).nextSibling;
    expect(value('Rows in the file')).toHaveTextContent('6');
    expect(value('Athletes added')).toHaveTextContent('4');
    expect(value('Already here, completed')).toHaveTextContent('1');
    expect(value('Already here, unchanged')).toHaveTextContent('0');
    expect(value('Left out (problems)')).toHaveTextContent('1');
    expect(value('Invitations queued')).toHaveTextContent('5');
    expect(screen.getByRole('link', { name: 'See the people' })).toHaveAttribute('href', '/admin/people');
  });

  it('a stopped import gives its reason and starts again from where it stopped', () => {
    const onResume = vi.fn();
    show(importDto({ status: 'failed', totalRows: 2000, processed: 900, error: 'You are no longer an admin here.' }), onResume);
    const alert = screen.getByRole('alert');
    expect(alert).toHaveTextContent('The import of roster.csv stopped');
    expect(alert).toHaveTextContent('You are no longer an admin here.');
    expect(alert).toHaveTextContent('900 of 2,000 rows were done and stay done.');
    fireEvent.click(screen.getByRole('button', { name: 'Start again' }));
    expect(onResume).toHaveBeenCalledTimes(1);
  });
});

describe('following an import on the page', () => {
  const fetchMock = vi.fn<typeof fetch>();
  beforeEach(() => vi.stubGlobal('fetch', fetchMock));
  afterEach(() => {
    vi.unstubAllGlobals();
    fetchMock.mockReset();
  });

  it('polls the server while the import runs and shows the summary when it is done', async () => {
    const id = importDto().id;
    const answers = [
      importDto({ status: 'running', processed: 2 }),
      importDto({ status: 'done', processed: 5, created: 5, invitations: 5, finishedAt: '2026-12-05T08:01:00.000Z' }),
    ];
    fetchMock.mockImplementation(async () => jsonResponse(200, answers.length > 1 ? answers.shift() : answers[0]));
    renderWithProviders(<RosterImportFlow orgId={ORG} />, { route: `/admin/roster-import?import=${id}` });
    expect(await screen.findByText('2 of 5 rows imported')).toBeInTheDocument();
    expect(await screen.findByText('The import of roster.csv is done')).toBeInTheDocument();
    expect(fetchMock).toHaveBeenCalledWith(`/api/orgs/${ORG}/roster-imports/${id}`, expect.objectContaining({ method: 'GET' }));

    fireEvent.click(screen.getByRole('button', { name: 'Check another file' }));
    expect(screen.getByRole('form', { name: 'Check a roster file' })).toBeInTheDocument();
  });
});
