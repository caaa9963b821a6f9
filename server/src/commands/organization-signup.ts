import type { OrganizationSignupConfirmedDto, OrganizationSignupRequestedDto } from '../../../policies/dto';
import type { OrganizationSignupInput } from '../../../policies/schemas';
import { Membership, OrganizationSignup, User } from '../entities';
import { publicCommand } from '../core/command';
import { AppError } from '../core/errors';
import { publicBaseUrl } from '../core/public-url';
import { enqueueEmail } from '../mail/deliveries';
import { emails } from '../../../templates/email/messages';
import { hashToken, newInvitationToken } from '../services/invitations';
import { hashPassword } from '../services/passwords';
import { startOrganization } from '../services/organizations';

/** The one answer to every sign-up request, whether or not the address already has an account (ASVS 5.0 V6.3.8). */
export const SIGNUP_REQUESTED: OrganizationSignupRequestedDto = {
  message:
    'Almost there: we sent a link to that address. Open it to confirm the address and start the organization. Check your inbox (and spam folder).',
};

/** One message for every unusable link, so its holder learns nothing about why. */
export const signupInvalid = () =>
  new AppError(
    'signup_invalid',
    'This confirmation link can’t be used: it may have been used already or have expired. Start the organization again to get a new one.',
  );

/**
 * A request from the public page. The route answers 202 before running it, so the reply takes the
 * same time whether or not the address has an account. Nothing of the organization exists yet: the
 * request waits in `organization_signups` (with the bcrypt hash of the chosen password and the
 * SHA-256 of a 256-bit link token) until the address is confirmed. An address that already has an
 * account gets a mail saying so, and its existing password stays the one it signs in with. The row,
 * its e-mail and the audit entry (in the trail of no organization, as there is none yet) commit
 * together.
 */
export const requestOrganizationSignup = publicCommand({
  name: 'requestOrganizationSignup',
  async run(ctx, input: OrganizationSignupInput): Promise<void> {
    const { token, tokenHash } = newInvitationToken();
    const passwordHash = await hashPassword(input.password, ctx.deps.config.BCRYPT_COST);
    const existingAccount = await ctx.m.exists(User, { where: { email: input.email } });
    // Password hashes of links that expired unused are not kept: each new request clears them.
    await ctx.m.query(`UPDATE organization_signups SET password_hash = NULL WHERE password_hash IS NOT NULL AND expires_at < now()`);
    const hours = ctx.deps.config.ORG_SIGNUP_TTL_HOURS;
    const signup = await ctx.m.save(
      ctx.m.create(OrganizationSignup, {
        organizationName: input.organizationName,
        country: input.country,
        timeZone: input.timeZone,
        adminName: input.adminName,
        email: input.email,
        passwordHash,
        tokenHash,
        expiresAt: new Date(ctx.now.getTime() + hours * 3_600_000),
      }),
    );
    await ctx.audit({
      actorUserId: null,
      action: 'organization.signup_requested',
      subjectType: 'OrganizationSignup',
      subjectId: signup.id,
      after: { organizationName: input.organizationName, country: input.country, timeZone: input.timeZone, email: input.email },
    });
    // The token rides in the fragment, which browsers never send to a server or in a Referer.
    const link = `${publicBaseUrl(ctx.deps.config)}/start/confirm#${token}`;
    await enqueueEmail(ctx.m, ctx.deps.jobs, {
      organizationId: null,
      kind: 'organization_signup',
      to: input.email,
      content: emails.organizationSignup({
        name: input.adminName,
        organizationName: input.organizationName,
        link,
        hours,
        existingAccount,
      }),
    });
  },
});

/**
 * The first admin confirms the address with the e-mailed link: the organization is created (its
 * first audit entry starts its own chain), then the admin's account (or, when the address already has
 * one, that account with its own password) and the admin membership. The link works once: the row is
 * locked, so two uses at once cannot both create an organization, and the stored password hash is
 * cleared.
 */
export const confirmOrganizationSignup = publicCommand({
  name: 'confirmOrganizationSignup',
  async run(ctx, input: { token: string }): Promise<OrganizationSignupConfirmedDto> {
    const signup = await ctx.m
      .createQueryBuilder(OrganizationSignup, 's')
      .where('s.token_hash = :h', { h: hashToken(input.token) })
      .setLock('pessimistic_write')
      .getOne();
    if (!signup || signup.confirmedAt || signup.expiresAt <= ctx.now || !signup.passwordHash) throw signupInvalid();

    const existing = await ctx.m.findOne(User, { where: { email: signup.email } });
    const user =
      existing ??
      (await ctx.m.save(
        ctx.m.create(User, { email: signup.email, displayName: signup.adminName, passwordHash: signup.passwordHash, unitPref: 'kg' }),
      ));
    const org = await startOrganization(
      ctx.m,
      ctx.audit,
      { name: signup.organizationName, country: signup.country, timeZone: signup.timeZone },
      { via: 'signup', actorUserId: user.id },
    );
    const asAdmin = { organizationId: org.id, actorUserId: user.id };
    if (!existing) {
      await ctx.audit({
        ...asAdmin,
        action: 'user.created',
        subjectType: 'User',
        subjectId: user.id,
        after: { email: user.email, displayName: user.displayName, via: 'signup' },
      });
    }
    const membership = await ctx.m.save(
      ctx.m.create(Membership, { organizationId: org.id, userId: user.id, roles: ['admin'], active: true }),
    );
    await ctx.audit({
      ...asAdmin,
      action: 'membership.created',
      subjectType: 'Membership',
      subjectId: membership.id,
      after: { roles: membership.roles, active: true, via: 'signup' },
    });
    signup.confirmedAt = ctx.now;
    signup.organizationId = org.id;
    signup.passwordHash = null;
    await ctx.m.save(signup);
    return { organizationId: org.id, organizationName: org.name, email: user.email, existingAccount: !!existing };
  },
});

/**
 * Days an unconfirmed request is kept after its link expired, then deleted with its e-mail address and
 * names (GDPR Art. 5(1)(e), storage limitation: kept no longer than needed). A week is common practice:
 * long enough to answer "I never got the link" and to look into abuse of the public form, short enough
 * that nothing unproven lingers.
 */
export const SIGNUP_PURGE_AFTER_DAYS = 7;

/**
 * Deletes the sign-up requests never confirmed whose link expired more than SIGNUP_PURGE_AFTER_DAYS
 * ago, with one audit entry (the count and the cut-off, no addresses) in the trail of no organization.
 * Confirmed requests stay: they record how their organization started. Run by the daily pg-boss job
 * (services/signup-purge-job.ts); running it twice, or again after a crash, deletes nothing more.
 */
export const purgeUnconfirmedSignups = publicCommand({
  name: 'purgeUnconfirmedSignups',
  async run(ctx, _input: void): Promise<{ deleted: number; expiredBefore: Date }> {
    const expiredBefore = new Date(ctx.now.getTime() - SIGNUP_PURGE_AFTER_DAYS * 86_400_000);
    const [rows]: [{ id: string }[], number] = await ctx.m.query(
      `DELETE FROM organization_signups WHERE confirmed_at IS NULL AND expires_at < $1 RETURNING id`,
      [expiredBefore],
    );
    if (rows.length) {
      await ctx.audit({
        actorUserId: null,
        action: 'organization.signups_purged',
        subjectType: 'OrganizationSignup',
        subjectId: null,
        after: { deleted: rows.length, expiredBefore: expiredBefore.toISOString(), afterDays: SIGNUP_PURGE_AFTER_DAYS },
      });
    }
    return { deleted: rows.length, expiredBefore };
  },
});
