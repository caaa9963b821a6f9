import { afterEach, beforeEach, describe, expect, it, vi } from 'vitest';
import { fireEvent, screen, waitFor } from '@testing-library/react';
import { renderWithProviders, jsonResponse } from '../../../test/render';
import { setCsrfToken } from '../../../lib/api-client';
import { StartOrganizationForm } from './StartOrganizationForm';
import { ConfirmSignup, signupTokenFromHash } from './ConfirmSignup';

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

function fill(values: Record<string, string>) {
  for (const [label, value] of Object.entries(values)) fireEvent.change(screen.getByLabelText(label), { target: { value } });
}

// The form holds every country and zone: slow to render in happy-dom on a busy machine.
describe('StartOrganizationForm', { timeout: 30_000 }, () => {
  it('checks the fields with the shared schema before calling the server', async () => {
    renderWithProviders(<StartOrganizationForm />);
    fill({ 'Organization name': '', Country: '', 'Your name': 'Ingrid', 'E-mail': 'nope', Password: 'short' });
    fireEvent.click(screen.getByRole('button', { name: 'Start the organization' }));
    expect(await screen.findByText(/Organization name is required/)).toBeInTheDocument();
    expect(screen.getByText(/Country must be a two-letter country code/)).toBeInTheDocument();
    expect(screen.getByText(/Password must be at least 8 characters/)).toBeInTheDocument();
    expect(fetchMock).not.toHaveBeenCalled();
  });

  it('lists countries by name and every zone the browser knows', () => {
    renderWithProviders(<StartOrganizationForm />);
    // Looked up by value: a role query over some 650 options is slow in happy-dom.
    expect(screen.getByLabelText('Country').querySelector('option[value="NO"]')).toHaveTextContent('Norway');
    expect(screen.getByLabelText('Time zone').querySelector('option[value="America/Los_Angeles"]')).toHaveTextContent(
      'America/Los Angeles',
    );
  });

  it('sends the form and says to check the e-mail, whatever the address', async () => {
    fetchMock.mockImplementation(async () => jsonResponse(202, { message: 'Almost there: we sent a link to that address.' }));
    renderWithProviders(<StartOrganizationForm />);
    fill({
      'Organization name': 'Fjord Rowing',
      Country: 'NO',
      'Time zone': 'Europe/Oslo',
      'Your name': 'Ingrid Solberg',
      'E-mail': 'Ingrid@Example.org',
      Password: 'a long new passphrase',
    });
    fireEvent.click(screen.getByRole('button', { name: 'Start the organization' }));
    expect(await screen.findByRole('status')).toHaveTextContent('Almost there');
    expect(JSON.parse(fetchMock.mock.calls[0][1]?.body as string)).toEqual({
      organizationName: 'Fjord Rowing',
      country: 'NO',
      timeZone: 'Europe/Oslo',
      adminName: 'Ingrid Solberg',
      email: 'ingrid@example.org',
      password: 'a long new passphrase',
    });
  });
});

describe('ConfirmSignup', () => {
  it('reads the token from the fragment only', () => {
    expect(signupTokenFromHash(`#${TOKEN}`)).toBe(TOKEN);
    expect(signupTokenFromHash('#short')).toBeNull();
  });

  it('creates nothing on arrival; the button confirms, and a used link says so', async () => {
    fetchMock.mockImplementation(async () =>
      jsonResponse(404, { error: { code: 'signup_invalid', message: 'This confirmation link can’t be used.' }, requestId: 'r' }),
    );
    renderWithProviders(<ConfirmSignup hash={`#${TOKEN}`} onConfirmed={vi.fn()} />);
    expect(fetchMock).not.toHaveBeenCalled();
    fireEvent.click(screen.getByRole('button', { name: 'Confirm and start the organization' }));
    expect(await screen.findByRole('alert')).toHaveTextContent("This link can't be used");
    expect(screen.getByRole('link', { name: 'Start an organization' })).toBeInTheDocument();
  });

  it('hands the new organization on when confirmed', async () => {
    const done = { organizationId: 'o', organizationName: 'Fjord Rowing', email: 'i@example.org', existingAccount: false };
    fetchMock.mockImplementation(async () => jsonResponse(200, done));
    const onConfirmed = vi.fn();
    renderWithProviders(<ConfirmSignup hash={`#${TOKEN}`} onConfirmed={onConfirmed} />);
    fireEvent.click(screen.getByRole('button', { name: 'Confirm and start the organization' }));
    await waitFor(() => expect(onConfirmed).toHaveBeenCalled());
    expect(onConfirmed.mock.calls[0][0]).toEqual(done);
    expect(JSON.parse(fetchMock.mock.calls[0][1]?.body as string)).toEqual({ token: TOKEN });
  });
});
