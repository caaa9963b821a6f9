import { AppError, type ErrorCode } from '../core/errors';

/**
 * Any thrown value → the AppError the client sees. Only a fault of ours answers 500: a request the
 * framework already judged (a 4xx status), data the database refuses (SQLSTATE class 22, 23) and a
 * database that is away (a 503 the client may retry, RFC 9110 section 15.6.4) each keep their own
 * answer. No message here repeats a value from the request or the database.
 */
export function normalise(err: unknown): AppError {
  if (err instanceof AppError) return err;
  const e = (err ?? {}) as { type?: unknown; status?: unknown; statusCode?: unknown; code?: unknown; message?: unknown };

  const bodyError = fromBodyParser(e.type);
  if (bodyError) return bodyError;

  const sqlState = sqlStateOf(err);
  if (sqlState) {
    const mapped = fromSqlState(sqlState, err);
    if (mapped) return mapped;
  }
  if (isConnectionError(err)) return unavailable();

  // Errors raised with a 4xx status (a URIError from decoding a path parameter, http-errors) keep it.
  const status = typeof e.status === 'number' ? e.status : typeof e.statusCode === 'number' ? e.statusCode : undefined;
  if (status !== undefined && status >= 400 && status < 500) return fromClientStatus(status);

  return new AppError('internal', 'Something went wrong on our side. It has been logged; please try again.');
}

function unavailable(): AppError {
  return new AppError('unavailable', 'The service is briefly unavailable. Please try again in a moment.');
}

/** body-parser's (raw-body's) error types; each carries a status, but a sentence of our own is better. */
function fromBodyParser(type: unknown): AppError | null {
  switch (type) {
    case 'entity.parse.failed':
      return new AppError('validation_failed', 'Please check the form: the request body is not valid JSON.', {
        body: ['is not valid JSON'],
      });
    case 'entity.too.large':
    case 'parameters.too.many':
      return new AppError('payload_too_large', 'The request is too large.');
    case 'charset.unsupported':
    case 'encoding.unsupported':
      return new AppError('unsupported_media_type', 'The request body must be UTF-8 JSON.');
    case 'request.aborted':
    case 'request.size.invalid':
      return new AppError('validation_failed', 'The request body was incomplete. Please send it again.', { body: ['is incomplete'] });
    case 'entity.verify.failed':
      return new AppError('forbidden', 'The request body was refused.');
    default:
      return null;
  }
}

const CLIENT_STATUS: Record<number, [ErrorCode, string]> = {
  400: ['validation_failed', 'The request is not valid: please check the address and the form.'],
  401: ['unauthenticated', 'Please sign in to continue.'],
  403: ['forbidden', 'You may not do that.'],
  404: ['not_found', 'That was not found.'],
  409: ['conflict', 'That conflicts with the current state. Reload and try again.'],
  413: ['payload_too_large', 'The request is too large.'],
  415: ['unsupported_media_type', 'The request body must be UTF-8 JSON.'],
  416: ['range_not_satisfiable', 'The requested range is not available.'],
  422: ['unprocessable', 'The request could not be processed.'],
  429: ['rate_limited', 'Too many requests. Please wait a moment and try again.'],
};

/** A 4xx without a code of its own (405, 408, 411, …) is the client's to fix: 400. */
function fromClientStatus(status: number): AppError {
  const [code, message] = CLIENT_STATUS[status] ?? CLIENT_STATUS[400];
  return new AppError(code, message);
}

/** The SQLSTATE of a node-postgres error, also when TypeORM wraps it (QueryFailedError copies it). */
function sqlStateOf(err: unknown): string | null {
  const e = err as { code?: unknown; driverError?: { code?: unknown } } | null;
  for (const code of [e?.code, e?.driverError?.code]) {
    if (typeof code === 'string' && /^[0-9A-Z]{5}$/.test(code)) return code;
  }
  return null;
}

/** PostgreSQL error codes (Appendix A of its manual). */
function fromSqlState(code: string, err: unknown): AppError | null {
  const cls = code.slice(0, 2);
  // Class 22, data exception: a value the column cannot hold (out of range, bad date, NUL in text).
  // 54000: a value too large for an index. Both are the request's data, so 400.
  if (cls === '22' || code === '54000') {
    return new AppError('validation_failed', 'Please check the form: a value is out of range or cannot be stored.', {
      body: ['has a value that is out of range or cannot be stored'],
    });
  }
  if (cls === '23') {
    if (code === '23502' || code === '23514') {
      return new AppError('validation_failed', 'Please check the form: a value is missing or not allowed.', {
        body: ['has a value that is missing or not allowed'],
      });
    }
    if (code === '23503') {
      const detail = String((err as { detail?: unknown })?.detail ?? (err as { driverError?: { detail?: unknown } })?.driverError?.detail);
      if (/is not present in table/.test(detail)) return new AppError('not_found', 'A record this refers to was not found.');
      return new AppError('conflict', 'Other records still refer to this one.');
    }
    return new AppError('conflict', 'That conflicts with a record that already exists. Reload and try again.');
  }
  // Class 08 (connection exception), 53 (insufficient resources, 53300 too many connections),
  // 57P01–57P03 (admin shutdown, crash shutdown, cannot connect now), 57014 (statement timeout),
  // 40001/40P01 (serialization failure, deadlock) and 55P03 (lock not available): retry later.
  if (
    cls === '08' ||
    cls === '53' ||
    /^57P0[1-3]$/.test(code) ||
    code === '57014' ||
    code === '40001' ||
    code === '40P01' ||
    code === '55P03'
  ) {
    return unavailable();
  }
  return null;
}

const CONNECTION_CODES = new Set([
  'ECONNREFUSED',
  'ECONNRESET',
  'ECONNABORTED',
  'EPIPE',
  'ETIMEDOUT',
  'EHOSTUNREACH',
  'ENETUNREACH',
  'ENOTFOUND',
  'EAI_AGAIN',
]);

/** node-postgres and pg-pool say "connection is gone" in messages only. */
const CONNECTION_MESSAGES =
  /Connection terminated|timeout exceeded when trying to connect|Client has encountered a connection error|Connection is not (?:established|open)|Cannot use a pool after calling end/i;

function isConnectionError(err: unknown): boolean {
  const e = err as { code?: unknown; message?: unknown; driverError?: { code?: unknown; message?: unknown } } | null;
  for (const x of [e, e?.driverError]) {
    if (typeof x?.code === 'string' && CONNECTION_CODES.has(x.code)) return true;
    if (CONNECTION_MESSAGES.test(String(x?.message ?? ''))) return true;
  }
  return false;
}
