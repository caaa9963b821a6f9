import { useState } from 'react';
import { asSubject } from '../../../../../policies/access';
import type { LetterDto } from '../../../../../policies/dto';
import { useAppAbility } from '../../../lib/ability';
import { useCurrentMembership } from '../../../lib/membership-context';
import { Button } from '../../../components/ui/Button';
import { ErrorNotice } from '../../../components/ui/Notice';
import { Loading, Panel } from '../../../components/ui/Panel';
import { useLetterPrefill } from '../api/get-letter-prefill';
import { currentLetter, expiredLetter, scheduledLetters, useLetters } from '../api/get-letters';
import { DraftLetter } from './DraftLetter';
import { LetterCaution } from './LetterCaution';
import { LetterRecord } from './LetterRecord';
import { VerificationCodeNotice } from './VerificationCodeNotice';
import { WriteLetterForm } from './WriteLetterForm';

/** The updated letter's form, once the server has filled it in from what is in force today. */
function UpdatedLetterForm({
  orgId,
  athleteId,
  athleteName,
  signer,
  onDone,
}: {
  orgId: string;
  athleteId: string;
  athleteName: string;
  signer: { credential: string; licenceNumber: string };
  onDone: () => void;
}) {
  const prefill = useLetterPrefill(orgId, athleteId);
  if (prefill.isPending) return <Loading what="what is in force today" />;
  if (prefill.isError) return <ErrorNotice error={prefill.error} />;
  return (
    <WriteLetterForm
      orgId={orgId}
      athleteId={athleteId}
      athleteName={athleteName}
      signer={signer}
      prefill={prefill.data}
      onSaved={onDone}
      onCancel={onDone}
    />
  );
}

/**
 * The clinician's "Clearance letters" section for one athlete: drafts (editable, previewable,
 * signable), letters signed to start later, the letter in force with its deliveries and
 * acknowledgements (or the expired one that was, asking for a new letter), and earlier letters.
 */
export function ClearanceLetters({ orgId, athleteId, athleteName }: { orgId: string; athleteId: string; athleteName: string }) {
  const { user } = useCurrentMembership();
  const ability = useAppAbility();
  const letters = useLetters(orgId, athleteId, { followDeliveries: true });
  // 'updated': the updated letter, filled in from what is in force today (the letter in force is out of date).
  const [writing, setWriting] = useState<false | 'new' | 'updated'>(false);
  // Held here, not in the draft: the draft becomes a signed letter the moment the list refreshes.
  const [justSigned, setJustSigned] = useState<LetterDto | null>(null);
  const scope = { organizationId: orgId, athleteId };
  const canWrite = ability.can('create', asSubject('Letter', { id: '', ...scope }));
  const canEdit = ability.can('update', asSubject('Letter', { id: '', ...scope }));

  const all = letters.data ?? [];
  const drafts = all.filter((l) => l.status === 'draft');
  const current = currentLetter(all);
  const expired = expiredLetter(all);
  const upcoming = scheduledLetters(all);
  const earlier = all.filter((l) => l.status === 'superseded');
  const mine = all.find((l) => l.clinicianName === user.displayName);
  const byId = new Map(all.map((l) => [l.id, l]));
  // One updated letter at a time: not while writing, nor while a draft waits to be signed.
  const updatable = canWrite && !writing && drafts.length === 0;

  return (
    <Panel
      title="Clearance letters"
      actions={
        canWrite &&
        !writing && (
          <Button onClick={() => setWriting('new')} variant="primary">
            Write a clearance letter
          </Button>
        )
      }
    >
      <div className="space-y-4">
        <LetterCaution audience="clinician" />
        {justSigned?.verificationCode && (
          <VerificationCodeNotice code={justSigned.verificationCode} athleteName={athleteName} onDone={() => setJustSigned(null)} />
        )}
        {writing && (
          <section aria-label="New clearance letter" className="rounded-md border border-rule-strong p-3 sm:p-4">
            <h3 className="mb-3 text-base font-bold">
              {writing === 'updated' ? 'Updated' : 'New'} clearance letter for {athleteName}
            </h3>
            {writing === 'updated' ? (
              <UpdatedLetterForm
                orgId={orgId}
                athleteId={athleteId}
                athleteName={athleteName}
                signer={{ credential: mine?.credential ?? '', licenceNumber: mine?.licenceNumber ?? '' }}
                onDone={() => setWriting(false)}
              />
            ) : (
              <WriteLetterForm
                orgId={orgId}
                athleteId={athleteId}
                athleteName={athleteName}
                signer={{ credential: mine?.credential ?? '', licenceNumber: mine?.licenceNumber ?? '' }}
                onSaved={() => setWriting(false)}
                onCancel={() => setWriting(false)}
              />
            )}
          </section>
        )}
        {letters.isPending ? (
          <Loading what="clearance letters" />
        ) : letters.isError ? (
          <ErrorNotice error={letters.error} />
        ) : all.length === 0 && !writing ? (
          <p className="text-sm text-ink-2">
            No clearance letter yet. Write one when {athleteName} is ready to return, fully or within named limits.
          </p>
        ) : (
          <>
            {drafts.map((draft) =>
              canEdit ? (
                <DraftLetter
                  key={draft.id}
                  orgId={orgId}
                  letter={draft}
                  signerName={user.displayName}
                  replaces={current}
                  onSigned={setJustSigned}
                />
              ) : (
                <LetterRecord key={draft.id} orgId={orgId} letter={draft} />
              ),
            )}
            {upcoming.map((l) => (
              <LetterRecord key={l.id} orgId={orgId} letter={l} onWriteUpdated={updatable ? () => setWriting('updated') : undefined} />
            ))}
            {current && (
              <LetterRecord orgId={orgId} letter={current} onWriteUpdated={updatable ? () => setWriting('updated') : undefined} />
            )}
            {expired && <LetterRecord orgId={orgId} letter={expired} />}
            {earlier.length > 0 && (
              <details className="rounded-md border border-rule">
                <summary className="cursor-pointer px-3 py-2 text-sm font-semibold">Earlier letters, superseded ({earlier.length})</summary>
                <div className="space-y-3 p-3 pt-0">
                  {earlier.map((l) => (
                    <LetterRecord key={l.id} orgId={orgId} letter={l} supersededBy={l.supersededBy ? byId.get(l.supersededBy) : null} />
                  ))}
                </div>
              </details>
            )}
          </>
        )}
      </div>
    </Panel>
  );
}
