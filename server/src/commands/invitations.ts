import bcrypt from 'bcryptjs';
import { IsNull } from 'typeorm';
import type { InvitationDto } from '../../../policies/dto';
import type { InvitationAcceptInput, InvitationCreateInput } from '../../../policies/schemas';
import { ROLE_LABELS } from '../../../policies/roles';
import { dayIn } from '../../../policies/today';
import { AthleteProfile, Invitation, Membership, User } from '../entities';
import { orgCommand, publicCommand, type CommandCtx } from '../core/command';
import { authorize } from '../core/authorize';
import { AppError } from '../core/errors';
import { publicBaseUrl } from '../core/public-url';
import { enqueueEmail } from '../mail/deliveries';
import { emails } from '../../../templates/email/messages';
import { findUsableInvitation, newInvitationToken, toInvitationDto } from '../services/invitations';
import { assertAcceptablePassword, hashPassword } from '../services/passwords';
import { isTwoStepOn } from '../services/two-step';
import { memberName } from '../queries/members';

/**
 * An admin invites a person by e-mail. The link is built from the configured address, never the
 * request's Host (core/public-url.ts): a forged Host must not put a live token in a link to another
 * site. The token (256 random bits) rides in the link's fragment; only its SHA-256 is stored
 * (ASVS 5.0 V6.4.1). The invitation, its audit entry and its e-mail commit together.
 */
export const createInvitation = orgCommand({
  name: 'createInvitation',
  async run(ctx, input: InvitationCreateInput): Promise<InvitationDto> {
    const { actor } = ctx;
    authorize(ctx.ability, 'create', 'Invitation', { id: '', organizationId: actor.organizationId });
    const { token, tokenHash } = newInvitationToken();
    const expiresAt = new Date(ctx.now.getTime() + ctx.deps.config.INVITATION_TTL_HOURS * 3_600_000);
    // The token rides in the fragment, which browsers never send to a server or in a Referer.
    const link = `${publicBaseUrl(ctx.deps.config)}/invite#${token}`;
    const inviterName = await memberName(ctx.m, actor.membershipId, '');
    const saved = await ctx.m.save(
      ctx.m.create(Invitation, {
        organizationId: actor.organizationId,
        email: input.email,
        roles: input.roles,
        displayName: input.displayName ?? null,
        dateOfBirth: input.dateOfBirth ?? null,
        sport: input.sport ?? null,
        tokenHash,
        expiresAt,
        invitedBy: ctx.userId,
      }),
    );
    await ctx.audit({
      action: 'invitation.created',
      subjectType: 'Invitation',
      subjectId: saved.id,
      after: { email: saved.email, roles: saved.roles, expiresAt },
    });
    await enqueueEmail(ctx.m, ctx.deps.jobs, {
      organizationId: actor.organizationId,
      kind: 'invitation',
      to: saved.email,
      content: emails.invitation({
        organizationName: actor.organizationName,
        inviterName,
        roles: saved.roles.map((r) => ROLE_LABELS[r].toLowerCase()).join(' and '),
        link,
        // The last day the link works, on the organization's calendar (policies/today.ts).
        expiresAt: dayIn(actor.timeZone, expiresAt),
      }),
    });
    return toInvitationDto(saved, inviterName, link);
  },
});

/** Withdraws a pending invitation; withdrawing it again changes nothing and writes nothing. */
export const revokeInvitation = orgCommand({
  name: 'revokeInvitation',
  async run(ctx, input: { id: string }): Promise<void> {
    const inv = await ctx.m.findOne(Invitation, {
      where: { id: input.id, organizationId: ctx.actor.organizationId, acceptedAt: IsNull() },
    });
    authorize(ctx.ability, 'delete', 'Invitation', inv);
    if (inv.revokedAt) return;
    inv.revokedAt = ctx.now;
    await ctx.m.save(inv);
    await ctx.audit({ action: 'invitation.revoked', subjectType: 'Invitation', subjectId: inv.id });
  },
});

