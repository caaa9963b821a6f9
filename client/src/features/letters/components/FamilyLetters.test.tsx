import { afterEach, beforeEach, describe, expect, it, vi } from 'vitest';
import { fireEvent, screen, waitFor, within } from '@testing-library/react';
import type { LetterDto } from '../../../../../policies/dto';
import { jsonResponse, renderWithProviders } from '../../../test/render';
import { FamilyLetters } from './FamilyLetters';

const fetchMock = vi.fn<typeof fetch>();
beforeEach(() => vi.stubGlobal('fetch', fetchMock));
afterEach(() => {
  vi.unstubAllGlobals();
  fetchMock.mockReset();
});

const letter = (over: Partial<LetterDto> = {}): LetterDto => ({
  id: 'l-2',
  athleteId: 'm-maya',
  athleteName: 'Maya Torres',
  decision: 'limited',
  effectiveFrom: '2026-03-16',
  validUntil: '2026-04-13',
  limits: ['Hinge: up to 60% of your best lift', 'Jump / landing: not allowed for now'],
  clinicianName: 'Priya Raman',
  credential: 'Physiotherapist, PT',
  licenceNumber: 'PT-448812',
  familyNote: 'Build back to full games over two weeks.',
  signature: 'Priya Raman',
  signedAt: '2026-03-12T15:00:00.000Z',
  status: 'signed',
  supersededBy: null,
  outOfDate: false,
  pdfSha256: 'ab',
  version: 2,
  createdAt: '2026-03-12T14:00:00.000Z',
  acknowledgements: [],
  ...over,
});

