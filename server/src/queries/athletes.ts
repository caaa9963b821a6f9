import type { DataSource, EntityManager } from 'typeorm';
import type { AppAbility } from '../../../policies/access';
import type { AthleteProfileDto, CareTeamAssignmentDto, GuardianLinkDto } from '../../../policies/dto';
import { ageOn, isMinor } from '../../../policies/roles';
import { accessibleWhere } from '../core/accessible';
import { authorize } from '../core/authorize';
import { orgQuery } from '../core/command';
import { careTeamsFor, guardianLinksFor } from './athlete-links';

type Db = DataSource | EntityManager;

interface AthleteRow {
  id: string;
  organization_id: string;
  display_name: string;
  date_of_birth: string | null;
  sport: string | null;
  position: string | null;
  version: number;
}

const ATHLETE_COLUMNS = { id: 'm.id', organizationId: 'm.organization_id' };

function toAthleteDto(row: AthleteRow, careTeam: CareTeamAssignmentDto[], guardians: GuardianLinkDto[], today: string): AthleteProfileDto {
  const minor = isMinor(row.date_of_birth, today);
  const mine = guardians.filter((g) => g.athleteId === row.id);
  return {
    id: row.id,
    organizationId: row.organization_id,
    displayName: row.display_name,
    dateOfBirth: row.date_of_birth,
    age: row.date_of_birth ? ageOn(row.date_of_birth, today) : null,
    isMinor: minor,
    needsGuardian: minor && mine.length === 0,
    sport: row.sport,
    position: row.position,
    version: row.version,
    careTeam: careTeam.filter((c) => c.athleteId === row.id),
    guardians: mine,
  };
}

/**
 * The athletes this ability may read, in three queries whatever the count. Ages and "minor" are
 * counted on `today`, the organization's day (policies/today.ts).
 */
export async function athleteProfiles(
  db: Db,
  ability: AppAbility,
  organizationId: string,
  today: string,
  onlyId?: string,
): Promise<AthleteProfileDto[]> {
  const acl = accessibleWhere(ability, 'read', 'Athlete', ATHLETE_COLUMNS);
  const qb = db
    .createQueryBuilder()
    .select([
      'm.id AS id',
      'm.organization_id AS organization_id',
      'u.display_name AS display_name',
      'p.date_of_birth AS date_of_birth',
      'p.sport AS sport',
      'p.position AS position',
      'p.version AS version',
    ])
    .from('memberships', 'm')
    .innerJoin('users', 'u', 'u.id = m.user_id')
    .innerJoin('athlete_profiles', 'p', 'p.membership_id = m.id')
    .where('m.organization_id = :org', { org: organizationId })
    .andWhere('m.active')
    .andWhere(`'athlete' = ANY(m.roles)`)
    .andWhere(acl.sql, acl.params)
    .orderBy('u.display_name');
  if (onlyId) qb.andWhere('m.id = :onlyId', { onlyId });
  const rows = await qb.getRawMany<AthleteRow>();
  const ids = rows.map((r) => r.id);
  // One after the other: inside a transaction both would share one connection (pg refuses overlap).
  const careTeam = await careTeamsFor(db, ids);
  const guardians = await guardianLinksFor(db, ids);
  return rows.map((r) => toAthleteDto(r, careTeam, guardians, today));
}

/** One athlete the reader may see, or 404 (403 when the rules name the reason). */
export async function athleteProfile(db: Db, ability: AppAbility, organizationId: string, today: string, id: string) {
  const [athlete] = await athleteProfiles(db, ability, organizationId, today, id);
  authorize(ability, 'read', 'Athlete', athlete);
  return athlete;
}

export const listAthletes = orgQuery({
  name: 'listAthletes',
  run: (ctx, _input: void) => athleteProfiles(ctx.db, ctx.ability, ctx.actor.organizationId, ctx.today),
});

export const getAthlete = orgQuery({
  name: 'getAthlete',
  run: (ctx, input: { id: string }) => athleteProfile(ctx.db, ctx.ability, ctx.actor.organizationId, ctx.today, input.id),
});
