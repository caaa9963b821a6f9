import type { LetterDto } from '../../../../../policies/dto';
import { describeDate } from '../../../../../policies/load/describe';
import { orgDayOf } from '../../../lib/dates';
import { formatDateTime } from '../../../lib/format';

export type LetterStatus = LetterDto['status'];
export type Delivery = NonNullable<LetterDto['deliveries']>[number];

export const DECISION_WORDS: Record<LetterDto['decision'], string> = {
  full: 'Full participation',
  limited: 'Limited participation',
};

export const DECISION_HINTS: Record<LetterDto['decision'], string> = {
  full: 'Cleared to train and compete without limits.',
  limited: 'Cleared to take part within named limits.',
};

export const LETTER_STATUS_WORDS: Record<LetterStatus, string> = {
  draft: 'Draft',
  scheduled: 'Signed, not yet in force',
  signed: 'Signed',
  expired: 'Expired',
  superseded: 'Superseded',
};

export const LETTER_STATUS_MEANING: Record<LetterStatus, string> = {
  draft: 'not signed, not sent, can still change',
  scheduled: 'signed and sent; takes effect on its start date',
  signed: 'signed, sent and in force',
  expired: 'past its valid-until date; a new letter is needed',
  superseded: 'replaced by a later letter',
};

/** "From 5 March 2026 until 2 April 2026" — or open-ended when no review date was set. */
export function letterDates(letter: Pick<LetterDto, 'effectiveFrom' | 'validUntil'>): string {
  return letter.validUntil
    ? `From ${describeDate(letter.effectiveFrom)} until ${describeDate(letter.validUntil)}`
    : `From ${describeDate(letter.effectiveFrom)}, with no end date set`;
}

/** "Signed, takes effect on 9 December 2026": a signed letter whose start date is still ahead. */
export function takesEffect(letter: Pick<LetterDto, 'effectiveFrom'>): string {
  return `Signed, takes effect on ${describeDate(letter.effectiveFrom)}`;
}

/** "This letter was valid until 30 June 2026": said on an expired letter, before what to do next. */
export function validUntilWords(letter: Pick<LetterDto, 'validUntil'>): string {
  return `This letter was valid until ${letter.validUntil ? describeDate(letter.validUntil) : 'its review date'}`;
}

/** A recipient's delivery in words: sent, waiting, or failed with the reason. */
export function deliveryWords(d: Delivery): { word: string; detail: string | null; state: 'sent' | 'waiting' | 'failed' } {
  switch (d.status) {
    case 'sent':
      return { word: 'Sent', detail: d.sentAt ? formatDateTime(d.sentAt) : null, state: 'sent' };
    case 'failed':
      return { word: 'Failed', detail: d.lastError ? `Not delivered: ${d.lastError}` : 'Not delivered.', state: 'failed' };
    case 'sending':
      return { word: 'Sending', detail: null, state: 'waiting' };
    default:
      return {
        word: 'Queued',
        detail:
          d.attempts > 0
            ? `Will try again (${d.attempts} ${d.attempts === 1 ? 'attempt' : 'attempts'} so far)${d.lastError ? `: ${d.lastError}` : ''}`
            : 'Waiting to be sent.',
        state: 'waiting',
      };
  }
}

export const STALE_LETTER = 'Someone changed this draft after you opened it. Load the latest draft, check it, and make your changes again.';

/** An instant as the organization's calendar day, in words: "6 March 2026". */
export function dayOf(instant: string): string {
  return describeDate(orgDayOf(instant));
}
