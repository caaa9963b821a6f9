import type { LetterDto } from '../../../../../policies/dto';
import { buttonClass } from '../../../components/ui/Button';
import { ErrorNotice } from '../../../components/ui/Notice';
import { Loading } from '../../../components/ui/Panel';
import { StatusMark } from '../../../components/ui/StatusMark';
import { isApiError } from '../../../lib/api-client';
import { currentLetter, expiredLetter, letterPdfHref, scheduledLetters, useLetters } from '../api/get-letters';
import { LetterStatusMark } from './LetterMarks';
import { LimitsList } from './LetterRecord';
import { dayOf, letterDates, takesEffect, validUntilWords } from './letter-words';
import { nameWithCredential } from '../../../../../policies/letters';
import { describeDate } from '../../../../../policies/load/describe';

/**
 * The letter in force (or the expired one, said so), for the athlete (their own) and the coach
 * (a care-team athlete): decision, dates, limits and the PDF. A letter signed to start later is named beneath it (or shown on its own,
 * said so, when none is in force yet). Drafts never show here; the section stays out for a reader
 * refused the letters.
 */
export function CurrentLetter({ orgId, athleteId, audience }: { orgId: string; athleteId: string; audience: 'athlete' | 'coach' }) {
  const letters = useLetters(orgId, athleteId);
  if (letters.isPending) return <Loading what="the clearance letter" />;
  // Without signal, the athlete's copy from the last visit still serves (lib/offline-copy.ts).
  if (letters.isError && !letters.data) {
    return isApiError(letters.error) && (letters.error.status === 403 || letters.error.status === 404) ? null : (
      <ErrorNotice error={letters.error} />
    );
  }
  const current = currentLetter(letters.data);
  // An expired letter is not in force, but it is the latest word: shown, said so, until a new one is signed.
  const shown = current ?? expiredLetter(letters.data);
  const next = scheduledLetters(letters.data)[0];
  if (!shown && next) return <LetterSummary orgId={orgId} letter={next} audience={audience} />;
  if (!shown) {
    return (
      <p className="text-sm text-ink-2">
        {audience === 'athlete'
          ? 'No clearance letter yet. When your clinician signs one, it appears here and is e-mailed to you.'
          : 'No signed clearance letter. Program under the limits the clinician has set.'}
      </p>
    );
  }
  return (
    <div className="space-y-3">
      <LetterSummary orgId={orgId} letter={shown} audience={audience} />
      {next && (
        <p className={audience === 'athlete' ? 'text-base font-semibold' : 'text-sm font-semibold'}>
          A new letter is signed and takes effect on {describeDate(next.effectiveFrom)}
          {current ? '; this one stays in force until then.' : '.'}
        </p>
      )}
    </div>
  );
}

function LetterSummary({ orgId, letter, audience }: { orgId: string; letter: LetterDto; audience: 'athlete' | 'coach' }) {
  return (
    <div className="space-y-3">
      <StatusMark status={letter.decision} size={audience === 'athlete' ? 'lg' : 'sm'} explain />
      <p className={audience === 'athlete' ? 'text-base' : 'text-sm'}>{letterDates(letter)}.</p>
      {letter.status === 'scheduled' && (
        <p className={audience === 'athlete' ? 'text-base font-semibold' : 'text-sm font-semibold'}>{takesEffect(letter)}.</p>
      )}
      {letter.status === 'expired' && (
        <>
          <LetterStatusMark status="expired" />
          <p className={audience === 'athlete' ? 'text-base font-semibold' : 'text-sm font-semibold'}>
            {validUntilWords(letter)} and has expired.{' '}
            {audience === 'athlete' ? 'Ask your clinician for a new letter.' : 'No letter is in force until the clinician signs a new one.'}
          </p>
        </>
      )}
      {letter.outOfDate && (
        <p className={audience === 'athlete' ? 'text-base font-semibold' : 'text-sm font-semibold'}>
          A newer decision exists: the clinician has changed what {audience === 'athlete' ? 'you may' : 'this athlete may'} do since signing
          this letter, and an updated letter will follow.{' '}
          {audience === 'athlete' ? 'Follow your plan as it is now.' : 'Program under the limits in force now.'}
        </p>
      )}
      {letter.decision === 'limited' && <LimitsList limits={letter.limits} large={audience === 'athlete'} />}
      {audience === 'athlete' && letter.familyNote && (
        <div className="text-base">
          <p className="font-semibold">From your clinician</p>
          <p className="mt-1 border-l-2 border-rule pl-3 whitespace-pre-wrap">{letter.familyNote}</p>
        </div>
      )}
      <p className="text-sm text-ink-2">
        Signed by {nameWithCredential(letter.clinicianName, letter.credential)}
        {letter.signedAt ? `, on ${dayOf(letter.signedAt)}` : ''}.
      </p>
      <a href={letterPdfHref(orgId, letter.id)} download className={buttonClass('secondary', audience === 'athlete' ? 'lg' : 'md')}>
        Download the letter (PDF)
      </a>
    </div>
  );
}
