import { afterEach, beforeEach, describe, expect, it, vi } from 'vitest';
import { fireEvent, screen, waitFor } from '@testing-library/react';
import { jsonResponse, renderWithProviders } from '../../../test/render';
import { SignLetterForm } from './SignLetterForm';

const fetchMock = vi.fn<typeof fetch>();
beforeEach(() => vi.stubGlobal('fetch', fetchMock));
afterEach(() => {
  vi.unstubAllGlobals();
  fetchMock.mockReset();
});

function renderForm(onSigned = vi.fn(), unsaved = false) {
  renderWithProviders(
    <SignLetterForm
      orgId="org-1"
      letterId="l-1"
      version={3}
      signerName="Priya Raman"
      unsaved={unsaved}
      replaces={null}
      onSigned={onSigned}
      onStale={() => {}}
    />,
  );
  return onSigned;
}

describe('SignLetterForm', () => {
  it('says what signing does, and cannot be sent without a typed signature', async () => {
    renderForm();
    expect(screen.getByText(/cannot be changed/)).toHaveTextContent(
      /e-mails it to the athlete’s guardian\(s\), the athlete and the coach\(es\)/,
    );

    fireEvent.click(screen.getByRole('button', { name: 'Sign and send' }));
    expect(await screen.findByText('Type your full name: the letter cannot be signed without it.')).toBeInTheDocument();
    expect(screen.getByLabelText('Type your full name to sign')).toHaveAttribute('aria-invalid', 'true');

    fireEvent.change(screen.getByLabelText('Type your full name to sign'), { target: { value: '   ' } });
    fireEvent.click(screen.getByRole('button', { name: 'Sign and send' }));
    await new Promise((r) => setTimeout(r, 20));
    expect(fetchMock).not.toHaveBeenCalled();
  });

  it('signs with the typed name and the version on screen, and hands back the one-time code', async () => {
    fetchMock.mockResolvedValue(jsonResponse(200, { id: 'l-1', status: 'signed', verificationCode: '7K3M-Q9TX-2HBD-VR4P-N8CW' }));
    const onSigned = renderForm();
    fireEvent.change(screen.getByLabelText('Type your full name to sign'), { target: { value: 'Priya Raman' } });
    fireEvent.click(screen.getByRole('button', { name: 'Sign and send' }));
    await waitFor(() => expect(onSigned).toHaveBeenCalled());
    const [url, init] = fetchMock.mock.calls[0];
    expect(url).toBe('/api/orgs/org-1/letters/l-1/sign');
    expect(JSON.parse(init?.body as string)).toEqual({ signature: 'Priya Raman', version: 3 });
    expect(onSigned.mock.calls[0][0]).toMatchObject({ verificationCode: '7K3M-Q9TX-2HBD-VR4P-N8CW' });
  });

  it('waits while edits above are unsaved, and says why', () => {
    renderForm(vi.fn(), true);
    expect(screen.getByRole('button', { name: 'Sign and send' })).toBeDisabled();
    expect(screen.getByText(/Save them first: signing signs the saved draft/)).toBeInTheDocument();
  });
});
