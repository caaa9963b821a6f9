/**
 * Loadline's one way of writing dates for people: "Thu 3 Dec 2026" for a calendar day, and
 * "3 Dec 2026, 14:05" for an instant in the reader's zone. Screens, notices and e-mails use these, so
 * an ISO date (2026-12-03) never sits inside a sentence. Pure (Intl only): both sides import it.
 */

const MONTHS = ['Jan', 'Feb', 'Mar', 'Apr', 'May', 'Jun', 'Jul', 'Aug', 'Sep', 'Oct', 'Nov', 'Dec'] as const;
const WEEKDAYS = ['Sun', 'Mon', 'Tue', 'Wed', 'Thu', 'Fri', 'Sat'] as const;
const ISO_DAY = /^(\d{4})-(\d{2})-(\d{2})$/;

/** Any YYYY-MM-DD run inside a text: what must never be shown to people in a sentence. */
export const ISO_DATE_IN_TEXT = /\d{4}-\d{2}-\d{2}/;

/** 'YYYY-MM-DD' → its parts, or null when it is not a real calendar day. */
function dayParts(isoDate: string): { y: number; m: number; d: number } | null {
  const match = ISO_DAY.exec(isoDate);
  if (!match) return null;
  const [y, m, d] = match.slice(1).map(Number);
  const probe = new Date(Date.UTC(y, m - 1, d));
  if (probe.getUTCFullYear() !== y || probe.getUTCMonth() !== m - 1 || probe.getUTCDate() !== d) return null;
  return { y, m, d };
}

/**
 * A calendar day → 'Thu 3 Dec 2026'. A day is not an instant: no time zone takes part, so no day is
 * shifted. Text that is not a calendar day comes back as it is (never a plausible wrong date).
 */
export function humanDate(isoDate: string): string {
  const p = dayParts(isoDate);
  if (!p) return isoDate;
  const weekday = WEEKDAYS[new Date(Date.UTC(p.y, p.m - 1, p.d)).getUTCDay()];
  return `${weekday} ${p.d} ${MONTHS[p.m - 1]} ${p.y}`;
}

/** A calendar day without its weekday, for tight columns and ranges: '3 Dec 2026'. */
export function humanDay(isoDate: string): string {
  const p = dayParts(isoDate);
  return p ? `${p.d} ${MONTHS[p.m - 1]} ${p.y}` : isoDate;
}

/** The wall-clock parts of an instant in a zone (Intl only for the numbers; the words are ours). */
function clockParts(instant: Date, timeZone: string) {
  const parts = new Intl.DateTimeFormat('en-GB', {
    timeZone,
    year: 'numeric',
    month: 'numeric',
    day: 'numeric',
    hour: '2-digit',
    minute: '2-digit',
    hourCycle: 'h23',
  }).formatToParts(instant);
  const get = (type: Intl.DateTimeFormatPartTypes) => Number(parts.find((p) => p.type === type)?.value);
  return { y: get('year'), m: get('month'), d: get('day'), hh: get('hour'), mm: get('minute') };
}

/** An instant → '3 Dec 2026, 14:05' on the wall clock of `timeZone` (an IANA zone). */
export function humanDateTime(instant: Date | string, timeZone: string): string {
  const at = typeof instant === 'string' ? new Date(instant) : instant;
  if (Number.isNaN(at.getTime())) return String(instant);
  const { y, m, d, hh, mm } = clockParts(at, timeZone);
  return `${d} ${MONTHS[m - 1]} ${y}, ${String(hh).padStart(2, '0')}:${String(mm).padStart(2, '0')}`;
}

/** Every ISO day inside a text written out in words: for sentences built from stored text. */
export function humanizeIsoDates(text: string): string {
  return text.replace(/\b(\d{4}-\d{2}-\d{2})\b/g, (iso) => humanDate(iso));
}
