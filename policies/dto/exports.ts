/** A member's private calendar feed (iCalendar, RFC 5545). The URL holds a secret and is shown only when made. */
export interface CalendarFeedDto {
  on: boolean;
  /** When the live address was made (ISO instant), or null when the feed is off. */
  since: string | null;
  /** The feed's address: only in the answer that made it, since only the token's hash is kept. */
  url?: string;
}
