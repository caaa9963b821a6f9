import { z } from 'zod';

/**
 * Shared building blocks that bound every value to what its database column can hold, so a request
 * the column would refuse is a 400 naming the field, never a database error (OWASP ASVS 5.0 V2.2.1:
 * input is checked against an allow-list of types, ranges and lengths).
 */

/** PostgreSQL `integer` (int4). */
export const INT4_MIN = -2_147_483_648;
export const INT4_MAX = 2_147_483_647;
/** PostgreSQL `bigint` ids as the API takes them: no further than a JavaScript number stays exact. */
export const BIGINT_ID_MAX = Number.MAX_SAFE_INTEGER;

/** "is required" when the value is missing, else `message`. */
const missingOr = (message: string) => ({ error: (issue: { input?: unknown }) => (issue.input === undefined ? 'is required' : message) });

/** A whole number within `[min, max]`, by default the int4 column range. */
export function wholeNumber(min = INT4_MIN, max = INT4_MAX) {
  return z
    .number(missingOr('must be a number'))
    .int({ message: 'must be a whole number' })
    .min(min, { message: `must be at least ${min}` })
    .max(max, { message: `must be at most ${max}` });
}

/**
 * A whole number in a query string or path: digits only (no `1e3`, `0x10`, spaces or a list), then
 * bounded as `wholeNumber`.
 */
export function wholeNumberText(min = 0, max = INT4_MAX) {
  return z
    .string({ message: 'must be a whole number' })
    .regex(min < 0 ? /^-?\d{1,16}$/ : /^\d{1,16}$/, { message: 'must be a whole number' })
    .transform(Number)
    .pipe(wholeNumber(min, max));
}

/** U+0000 (PostgreSQL text and jsonb refuse it) and UTF-16 halves without their pair (not UTF-8 encodable). */
const LONE_SURROGATE = /[\uD800-\uDBFF](?![\uDC00-\uDFFF])|(?<![\uD800-\uDBFF])[\uDC00-\uDFFF]/;

export const isStorableText = (v: string) => !v.includes('\u0000') && !LONE_SURROGATE.test(v);
export const UNSTORABLE_MESSAGE = 'must not contain a null character or a broken (unpaired surrogate) character';

/**
 * Text for a column of `max` characters: trimmed, at most `max`, without U+0000 or unpaired
 * surrogates. Chain `.min(1, …)`, `.regex(…)`, `.optional()` as needed.
 */
export function text(max: number) {
  return z
    .string(missingOr('must be text'))
    .trim()
    .max(max, { message: `must be at most ${max.toLocaleString('en-US')} characters` })
    .refine(isStorableText, { message: UNSTORABLE_MESSAGE });
}

/** Text on one line (no CR or LF, so it cannot start another header or line in a letter or e-mail). */
export function line(max: number) {
  return text(max)
    .min(1, { message: 'is required' })
    .refine((v) => !/[\r\n]/.test(v), { message: 'must not contain line breaks' });
}

export const UuidSchema = z.uuid({ message: 'must be a valid id' });

/** CR and LF are refused so an address can never smuggle extra mail headers. */
export const EmailSchema = z
  .string({ message: 'is required' })
  .trim()
  .toLowerCase()
  .min(1, { message: 'is required' })
  .max(254, { message: 'must be at most 254 characters' })
  .refine((v) => !/[\r\n]/.test(v), { message: 'must not contain line breaks' })
  .refine(isStorableText, { message: UNSTORABLE_MESSAGE })
  .pipe(z.email({ message: 'must be a valid e-mail address' }));

export const DisplayNameSchema = z
  .string({ message: 'is required' })
  .trim()
  .min(1, { message: 'is required' })
  .max(120, { message: 'must be at most 120 characters' })
  .refine((v) => !/[\r\n]/.test(v), { message: 'must not contain line breaks' })
  .refine(isStorableText, { message: UNSTORABLE_MESSAGE });

/** The calendar dates the service takes: wide enough for any birth date or plan, narrow enough for every column and computation. */
export const MIN_DATE = '1900-01-01';
export const MAX_DATE = '2100-12-31';

/** A calendar date without time, as ISO 'YYYY-MM-DD', from 1900-01-01 to 2100-12-31. */
export const IsoDateSchema = z.iso
  .date({ message: 'must be a date (YYYY-MM-DD)' })
  // Only a well-formed date is judged for its range: a malformed one has its own message already.
  .refine((d) => !/^\d{4}-\d{2}-\d{2}$/.test(d) || (d >= MIN_DATE && d <= MAX_DATE), {
    message: `must be between ${MIN_DATE} and ${MAX_DATE}`,
  });

/** Row versions are int4 columns (TypeORM's @VersionColumn). */
export const VersionSchema = wholeNumber(1, INT4_MAX);

/** For a route that takes no path parameters, no query or no body: any key is refused. */
export const NothingSchema = z.strictObject({});

export const UNITS = ['kg', 'lb'] as const;
export type Unit = (typeof UNITS)[number];

/**
 * The error of a number field: an empty field (undefined, null, '' or the NaN a cleared number input
 * gives) says the field is required — "Pain now is required (a number from 0 to 10)" — rather than
 * blaming the person for a value they never typed; anything else that is not a number gets `message`.
 */
export function numberError(message: string) {
  const empty = `is required (${message.replace(/^must be /, '')})`;
  return {
    error: (issue: { input?: unknown }) =>
      issue.input === undefined ||
      issue.input === null ||
      issue.input === '' ||
      (typeof issue.input === 'number' && Number.isNaN(issue.input))
        ? empty
        : message,
  };
}