describe('FamilyLetters', () => {
  it('shows the signed letter with its PDF, and the acknowledge button goes once pressed', async () => {
    const acknowledged = letter({
      acknowledgements: [{ guardianId: 'm-elena', guardianName: 'Elena Torres', acknowledgedAt: '2026-03-13T09:10:00.000Z' }],
    });
    let served = [letter(), letter({ id: 'l-1', status: 'superseded', supersededBy: 'l-2', decision: 'full', limits: [] })];
    fetchMock.mockImplementation(async (_input, init) => {
      if (init?.method === 'POST') {
        served = [acknowledged, served[1]];
        return jsonResponse(200, acknowledged);
      }
      return jsonResponse(200, served);
    });
    renderWithProviders(<FamilyLetters orgId="org-1" guardianId="m-elena" athletes={[{ id: 'm-maya', name: 'Maya' }]} />);

    expect(await screen.findByRole('heading', { name: 'Letters' })).toBeInTheDocument();
    const card = await screen.findByRole('article', { name: 'Clearance letter for Maya' });
    expect(within(card).getByText('From 16 March 2026 until 13 April 2026.')).toBeInTheDocument();
    expect(within(card).getByText('Hinge: up to 60% of your best lift')).toBeInTheDocument();
    expect(within(card).getByRole('link', { name: 'Download the letter (PDF)' })).toHaveAttribute(
      'href',
      '/api/orgs/org-1/letters/l-2/pdf',
    );
    // Only the letter in force asks to be acknowledged; the earlier one is folded away.
    expect(screen.getAllByRole('button', { name: 'I have read this letter' })).toHaveLength(1);

    fireEvent.click(screen.getByRole('button', { name: 'I have read this letter' }));
    expect(await screen.findByText(/Acknowledged on 13 March 2026/)).toBeInTheDocument();
    expect(screen.queryByRole('button', { name: 'I have read this letter' })).not.toBeInTheDocument();
    const post = fetchMock.mock.calls.find(([, init]) => init?.method === 'POST');
    expect(String(post?.[0])).toBe('/api/orgs/org-1/letters/l-2/acknowledge');
    await waitFor(() => expect(screen.queryByRole('button', { name: 'I have read this letter' })).not.toBeInTheDocument());
  });

  it('counts only this guardian’s own acknowledgement', async () => {
    fetchMock.mockResolvedValue(
      jsonResponse(200, [
        letter({ acknowledgements: [{ guardianId: 'm-other', guardianName: 'Sam Torres', acknowledgedAt: '2026-03-13T09:10:00.000Z' }] }),
      ]),
    );
    renderWithProviders(<FamilyLetters orgId="org-1" guardianId="m-elena" athletes={[{ id: 'm-maya', name: 'Maya' }]} />);
    expect(await screen.findByRole('button', { name: 'I have read this letter' })).toBeInTheDocument();
    expect(screen.queryByText(/Acknowledged on/)).not.toBeInTheDocument();
  });

  it('shows a letter signed to start later beneath the one in force, saying when it takes effect', async () => {
    const next = letter({
      id: 'l-3',
      status: 'scheduled',
      decision: 'full',
      limits: [],
      effectiveFrom: '2026-12-09',
      validUntil: null,
      signedAt: '2026-12-01T10:00:00.000Z',
    });
    fetchMock.mockResolvedValue(jsonResponse(200, [next, letter()]));
    renderWithProviders(<FamilyLetters orgId="org-1" guardianId="m-elena" athletes={[{ id: 'm-maya', name: 'Maya' }]} />);

    const current = await screen.findByRole('article', { name: 'Clearance letter for Maya' });
    expect(within(current).getByRole('img', { name: /Letter status: Signed — signed, sent and in force/ })).toBeInTheDocument();
    expect(within(current).queryByText(/takes effect/)).not.toBeInTheDocument();
    const upcoming = screen.getByRole('article', { name: 'Next clearance letter for Maya' });
    expect(
      within(upcoming).getByText('Signed, takes effect on 9 December 2026. Until then, the letter above stays in force.'),
    ).toBeInTheDocument();
    expect(within(upcoming).getByRole('img', { name: /Letter status: Signed, not yet in force/ })).toBeInTheDocument();
    expect(within(upcoming).getByRole('link', { name: 'Download the letter (PDF)' })).toHaveAttribute(
      'href',
      '/api/orgs/org-1/letters/l-3/pdf',
    );
    expect(screen.queryByText(/Earlier letters/)).not.toBeInTheDocument();
  });

  it('shows a letter past its valid-until date as expired, saying a new letter is needed', async () => {
    fetchMock.mockResolvedValue(jsonResponse(200, [letter({ status: 'expired' })]));
    renderWithProviders(<FamilyLetters orgId="org-1" guardianId="m-elena" athletes={[{ id: 'm-maya', name: 'Maya' }]} />);

    const card = await screen.findByRole('article', { name: 'Clearance letter for Maya' });
    expect(within(card).getByRole('img', { name: /^Letter status: Expired — / })).toBeInTheDocument();
    expect(card.querySelector('svg[data-shape="expired"]')).not.toBeNull();
    expect(
      within(card).getByText(
        'This letter was valid until 13 April 2026 and has expired: it no longer clears Maya. The clinician needs to sign a new letter.',
      ),
    ).toBeInTheDocument();
    expect(screen.queryByRole('img', { name: /Letter status: Signed/ })).not.toBeInTheDocument();
  });

  it('says a newer decision exists when the letter in force is out of date, without what it is', async () => {
    fetchMock.mockResolvedValue(jsonResponse(200, [letter({ outOfDate: true })]));
    renderWithProviders(<FamilyLetters orgId="org-1" guardianId="m-elena" athletes={[{ id: 'm-maya', name: 'Maya' }]} />);
    const card = await screen.findByRole('article', { name: 'Clearance letter for Maya' });
    expect(within(card).getByText('A newer decision exists')).toBeInTheDocument();
    expect(within(card).getByText(/The clinician has changed what Maya may do since signing this letter/)).toBeInTheDocument();
  });

  it('says nothing of a newer decision while the letter is current', async () => {
    fetchMock.mockResolvedValue(jsonResponse(200, [letter()]));
    renderWithProviders(<FamilyLetters orgId="org-1" guardianId="m-elena" athletes={[{ id: 'm-maya', name: 'Maya' }]} />);
    await screen.findByRole('article', { name: 'Clearance letter for Maya' });
    expect(screen.queryByText('A newer decision exists')).not.toBeInTheDocument();
  });
});
