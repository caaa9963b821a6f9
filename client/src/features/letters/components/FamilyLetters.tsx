import { useId } from 'react';
import type { LetterDto } from '../../../../../policies/dto';
import { describeDate } from '../../../../../policies/load/describe';
import { Button, buttonClass } from '../../../components/ui/Button';
import { ErrorNotice } from '../../../components/ui/Notice';
import { Loading } from '../../../components/ui/Panel';
import { StatusMark } from '../../../components/ui/StatusMark';
import { useAcknowledgeLetter } from '../api/acknowledge-letter';
import { currentLetter, expiredLetter, letterPdfHref, scheduledLetters, useLetters } from '../api/get-letters';
import { LetterCaution } from './LetterCaution';
import { LetterStatusMark } from './LetterMarks';
import { LimitsList } from './LetterRecord';
import { DECISION_WORDS, dayOf, letterDates, takesEffect, validUntilWords } from './letter-words';
import { nameWithCredential } from '../../../../../policies/letters';

/**
 * "Letters" on the guardian's phone: the letter in force (or the expired one, said so) for each linked
 * athlete, large and plain, with the PDF and "I have read this letter", then any letter signed to start
 * later (said so on it). Earlier, superseded letters fold away beneath.
 */
export function FamilyLetters({
  orgId,
  guardianId,
  athletes,
}: {
  orgId: string;
  /** The reader's membership: their own acknowledgement is the one that counts here. */
  guardianId: string;
  athletes: Array<{ id: string; name: string }>;
}) {
  const headingId = useId();
  const letters = useLetters(orgId, null);
  const several = athletes.length > 1;

  return (
    <section aria-labelledby={headingId} className="rounded-lg border border-rule bg-sheet p-4 sm:p-5">
      <h2 id={headingId} className="text-xl font-bold">
        Letters
      </h2>
      <p className="mt-1 text-sm text-ink-2">Clearance letters signed by the clinician. Each one is also e-mailed to you.</p>
      <div className="mt-4 space-y-5">
        {letters.isPending ? (
          <Loading what="letters" />
        ) : letters.isError && !letters.data ? (
          <ErrorNotice error={letters.error} />
        ) : (
          athletes.map((athlete) => {
            const theirs = letters.data.filter((l) => l.athleteId === athlete.id && l.status !== 'draft');
            const current = currentLetter(theirs);
            const expired = expiredLetter(theirs);
            const upcoming = scheduledLetters(theirs);
            const earlier = theirs.filter((l) => l.status === 'superseded');
            return (
              <div key={athlete.id} className="space-y-3">
                {several && <h3 className="text-lg font-bold">{athlete.name}</h3>}
                {theirs.length === 0 ? (
                  <p className="text-base text-ink-2">
                    No clearance letter for {athlete.name} yet. When the clinician signs one, it appears here.
                  </p>
                ) : (
                  <>
                    {current && <FamilyLetter orgId={orgId} letter={current} guardianId={guardianId} name={athlete.name} />}
                    {expired && <FamilyLetter orgId={orgId} letter={expired} guardianId={guardianId} name={athlete.name} />}
                    {upcoming.map((l) => (
                      <FamilyLetter
                        key={l.id}
                        orgId={orgId}
                        letter={l}
                        guardianId={guardianId}
                        name={athlete.name}
                        afterCurrent={!!current}
                      />
                    ))}
                    {earlier.length > 0 && (
                      <details className="rounded-md border border-rule">
                        <summary className="flex min-h-11 cursor-pointer items-center px-3 text-sm font-semibold">
                          Earlier letters ({earlier.length})
                        </summary>
                        <ul className="space-y-2 px-3 pb-3 text-sm">
                          {earlier.map((l) => (
                            <li key={l.id} className="flex flex-wrap items-center gap-x-3 gap-y-1">
                              <LetterStatusMark status={l.status} />
                              <span>
                                {DECISION_WORDS[l.decision]} from {describeDate(l.effectiveFrom)}
                              </span>
                              <a href={letterPdfHref(orgId, l.id)} download>
                                PDF of the letter from {describeDate(l.effectiveFrom)}
                              </a>
                            </li>
                          ))}
                        </ul>
                      </details>
                    )}
                  </>
                )}
              </div>
            );
          })
        )}
        <LetterCaution audience="family" />
      </div>
    </section>
  );
}

function FamilyLetter({
  orgId,
  letter,
  guardianId,
  name,
  afterCurrent = false,
}: {
  orgId: string;
  letter: LetterDto;
  guardianId: string;
  name: string;
  /** A scheduled letter shown under the one in force, which it leaves in force until it starts. */
  afterCurrent?: boolean;
}) {
  const acknowledge = useAcknowledgeLetter(orgId);
  const mine = letter.acknowledgements.find((a) => a.guardianId === guardianId);

  return (
    <article
      aria-label={letter.status === 'scheduled' ? `Next clearance letter for ${name}` : `Clearance letter for ${name}`}
      className="space-y-3 rounded-md border border-ink p-3 sm:p-4"
    >
      <div className="flex flex-wrap items-center justify-between gap-2">
        <StatusMark status={letter.decision} size="lg" />
        <LetterStatusMark status={letter.status} />
      </div>
      <p className="text-lg font-semibold">
        {name}: {DECISION_WORDS[letter.decision].toLowerCase()}
      </p>
      <p className="text-base tabular-nums">{letterDates(letter)}.</p>
      {letter.outOfDate && (
        <div className="rounded-md border border-l-8 border-line bg-sheet px-4 py-3 text-base">
          <p className="font-semibold">A newer decision exists</p>
          <p className="mt-1">
            The clinician has changed what {name} may do since signing this letter. An updated letter will follow; until then, ask the
            clinician or coach what applies today.
          </p>
        </div>
      )}
      {letter.status === 'expired' && (
        <p className="text-base font-semibold">
          {validUntilWords(letter)} and has expired: it no longer clears {name}. The clinician needs to sign a new letter.
        </p>
      )}
      {letter.status === 'scheduled' && (
        <p className="text-base font-semibold">
          {takesEffect(letter)}.{afterCurrent && ' Until then, the letter above stays in force.'}
        </p>
      )}
      {letter.decision === 'limited' && <LimitsList limits={letter.limits} large />}
      {letter.familyNote && (
        <div className="text-base">
          <p className="font-semibold">From the clinician</p>
          <p className="mt-1 border-l-2 border-rule pl-3 whitespace-pre-wrap">{letter.familyNote}</p>
        </div>
      )}
      <p className="text-sm text-ink-2">
        Signed by {nameWithCredential(letter.clinicianName, letter.credential)}
        {letter.signedAt && `, on ${dayOf(letter.signedAt)}`}.
      </p>
      <div className="flex flex-col gap-2 sm:flex-row sm:flex-wrap">
        <a href={letterPdfHref(orgId, letter.id)} download className={buttonClass('secondary', 'lg')}>
          Download the letter (PDF)
        </a>
        {!mine && (
          <Button size="lg" busy={acknowledge.isPending} onClick={() => acknowledge.mutate(letter.id)}>
            I have read this letter
          </Button>
        )}
      </div>
      {mine ? (
        <p role="status" className="flex items-center gap-2 text-base font-semibold">
          <span aria-hidden="true">✓</span>
          Acknowledged on {dayOf(mine.acknowledgedAt)}
        </p>
      ) : (
        <p className="text-sm text-ink-2">Pressing “I have read this letter” lets the clinician know, with the date.</p>
      )}
      <ErrorNotice error={acknowledge.error} />
    </article>
  );
}
