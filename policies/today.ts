/**
 * The one meaning of "today" in Loadline: the organization's local calendar day.
 *
 * Every date a person reads or types (a session's date, when a status starts, "this morning", "this
 * week") is a plain `YYYY-MM-DD` day in the organization's IANA time zone, because the people
 * around one athlete live by the same wall clock: an emergency report at 6 pm in California is Out
 * from that evening, not from tomorrow (the UTC day). Timestamps stay in UTC; only days are local.
 *
 * Both sides import this module; the server passes the organization's zone, the client the zone of
 * the organization in view. Nothing else in the code base may derive a day from `Date`.
 */

/** The zone used when an organization has none (old rows) or an unknown one is given. */
export const DEFAULT_TIME_ZONE = 'UTC';

const formatters = new Map<string, Intl.DateTimeFormat>();

function dayFormatter(timeZone: string): Intl.DateTimeFormat {
  let f = formatters.get(timeZone);
  if (!f) {
    f = new Intl.DateTimeFormat('en-CA', { timeZone, year: 'numeric', month: '2-digit', day: '2-digit' });
    formatters.set(timeZone, f);
  }
  return f;
}

/** True for a zone name this runtime knows (the IANA database shipped with Node and browsers). */
export function isTimeZone(name: string): boolean {
  if (typeof name !== 'string' || name.length === 0 || name.length > 64) return false;
  try {
    dayFormatter(name);
    return true;
  } catch {
    return false;
  }
}

/** The calendar day of `instant` in `timeZone`, as `YYYY-MM-DD`. */
export function dayIn(timeZone: string, instant: Date = new Date()): string {
  const zone = isTimeZone(timeZone) ? timeZone : DEFAULT_TIME_ZONE;
  const parts = dayFormatter(zone).formatToParts(instant);
  const get = (type: string) => parts.find((p) => p.type === type)?.value ?? '';
  return `${get('year')}-${get('month')}-${get('day')}`;
}

/** The organization's today. `now` is injectable so tests pin the clock. */
export function orgToday(timeZone: string, now: Date = new Date()): string {
  return dayIn(timeZone, now);
}

/** Adds whole days to a `YYYY-MM-DD` day (calendar arithmetic, no time zone involved). */
export function addDays(day: string, days: number): string {
  const d = new Date(`${day}T00:00:00Z`);
  d.setUTCDate(d.getUTCDate() + days);
  return d.toISOString().slice(0, 10);
}

/** The hour (0–23) on the organization's wall clock at `instant`, e.g. to ask the next-morning question. */
export function hourIn(timeZone: string, instant: Date = new Date()): number {
  const zone = isTimeZone(timeZone) ? timeZone : DEFAULT_TIME_ZONE;
  const h = new Intl.DateTimeFormat('en-GB', { timeZone: zone, hour: '2-digit', hourCycle: 'h23' }).format(instant);
  return Number(h);
}

/** True when the two zones show different wall-clock offsets at `instant` (then a time is shown with its zone). */
export function zoneDiffers(readerZone: string, orgZone: string, instant: Date = new Date()): boolean {
  const fmt = (z: string) =>
    new Intl.DateTimeFormat('en-GB', { timeZone: isTimeZone(z) ? z : DEFAULT_TIME_ZONE, timeZoneName: 'longOffset' }).format(instant);
  return fmt(readerZone) !== fmt(orgZone);
}
