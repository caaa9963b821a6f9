import { createHmac, randomBytes, timingSafeEqual } from 'node:crypto';
import type { Request, RequestHandler, Response } from 'express';
import { AppError } from '../core/errors';

/**
 * CSRF tokens (ASVS 5.0 V3.5.1). A session's writes carry the token stored in the session. A
 * signed-out caller (the sign-in, reset and invitation forms) has no session, and handing out a token
 * must not create one: every visit to the sign-in page would write a session row. Such a caller gets
 * a signed double-submit token instead (OWASP CSRF Prevention Cheat Sheet, "signed double-submit
 * cookie"): a random nonce in an HttpOnly cookie and, as the token, an HMAC of that nonce under a key
 * derived from SESSION_SECRET. Only the server can make a token that fits a nonce, and a page on
 * another site can read neither. With Secure cookies the cookie is `__Host-` prefixed, so a sibling
 * sub-domain cannot plant one (RFC 6265bis section 4.1.3.2).
 */

declare module 'express-session' {
  interface SessionData {
    csrfToken?: string;
  }
}

export function newCsrfToken(): string {
  return randomBytes(32).toString('base64url');
}

/** The session's CSRF token, created on first use (this makes the session worth saving). */
export function ensureCsrfToken(req: Request): string {
  if (!req.session.csrfToken) req.session.csrfToken = newCsrfToken();
  return req.session.csrfToken;
}

interface CsrfKey {
  key: Buffer;
  secure: boolean;
}
const KEY = Symbol('signed-out CSRF key');

/** The HMAC key for signed-out tokens (kept apart from the cookie-signing use of the same secret). */
export function csrfKeyFor(sessionSecret: string, secure: boolean): CsrfKey {
  return { key: createHmac('sha256', sessionSecret).update('loadline signed-out CSRF token v1').digest(), secure };
}

/** Set by the session middleware (http/security.ts), which knows the secret, for the check below. */
export function attachCsrfKey(req: Request, key: CsrfKey): void {
  (req as unknown as Record<symbol, CsrfKey>)[KEY] = key;
}

const cookieName = (secure: boolean) => (secure ? '__Host-loadline.csrf' : 'loadline.csrf');

function readCookie(req: Request, name: string): string | undefined {
  for (const part of (req.headers.cookie ?? '').split(';')) {
    const eq = part.indexOf('=');
    if (eq !== -1 && part.slice(0, eq).trim() === name) return part.slice(eq + 1).trim();
  }
  return undefined;
}

const NONCE = /^[\w-]{43}$/;

function signedOutExpected(req: Request): string {
  const k = (req as unknown as Record<symbol, CsrfKey | undefined>)[KEY];
  const nonce = k && readCookie(req, cookieName(k.secure));
  return k && nonce && NONCE.test(nonce) ? createHmac('sha256', k.key).update(nonce).digest('base64url') : '';
}

/** A signed-out caller's token, bound to their nonce cookie (set now if they have none). No session row is written. */
export function signedOutCsrfToken(req: Request, res: Response): string {
  const existing = signedOutExpected(req);
  if (existing) return existing;
  const k = (req as unknown as Record<symbol, CsrfKey | undefined>)[KEY];
  if (!k) throw new Error('signedOutCsrfToken needs the session middleware (it holds the key)');
  const nonce = randomBytes(32).toString('base64url');
  // Like the session cookie: a Secure cookie is never handed out over plain HTTP.
  if (!k.secure || req.secure) res.cookie(cookieName(k.secure), nonce, { httpOnly: true, sameSite: 'lax', secure: k.secure, path: '/' });
  return createHmac('sha256', k.key).update(nonce).digest('base64url');
}

const SAFE_METHODS = new Set(['GET', 'HEAD', 'OPTIONS']);

function sameToken(sent: string, expected: string): boolean {
  const a = Buffer.from(sent);
  const b = Buffer.from(expected);
  return b.length > 0 && a.length === b.length && timingSafeEqual(a, b);
}

/**
 * CSRF defence in depth: a cross-site Fetch Metadata header or a foreign Origin is refused, and every
 * state-changing request must echo its token in X-CSRF-Token: the session's, or — with no session
 * token — the signed-out token of its nonce cookie.
 */
export function csrfProtection(): RequestHandler {
  return (req, _res, next) => {
    if (SAFE_METHODS.has(req.method)) return next();
    const site = req.get('sec-fetch-site');
    if (site && site !== 'same-origin' && site !== 'none') {
      return next(new AppError('csrf_failed', 'This request came from another site and was refused.'));
    }
    const origin = req.get('origin');
    if (origin) {
      const host = req.get('host');
      let originHost: string | null;
      try {
        originHost = new URL(origin).host;
      } catch {
        originHost = null;
      }
      if (!host || originHost !== host) {
        return next(new AppError('csrf_failed', 'This request came from another site and was refused.'));
      }
    }
    const sent = req.get('x-csrf-token') ?? '';
    const sessionToken = req.session?.csrfToken;
    const expected = sessionToken ?? signedOutExpected(req);
    if (!sameToken(sent, expected)) {
      return next(new AppError('csrf_failed', 'Your page is out of date (security check failed). Reload the page and try again.'));
    }
    next();
  };
}
