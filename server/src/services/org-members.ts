import type { EntityManager } from 'typeorm';
import type { Role } from '../../../policies/roles';
import { Membership } from '../entities';
import { AppError } from '../core/errors';

/**
 * Loads an active member of this organization who holds `role`, or refuses with a message naming
 * the field. Used when linking people, so links never cross organizations or roles.
 */
export async function requireMemberWithRole(
  m: EntityManager,
  organizationId: string,
  id: string,
  role: Role,
  field: string,
): Promise<Membership> {
  const member = await m.findOne(Membership, { where: { id, organizationId, active: true } });
  if (!member || !member.roles.includes(role)) {
    throw new AppError('validation_failed', `Please check the form: ${field} must be a ${role} in this organization.`, {
      [field]: [`must be a ${role} in this organization`],
    });
  }
  return member;
}

export function isUniqueViolation(err: unknown): boolean {
  return typeof err === 'object' && err !== null && (err as { code?: string }).code === '23505';
}
