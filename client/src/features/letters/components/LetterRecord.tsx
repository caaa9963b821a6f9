import { useId } from 'react';
import type { LetterDto } from '../../../../../policies/dto';
import { describeDate } from '../../../../../policies/load/describe';
import { formatDateTime } from '../../../lib/format';
import { Button } from '../../../components/ui/Button';
import { cx } from '../../../components/ui/cx';
import { Facts } from '../../../components/ui/Panel';
import { letterPdfHref } from '../api/get-letters';
import { LetterStatusMark } from './LetterMarks';
import { DECISION_WORDS, dayOf, deliveryWords, takesEffect, validUntilWords, type Delivery } from './letter-words';

/**
 * A signed, scheduled, expired or superseded letter as the care team's record: contents, who it went
 * to, who has read it — and, when the plan or status has changed since it was signed, that it is out
 * of date, with the one click that writes the updated letter (`onWriteUpdated`, for those who may).
 */
export function LetterRecord({
  orgId,
  letter,
  supersededBy,
  onWriteUpdated,
}: {
  orgId: string;
  letter: LetterDto;
  supersededBy?: LetterDto | null;
  onWriteUpdated?: () => void;
}) {
  const headingId = useId();
  return (
    <article
      aria-labelledby={headingId}
      className={cx(
        'rounded-md border p-3 sm:p-4',
        letter.status === 'signed' || letter.status === 'scheduled' ? 'border-ink' : 'border-rule',
      )}
    >
      <header className="mb-3 flex flex-wrap items-center justify-between gap-2">
        <h3 id={headingId} className="text-base font-bold">
          {DECISION_WORDS[letter.decision]}{' '}
          <span className="font-normal text-ink-2 tabular-nums">from {describeDate(letter.effectiveFrom)}</span>
        </h3>
        <span className="flex flex-wrap items-center gap-3">
          {letter.outOfDate && <OutOfDateMark />}
          <LetterStatusMark status={letter.status} />
        </span>
      </header>
      {letter.outOfDate && (
        <div className="mb-3 rounded-md border border-l-8 border-line bg-sheet px-4 py-3 text-sm">
          <p className="font-semibold">Out of date: the plan or status changed after this letter was signed</p>
          <p className="mt-1 text-ink-2">
            It no longer states what {letter.athleteName || 'the athlete'} may do now. The family and anyone checking its code are told that
            a newer decision exists, without any detail. Signing the updated letter replaces this one.
          </p>
          {onWriteUpdated && (
            <Button className="mt-2" onClick={onWriteUpdated}>
              Write the updated letter
            </Button>
          )}
        </div>
      )}
      {letter.status === 'scheduled' && (
        <p className="mb-3 text-sm text-ink-2">{takesEffect(letter)}. Until then, any earlier letter stays in force.</p>
      )}
      {letter.status === 'expired' && (
        <p className="mb-3 text-sm font-semibold">
          {validUntilWords(letter)} and has expired, so no letter is in force. Write a new letter if {letter.athleteName || 'the athlete'}{' '}
          is still cleared.
        </p>
      )}
      {letter.status === 'superseded' && (
        <p className="mb-3 text-sm text-ink-2">
          Replaced by {supersededBy?.signedAt ? `the letter signed on ${dayOf(supersededBy.signedAt)}` : 'a later letter'}.
        </p>
      )}
      <div className="grid gap-4 md:grid-cols-2">
        <div className="space-y-3">
          <Facts
            items={[
              { label: 'From', value: describeDate(letter.effectiveFrom) },
              { label: 'Valid until', value: letter.validUntil ? describeDate(letter.validUntil) : 'no end date' },
              { label: 'Signed', value: `${letter.signature ?? letter.clinicianName}, ${formatDateTime(letter.signedAt)}` },
              { label: 'Credential', value: `${letter.credential} · licence ${letter.licenceNumber}` },
            ]}
          />
          {letter.decision === 'limited' && <LimitsList limits={letter.limits} />}
          {letter.familyNote && (
            <div className="text-sm">
              <p className="text-muted">Note for the family</p>
              <p className="mt-0.5 whitespace-pre-wrap">{letter.familyNote}</p>
            </div>
          )}
          <p className="text-sm">
            <a href={letterPdfHref(orgId, letter.id)} download className="font-semibold">
              Download the letter (PDF)
            </a>
          </p>
        </div>
        <div className="space-y-3">
          {letter.deliveries && <DeliveryList deliveries={letter.deliveries} />}
          <Acknowledgements letter={letter} />
        </div>
      </div>
    </article>
  );
}

