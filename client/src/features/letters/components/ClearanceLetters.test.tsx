import { afterEach, beforeEach, describe, expect, it, vi } from 'vitest';
import { fireEvent, screen, waitFor, within } from '@testing-library/react';
import { AbilityProvider } from '@casl/react';
import { defineAbilityFor, type Actor } from '../../../../../policies/access';
import type { LetterDto } from '../../../../../policies/dto';
import { MembershipContext } from '../../../lib/membership-context';
import { jsonResponse, renderWithProviders } from '../../../test/render';
import { ClearanceLetters } from './ClearanceLetters';

const ORG = '11111111-1111-4111-8111-111111111111';
const MAYA = '22222222-2222-4222-8222-222222222222';
const fetchMock = vi.fn<typeof fetch>();
beforeEach(() => vi.stubGlobal('fetch', fetchMock));
afterEach(() => {
  vi.unstubAllGlobals();
  fetchMock.mockReset();
});

const actor: Actor = {
  userId: 'u-priya',
  organizationId: ORG,
  membershipId: 'm-priya',
  roles: ['clinician'],
  coachOf: [],
  clinicianOf: [MAYA],
  guardianOf: [],
};

function renderSection() {
  return renderWithProviders(
    <AbilityProvider value={defineAbilityFor(actor)}>
      <MembershipContext.Provider
        value={{
          orgId: ORG,
          user: { id: 'u-priya', email: 'priya@x.test', displayName: 'Priya Raman', unitPref: 'kg' },
          membership: {
            id: 'm-priya',
            organizationId: ORG,
            organizationName: 'Harbor Point Performance',
            timeZone: 'UTC',
            roles: ['clinician'],
            actor,
          },
        }}
      >
        <ClearanceLetters orgId={ORG} athleteId={MAYA} athleteName="Maya Torres" />
      </MembershipContext.Provider>
    </AbilityProvider>,
  );
}

const draft: LetterDto = {
  id: 'l-1',
  athleteId: MAYA,
  athleteName: 'Maya Torres',
  decision: 'limited',
  effectiveFrom: '2026-03-16',
  validUntil: '2026-04-13',
  limits: ['Hinge: up to 60% of your best lift', 'Jump / landing: not allowed for now'],
  clinicianName: 'Priya Raman',
  credential: 'Physiotherapist, PT',
  licenceNumber: 'PT-448812',
  familyNote: '',
  signature: null,
  signedAt: null,
  status: 'draft',
  supersededBy: null,
  outOfDate: false,
  pdfSha256: null,
  version: 1,
  createdAt: '2026-03-12T14:00:00.000Z',
  acknowledgements: [],
  deliveries: [],
};

