import { afterEach, beforeEach, describe, expect, it, vi } from 'vitest';
import { fireEvent, screen, waitFor } from '@testing-library/react';
import { renderWithProviders, jsonResponse } from '../../../test/render';
import { getCsrfToken, setCsrfToken } from '../../../lib/api-client';
import { SecondStepForm } from './SecondStepForm';

const fetchMock = vi.fn<typeof fetch>();
beforeEach(() => {
  vi.stubGlobal('fetch', fetchMock);
  setCsrfToken('pending-token');
});
afterEach(() => {
  vi.unstubAllGlobals();
  fetchMock.mockReset();
});

const enter = (code: string) => {
  fireEvent.change(screen.getByLabelText('Sign-in code'), { target: { value: code } });
  fireEvent.click(screen.getByRole('button', { name: 'Finish signing in' }));
};

describe('SecondStepForm', () => {
  it('refuses something that is neither an app code nor a recovery code without calling the server', async () => {
    renderWithProviders(<SecondStepForm onSignedIn={vi.fn()} onStartOver={vi.fn()} />);
    enter('12345');
    expect(
      await screen.findByText(/Sign-in code must be the 6-digit code from your app or one of your recovery codes/),
    ).toBeInTheDocument();
    expect(fetchMock).not.toHaveBeenCalled();
  });

  it('sends an app code (spaces removed) with the pending session’s CSRF token and reports the signed-in session', async () => {
    const session = {
      user: { id: 'u1', email: 'p@example.test', displayName: 'P', unitPref: 'kg' },
      memberships: [],
      csrfToken: 'signed-in-token',
    };
    fetchMock.mockImplementation(async () => jsonResponse(200, session));
    const onSignedIn = vi.fn();
    renderWithProviders(<SecondStepForm onSignedIn={onSignedIn} onStartOver={vi.fn()} />);
    enter('123 456');
    await waitFor(() => expect(onSignedIn).toHaveBeenCalledWith(session));
    const [url, init] = fetchMock.mock.calls[0];
    expect(url).toBe('/api/session/second-step');
    expect((init?.headers as Record<string, string>)['X-CSRF-Token']).toBe('pending-token');
    expect(JSON.parse(init?.body as string)).toEqual({ code: '123456' });
    expect(getCsrfToken()).toBe('signed-in-token');
  });

  it('accepts a recovery code as printed, and shows the server’s sentence when a code is wrong', async () => {
    fetchMock.mockImplementation(async () =>
      jsonResponse(401, { error: { code: 'invalid_credentials', message: 'That code did not work.' }, requestId: 'r1' }),
    );
    renderWithProviders(<SecondStepForm onSignedIn={vi.fn()} onStartOver={vi.fn()} />);
    enter('ABCDE-23456');
    expect(await screen.findByRole('alert')).toHaveTextContent('That code did not work.');
    expect(JSON.parse(fetchMock.mock.calls[0][1]?.body as string)).toEqual({ code: 'abcde23456' });
  });
});
