import { isValid, parseISO } from 'date-fns';
import { dayIn, zoneDiffers } from '../../../policies/today';
import { humanDate, humanDateTime } from '../../../policies/words/dates';
import { currentOrgTimeZone } from './dates';

/**
 * '2026-12-03' → 'Thu 3 Dec 2026': the client's one way of showing a calendar day (policies/words/dates.ts,
 * which notices and e-mails use too). A day is never shifted by a zone.
 */
export function formatDate(isoDate: string | null | undefined): string {
  if (!isoDate) return '—';
  if (isoDate.length <= 10) return humanDate(isoDate);
  // An instant given where a day is meant: the reader's calendar day of it.
  const parsed = parseISO(isoDate);
  return isValid(parsed) ? humanDate(dayIn(readerTimeZone(), parsed)) : isoDate;
}

/** The zone the reader's browser is in. */
function readerTimeZone(): string {
  return Intl.DateTimeFormat().resolvedOptions().timeZone;
}

/** The reader's zone at an instant, as the short name people see on clocks: 'UTC', 'GMT+11', 'BST'. */
function zoneName(timeZone: string, instant: Date): string {
  const parts = new Intl.DateTimeFormat('en-GB', { timeZone, timeZoneName: 'short' }).formatToParts(instant);
  return parts.find((p) => p.type === 'timeZoneName')?.value ?? timeZone;
}

/**
 * An instant → '14 Mar 2025, 09:30' in the reader's own time zone (policies/words/dates.ts). When the reader's clock differs
 * from the organization's, the zone is named ('14 Mar 2025, 17:30 UTC'), so nobody takes it for
 * the organization's time. `orgZone` defaults to the organization in view (lib/dates.ts).
 */
export function formatDateTime(isoInstant: string | null | undefined, orgZone: string | null = currentOrgTimeZone()): string {
  if (!isoInstant) return '—';
  const parsed = parseISO(isoInstant);
  if (!isValid(parsed)) return isoInstant;
  const reader = readerTimeZone();
  const shown = humanDateTime(parsed, reader);
  return orgZone && zoneDiffers(reader, orgZone, parsed) ? `${shown} ${zoneName(reader, parsed)}` : shown;
}

export function joinNames(names: string[]): string {
  if (names.length <= 1) return names[0] ?? '';
  return `${names.slice(0, -1).join(', ')} and ${names[names.length - 1]}`;
}
