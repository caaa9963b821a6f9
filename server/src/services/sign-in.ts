import type { Request, Response } from 'express';
import type { Deps } from '../http/context';
import type { User } from '../entities';
import { AppError } from '../http/errors';
import { newCsrfToken } from '../http/security';
import { appendAudit } from './audit';
import { loadActors } from './actor';

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

/** Sign-in events go into each organization's trail the person belongs to (or the global one). */
export async function auditSignIn(deps: Deps, requestId: string, action: 'auth.signed_in' | 'auth.sign_in_failed' | 'auth.signed_out', user: User | null, email: string) {
  const actors = user ? await loadActors(deps.ds, user.id) : [];
  const orgs: (string | null)[] = actors.length ? actors.map((a) => a.organizationId) : [null];
  await deps.ds.transaction(async (m) => {
    for (const organizationId of orgs) {
      await appendAudit(m, {
        organizationId,
        actorUserId: user?.id ?? null,
        action,
        subjectType: 'User',
        subjectId: user?.id ?? null,
        // The e-mail tried is kept for failures (to spot attacks); never the password.
        after: action === 'auth.sign_in_failed' ? { email } : null,
        requestId,
      });
    }
  });
}

export const invalidCredentials = () => new AppError('invalid_credentials', 'E-mail or password is incorrect.');
