import { afterEach, beforeEach, describe, expect, it, vi } from 'vitest';
import { fireEvent, screen, waitFor, within } from '@testing-library/react';
import { AbilityProvider } from '@casl/react';
import { defineAbilityFor, type Actor } from '../../../../../policies/access';
import { jsonResponse, renderWithProviders } from '../../../test/render';
import { CaseDocuments } from './CaseDocuments';

const ORG = '11111111-1111-4111-8111-111111111111';
const ATHLETE = '22222222-2222-4222-8222-222222222222';
const CASE = '33333333-3333-4333-8333-333333333333';

/** A stand-in XMLHttpRequest that answers every upload with the response given. */
function fakeXhr(status: number, body: unknown) {
  return class {
    upload = { onprogress: null as null | ((e: unknown) => void) };
    status = 0;
    responseText = '';
    onload: (() => void) | null = null;
    onerror: (() => void) | null = null;
    onabort: (() => void) | null = null;
    withCredentials = false;
    open() {}
    setRequestHeader() {}
    abort() {}
    send() {
      setTimeout(() => {
        this.upload.onprogress?.({ lengthComputable: true, loaded: 10, total: 10 });
        this.status = status;
        this.responseText = JSON.stringify(body);
        this.onload?.();
      }, 0);
    }
  };
}

const clinician: Actor = {
  userId: 'u-priya',
  organizationId: ORG,
  membershipId: 'm-priya',
  roles: ['clinician'],
  coachOf: [],
  clinicianOf: [ATHLETE],
  guardianOf: [],
};
const fetchMock = vi.fn<typeof fetch>();
beforeEach(() => {
  vi.stubGlobal('fetch', fetchMock);
  fetchMock.mockImplementation(async () => jsonResponse(200, []));
});
afterEach(() => {
  vi.unstubAllGlobals();
  fetchMock.mockReset();
});

function renderPanel() {
  return renderWithProviders(
    <AbilityProvider value={defineAbilityFor(clinician)}>
      <CaseDocuments orgId={ORG} caseId={CASE} athleteId={ATHLETE} athleteName="Maya Torres" audience="clinician" />
    </AbilityProvider>,
  );
}

describe('CaseDocuments', () => {
  it('says who sees the documents and that Loadline does not read them', async () => {
    renderPanel();
    const panel = screen.getByRole('region', { name: 'Documents' });
    expect(panel).toHaveTextContent("Only the clinicians on Maya Torres's care team and Maya Torres see these.");
    expect(panel).toHaveTextContent('it does not read, check or interpret it');
    expect(await within(panel).findByText(/No documents on this case yet/)).toBeInTheDocument();
  });

  it('shows the server’s sentence for a refused file and keeps everything typed', async () => {
    vi.stubGlobal(
      'XMLHttpRequest',
      fakeXhr(415, {
        error: {
          code: 'unsupported_media_type',
          message: 'This file is not a PDF, JPEG, PNG or HEIC image (its contents were checked, not its name).',
        },
        requestId: 'r-415',
      }),
    );
    renderPanel();
    fireEvent.click(screen.getByRole('button', { name: 'Attach a document' }));
    const form = screen.getByRole('form', { name: 'Attach a document' });
    fireEvent.change(within(form).getByLabelText('Title'), { target: { value: 'Referral letter' } });
    fireEvent.change(within(form).getByLabelText('Date on the document'), { target: { value: '2026-11-30' } });
    fireEvent.change(within(form).getByLabelText('Issued by'), { target: { value: 'Dr Ames' } });
    const file = new File(['not really a pdf'], 'referral.pdf', { type: 'application/pdf' });
    fireEvent.change(within(form).getByLabelText('File'), { target: { files: [file] } });
    fireEvent.click(within(form).getByRole('button', { name: 'Attach document' }));

    const alert = await screen.findByRole('alert');
    expect(alert).toHaveTextContent('The document was not saved');
    expect(alert).toHaveTextContent('This file is not a PDF, JPEG, PNG or HEIC image (its contents were checked, not its name).');
    expect(within(form).getByLabelText('Title')).toHaveValue('Referral letter');
    expect(within(form).getByLabelText('Issued by')).toHaveValue('Dr Ames');
    await waitFor(() => expect(within(form).getByRole('button', { name: 'Attach document' })).toBeEnabled());
  });

  it('asks for the file before sending anything', async () => {
    const xhr = vi.fn();
    vi.stubGlobal('XMLHttpRequest', xhr);
    renderPanel();
    fireEvent.click(screen.getByRole('button', { name: 'Attach a document' }));
    const form = screen.getByRole('form', { name: 'Attach a document' });
    fireEvent.change(within(form).getByLabelText('Title'), { target: { value: 'Referral letter' } });
    fireEvent.change(within(form).getByLabelText('Date on the document'), { target: { value: '2026-11-30' } });
    fireEvent.change(within(form).getByLabelText('Issued by'), { target: { value: 'Dr Ames' } });
    fireEvent.click(within(form).getByRole('button', { name: 'Attach document' }));
    expect(await within(form).findByText('Choose the file to attach.')).toBeInTheDocument();
    expect(xhr).not.toHaveBeenCalled();
  });
});
