import { afterEach, beforeEach, describe, expect, it, vi } from 'vitest';
import { fireEvent, screen, waitFor } from '@testing-library/react';
import { renderWithProviders, jsonResponse } from '../../../test/render';
import { setCsrfToken } from '../../../lib/api-client';
import { ResetPasswordForm, resetTokenFromHash } from './ResetPasswordForm';
import { ForgotPasswordForm } from './ForgotPasswordForm';

const fetchMock = vi.fn<typeof fetch>();
beforeEach(() => {
  vi.stubGlobal('fetch', fetchMock);
  setCsrfToken('t');
});
afterEach(() => {
  vi.unstubAllGlobals();
  fetchMock.mockReset();
});

const TOKEN = 'Abc_def-0123456789abcdefghijklmnopqrstuvwxyz';

describe('resetTokenFromHash', () => {
  it('reads a token from the fragment and refuses anything else', () => {
    expect(resetTokenFromHash(`#${TOKEN}`)).toBe(TOKEN);
    expect(resetTokenFromHash('')).toBeNull();
    expect(resetTokenFromHash('#short')).toBeNull();
    expect(resetTokenFromHash('#has spaces inside it and more')).toBeNull();
  });
});

describe('ResetPasswordForm', () => {
  it('says the link is incomplete when there is no token', () => {
    renderWithProviders(<ResetPasswordForm hash="" onDone={vi.fn()} />);
    expect(screen.getByRole('alert')).toHaveTextContent('This link is incomplete');
    expect(screen.queryByLabelText('New password')).not.toBeInTheDocument();
  });

  it('applies the shared length rule before calling the server', async () => {
    renderWithProviders(<ResetPasswordForm hash={`#${TOKEN}`} onDone={vi.fn()} />);
    fireEvent.change(screen.getByLabelText('New password'), { target: { value: 'short' } });
    fireEvent.click(screen.getByRole('button', { name: 'Save the new password' }));
    expect(await screen.findByText(/New password must be at least 8 characters/)).toBeInTheDocument();
    expect(fetchMock).not.toHaveBeenCalled();
  });

  it('sends the token and password, then calls onDone', async () => {
    fetchMock.mockImplementation(async () => new Response(null, { status: 204 }));
    const onDone = vi.fn();
    renderWithProviders(<ResetPasswordForm hash={`#${TOKEN}`} onDone={onDone} />);
    fireEvent.change(screen.getByLabelText('New password'), { target: { value: 'a long new passphrase' } });
    fireEvent.click(screen.getByRole('button', { name: 'Save the new password' }));
    await waitFor(() => expect(onDone).toHaveBeenCalled());
    expect(JSON.parse(fetchMock.mock.calls[0][1]?.body as string)).toEqual({ token: TOKEN, password: 'a long new passphrase' });
  });

  it('offers a new link when the server says this one is used up or expired', async () => {
    fetchMock.mockImplementation(async () =>
      jsonResponse(404, { error: { code: 'reset_invalid', message: 'This password link can’t be used.' }, requestId: 'r' }),
    );
    renderWithProviders(<ResetPasswordForm hash={`#${TOKEN}`} onDone={vi.fn()} />);
    fireEvent.change(screen.getByLabelText('New password'), { target: { value: 'a long new passphrase' } });
    fireEvent.click(screen.getByRole('button', { name: 'Save the new password' }));
    const alert = await screen.findByRole('alert');
    expect(alert).toHaveTextContent("This link can't be used");
    expect(screen.getByRole('link', { name: 'Ask for a new link' })).toHaveAttribute('href', '/forgot-password');
  });
});

describe('ForgotPasswordForm', () => {
  it('shows the server’s one answer after sending the address', async () => {
    fetchMock.mockImplementation(async () =>
      jsonResponse(202, { message: 'If that address belongs to a Loadline account, a link is on its way.' }),
    );
    renderWithProviders(<ForgotPasswordForm />);
    fireEvent.change(screen.getByLabelText('E-mail'), { target: { value: 'someone@example.test' } });
    fireEvent.click(screen.getByRole('button', { name: 'Send me a link' }));
    expect(await screen.findByRole('status')).toHaveTextContent('If that address belongs to a Loadline account');
    expect(JSON.parse(fetchMock.mock.calls[0][1]?.body as string)).toEqual({ email: 'someone@example.test' });
  });
});
