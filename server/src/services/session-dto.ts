import type { Request } from 'express';
import type { DataSource } from 'typeorm';
import type { SessionDto, UserDto } from '../../../policies/dto';
import type { User } from '../entities';
import { ensureCsrfToken } from '../http/security';
import { loadActors } from './actor';

export function toUserDto(user: User): UserDto {
  return { id: user.id, email: user.email, displayName: user.displayName, unitPref: user.unitPref };
}

export async function sessionDto(ds: DataSource, req: Request): Promise<SessionDto> {
  const user = (req.user as User | undefined) ?? null;
  const csrfToken = ensureCsrfToken(req);
  if (!user) return { user: null, memberships: [], csrfToken };
  const actors = await loadActors(ds, user.id);
  return {
    user: toUserDto(user),
    csrfToken,
    memberships: actors.map(({ organizationName, timeZone, ...actor }) => ({
      id: actor.membershipId,
      organizationId: actor.organizationId,
      organizationName,
      timeZone,
      roles: actor.roles,
      actor,
    })),
  };
}
