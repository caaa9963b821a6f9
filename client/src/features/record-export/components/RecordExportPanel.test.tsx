import { afterEach, beforeEach, describe, expect, it, vi } from 'vitest';
import { fireEvent, screen, waitFor } from '@testing-library/react';
import type { RecordExportDto, RecordExportsDto } from '../../../../../policies/dto';
import { jsonResponse, renderWithProviders } from '../../../test/render';
import { RecordExportPanel } from './RecordExportPanel';

const ORG = '11111111-1111-4111-8111-111111111111';
const NORA = '22222222-2222-4222-8222-222222222222';
const ELI = '33333333-3333-4333-8333-333333333333';

const request = (over: Partial<RecordExportDto>): RecordExportDto => ({
  id: '44444444-4444-4444-8444-444444444444',
  athleteId: NORA,
  athleteName: 'Nora Ellis',
  state: 'ready',
  requestedAt: '2026-12-03T10:00:00.000Z',
  readyAt: '2026-12-03T10:01:00.000Z',
  expiresAt: '2026-12-10T10:01:00.000Z',
  downloadedAt: null,
  sizeBytes: 2_400_000,
  problem: null,
  ...over,
});

const fetchMock = vi.fn<typeof fetch>();
beforeEach(() => vi.stubGlobal('fetch', fetchMock));
afterEach(() => {
  vi.unstubAllGlobals();
  fetchMock.mockReset();
});

describe('"Your records" on the account page', () => {
  it('a guardian gets one button per minor, each with its latest copy’s state in words', async () => {
    const list: RecordExportsDto = {
      people: [
        { athleteId: NORA, athleteName: 'Nora Ellis', self: false },
        { athleteId: ELI, athleteName: 'Eli Ellis', self: false },
      ],
      requests: [request({ athleteId: NORA })],
    };
    fetchMock.mockImplementation(async () => jsonResponse(200, list));
    renderWithProviders(<RecordExportPanel orgId={ORG} />);
    expect(await screen.findByRole('button', { name: "Download Nora Ellis's record" })).toBeEnabled();
    expect(screen.getByRole('button', { name: "Download Eli Ellis's record" })).toBeEnabled();
    expect(screen.getByTestId(`record-state-${NORA}`)).toHaveTextContent(
      /^Ready · The link is in your e-mail\. It works until .+ \(2\.4 MB\)\.$/,
    );
    expect(screen.queryByTestId(`record-state-${ELI}`)).toBeNull();
  });

  it('asking shows the new copy as preparing at once and blocks a second ask; a refusal reads as a sentence', async () => {
    const list: RecordExportsDto = { people: [{ athleteId: NORA, athleteName: 'Nora Ellis', self: true }], requests: [] };
    const created = request({ state: 'preparing', readyAt: null, expiresAt: null, sizeBytes: null });
    // As the server would: once asked, the list holds the new request.
    fetchMock.mockImplementation(async (_url, init) => {
      if (init?.method !== 'POST') return jsonResponse(200, list);
      list.requests = [created];
      return jsonResponse(202, created);
    });
    renderWithProviders(<RecordExportPanel orgId={ORG} />);
    fireEvent.click(await screen.findByRole('button', { name: 'Download my record' }));
    expect(await screen.findByText(/Look for an e-mail from Loadline/)).toBeInTheDocument();
    expect(fetchMock).toHaveBeenCalledWith(
      `/api/orgs/${ORG}/record-exports`,
      expect.objectContaining({ method: 'POST', body: JSON.stringify({ athleteId: NORA }) }),
    );

    // Still preparing: a second ask is blocked until it is ready.
    expect(screen.getByTestId(`record-state-${NORA}`)).toHaveTextContent(
      /^Preparing · Asked for .+\. We will e-mail you a link when it is ready\.$/,
    );
    expect(screen.getByRole('button', { name: 'Download my record' })).toBeDisabled();
  });

  it('a refusal (a fourth copy in a day) reads as the server’s sentence', async () => {
    const list: RecordExportsDto = { people: [{ athleteId: NORA, athleteName: 'Nora Ellis', self: true }], requests: [] };
    const refusal = { error: { code: 'rate_limited', message: 'You have asked for 3 copies in the last day.' }, requestId: 'r1' };
    fetchMock.mockImplementation(async (_url, init) => (init?.method === 'POST' ? jsonResponse(429, refusal) : jsonResponse(200, list)));
    renderWithProviders(<RecordExportPanel orgId={ORG} />);
    fireEvent.click(await screen.findByRole('button', { name: 'Download my record' }));
    expect(await screen.findByRole('alert')).toHaveTextContent('You have asked for 3 copies in the last day.');
  });

  it('shows nothing to someone who may ask for nobody’s record', async () => {
    fetchMock.mockImplementation(async () => jsonResponse(200, { people: [], requests: [] }));
    const { container } = renderWithProviders(<RecordExportPanel orgId={ORG} />);
    await waitFor(() => expect(fetchMock).toHaveBeenCalled());
    expect(container).toBeEmptyDOMElement();
  });
});
