import type { Request, RequestHandler, Response } from 'express';
import type { DataSource, EntityManager } from 'typeorm';
import type { SessionDto } from '../../../policies/dto';
import type { Deps } from '../http/context';
import type { User } from '../entities';
import { AppError } from '../core/errors';
import { newCsrfToken, signInLimits } from '../http/security';
import { appendAudit } from './audit';
import { loadActors } from './actor';
import { sessionDto } from './session-dto';
import { useSecondStepCode } from './two-step';

export function authenticateLocal(deps: Deps, req: Request, res: Response): Promise<User | false> {
  return new Promise((resolve, reject) => {
    deps.passport.authenticate('local', { session: false }, (err: unknown, user: User | false) => {
      if (err) reject(err);
      else resolve(user);
    })(req, res, (err?: unknown) => (err ? reject(err) : resolve(false)));
  });
}

/**
 * Starts a signed-in session: passport's login regenerates the session id (the pre-sign-in cookie
 * stops working), then a fresh CSRF token and the sign-in time for the absolute timeout are stored.
 */
export async function startSession(req: Request, user: User): Promise<void> {
  await new Promise<void>((resolve, reject) => req.login(user, (err) => (err ? reject(err) : resolve())));
  req.session.signedInAt = Date.now();
  req.session.csrfToken = newCsrfToken();
  await new Promise<void>((resolve, reject) => req.session.save((err) => (err ? reject(err) : resolve())));
}

declare module 'express-session' {
  interface SessionData {
    /** The password was right; the person still has to give a second-step code (not signed in yet). */
    pendingSignIn?: { userId: string; email: string; at: number };
  }
}

/** How long the second-step screen waits for a code before the password must be entered again. */
export const SECOND_STEP_MINUTES = 5;

/** Sign-in events go into each organization's trail the person belongs to (or the global one). */
export async function auditSignIn(
  deps: Deps,
  requestId: string,
  action: 'auth.signed_in' | 'auth.sign_in_failed' | 'auth.signed_out' | 'auth.second_step_needed',
  user: User | null,
  email: string,
  extra?: Record<string, string>,
) {
  // The e-mail tried is kept for failures (to spot attacks); never the password or a code.
  const after = action === 'auth.sign_in_failed' ? { email, ...extra } : (extra ?? null);
  await deps.ds.transaction((m) => auditAccount(m, { requestId, action, userId: user?.id ?? null, after }));
}

/**
 * An event about a person's own account (sign-in, password reset, two-step sign-in), written into
 * the trail of each organization they belong to, or the global trail when they belong to none.
 */
export async function auditAccount(
  m: EntityManager,
  e: { requestId: string; action: string; userId: string | null; actorUserId?: string | null; after?: unknown },
) {
  const actors = e.userId ? await loadActors(m, e.userId) : [];
  const orgs: (string | null)[] = actors.length ? actors.map((a) => a.organizationId) : [null];
  for (const organizationId of orgs) {
    await appendAudit(m, {
      organizationId,
      actorUserId: e.actorUserId === undefined ? e.userId : e.actorUserId,
      action: e.action,
      subjectType: 'User',
      subjectId: e.userId,
      after: e.after ?? null,
      requestId: e.requestId,
    });
  }
}

/**
 * A second-step code (app code or recovery code) checked in the caller's transaction; a recovery
 * code that worked is used up and audited. Answers which kind worked, or null.
 */
export async function useAuditedSecondStepCode(m: EntityManager, key: Buffer, userId: string, code: string, requestId: string) {
  const kind = await useSecondStepCode(m, key, userId, code);
  if (kind === 'recovery_code') await auditAccount(m, { requestId, action: 'auth.recovery_code_used', userId });
  return kind;
}

/**
 * The password was right and two-step sign-in is on: a new session id (SECURITY 8) holding only a
 * pending marker. Nobody is signed in until the second step succeeds, which regenerates the id again.
 */
export async function beginSecondStep(req: Request, user: User): Promise<void> {
  await new Promise<void>((resolve, reject) => req.session.regenerate((err) => (err ? reject(err) : resolve())));
  req.session.pendingSignIn = { userId: user.id, email: user.email, at: Date.now() };
  req.session.csrfToken = newCsrfToken();
  await new Promise<void>((resolve, reject) => req.session.save((err) => (err ? reject(err) : resolve())));
}

/** The session's pending second step, if it has not timed out. */
export function pendingSecondStep(req: Request): { userId: string; email: string } | null {
  const p = req.session?.pendingSignIn;
  if (!p || req.user) return null;
  if (Date.now() - p.at > SECOND_STEP_MINUTES * 60_000) return null;
  return p;
}

/** The session as the client sees it, saying so when a second-step code is awaited. */
export async function sessionWithStep(ds: DataSource, req: Request): Promise<SessionDto> {
  const dto = await sessionDto(ds, req);
  return pendingSecondStep(req) ? { ...dto, secondStep: true } : dto;
}

const limits = new WeakMap<Deps, RequestHandler[]>();
/**
 * One set of sign-in limiters for every step that checks a secret of an account: the password, the
 * second-step code and turning two-step sign-in off. Wrong codes therefore count against the same
 * per-account budget as wrong passwords.
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

export const invalidCredentials = () => new AppError('invalid_credentials', 'E-mail or password is incorrect.');
