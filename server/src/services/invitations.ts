import { createHash, randomBytes } from 'node:crypto';
import type { EntityManager } from 'typeorm';
import type { InvitationDto, InvitationStatus } from '../../../policies/dto';
import { Invitation } from '../entities';
import { AppError } from '../core/errors';

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
