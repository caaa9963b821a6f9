import type { DataSource, EntityManager } from 'typeorm';
import type { MembershipSummaryDto, TwoStepStatusDto, UserDto } from '../../../policies/dto';
import type { User } from '../entities';
import { UserTotp } from '../entities';
import type { CoreDeps } from '../core/command';
import { loadActors } from '../services/actor';
import { recoveryCodesLeft } from '../services/two-step';

/**
 * Reads about the signed-in person's own account. They belong to no organization's rules, so they
 * take the person's id rather than a member's ability.
 */

export function toUserDto(user: User): UserDto {
  return { id: user.id, email: user.email, displayName: user.displayName, unitPref: user.unitPref };
}

/** Each active membership of the person, with the actor the client builds the same CASL ability from. */
export async function sessionMemberships(db: DataSource | EntityManager, userId: string): Promise<MembershipSummaryDto[]> {
  const actors = await loadActors(db, userId);
  return actors.map(({ organizationName, timeZone, ...actor }) => ({
    id: actor.membershipId,
    organizationId: actor.organizationId,
    organizationName,
    timeZone,
    roles: actor.roles,
    actor,
  }));
}

/** Whether two-step sign-in is on for the person, and how many recovery codes they have left. */
export async function twoStepStatus(deps: Pick<CoreDeps, 'ds'>, userId: string): Promise<TwoStepStatusDto> {
  const row = await deps.ds.getRepository(UserTotp).findOne({ where: { userId } });
  return {
    enabled: !!row?.enabledAt,
    enabledAt: row?.enabledAt?.toISOString() ?? null,
    recoveryCodesLeft: row?.enabledAt ? await recoveryCodesLeft(deps.ds.manager, userId) : 0,
  };
}
