import type { DataSource, EntityManager } from 'typeorm';
import type { AppAbility } from '../../../policies/access';
import type { PersonDto } from '../../../policies/dto';
import type { Role } from '../../../policies/roles';
import { accessibleWhere } from '../core/accessible';
import { authorize } from '../core/authorize';
import { orgQuery } from '../core/command';
import { athleteProfiles } from './athletes';

type Db = DataSource | EntityManager;

interface PersonRow {
  id: string;
  organization_id: string;
  user_id: string;
  email: string;
  display_name: string;
  roles: Role[];
  version: number;
  created_at: Date;
}

const PERSON_COLUMNS = { id: 'm.id', organizationId: 'm.organization_id', userId: 'm.user_id' };

/** People (memberships) the ability may read, each with an athlete profile where they are one. */
export async function peopleOf(db: Db, ability: AppAbility, organizationId: string, today: string, onlyId?: string): Promise<PersonDto[]> {
  const acl = accessibleWhere(ability, 'read', 'Membership', PERSON_COLUMNS);
  const qb = db
    .createQueryBuilder()
    .select([
      'm.id AS id',
      'm.organization_id AS organization_id',
      'm.user_id AS user_id',
      'u.email AS email',
      'u.display_name AS display_name',
      'm.roles AS roles',
      'm.version AS version',
      'm.created_at AS created_at',
    ])
    .from('memberships', 'm')
    .innerJoin('users', 'u', 'u.id = m.user_id')
    .where('m.organization_id = :org', { org: organizationId })
    .andWhere('m.active')
    .andWhere(acl.sql, acl.params)
    .orderBy('u.display_name');
  if (onlyId) qb.andWhere('m.id = :onlyId', { onlyId });
  const rows = await qb.getRawMany<PersonRow>();
  const hasAthletes = rows.some((r) => r.roles.includes('athlete'));
  const athletes = hasAthletes ? await athleteProfiles(db, ability, organizationId, today, onlyId) : [];
  const byId = new Map(athletes.map((a) => [a.id, a]));
  return rows.map((r) => ({
    id: r.id,
    organizationId: r.organization_id,
    userId: r.user_id,
    email: r.email,
    displayName: r.display_name,
    roles: r.roles,
    version: r.version,
    createdAt: new Date(r.created_at).toISOString(),
    athlete: byId.get(r.id) ?? null,
  }));
}

/** One person the reader may see, or 404. */
export async function personOf(db: Db, ability: AppAbility, organizationId: string, today: string, id: string): Promise<PersonDto> {
  const [person] = await peopleOf(db, ability, organizationId, today, id);
  authorize(ability, 'read', 'Membership', person);
  return person;
}

export const listPeople = orgQuery({
  name: 'listPeople',
  run: (ctx, _input: void) => peopleOf(ctx.db, ctx.ability, ctx.actor.organizationId, ctx.today),
});

export const getPerson = orgQuery({
  name: 'getPerson',
  run: (ctx, input: { id: string }) => personOf(ctx.db, ctx.ability, ctx.actor.organizationId, ctx.today, input.id),
});
