import type { z } from 'zod';
import { statusFor, type ErrorCode } from '../../../policies/errors';

export type { ErrorCode };

export class AppError extends Error {
  constructor(
    readonly code: ErrorCode,
    message: string,
    readonly fields?: Record<string, string[]>,
    /** Structured detail the client can render, e.g. the breaches that stopped a publish. */
    readonly details?: unknown,
  ) {
    super(message);
  }
  get status() {
    return statusFor(this.code);
  }
}

export const notFound = (what = 'record') => new AppError('not_found', `That ${what} was not found.`);
export const forbidden = (message: string) => new AppError('forbidden', message);
export const versionConflict = (what: string) =>
  new AppError(
    'version_conflict',
    `Someone else changed this ${what} after you opened it. Reload to see the latest, then make your change again.`,
  );

/** Turns zod issues into `{ "field.path": ["message"] }` and one sentence naming each field. */
export function fromZod(error: z.ZodError, where: 'body' | 'query' | 'params'): AppError {
  // No prototype: an unknown key such as `constructor` or `__proto__` in a request must be reported,
  // not resolved to Object.prototype's member (which made the push below throw, answering 500).
  const fields: Record<string, string[]> = Object.create(null);
  for (const issue of error.issues) {
    let key = issue.path.map(String).join('.');
    let message = issue.message;
    if (issue.code === 'unrecognized_keys') {
      for (const k of issue.keys) {
        const path = key ? `${key}.${k}` : k;
        (fields[path] ??= []).push('is not an accepted field');
      }
      continue;
    }
    if (!key) key = where;
    if (issue.code === 'invalid_type' && /received undefined/.test(message)) message = 'is required';
    (fields[key] ??= []).push(message);
  }
  const summary = Object.entries(fields)
    .map(([k, msgs]) => `${k} ${msgs[0]}`)
    .join('; ');
  return new AppError('validation_failed', `Please check the ${where === 'body' ? 'form' : where}: ${summary}.`, fields);
}
