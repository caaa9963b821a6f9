import { IsNull, Not } from 'typeorm';
import type { EntityManager } from 'typeorm';
import { Membership, PasswordResetToken, User } from '../entities';
import { publicCommand } from '../core/command';
import { AppError } from '../core/errors';
import { publicBaseUrl } from '../core/public-url';
import { enqueueEmail } from '../mail/deliveries';
import { emails } from '../../../templates/email/messages';
import { hashToken, newInvitationToken } from '../services/invitations';
import { assertAcceptablePassword, hashPassword } from '../services/passwords';
import { auditAccount, endSessionsOf } from './account';

/** The one answer to every reset request, whether or not the address has an account (ASVS 5.0 V6.3.8). */
export const RESET_REQUESTED = {
  message:
    'If that address belongs to a Loadline account, a link to choose a new password is on its way. Check your inbox (and spam folder).',
} as const;

/** One message for every unusable link, so its holder learns nothing about why. */
export const resetInvalid = () =>
  new AppError('reset_invalid', 'This password link can’t be used: it may have been used already or have expired. Ask for a new one.');

/**
 * Handles a reset request. The route answers 202 before running it, so the reply takes the same time
 * whether or not the address has an account; the token is made (256 random bits, SHA-256 stored)
 * either way. Only a person with at least one active membership gets an e-mail. A new request
 * replaces any earlier unused link of that person. The link is built from the configured address,
 * never the request's Host (core/public-url.ts). The token row, its e-mail and the audit entry
 * commit together (ASVS 5.0 V6.4.1).
 */
export const requestPasswordReset = publicCommand({
  name: 'requestPasswordReset',
  async run(ctx, input: { email: string }): Promise<void> {
    const { token, tokenHash } = newInvitationToken();
    const user = await ctx.m.findOne(User, { where: { email: input.email } });
    const active = user ? await ctx.m.exists(Membership, { where: { userId: user.id, active: true } }) : false;
    if (!user || !active) return;
    const minutes = ctx.deps.config.RESET_TTL_MINUTES;
    const expiresAt = new Date(Date.now() + minutes * 60_000);
    // The token rides in the fragment, which browsers never send to a server or in a Referer.
    const link = `${publicBaseUrl(ctx.deps.config)}/reset#${token}`;
    await ctx.m.delete(PasswordResetToken, { userId: user.id, usedAt: IsNull() });
    await ctx.m.insert(PasswordResetToken, { userId: user.id, tokenHash, expiresAt });
    await enqueueEmail(ctx.m, ctx.deps.jobs, {
      organizationId: null,
      kind: 'password_reset',
      to: user.email,
      content: emails.passwordReset({ name: user.displayName, link, minutes }),
    });
    await auditAccount(ctx, { action: 'auth.password_reset_requested', userId: user.id, actorUserId: null, after: { expiresAt } });
  },
});

async function usableToken(m: EntityManager, token: string, lock: boolean): Promise<PasswordResetToken> {
  const qb = m.createQueryBuilder(PasswordResetToken, 't').where('t.token_hash = :h', { h: hashToken(token) });
  if (lock) qb.setLock('pessimistic_write');
  const row = await qb.getOne();
  if (!row || row.usedAt || row.expiresAt <= new Date()) throw resetInvalid();
  return row;
}

/**
 * Sets a new password with a reset link: the link is checked, then locked and checked again, so two
 * uses at once cannot both succeed; the password changes, the link and any other unused link of the
 * person stop working, every other session of the person ends (ASVS 5.0 V7.4.3), and the change is
 * audited — all in one commit.
 */
export const resetPassword = publicCommand({
  name: 'resetPassword',
  async run(ctx, input: { token: string; password: string; currentSid: string | null }): Promise<void> {
    // Checked before the (slow) hashing, so a dead link is refused at once.
    await usableToken(ctx.m, input.token, false);
    assertAcceptablePassword(input.password);
    const passwordHash = await hashPassword(input.password, ctx.deps.config.BCRYPT_COST);
    const row = await usableToken(ctx.m, input.token, true);
    await ctx.m.update(User, { id: row.userId }, { passwordHash });
    await ctx.m.update(PasswordResetToken, { id: row.id }, { usedAt: new Date() });
    await ctx.m.delete(PasswordResetToken, { userId: row.userId, id: Not(row.id), usedAt: IsNull() });
    const ended = await endSessionsOf(ctx.m, row.userId, input.currentSid);
    await auditAccount(ctx, { action: 'auth.password_reset', userId: row.userId, after: { sessionsEnded: ended } });
  },
});
