import { afterEach, beforeEach, describe, expect, it, vi } from 'vitest';
import { fireEvent, screen, waitFor } from '@testing-library/react';
import { jsonResponse, renderWithProviders } from '../../../test/render';
import { InviteForm } from './InviteForm';

const fetchMock = vi.fn<typeof fetch>();
beforeEach(() => vi.stubGlobal('fetch', fetchMock));
afterEach(() => {
  vi.unstubAllGlobals();
  fetchMock.mockReset();
});

describe('InviteForm', () => {
  it('requires at least one role', async () => {
    renderWithProviders(<InviteForm orgId="org-1" />);
    fireEvent.change(screen.getByLabelText('E-mail'), { target: { value: 'new@x.test' } });
    fireEvent.click(screen.getByRole('button', { name: 'Create invitation' }));
    expect(await screen.findByText('Roles must include at least one role')).toBeInTheDocument();
    expect(fetchMock).not.toHaveBeenCalled();
  });

  it('offers athlete details only for athletes, sends no empty fields, and shows the one-time link', async () => {
    fetchMock.mockImplementation(async () =>
      jsonResponse(201, {
        id: 'i1',
        organizationId: 'org-1',
        email: 'maya@x.test',
        roles: ['athlete'],
        displayName: null,
        status: 'pending',
        expiresAt: '2030-01-04T12:00:00.000Z',
        createdAt: '2030-01-01T12:00:00.000Z',
        invitedByName: 'Dana',
        link: 'http://localhost/invite#aBcD_efGh-ijKlMnOpQrStUv',
      }),
    );
    renderWithProviders(<InviteForm orgId="org-1" />);
    expect(screen.queryByLabelText('Sport (optional)')).not.toBeInTheDocument();

    fireEvent.change(screen.getByLabelText('E-mail'), { target: { value: 'maya@x.test' } });
    fireEvent.click(screen.getByRole('checkbox', { name: 'Athlete' }));
    fireEvent.change(await screen.findByLabelText('Sport (optional)'), { target: { value: 'Softball' } });
    fireEvent.click(screen.getByRole('button', { name: 'Create invitation' }));

    await waitFor(() => expect(fetchMock).toHaveBeenCalledTimes(1));
    const [url, init] = fetchMock.mock.calls[0];
    expect(url).toBe('/api/orgs/org-1/invitations');
    expect(JSON.parse(init?.body as string)).toEqual({ email: 'maya@x.test', roles: ['athlete'], sport: 'Softball' });

    expect(await screen.findByLabelText('Invitation link')).toHaveValue('http://localhost/invite#aBcD_efGh-ijKlMnOpQrStUv');
    expect(screen.getByRole('button', { name: 'Copy link' })).toBeInTheDocument();
    expect(screen.getByText(/The invitation was e-mailed to maya@x.test/)).toBeInTheDocument();
    // The form starts clean for the next person.
    expect(screen.getByLabelText('E-mail')).toHaveValue('');
    expect(screen.getByRole('checkbox', { name: 'Athlete' })).not.toBeChecked();
    expect(screen.queryByLabelText('Sport (optional)')).not.toBeInTheDocument();
  });

  it('shows a refusal in words', async () => {
    fetchMock.mockImplementation(async () =>
      jsonResponse(403, { error: { code: 'forbidden', message: 'Only an admin may invite people.' }, requestId: 'r' }),
    );
    renderWithProviders(<InviteForm orgId="org-1" />);
    fireEvent.change(screen.getByLabelText('E-mail'), { target: { value: 'x@x.test' } });
    fireEvent.click(screen.getByRole('checkbox', { name: 'Coach' }));
    fireEvent.click(screen.getByRole('button', { name: 'Create invitation' }));
    expect(await screen.findByRole('alert')).toHaveTextContent("You can't do that: Only an admin may invite people.");
  });
});
