import { DEFAULT_TIME_ZONE, addDays, dayIn, orgToday } from '../../../policies/today';

/**
 * Days on screen are the organization's days (policies/today.ts): the athlete, the coach and the
 * clinician of one organization share one "today" wherever their browsers are, and the server counts
 * the same one. The browser's own zone only turns an instant into a clock time (lib/format.ts).
 *
 * The zone is that of the organization in view. The signed-in layout hands it over here whenever the
 * person's current organization changes, as the CSRF token is handed to the API client: every "today"
 * then reads it without each component and helper having to carry it.
 */
let orgZone: string | null = null;

/** Called by the signed-in layout with the current organization's zone (null when there is none). */
export function setOrgTimeZone(timeZone: string | null): void {
  orgZone = timeZone;
}

/** The zone of the organization in view, or null outside one (signed out, or in no organization). */
export function currentOrgTimeZone(): string | null {
  return orgZone;
}

/** The organization's today as 'YYYY-MM-DD'. `now` is there for tests; they pin the clock instead. */
export function todayLocal(now: Date = new Date()): string {
  return orgToday(orgZone ?? DEFAULT_TIME_ZONE, now);
}

/** The organization's calendar day of an instant, e.g. the day a letter was signed. */
export function orgDayOf(instant: string): string {
  return dayIn(orgZone ?? DEFAULT_TIME_ZONE, new Date(instant));
}

/** Calendar arithmetic on 'YYYY-MM-DD' days: no time zone takes part, so no day is skipped or repeated. */
export function addDaysIso(isoDate: string, days: number): string {
  return addDays(isoDate, days);
}
