import { afterEach, beforeEach, describe, expect, it, vi } from 'vitest';
import { fireEvent, screen, waitFor } from '@testing-library/react';
import { jsonResponse, renderWithProviders } from '../../../test/render';
import { AcceptInvitation, tokenFromHash } from './AcceptInvitation';

const TOKEN = 'aBcD_efGh-ijKlMnOpQrStUv';
const fetchMock = vi.fn<typeof fetch>();

beforeEach(() => vi.stubGlobal('fetch', fetchMock));
afterEach(() => {
  vi.unstubAllGlobals();
  fetchMock.mockReset();
});

function bodyOf(call: number): unknown {
  return JSON.parse(fetchMock.mock.calls[call][1]?.body as string);
}

describe('tokenFromHash', () => {
  it('takes the token from the fragment', () => {
    expect(tokenFromHash(`#${TOKEN}`)).toBe(TOKEN);
  });
  it('refuses an empty or malformed fragment', () => {
    expect(tokenFromHash('')).toBeNull();
    expect(tokenFromHash('#short')).toBeNull();
    expect(tokenFromHash('#has spaces in it and more text')).toBeNull();
  });
});

describe('AcceptInvitation', () => {
  it('explains an incomplete link without calling the server', () => {
    renderWithProviders(<AcceptInvitation hash="" onAccepted={vi.fn()} />);
    expect(screen.getByRole('alert')).toHaveTextContent('This invitation link is incomplete');
    expect(fetchMock).not.toHaveBeenCalled();
  });

  it('shows the server sentence for a used or expired invitation', async () => {
    fetchMock.mockImplementation(async () =>
      jsonResponse(410, { error: { code: 'invitation_invalid', message: 'This invitation has expired.' }, requestId: 'r' }),
    );
    renderWithProviders(<AcceptInvitation hash={`#${TOKEN}`} onAccepted={vi.fn()} />);
    const alert = await screen.findByRole('alert');
    expect(alert).toHaveTextContent("This invitation can't be used");
    expect(alert).toHaveTextContent('This invitation has expired.');
  });

  it('previews by POST, asks an athlete for a date of birth, and accepts with the token', async () => {
    const session = { user: { id: 'u', email: 'maya@x.test', displayName: 'Maya T', unitPref: 'kg' }, memberships: [], csrfToken: 'n' };
    fetchMock.mockImplementation(async (url) =>
      String(url).endsWith('/preview')
        ? jsonResponse(200, {
            organizationName: 'Harbor Point Performance',
            email: 'maya@x.test',
            roles: ['athlete'],
            displayName: 'Maya',
            hasAccount: false,
            expiresAt: '2030-01-01T12:00:00.000Z',
          })
        : jsonResponse(200, session),
    );
    const onAccepted = vi.fn();
    renderWithProviders(<AcceptInvitation hash={`#${TOKEN}`} onAccepted={onAccepted} />);

    expect(await screen.findByText('Harbor Point Performance')).toBeInTheDocument();
    expect(bodyOf(0)).toEqual({ token: TOKEN });
    expect(screen.getByLabelText('Your name')).toHaveValue('Maya');

    fireEvent.change(screen.getByLabelText('Password'), { target: { value: 'short' } });
    fireEvent.click(screen.getByRole('button', { name: 'Accept invitation' }));
    expect(await screen.findByText(/Password must be at least 8 characters/)).toBeInTheDocument();

    fireEvent.change(screen.getByLabelText('Your name'), { target: { value: 'Maya T' } });
    fireEvent.change(screen.getByLabelText('Password'), { target: { value: 'a long pass phrase' } });
    fireEvent.change(screen.getByLabelText('Date of birth (optional)'), { target: { value: '2010-03-14' } });
    fireEvent.click(screen.getByRole('button', { name: 'Accept invitation' }));

    await waitFor(() => expect(onAccepted).toHaveBeenCalledWith(session));
    expect(String(fetchMock.mock.calls[1][0])).toBe('/api/invitations/accept');
    expect(bodyOf(1)).toEqual({
      token: TOKEN,
      displayName: 'Maya T',
      password: 'a long pass phrase',
      dateOfBirth: '2010-03-14',
    });
  });

  it('asks an existing account holder for their current password and omits an empty date', async () => {
    fetchMock.mockImplementation(async (url) =>
      String(url).endsWith('/preview')
        ? jsonResponse(200, {
            organizationName: 'Harbor Point Performance',
            email: 'coach@x.test',
            roles: ['coach'],
            displayName: null,
            hasAccount: true,
            expiresAt: '2030-01-01T12:00:00.000Z',
          })
        : jsonResponse(401, {
            error: { code: 'invalid_credentials', message: 'That password does not match this account.' },
            requestId: 'r',
          }),
    );
    renderWithProviders(<AcceptInvitation hash={`#${TOKEN}`} onAccepted={vi.fn()} />);

    expect(await screen.findByText(/already have a Loadline account/)).toBeInTheDocument();
    expect(screen.getByLabelText('Password')).toHaveAttribute('autocomplete', 'current-password');
    expect(screen.queryByLabelText(/Date of birth/)).not.toBeInTheDocument();

    fireEvent.change(screen.getByLabelText('Your name'), { target: { value: 'Rosa' } });
    fireEvent.change(screen.getByLabelText('Password'), { target: { value: 'not the right one' } });
    fireEvent.click(screen.getByRole('button', { name: 'Accept invitation' }));

    expect(await screen.findByRole('alert')).toHaveTextContent('That password does not match this account.');
    expect(bodyOf(1)).toEqual({ token: TOKEN, displayName: 'Rosa', password: 'not the right one' });
  });
});