describe('ClearanceLetters', () => {
  it('saves a limited draft without limits, so the server fills them in, then shows them as editable lines', async () => {
    let served: LetterDto[] = [];
    fetchMock.mockImplementation(async (_input, init) => {
      if (init?.method === 'POST') {
        served = [draft];
        return jsonResponse(201, draft);
      }
      return jsonResponse(200, served);
    });
    renderSection();
    const section = await screen.findByRole('region', { name: 'Clearance letters' });
    expect(within(section).getByText(/does not diagnose, treat or replace professional care/)).toBeInTheDocument();
    expect(await screen.findByText(/No clearance letter yet/)).toBeInTheDocument();

    fireEvent.click(screen.getByRole('button', { name: 'Write a clearance letter' }));
    fireEvent.click(screen.getByRole('radio', { name: 'Limited participation' }));
    fireEvent.change(screen.getByLabelText('From'), { target: { value: '2026-03-16' } });
    fireEvent.change(screen.getByLabelText('Valid until (next review)'), { target: { value: '2026-04-13' } });
    fireEvent.change(screen.getByLabelText('Credential'), { target: { value: 'Physiotherapist, PT' } });
    fireEvent.change(screen.getByLabelText('Licence number'), { target: { value: 'PT-448812' } });
    fireEvent.click(screen.getByRole('button', { name: 'Save draft letter' }));

    expect(await screen.findByRole('heading', { name: 'Draft letter: Limited participation' })).toBeInTheDocument();
    const post = fetchMock.mock.calls.find(([, init]) => init?.method === 'POST');
    expect(String(post?.[0])).toBe(`/api/orgs/${ORG}/letters`);
    expect(JSON.parse(post?.[1]?.body as string)).toEqual({
      athleteId: MAYA,
      decision: 'limited',
      effectiveFrom: '2026-03-16',
      validUntil: '2026-04-13',
      credential: 'Physiotherapist, PT',
      licenceNumber: 'PT-448812',
      familyNote: '',
    });
    expect(screen.getByLabelText('Limit 1')).toHaveValue('Hinge: up to 60% of your best lift');
    expect(screen.getByLabelText('Limit 2')).toHaveValue('Jump / landing: not allowed for now');
    expect(screen.getByRole('link', { name: 'Preview PDF' })).toHaveAttribute('href', `/api/orgs/${ORG}/letters/l-1/preview`);
    expect(screen.getByRole('img', { name: /Letter status: Draft/ })).toBeInTheDocument();
    expect(screen.queryByRole('button', { name: 'Save draft letter' })).not.toBeInTheDocument();
  });

  it('shows the code once after signing, and each recipient’s delivery in words', async () => {
    const signed: LetterDto = {
      ...draft,
      status: 'signed',
      signature: 'Priya Raman',
      signedAt: '2026-03-12T15:00:00.000Z',
      version: 2,
      deliveries: [
        { id: 'd1', to: 'elena@x.test', status: 'sent', attempts: 1, lastError: null, sentAt: '2026-03-12T15:00:05.000Z' },
        { id: 'd2', to: 'theo@x.test', status: 'failed', attempts: 5, lastError: 'Mailbox unavailable', sentAt: null },
      ],
    };
    let served: LetterDto[] = [draft];
    fetchMock.mockImplementation(async (_input, init) => {
      if (init?.method === 'POST') {
        served = [signed];
        return jsonResponse(200, { ...signed, verificationCode: '7K3M-Q9TX-2HBD-VR4P-N8CW' });
      }
      return jsonResponse(200, served);
    });
    renderSection();
    fireEvent.change(await screen.findByLabelText('Type your full name to sign'), { target: { value: 'Priya Raman' } });
    fireEvent.click(screen.getByRole('button', { name: 'Sign and send' }));

    expect(await screen.findByText('7K3M-Q9TX-2HBD-VR4P-N8CW')).toBeInTheDocument();
    expect(screen.getByText('Verification code')).toBeInTheDocument();
    expect(screen.getByText(/Anyone holding the letter can check it at/)).toHaveTextContent('/check');
    await waitFor(() => expect(screen.getByRole('img', { name: /Letter status: Signed/ })).toBeInTheDocument());
    expect(screen.getByText('Not delivered: Mailbox unavailable')).toBeInTheDocument();
    expect(screen.getByText('Failed')).toBeInTheDocument();
    expect(screen.getByText('Sent')).toBeInTheDocument();

    fireEvent.click(screen.getByRole('button', { name: 'I have noted the code' }));
    expect(screen.queryByText('7K3M-Q9TX-2HBD-VR4P-N8CW')).not.toBeInTheDocument();
  });

  it('shows a letter signed to start later as not yet in force, above the letter still in force', async () => {
    const inForce: LetterDto = {
      ...draft,
      id: 'l-a',
      decision: 'full',
      limits: [],
      status: 'signed',
      signature: 'Priya Raman',
      signedAt: '2026-11-20T10:00:00.000Z',
      effectiveFrom: '2026-11-20',
      validUntil: null,
      version: 2,
    };
    const next: LetterDto = {
      ...inForce,
      id: 'l-b',
      signedAt: '2026-12-01T10:00:00.000Z',
      effectiveFrom: '2026-12-09',
      status: 'scheduled',
    };
    fetchMock.mockResolvedValue(jsonResponse(200, [next, inForce]));
    renderSection();

    const scheduledMark = await screen.findByRole('img', {
      name: 'Letter status: Signed, not yet in force — signed and sent; takes effect on its start date',
    });
    const scheduledRecord = scheduledMark.closest('article')!;
    expect(
      within(scheduledRecord).getByText('Signed, takes effect on 9 December 2026. Until then, any earlier letter stays in force.'),
    ).toBeInTheDocument();
    expect(scheduledRecord.querySelector('svg[data-shape="scheduled"]')).not.toBeNull();
    const inForceRecord = screen.getByRole('img', { name: 'Letter status: Signed — signed, sent and in force' }).closest('article')!;
    expect(within(inForceRecord).getByRole('heading')).toHaveTextContent('from 20 November 2026');
    // Nothing is superseded yet, and the next letter comes first.
    expect(screen.queryByText(/Earlier letters, superseded/)).not.toBeInTheDocument();
    expect(scheduledRecord.compareDocumentPosition(inForceRecord) & Node.DOCUMENT_POSITION_FOLLOWING).toBeTruthy();
  });

  it('shows a letter past its valid-until date as expired, not in force, and asks for a new letter', async () => {
    const expired: LetterDto = {
      ...draft,
      id: 'l-x',
      status: 'expired',
      signature: 'Priya Raman',
      signedAt: '2026-03-12T15:00:00.000Z',
      version: 2,
    };
    fetchMock.mockResolvedValue(jsonResponse(200, [expired]));
    const { container } = renderSection();

    const mark = await screen.findByRole('img', { name: 'Letter status: Expired — past its valid-until date; a new letter is needed' });
    const record = mark.closest('article')!;
    expect(
      within(record).getByText(
        'This letter was valid until 13 April 2026 and has expired, so no letter is in force. Write a new letter if Maya Torres is still cleared.',
      ),
    ).toBeInTheDocument();
    expect(record.querySelector('svg[data-shape="expired"]')).not.toBeNull();
    expect(screen.queryByRole('img', { name: /Letter status: Signed/ })).not.toBeInTheDocument();
    expect(container.querySelectorAll('article')).toHaveLength(1);
  });

  it('marks an out-of-date letter, and one click opens the updated letter filled in from what is in force today', async () => {
    const signed: LetterDto = {
      ...draft,
      status: 'signed',
      signature: 'Priya Raman',
      signedAt: '2026-03-12T15:00:00.000Z',
      outOfDate: true,
    };
    fetchMock.mockImplementation(async (input) => {
      if (String(input).includes('/letters/prefill')) {
        return jsonResponse(200, {
          athleteId: MAYA,
          status: 'limited',
          decision: 'limited',
          effectiveFrom: '2026-03-20',
          validUntil: '2026-04-20',
          limits: ['Hinge: up to 50% of your best lift'],
          credential: 'PT',
          licenceNumber: 'PT-448812',
        });
      }
      return jsonResponse(200, [signed]);
    });
    renderSection();
    expect(await screen.findByText('Out of date')).toBeInTheDocument();
    expect(screen.getByText('Out of date: the plan or status changed after this letter was signed')).toBeInTheDocument();

    fireEvent.click(screen.getByRole('button', { name: 'Write the updated letter' }));
    const form = await screen.findByRole('form', { name: 'Write a clearance letter for Maya Torres' });
    expect(within(form).getByRole('radio', { name: 'Limited participation' })).toBeChecked();
    expect(within(form).getByLabelText('From')).toHaveValue('2026-03-20');
    expect(within(form).getByLabelText('Valid until (next review)')).toHaveValue('2026-04-20');
    expect(within(form).getByLabelText('Credential')).toHaveValue('PT');
    expect(within(form).getByText('Hinge: up to 50% of your best lift')).toBeInTheDocument();
    expect(String(fetchMock.mock.calls.find(([i]) => String(i).includes('prefill'))?.[0])).toBe(
      `/api/orgs/${ORG}/letters/prefill?athleteId=${MAYA}`,
    );
  });

  it('shows no out-of-date mark on a letter that still states what is in force', async () => {
    fetchMock.mockResolvedValue(jsonResponse(200, [{ ...draft, status: 'signed', signedAt: '2026-03-12T15:00:00.000Z' }]));
    renderSection();
    expect(await screen.findByRole('img', { name: /Letter status: Signed/ })).toBeInTheDocument();
    expect(screen.queryByText('Out of date')).not.toBeInTheDocument();
    expect(screen.queryByRole('button', { name: 'Write the updated letter' })).not.toBeInTheDocument();
  });
});
