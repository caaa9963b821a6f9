import { afterEach, beforeEach, describe, expect, it, vi } from 'vitest';
import { fireEvent, screen, waitFor } from '@testing-library/react';
import type { RosterPreviewDto } from '../../../../../policies/dto';
import { jsonResponse, renderWithProviders } from '../../../test/render';
import { RosterImportFlow } from './RosterImportFlow';
import { importDto } from './roster-fixtures';

/** A file checked but not yet imported survives a reload: the server keeps it, the page shows it again. */

const ORG = '11111111-1111-4111-8111-111111111111';
const waiting: RosterPreviewDto = {
  import: importDto({ totalRows: 2 }),
  counts: { rows: 2, create: 2, update: 0, unchanged: 0, skip: 0 },
  rows: [2, 3].map((line) => ({
    line,
    name: `Person ${line}`,
    email: `p${line}@x.test`,
    outcome: 'create' as const,
    problems: [],
    does: ['adds the athlete and sends an invitation'],
  })),
};

describe('the roster page after a reload', () => {
  const fetchMock = vi.fn<typeof fetch>();
  beforeEach(() => vi.stubGlobal('fetch', fetchMock));
  afterEach(() => {
    vi.unstubAllGlobals();
    fetchMock.mockReset();
  });

  it('shows the file checked last, says it is not imported yet, and its import button starts it', async () => {
    const id = waiting.import.id;
    fetchMock.mockImplementation(async (url, init) => {
      if (String(url).endsWith('/roster-imports/last-check')) return jsonResponse(200, { preview: waiting });
      if (init?.method === 'POST') return jsonResponse(202, importDto({ status: 'queued', totalRows: 2 }));
      return jsonResponse(200, importDto({ status: 'done', totalRows: 2, processed: 2, created: 2, invitations: 2 }));
    });
    renderWithProviders(<RosterImportFlow orgId={ORG} />, { route: '/admin/roster-import' });
    expect(await screen.findByRole('heading', { name: 'What importing roster.csv would do' })).toBeInTheDocument();
    expect(screen.getByRole('status')).toHaveTextContent(/^Checked on 5 Dec 2026, \d\d:\d\d and not imported yet\./);
    expect(screen.getByRole('form', { name: 'Check a roster file' })).toBeInTheDocument();

    fireEvent.click(screen.getByRole('button', { name: 'Import 2 rows' }));
    await waitFor(() =>
      expect(fetchMock).toHaveBeenCalledWith(`/api/orgs/${ORG}/roster-imports/${id}/start`, expect.objectContaining({ method: 'POST' })),
    );
    expect(await screen.findByText('The import of roster.csv is done')).toBeInTheDocument();
  });

  it('with no file waiting, shows only the form', async () => {
    fetchMock.mockImplementation(async () => jsonResponse(200, { preview: null }));
    renderWithProviders(<RosterImportFlow orgId={ORG} />, { route: '/admin/roster-import' });
    await waitFor(() =>
      expect(fetchMock).toHaveBeenCalledWith(`/api/orgs/${ORG}/roster-imports/last-check`, expect.objectContaining({ method: 'GET' })),
    );
    expect(screen.getByRole('form', { name: 'Check a roster file' })).toBeInTheDocument();
    expect(screen.queryByTestId('roster-preview')).not.toBeInTheDocument();
  });
});
