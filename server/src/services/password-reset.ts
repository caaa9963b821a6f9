import type { DataSource, EntityManager } from 'typeorm';
import { IsNull, Not } from 'typeorm';
import { Membership, PasswordResetToken, User } from '../entities';
import type { CoreDeps as Deps } from '../core/command';
import { AppError } from '../core/errors';
import { enqueueEmail } from '../mail/deliveries';
import { emails } from '../../../templates/email/messages';
import { hashToken, newInvitationToken } from './invitations';
import { assertAcceptablePassword, hashPassword } from './passwords';
import { auditAccount } from './sign-in';

/** The one answer to every reset request, whether or not the address has an account. */
export const RESET_REQUESTED = {
  message:
    'If that address belongs to a Loadline account, a link to choose a new password is on its way. Check your inbox (and spam folder).',
} as const;

/** One message for every unusable link, so its holder learns nothing about why. */
export const resetInvalid = () =>
  new AppError('reset_invalid', 'This password link can’t be used: it may have been used already or have expired. Ask for a new one.');

/**
 * Handles a reset request. Called after the 202 has been answered, so the reply takes the same time
 * whether or not the address has an account; the token is made (256 random bits, SHA-256 stored)
 * either way. Only a person with at least one active membership gets an e-mail. A new request
 * replaces any earlier unused link of that person. The token row, its e-mail and the audit entry
 * commit together.
 */
export async function requestPasswordReset(deps: Deps, input: { email: string; baseUrl: string; requestId: string }): Promise<void> {
  const { token, tokenHash } = newInvitationToken();
  const user = await deps.ds.getRepository(User).findOne({ where: { email: input.email } });
  const active = user ? await deps.ds.getRepository(Membership).exists({ where: { userId: user.id, active: true } }) : false;
  if (!user || !active) return;
  const minutes = deps.config.RESET_TTL_MINUTES;
  const expiresAt = new Date(Date.now() + minutes * 60_000);
  // The token rides in the fragment, which browsers never send to a server or in a Referer.
  const link = `${input.baseUrl}/reset#${token}`;
  await deps.ds.transaction(async (m) => {
    await m.delete(PasswordResetToken, { userId: user.id, usedAt: IsNull() });
    await m.insert(PasswordResetToken, { userId: user.id, tokenHash, expiresAt });
    await enqueueEmail(m, deps.jobs, {
      organizationId: null,
      kind: 'password_reset',
      to: user.email,
      content: emails.passwordReset({ name: user.displayName, link, minutes }),
    });
    await auditAccount(m, {
      requestId: input.requestId,
      action: 'auth.password_reset_requested',
      userId: user.id,
      actorUserId: null,
      after: { expiresAt },
    });
  });
}

async function usableToken(m: EntityManager | DataSource, token: string, lock: boolean): Promise<PasswordResetToken> {
  const qb = (m as EntityManager).createQueryBuilder(PasswordResetToken, 't').where('t.token_hash = :h', { h: hashToken(token) });
  if (lock) qb.setLock('pessimistic_write');
  const row = await qb.getOne();
  if (!row || row.usedAt || row.expiresAt <= new Date()) throw resetInvalid();
  return row;
}

/**
 * Ends every session of a person except `keepSid`: signed-in ones (passport's user in the session
 * JSON, indexed) and ones waiting for a second-step code.
 */
export async function endSessionsOf(m: EntityManager, userId: string, keepSid: string | null): Promise<number> {
  const signedIn: [unknown, number] = await m.query(
    `DELETE FROM "session" WHERE (sess -> 'passport' ->> 'user') = $1 AND sid IS DISTINCT FROM $2`,
    [userId, keepSid],
  );
  const pending: [unknown, number] = await m.query(
    `DELETE FROM "session" WHERE (sess -> 'pendingSignIn' ->> 'userId') = $1 AND sid IS DISTINCT FROM $2`,
    [userId, keepSid],
  );
  return signedIn[1] + pending[1];
}

/**
 * Sets a new password with a reset link: the link is checked (and locked) again inside the
 * transaction so two uses at once cannot both succeed; then the password changes, the link and any
 * other unused link of the person stop working, every other session of the person ends, and the
 * change is audited — all in one commit.
 */
export async function confirmPasswordReset(
  deps: Deps,
  input: { token: string; password: string; requestId: string; currentSid: string | null },
): Promise<void> {
  await usableToken(deps.ds.manager, input.token, false);
  assertAcceptablePassword(input.password);
  const passwordHash = await hashPassword(input.password, deps.config.BCRYPT_COST);
  await deps.ds.transaction(async (m) => {
    const row = await usableToken(m, input.token, true);
    await m.update(User, { id: row.userId }, { passwordHash });
    await m.update(PasswordResetToken, { id: row.id }, { usedAt: new Date() });
    await m.delete(PasswordResetToken, { userId: row.userId, id: Not(row.id), usedAt: IsNull() });
    const ended = await endSessionsOf(m, row.userId, input.currentSid);
    await auditAccount(m, {
      requestId: input.requestId,
      action: 'auth.password_reset',
      userId: row.userId,
      after: { sessionsEnded: ended },
    });
  });
}
