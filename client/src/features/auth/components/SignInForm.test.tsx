import { afterEach, beforeEach, describe, expect, it, vi } from 'vitest';
import { fireEvent, screen, waitFor } from '@testing-library/react';
import { renderWithProviders, jsonResponse } from '../../../test/render';
import { getCsrfToken, setCsrfToken } from '../../../lib/api-client';
import { SignInForm } from './SignInForm';

const fetchMock = vi.fn<typeof fetch>();

beforeEach(() => {
  vi.stubGlobal('fetch', fetchMock);
  setCsrfToken('before-sign-in');
});
afterEach(() => {
  vi.unstubAllGlobals();
  fetchMock.mockReset();
});

function fill(email: string, password: string) {
  fireEvent.change(screen.getByLabelText('E-mail'), { target: { value: email } });
  fireEvent.change(screen.getByLabelText('Password'), { target: { value: password } });
}

describe('SignInForm', () => {
  it('shows field errors from the shared schema without calling the server', async () => {
    renderWithProviders(<SignInForm onSignedIn={vi.fn()} />);
    fill('not-an-address', '');
    fireEvent.click(screen.getByRole('button', { name: 'Sign in' }));

    expect(await screen.findByText('E-mail must be a valid e-mail address')).toBeInTheDocument();
    expect(screen.getByText('Password is required')).toBeInTheDocument();
    expect(screen.getByLabelText('E-mail')).toHaveAttribute('aria-invalid', 'true');
    expect(fetchMock).not.toHaveBeenCalled();
  });

  it('says only that the e-mail or password is wrong on invalid credentials', async () => {
    fetchMock.mockImplementation(async () =>
      jsonResponse(401, { error: { code: 'invalid_credentials', message: 'No such user' }, requestId: 'r1' }),
    );
    renderWithProviders(<SignInForm onSignedIn={vi.fn()} />);
    fill('maya@example.test', 'wrong password');
    fireEvent.click(screen.getByRole('button', { name: 'Sign in' }));

    expect(await screen.findByRole('alert')).toHaveTextContent('E-mail or password is incorrect.');
    expect(screen.queryByText('No such user')).not.toBeInTheDocument();
  });

  it('shows the server sentence when attempts are rate limited', async () => {
    fetchMock.mockImplementation(async () =>
      jsonResponse(429, { error: { code: 'rate_limited', message: 'Try again in 10 minutes.' }, requestId: 'r2' }),
    );
    renderWithProviders(<SignInForm onSignedIn={vi.fn()} />);
    fill('maya@example.test', 'whatever1');
    fireEvent.click(screen.getByRole('button', { name: 'Sign in' }));

    expect(await screen.findByRole('alert')).toHaveTextContent('Try again in 10 minutes.');
  });

  it('says plainly when the limit is the network’s, not the person’s (distinct title and the server sentence)', async () => {
    const sentence =
      'Too many failed sign-ins from this network (everyone here shares one internet address). This is not about your account: wait 12 minutes, or ask your admin.';
    fetchMock.mockImplementation(async () =>
      jsonResponse(429, { error: { code: 'rate_limited_network', message: sentence }, requestId: 'r4' }),
    );
    renderWithProviders(<SignInForm onSignedIn={vi.fn()} />);
    fill('maya@example.test', 'whatever1');
    fireEvent.click(screen.getByRole('button', { name: 'Sign in' }));

    const alert = await screen.findByRole('alert');
    expect(alert).toHaveTextContent('Paused for this network');
    expect(alert).toHaveTextContent('This is not about your account');
    expect(alert).not.toHaveTextContent('Too many attempts');
  });

  it('puts server field messages on the fields', async () => {
    fetchMock.mockImplementation(async () =>
      jsonResponse(400, {
        error: { code: 'validation_failed', message: 'Check the form.', fields: { email: ['is not allowed here'] } },
        requestId: 'r3',
      }),
    );
    renderWithProviders(<SignInForm onSignedIn={vi.fn()} />);
    fill('maya@example.test', 'whatever1');
    fireEvent.click(screen.getByRole('button', { name: 'Sign in' }));

    expect(await screen.findByText('E-mail is not allowed here')).toBeInTheDocument();
  });

  it('sends the CSRF token, keeps the new one and reports the signed-in session', async () => {
    const session = {
      user: { id: 'u1', email: 'maya@example.test', displayName: 'Maya', unitPref: 'kg' },
      memberships: [],
      csrfToken: 'after-sign-in',
    };
    fetchMock.mockImplementation(async () => jsonResponse(200, session));
    const onSignedIn = vi.fn();
    renderWithProviders(<SignInForm onSignedIn={onSignedIn} />);
    fill('  Maya@Example.test ', 'correct horse');
    fireEvent.click(screen.getByRole('button', { name: 'Sign in' }));

    await waitFor(() => expect(onSignedIn).toHaveBeenCalledWith(session));
    const [, init] = fetchMock.mock.calls[0];
    expect((init?.headers as Record<string, string>)['X-CSRF-Token']).toBe('before-sign-in');
    expect(JSON.parse(init?.body as string)).toEqual({ email: 'maya@example.test', password: 'correct horse' });
    expect(getCsrfToken()).toBe('after-sign-in');
  });
});