/** "Out of date" as a word with a broken-line glyph: never colour alone. */
export function OutOfDateMark() {
  return (
    <span className="inline-flex items-center gap-1.5 font-semibold whitespace-nowrap text-line-deep">
      <svg width="16" height="16" viewBox="0 0 24 24" aria-hidden="true" focusable="false">
        <path d="M12 3 L22 20 H2 Z" fill="none" stroke="currentColor" strokeWidth="2.2" strokeLinejoin="round" />
        <path d="M12 9.5 V14" stroke="currentColor" strokeWidth="2.4" strokeLinecap="round" />
        <circle cx="12" cy="17" r="1.3" fill="currentColor" />
      </svg>
      <span>Out of date</span>
    </span>
  );
}

export function LimitsList({ limits, large }: { limits: string[]; large?: boolean }) {
  if (limits.length === 0) return <p className="text-sm text-ink-2">No limits are listed on this letter.</p>;
  return (
    <div>
      <p className={large ? 'font-semibold' : 'text-sm text-muted'}>Limits</p>
      <ul className={cx('mt-1 space-y-1', large ? 'text-base' : 'text-sm')}>
        {limits.map((limit, i) => (
          <li key={i} className="border-l-4 border-line py-0.5 pl-2">
            {limit}
          </li>
        ))}
      </ul>
    </div>
  );
}

function DeliveryGlyph({ state }: { state: 'sent' | 'waiting' | 'failed' }) {
  // Filled dot for sent, open dot for waiting, a triangle for a failure: readable without colour.
  return (
    <svg width="12" height="12" viewBox="0 0 12 12" aria-hidden="true" focusable="false" className="mt-1 shrink-0">
      {state === 'sent' ? (
        <circle cx="6" cy="6" r="5" fill="currentColor" />
      ) : state === 'waiting' ? (
        <circle cx="6" cy="6" r="4.2" fill="none" stroke="currentColor" strokeWidth="1.6" />
      ) : (
        <path d="M6 1 L11.2 10.8 H0.8 Z" fill="currentColor" />
      )}
    </svg>
  );
}

/** One line per recipient: the address, then Sent / Queued / Failed in words, with the reason for a failure. */
export function DeliveryList({ deliveries }: { deliveries: Delivery[] }) {
  return (
    <div className="text-sm">
      <p className="text-muted">E-mailed to</p>
      {deliveries.length === 0 ? (
        <p className="mt-0.5 text-ink-2">Nobody: no recipient had an e-mail address on record.</p>
      ) : (
        <ul className="mt-1 space-y-1.5">
          {deliveries.map((d) => {
            const words = deliveryWords(d);
            return (
              <li key={d.id} className={cx('flex items-start gap-2', words.state === 'failed' && 'text-line-deep')}>
                <DeliveryGlyph state={words.state} />
                <span className="min-w-0">
                  <span className="break-all">{d.to}</span>
                  {' — '}
                  <span className="font-semibold">{words.word}</span>
                  {words.detail && (
                    <span className={cx('block tabular-nums', words.state !== 'failed' && 'text-ink-2')}>{words.detail}</span>
                  )}
                </span>
              </li>
            );
          })}
        </ul>
      )}
    </div>
  );
}

function Acknowledgements({ letter }: { letter: LetterDto }) {
  return (
    <div className="text-sm">
      <p className="text-muted">Read by the family</p>
      {letter.acknowledgements.length === 0 ? (
        <p className="mt-0.5 text-ink-2">No guardian has acknowledged it yet.</p>
      ) : (
        <ul className="mt-1 space-y-0.5">
          {letter.acknowledgements.map((a) => (
            <li key={a.guardianId} className="tabular-nums">
              Acknowledged by {a.guardianName}, {formatDateTime(a.acknowledgedAt)}
            </li>
          ))}
        </ul>
      )}
    </div>
  );
}
