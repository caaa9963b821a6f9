import type { Request, RequestHandler, Response } from 'express';
import type { User } from '../entities';
import type { Deps } from './context';
import { newCsrfToken, SESSION_COOKIE, signInLimits } from './security';

/**
 * The session side of signing in and out. The checks (password, second-step code) and their audit
 * entries are commands (commands/account.ts); what needs the request — passport's login, a new
 * session id, the CSRF token, the cookie — is here.
 */

declare module 'express-session' {
  interface SessionData {
    /** The password was right; the person still has to give a second-step code (not signed in yet). */
    pendingSignIn?: { userId: string; email: string; at: number };
  }
}

/** How long the second-step screen waits for a code before the password must be entered again. */
export const SECOND_STEP_MINUTES = 5;

const saved = (req: Request) => new Promise<void>((resolve, reject) => req.session.save((err) => (err ? reject(err) : resolve())));

/**
 * Starts a signed-in session: passport's login regenerates the session id, so the pre-sign-in cookie
 * stops working (ASVS 5.0 V7.2.4); then a fresh CSRF token and the sign-in time for the absolute
 * timeout are stored.
 */
export async function startSession(req: Request, user: User): Promise<void> {
  await new Promise<void>((resolve, reject) => req.login(user, (err) => (err ? reject(err) : resolve())));
  req.session.signedInAt = Date.now();
  req.session.csrfToken = newCsrfToken();
  await saved(req);
}

/**
 * The password was right and two-step sign-in is on: a new session id (ASVS 5.0 V7.2.4) holding only
 * a pending marker. Nobody is signed in until the second step succeeds, which regenerates the id again.
 */
export async function beginSecondStep(req: Request, user: User): Promise<void> {
  await new Promise<void>((resolve, reject) => req.session.regenerate((err) => (err ? reject(err) : resolve())));
  req.session.pendingSignIn = { userId: user.id, email: user.email, at: Date.now() };
  req.session.csrfToken = newCsrfToken();
  await saved(req);
}

/** The session's pending second step, if it has not timed out. */
export function pendingSecondStep(req: Request): { userId: string; email: string } | null {
  const p = req.session?.pendingSignIn;
  if (!p || req.user) return null;
  if (Date.now() - p.at > SECOND_STEP_MINUTES * 60_000) return null;
  return p;
}

/** Signs out: the session row is deleted, not just the cookie (ASVS 5.0 V7.4.1). */
export async function endSession(req: Request, res: Response): Promise<void> {
  await new Promise<void>((resolve, reject) => req.logout((err) => (err ? reject(err) : resolve())));
  await new Promise<void>((resolve, reject) => req.session.destroy((err) => (err ? reject(err) : resolve())));
  res.clearCookie(SESSION_COOKIE, { path: '/' });
}

const limits = new WeakMap<Deps, RequestHandler[]>();
/**
 * One set of sign-in limiters for every step that checks a secret of an account: the password, the
 * second-step code and turning two-step sign-in off. Wrong codes therefore count against the same
 * per-account budget as wrong passwords (ASVS 5.0 V6.3.1).
 */
export function accountLimits(deps: Deps): RequestHandler[] {
  let l = limits.get(deps);
  if (!l) {
    l = signInLimits(deps, {
      accountOf: (req) => pendingSecondStep(req)?.email ?? (req.user as User | undefined)?.email,
    });
    limits.set(deps, l);
  }
  return l;
}
