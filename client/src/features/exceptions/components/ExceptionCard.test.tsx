import { afterEach, beforeEach, describe, expect, it, vi } from 'vitest';
import { screen, within } from '@testing-library/react';
import type { ExceptionDto } from '../../../../../policies/dto';
import { EXCEPTION_DECISION_CAUTION } from '../../../../../policies/cautions';
import { setCsrfToken } from '../../../lib/api-client';
import { jsonResponse, renderWithProviders } from '../../../test/render';
import { ExceptionCard } from './ExceptionCard';

const ORG = '11111111-1111-4111-8111-111111111111';

const request: ExceptionDto = {
  id: '22222222-2222-4222-8222-222222222222',
  sessionId: '33333333-3333-4333-8333-333333333333',
  sessionDate: '2027-01-05',
  sessionTitle: 'Day 1',
  athleteId: '44444444-4444-4444-8444-444444444444',
  athleteName: 'Sam Whitfield',
  setIds: ['55555555-5555-4555-8555-555555555555'],
  reason: 'Testing day for the team.',
  requestedByName: 'Rosa Delgado',
  status: 'pending',
  grantedSetIds: [],
  decidedByName: null,
  decidedAt: null,
  decisionNote: null,
  createdAt: '2027-01-03T17:00:00.000Z',
};

const fetchMock = vi.fn<typeof fetch>();
beforeEach(() => {
  vi.stubGlobal('fetch', fetchMock);
  setCsrfToken('token-1');
  fetchMock.mockImplementation(async () => jsonResponse(200, []));
});
afterEach(() => {
  vi.unstubAllGlobals();
  fetchMock.mockReset();
});

describe('the exception decision', () => {
  it('carries its own caution beside Grant and Refuse, in the product brief’s words (shared/PRODUCT.md, cautions)', () => {
    renderWithProviders(
      <ExceptionCard orgId={ORG} unit="kg" request={request} useBreaches={() => ({ bySet: new Map(), isPending: false })} />,
    );
    const card = screen.getByRole('article', { name: /Sam Whitfield/ });
    const caution = within(card).getByRole('note', { name: 'Caution' });
    expect(caution).toHaveTextContent(`${EXCEPTION_DECISION_CAUTION.lead} ${EXCEPTION_DECISION_CAUTION.text}`);
    expect(caution).toHaveTextContent('does not diagnose, treat or replace professional care');
    // Beside the action: the buttons come right after it, in the same form.
    const grant = within(card).getByRole('button', { name: 'Grant' });
    expect(caution.nextElementSibling).toContainElement(grant);
    expect(caution.nextElementSibling).toContainElement(within(card).getByRole('button', { name: 'Refuse' }));
  });
});
