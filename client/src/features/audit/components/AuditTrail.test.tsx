import { afterEach, beforeEach, describe, expect, it, vi } from 'vitest';
import { fireEvent, screen, waitFor } from '@testing-library/react';
import { jsonResponse, renderWithProviders } from '../../../test/render';
import { AuditTrail } from './AuditTrail';

const ORG = '11111111-1111-4111-8111-111111111111';
const MAYA = '55555555-5555-4555-8555-555555555555';

const fetchMock = vi.fn<typeof fetch>();
beforeEach(() => vi.stubGlobal('fetch', fetchMock));
afterEach(() => {
  vi.unstubAllGlobals();
  fetchMock.mockReset();
});

function serve(chain: unknown) {
  fetchMock.mockImplementation(async (input) => {
    const url = String(input);
    if (url.startsWith(`/api/orgs/${ORG}/audit/verify`)) return jsonResponse(200, chain);
    return jsonResponse(200, {
      entries: [
        {
          id: '41',
          occurredAt: '2026-03-02T09:00:00.000Z',
          actorUserId: 'u1',
          actorName: 'Priya Raman',
          action: 'plan.created',
          subjectType: 'RestrictionPlan',
          subjectId: '33333333-3333-4333-8333-333333333333',
          athleteId: MAYA,
          athleteName: 'Maya Torres',
          before: null,
          after: { version: 1 },
          requestId: 'r1',
        },
      ],
      nextBefore: null,
    });
  });
}

describe('AuditTrail', () => {
  it('filters by athlete, and the CSV link carries the same filters', async () => {
    serve({ intact: true, entries: 41, firstBrokenId: null, reason: null });
    renderWithProviders(<AuditTrail orgId={ORG} athletes={[{ id: MAYA, name: 'Maya Torres' }]} />);
    expect(await screen.findByRole('cell', { name: 'Maya Torres' })).toBeInTheDocument();
    // A sentence with the actor and the athlete, not the code (the code stays in the details).
    expect(screen.getByRole('cell', { name: "Priya Raman wrote Maya Torres's restriction plan (version 1)." })).toBeInTheDocument();
    expect(screen.queryByRole('cell', { name: 'plan.created' })).not.toBeInTheDocument();
    expect(screen.getByRole('link', { name: 'Download the trail as CSV' })).toHaveAttribute('href', `/api/orgs/${ORG}/audit/export`);
    // Only admins verify the trail.
    expect(screen.queryByRole('button', { name: 'Verify the audit trail' })).not.toBeInTheDocument();

    fireEvent.change(screen.getByLabelText('Athlete'), { target: { value: MAYA } });
    fireEvent.click(screen.getByRole('button', { name: 'Apply filters' }));
    const link = await screen.findByRole('link', { name: 'Download these entries as CSV' });
    expect(link).toHaveAttribute('href', `/api/orgs/${ORG}/audit/export?athleteId=${MAYA}`);
    expect(link).toHaveAttribute('download');
    await waitFor(() => expect(fetchMock.mock.calls.some(([url]) => String(url).includes(`athleteId=${MAYA}`))).toBe(true));
  });

  it('says where the chain breaks', async () => {
    serve({ intact: false, entries: 7, firstBrokenId: '7', reason: 'contents do not match the stored hash' });
    renderWithProviders(<AuditTrail orgId={ORG} canVerify />);
    fireEvent.click(await screen.findByRole('button', { name: 'Verify the audit trail' }));
    expect(await screen.findByText('The audit trail is broken at entry #7: contents do not match the stored hash')).toBeInTheDocument();
  });

  it('says how many entries an intact chain has', async () => {
    serve({ intact: true, entries: 41, firstBrokenId: null, reason: null });
    renderWithProviders(<AuditTrail orgId={ORG} canVerify />);
    fireEvent.click(await screen.findByRole('button', { name: 'Verify the audit trail' }));
    expect(await screen.findByText('The audit trail is intact: 41 entries verified, none changed or missing.')).toBeInTheDocument();
  });
});
