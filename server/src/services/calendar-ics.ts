import { createEvents, type EventAttributes } from 'ics';
import { addDays } from '../../../policies/today';

/** One all-day entry of a calendar feed. Sessions carry a date but no time of day, so every entry is all-day. */
export interface FeedEvent {
  /** Stable across fetches and edits, so a calendar updates the entry rather than adding another. */
  uid: string;
  /** First day, YYYY-MM-DD. */
  date: string;
  /** Last day, inclusive (a one-day entry has date = lastDate). */
  lastDate: string;
  summary: string;
  description: string;
  /** When the record behind the entry last changed: DTSTAMP and LAST-MODIFIED. */
  changedAt: Date;
  /** Grows with each edit of the record (SEQUENCE). */
  sequence: number;
  /** A held session: the coach is changing it. */
  tentative?: boolean;
}

const dateArray = (iso: string): [number, number, number] => {
  const [y, m, d] = iso.split('-').map(Number);
  return [y, m, d];
};

/**
 * The feed as iCalendar text (RFC 5545), written by the `ics` library: CRLF line ends, folded lines,
 * escaped text, UID and DTSTAMP on every event. An all-day DTEND is the day after the last day
 * (exclusive, RFC 5545 §3.6.1). DTSTAMP is the record's last change rather than the fetch time: for
 * an object without a scheduling METHOD the RFC reads it as "last revised", and a feed that does not
 * change between fetches lets calendars skip the work.
 */
export function writeIcs(calName: string, events: FeedEvent[]): string {
  const attributes = events.map(
    (e) =>
      ({
        uid: e.uid,
        start: dateArray(e.date),
        end: dateArray(addDays(e.lastDate, 1)),
        title: e.summary,
        description: e.description,
        sequence: e.sequence,
        // `timestamp` (DTSTAMP) is in the library's schema but not in its type definitions.
        timestamp: e.changedAt.getTime(),
        lastModified: e.changedAt.getTime(),
        status: e.tentative ? 'TENTATIVE' : 'CONFIRMED',
        classification: 'PRIVATE',
        // All-day entries that do not block the day as busy for meetings.
        transp: 'TRANSPARENT',
      }) as EventAttributes & { timestamp: number },
  );
  const { error, value } = createEvents(attributes, { productId: '-//Loadline//Calendar feed//EN', calName });
  if (error || value === null) throw error ?? new Error('the calendar feed could not be written');
  return value;
}
