import type { ErrorBody } from '../../../policies/dto';
import { ERROR_CODES, type ErrorCode } from '../../../policies/errors';

/**
 * The one HTTP client. It turns every failure into an ApiError carrying the server's code and
 * sentence; deciding what to show or where to go is left to hooks and components.
 */

/**
 * The server's error codes (policies/errors.ts, the list both sides share), plus one only the
 * client can see: 'network', the request never got an answer (offline, server down, proxy gone).
 */
export type ApiErrorCode = ErrorCode | 'network';

function isErrorCode(code: string): code is ErrorCode {
  return (ERROR_CODES as readonly string[]).includes(code);
}

export class ApiError extends Error {
  readonly status: number;
  readonly code: ApiErrorCode;
  readonly fields: Record<string, string[]>;
  readonly requestId: string | null;
  /** Structured detail some refusals carry, e.g. the breaches that stopped a publish. */
  readonly details: unknown;

  constructor(init: {
    status: number;
    code: ApiErrorCode;
    message: string;
    fields?: Record<string, string[]>;
    requestId?: string | null;
    details?: unknown;
  }) {
    super(init.message);
    this.name = 'ApiError';
    this.status = init.status;
    this.code = init.code;
    this.fields = init.fields ?? {};
    this.requestId = init.requestId ?? null;
    this.details = init.details;
  }
}

export function isApiError(error: unknown): error is ApiError {
  return error instanceof ApiError;
}

/** Used when a failure arrives without our JSON error body (a proxy page, an empty reply). */
const FALLBACK: Record<number, { code: ApiErrorCode; message: string }> = {
  400: { code: 'validation_failed', message: 'Some of the information sent was not accepted.' },
  401: { code: 'unauthenticated', message: 'Please sign in to continue.' },
  403: { code: 'forbidden', message: 'You do not have permission for this.' },
  404: { code: 'not_found', message: 'That could not be found.' },
  409: { code: 'conflict', message: 'This clashes with a change made elsewhere.' },
  429: { code: 'rate_limited', message: 'Too many attempts. Please wait a moment and try again.' },
  503: { code: 'unavailable', message: 'Loadline is unavailable right now. Please try again shortly.' },
};

function fallbackFor(status: number): { code: ApiErrorCode; message: string } {
  return (
    FALLBACK[status] ??
    (status >= 500
      ? { code: status === 503 ? 'unavailable' : 'internal', message: 'Something went wrong on our side. Please try again.' }
      : { code: 'internal', message: 'The request could not be completed.' })
  );
}

function isErrorBody(value: unknown): value is ErrorBody {
  if (typeof value !== 'object' || value === null) return false;
  const error = (value as { error?: unknown }).error;
  return (
    typeof error === 'object' &&
    error !== null &&
    typeof (error as { code?: unknown }).code === 'string' &&
    typeof (error as { message?: unknown }).message === 'string'
  );
}

/** Builds an ApiError from a failed response, whatever its body holds. */
export async function errorFromResponse(response: Response): Promise<ApiError> {
  const body: unknown = await response.json().catch(() => null);
  if (isErrorBody(body)) {
    const code = body.error.code;
    return new ApiError({
      status: response.status,
      // A code this client does not know (a newer server) reads as the status's own code.
      code: isErrorCode(code) ? code : fallbackFor(response.status).code,
      message: body.error.message,
      fields: body.error.fields,
      requestId: typeof body.requestId === 'string' ? body.requestId : null,
      details: body.error.details,
    });
  }
  const fallback = fallbackFor(response.status);
  return new ApiError({ status: response.status, ...fallback });
}

// The CSRF token lives in memory only: it changes on sign-in, sign-out and invitation acceptance,
// and whoever receives a new SessionDto hands it over here.
let csrfToken: string | null = null;

export function setCsrfToken(token: string | null): void {
  csrfToken = token;
}

export function getCsrfToken(): string | null {
  return csrfToken;
}

export type HttpMethod = 'GET' | 'POST' | 'PATCH' | 'PUT' | 'DELETE';

export interface RequestOptions {
  body?: unknown;
  query?: Record<string, string | number | undefined | null>;
  signal?: AbortSignal;
  /** Sent as `Idempotency-Key`: the server answers a repeat of the same request from its store (lib/offline-queue.ts). */
  idempotencyKey?: string;
}

function withQuery(path: string, query: RequestOptions['query']): string {
  if (!query) return path;
  const params = new URLSearchParams();
  for (const [key, value] of Object.entries(query)) {
    if (value !== undefined && value !== null && value !== '') params.set(key, String(value));
  }
  const text = params.toString();
  return text ? `${path}?${text}` : path;
}

let sessionFromCopy = false;

/**
 * A page that started from the offline copy of the session (lib/offline-copy.ts) has no token until the
 * session is read again: a write asks for one first rather than being refused.
 */
export function startedFromSessionCopy(): void {
  sessionFromCopy = true;
}

async function ensureCsrfToken(): Promise<void> {
  if (csrfToken || !sessionFromCopy) return;
  const response = await fetch('/api/session', { headers: { Accept: 'application/json' }, credentials: 'same-origin' });
  if (!response.ok) return;
  const session = (await response.json()) as { csrfToken?: unknown };
  if (typeof session.csrfToken === 'string') csrfToken = session.csrfToken;
}

export async function apiRequest<T>(method: HttpMethod, path: string, options: RequestOptions = {}): Promise<T> {
  if (method !== 'GET') await ensureCsrfToken().catch(() => undefined);
  const headers: Record<string, string> = { Accept: 'application/json' };
  if (method !== 'GET') {
    headers['Content-Type'] = 'application/json';
    if (csrfToken) headers['X-CSRF-Token'] = csrfToken;
    if (options.idempotencyKey) headers['Idempotency-Key'] = options.idempotencyKey;
  }
  let response: Response;
  try {
    response = await fetch(`/api${withQuery(path, options.query)}`, {
      method,
      headers,
      credentials: 'same-origin',
      body: method === 'GET' || options.body === undefined ? undefined : JSON.stringify(options.body),
      signal: options.signal,
    });
  } catch (cause) {
    if (cause instanceof DOMException && cause.name === 'AbortError') throw cause;
    throw new ApiError({
      status: 0,
      code: 'network',
      message: 'Loadline could not be reached. Check your connection and try again.',
    });
  }
  if (!response.ok) throw await errorFromResponse(response);
  if (response.status === 204) return undefined as T;
  const text = await response.text();
  return (text ? JSON.parse(text) : undefined) as T;
}

export const api = {
  get: <T>(path: string, options?: Omit<RequestOptions, 'body'>) => apiRequest<T>('GET', path, options),
  post: <T>(path: string, body?: unknown) => apiRequest<T>('POST', path, { body: body ?? {} }),
  patch: <T>(path: string, body: unknown) => apiRequest<T>('PATCH', path, { body }),
  put: <T>(path: string, body: unknown) => apiRequest<T>('PUT', path, { body }),
  delete: <T = void>(path: string) => apiRequest<T>('DELETE', path),
};
