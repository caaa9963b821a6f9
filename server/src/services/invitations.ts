import { createHash, randomBytes } from 'node:crypto';
import type { EntityManager } from 'typeorm';
import bcrypt from 'bcryptjs';
import type { InvitationDto, InvitationStatus } from '../../../policies/dto';
import type { InvitationAcceptInput } from '../../../policies/schemas';
import { AthleteProfile, Invitation, Membership, User } from '../entities';
import { AppError } from '../core/errors';
import type { AuditFn } from '../core/tx';
import { assertAcceptablePassword, hashPassword } from './passwords';

/** 256 random bits, URL-safe. Only its SHA-256 is stored, so a database leak reveals no live link. */
export function newInvitationToken(): { token: string; tokenHash: string } {
  const token = randomBytes(32).toString('base64url');
  return { token, tokenHash: hashToken(token) };
}

export function hashToken(token: string): string {
  return createHash('sha256').update(token).digest('hex');
}

export function invitationStatus(inv: Pick<Invitation, 'acceptedAt' | 'revokedAt' | 'expiresAt'>, now = new Date()): InvitationStatus {
  if (inv.acceptedAt) return 'accepted';
  if (inv.revokedAt) return 'revoked';
  if (inv.expiresAt <= now) return 'expired';
  return 'pending';
}

export function toInvitationDto(inv: Invitation, invitedByName: string | null, link?: string): InvitationDto {
  return {
    id: inv.id,
    organizationId: inv.organizationId,
    email: inv.email,
    roles: inv.roles,
    displayName: inv.displayName,
    status: invitationStatus(inv),
    expiresAt: inv.expiresAt.toISOString(),
    createdAt: inv.createdAt.toISOString(),
    invitedByName,
    ...(link ? { link } : {}),
  };
}

/** One message for every unusable link, so a token holder learns nothing about why. */
export const invitationInvalid = () =>
  new AppError(
    'invitation_invalid',
    'This invitation link is not valid: it may have been used already, expired or been withdrawn. Ask your admin for a new one.',
  );

export async function findUsableInvitation(m: EntityManager, token: string, lock: boolean): Promise<Invitation> {
  const qb = m.createQueryBuilder(Invitation, 'i').where('i.token_hash = :h', { h: hashToken(token) });
  if (lock) qb.setLock('pessimistic_write');
  const inv = await qb.getOne();
  if (!inv || invitationStatus(inv) !== 'pending') throw invitationInvalid();
  return inv;
}

/**
 * Accepts an invitation in the caller's transaction: creates the account (or checks the existing
 * account's password), adds the roles to the membership, creates the athlete profile, and marks the
 * invitation used. The row lock makes a second, concurrent use of the same link fail.
 */
export async function acceptInvitation(m: EntityManager, input: InvitationAcceptInput, bcryptCost: number, audit: AuditFn): Promise<User> {
  const inv = await findUsableInvitation(m, input.token, true);
  let user = await m.findOne(User, { where: { email: inv.email } });
  if (user) {
    if (!(await bcrypt.compare(input.password, user.passwordHash))) {
      throw new AppError(
        'invalid_credentials',
        'That password does not match your existing Loadline account. Use the password you sign in with.',
        {
          password: ['does not match your existing account'],
        },
      );
    }
  } else {
    assertAcceptablePassword(input.password);
    user = await m.save(
      m.create(User, {
        email: inv.email,
        displayName: input.displayName,
        passwordHash: await hashPassword(input.password, bcryptCost),
        unitPref: 'kg',
      }),
    );
    await audit({
      organizationId: inv.organizationId,
      actorUserId: user.id,
      action: 'user.created',
      subjectType: 'User',
      subjectId: user.id,
      after: { email: user.email, displayName: user.displayName },
    });
  }
  let membership = await m.findOne(Membership, { where: { organizationId: inv.organizationId, userId: user.id } });
  const before = membership ? { roles: membership.roles, active: membership.active } : null;
  if (membership) {
    membership.roles = [...new Set([...(membership.active ? membership.roles : []), ...inv.roles])];
    membership.active = true;
    membership = await m.save(membership);
  } else {
    membership = await m.save(
      m.create(Membership, { organizationId: inv.organizationId, userId: user.id, roles: inv.roles, active: true }),
    );
  }
  await audit({
    organizationId: inv.organizationId,
    actorUserId: user.id,
    action: before ? 'membership.updated' : 'membership.created',
    subjectType: 'Membership',
    subjectId: membership.id,
    before,
    after: { roles: membership.roles, active: true, via: 'invitation' },
  });
  if (membership.roles.includes('athlete')) {
    const existing = await m.findOne(AthleteProfile, { where: { id: membership.id } });
    if (!existing) {
      await m.save(
        m.create(AthleteProfile, {
          id: membership.id,
          organizationId: inv.organizationId,
          dateOfBirth: inv.dateOfBirth ?? input.dateOfBirth ?? null,
          sport: inv.sport,
          position: null,
        }),
      );
    }
  }
  inv.acceptedAt = new Date();
  await m.save(inv);
  await audit({
    organizationId: inv.organizationId,
    actorUserId: user.id,
    action: 'invitation.accepted',
    subjectType: 'Invitation',
    subjectId: inv.id,
  });
  return user;
}
