import { afterEach, beforeEach, describe, expect, it, vi } from 'vitest';
import { fireEvent, screen, waitFor } from '@testing-library/react';
import { Route, Routes } from 'react-router-dom';
import { jsonResponse, renderWithProviders } from '../../test/render';
import { CheckPage } from './check';

const fetchMock = vi.fn<typeof fetch>();
beforeEach(() => vi.stubGlobal('fetch', fetchMock));
afterEach(() => {
  vi.unstubAllGlobals();
  fetchMock.mockReset();
});

const CODE = '7K3M-Q9TX-2HBD-VR4P-N8CW';

function renderCheck(route: string) {
  return renderWithProviders(
    <Routes>
      <Route path="/check" element={<CheckPage />} />
      <Route path="/check/:code" element={<CheckPage />} />
    </Routes>,
    { route },
  );
}

describe('public letter check', () => {
  it('checks a code from the address at once and shows only the allowed fields, whatever else the answer carries', async () => {
    fetchMock.mockResolvedValue(
      jsonResponse(200, {
        status: 'valid',
        athleteInitials: 'M. T.',
        decision: 'Limited participation from 16 March 2026',
        effectiveFrom: '2026-03-16',
        validUntil: '2026-04-13',
        organizationName: 'Harbor Point Performance',
        issuedOn: '2026-03-12',
        // None of these may ever reach the page.
        athleteName: 'Maya Torres',
        diagnosis: 'Lumbar strain',
        limits: ['Hinge: up to 60% of your best lift'],
        familyNote: 'No sliding yet.',
        clinicianName: 'Priya Raman',
        licenceNumber: 'PT-448812',
        signature: 'Priya Raman',
      }),
    );
    renderCheck(`/check/${CODE}`);

    expect(await screen.findByRole('heading', { name: 'Valid' })).toBeInTheDocument();
    const [url, init] = fetchMock.mock.calls[0];
    expect(url).toBe('/api/check');
    expect(JSON.parse(init?.body as string)).toEqual({ code: CODE });

    expect(screen.getByText('M. T.')).toBeInTheDocument();
    expect(screen.getByText('Limited participation from 16 March 2026')).toBeInTheDocument();
    expect(screen.getByText('16 March 2026')).toBeInTheDocument();
    expect(screen.getByText('13 April 2026')).toBeInTheDocument();
    expect(screen.getByText('12 March 2026')).toBeInTheDocument();
    expect(screen.getByText('Harbor Point Performance')).toBeInTheDocument();

    const page = document.body.textContent ?? '';
    for (const secret of ['Maya', 'Torres', 'Lumbar', 'Hinge', 'sliding', 'Priya', 'Raman', 'PT-448812']) {
      expect(page).not.toContain(secret);
    }
  });

  it('says Superseded and Not found in big plain words, each with its own shape', async () => {
    fetchMock.mockResolvedValueOnce(
      jsonResponse(200, {
        status: 'superseded',
        athleteInitials: 'M. T.',
        decision: 'Full participation from 1 April 2026',
        effectiveFrom: '2026-04-01',
        validUntil: null,
        organizationName: 'Harbor Point Performance',
        issuedOn: '2026-03-30',
      }),
    );
    const { container } = renderCheck(`/check/${CODE}`);
    expect(await screen.findByRole('heading', { name: 'Superseded' })).toBeInTheDocument();
    expect(container.querySelector('svg[data-shape="superseded"]')).not.toBeNull();
    expect(screen.getByText('no end date')).toBeInTheDocument();

    fetchMock.mockResolvedValueOnce(jsonResponse(200, { status: 'unknown', athleteInitials: 'X. Y.' }));
    fireEvent.change(screen.getByLabelText('Verification code'), { target: { value: 'AAAA-BBBB-CCCC-DDDD-EEEE' } });
    fireEvent.click(screen.getByRole('button', { name: 'Check' }));
    expect(await screen.findByRole('heading', { name: 'Not found' })).toBeInTheDocument();
    expect(container.querySelector('svg[data-shape="unknown"]')).not.toBeNull();
    expect(screen.queryByText('X. Y.')).not.toBeInTheDocument();
  });

  it('says a signed letter whose start date is ahead is not yet in force, and when it takes effect', async () => {
    fetchMock.mockResolvedValue(
      jsonResponse(200, {
        status: 'scheduled',
        athleteInitials: 'M. T.',
        decision: 'Full participation from 9 December 2026',
        effectiveFrom: '2026-12-09',
        validUntil: null,
        organizationName: 'Harbor Point Performance',
        issuedOn: '2026-12-01',
      }),
    );
    const { container } = renderCheck(`/check/${CODE}`);
    expect(await screen.findByRole('heading', { name: 'Not yet in force' })).toBeInTheDocument();
    expect(screen.getByText(/^Signed, takes effect on 9 December 2026\./)).toBeInTheDocument();
    expect(container.querySelector('svg[data-shape="scheduled"]')).not.toBeNull();
    expect(screen.queryByRole('heading', { name: 'Valid' })).not.toBeInTheDocument();
  });

  it('says a letter past its valid-until date has expired, with its own shape, and what to do', async () => {
    fetchMock.mockResolvedValue(
      jsonResponse(200, {
        status: 'expired',
        athleteInitials: 'M. T.',
        decision: 'Full participation from 1 April 2026',
        effectiveFrom: '2026-04-01',
        validUntil: '2026-06-30',
        organizationName: 'Harbor Point Performance',
        issuedOn: '2026-03-30',
      }),
    );
    const { container } = renderCheck(`/check/${CODE}`);
    expect(await screen.findByRole('heading', { name: 'Expired' })).toBeInTheDocument();
    expect(
      screen.getByText('This letter was valid until 30 June 2026. Ask the athlete’s clinician for a current letter.'),
    ).toBeInTheDocument();
    expect(container.querySelector('svg[data-shape="expired"]')).not.toBeNull();
    expect(screen.queryByRole('heading', { name: 'Valid' })).not.toBeInTheDocument();
  });

  it('says a newer decision exists for a valid letter the clinician has since changed, and nothing of what it is', async () => {
    fetchMock.mockResolvedValue(
      jsonResponse(200, {
        status: 'valid',
        athleteInitials: 'M. T.',
        decision: 'Limited participation from 1 April 2026',
        effectiveFrom: '2026-04-01',
        validUntil: null,
        organizationName: 'Harbor Point Performance',
        issuedOn: '2026-03-30',
        newerDecision: true,
      }),
    );
    renderCheck(`/check/${CODE}`);
    expect(await screen.findByRole('heading', { name: 'Valid' })).toBeInTheDocument();
    expect(
      screen.getByText(
        'A newer decision exists: the clinician has changed this decision since the letter was signed. Ask Harbor Point Performance for the updated letter.',
      ),
    ).toBeInTheDocument();
  });

  it('explains a code that cannot be right without sending it', async () => {
    renderCheck('/check');
    expect(screen.getByRole('heading', { name: 'Check a clearance letter' })).toBeInTheDocument();
    fireEvent.change(screen.getByLabelText('Verification code'), { target: { value: 'ABC' } });
    fireEvent.click(screen.getByRole('button', { name: 'Check' }));
    expect(await screen.findByText('Verification code is too short')).toBeInTheDocument();
    expect(fetchMock).not.toHaveBeenCalled();
    await waitFor(() => expect(screen.queryByRole('heading', { name: 'Valid' })).not.toBeInTheDocument());
  });
});