/** Creates the account, or checks an existing account's password (which must match). */
async function accountFor(ctx: CommandCtx, inv: Invitation, input: InvitationAcceptInput): Promise<User> {
  const existing = await ctx.m.findOne(User, { where: { email: inv.email } });
  if (existing && existing.passwordHash === '') {
    // Made by a roster import (services/roster.ts) with no password: the invitation sets the first one.
    assertAcceptablePassword(input.password);
    existing.passwordHash = await hashPassword(input.password, ctx.deps.config.BCRYPT_COST);
    existing.displayName = input.displayName;
    const saved = await ctx.m.save(existing);
    await ctx.audit({
      organizationId: inv.organizationId,
      actorUserId: saved.id,
      action: 'user.password_set',
      subjectType: 'User',
      subjectId: saved.id,
      after: { displayName: saved.displayName },
    });
    return saved;
  }
  if (existing) {
    if (!(await bcrypt.compare(input.password, existing.passwordHash))) {
      throw new AppError(
        'invalid_credentials',
        'That password does not match your existing Loadline account. Use the password you sign in with.',
        {
          password: ['does not match your existing account'],
        },
      );
    }
    return existing;
  }
  assertAcceptablePassword(input.password);
  const user = await ctx.m.save(
    ctx.m.create(User, {
      email: inv.email,
      displayName: input.displayName,
      passwordHash: await hashPassword(input.password, ctx.deps.config.BCRYPT_COST),
      unitPref: 'kg',
    }),
  );
  await ctx.audit({
    organizationId: inv.organizationId,
    actorUserId: user.id,
    action: 'user.created',
    subjectType: 'User',
    subjectId: user.id,
    after: { email: user.email, displayName: user.displayName },
  });
  return user;
}

/**
 * Accepts an invitation: creates the account (or checks the existing account's password), adds the
 * roles to the membership, creates the athlete profile, and marks the invitation used. The row lock
 * makes a second, concurrent use of the same link fail. Answers whether the account still needs its
 * second-step code before it is signed in (the password alone must not sign it in here either).
 */
export const acceptInvitation = publicCommand({
  name: 'acceptInvitation',
  async run(ctx, input: InvitationAcceptInput): Promise<{ user: User; secondStep: boolean }> {
    const inv = await findUsableInvitation(ctx.m, input.token, true);
    const user = await accountFor(ctx, inv, input);
    const asMember = { organizationId: inv.organizationId, actorUserId: user.id };
    let membership = await ctx.m.findOne(Membership, { where: { organizationId: inv.organizationId, userId: user.id } });
    const before = membership ? { roles: membership.roles, active: membership.active } : null;
    if (membership) {
      membership.roles = [...new Set([...(membership.active ? membership.roles : []), ...inv.roles])];
      membership.active = true;
      membership = await ctx.m.save(membership);
    } else {
      membership = await ctx.m.save(
        ctx.m.create(Membership, { organizationId: inv.organizationId, userId: user.id, roles: inv.roles, active: true }),
      );
    }
    await ctx.audit({
      ...asMember,
      action: before ? 'membership.updated' : 'membership.created',
      subjectType: 'Membership',
      subjectId: membership.id,
      before,
      after: { roles: membership.roles, active: true, via: 'invitation' },
    });
    if (membership.roles.includes('athlete') && !(await ctx.m.exists(AthleteProfile, { where: { id: membership.id } }))) {
      await ctx.m.save(
        ctx.m.create(AthleteProfile, {
          id: membership.id,
          organizationId: inv.organizationId,
          dateOfBirth: inv.dateOfBirth ?? input.dateOfBirth ?? null,
          sport: inv.sport,
          position: null,
        }),
      );
    }
    inv.acceptedAt = ctx.now;
    await ctx.m.save(inv);
    await ctx.audit({ ...asMember, action: 'invitation.accepted', subjectType: 'Invitation', subjectId: inv.id });
    return { user, secondStep: await isTwoStepOn(ctx.m, user.id) };
  },
});
