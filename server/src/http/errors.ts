import { z } from 'zod';

export type ErrorCode =
  | 'validation_failed'
  | 'unauthenticated'
  | 'invalid_credentials'
  | 'session_expired'
  | 'csrf_failed'
  | 'forbidden'
  | 'not_found'
  | 'conflict'
  | 'version_conflict'
  | 'invitation_invalid'
  | 'reset_invalid'
  | 'payload_too_large'
  | 'unsupported_media_type'
  | 'range_not_satisfiable'
  | 'unprocessable'
  | 'rate_limited'
  | 'unavailable'
  | 'internal';

export function statusFor(code: ErrorCode): number {
  switch (code) {
    case 'validation_failed': return 400;
    case 'unauthenticated':
    case 'invalid_credentials':
    case 'session_expired': return 401;
    case 'csrf_failed':
    case 'forbidden': return 403;
    case 'not_found':
    case 'invitation_invalid':
    case 'reset_invalid': return 404;
    case 'conflict':
    case 'version_conflict': return 409;
    case 'payload_too_large': return 413;
    case 'unsupported_media_type': return 415;
    case 'range_not_satisfiable': return 416;
    case 'unprocessable': return 422;
    case 'rate_limited': return 429;
    case 'unavailable': return 503;
    case 'internal': return 500;
  }
}

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
  new AppError('version_conflict', `Someone else changed this ${what} after you opened it. Reload to see the latest, then make your change again.`);

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
