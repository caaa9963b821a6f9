import type { DataSource, EntityManager } from 'typeorm';
import type { AppAbility } from '../../../policies/access';
import type { AthleteProfileDto, CareTeamAssignmentDto, GuardianLinkDto, PersonDto } from '../../../policies/dto';
import { ageOn, isMinor, todayIso, type CareTeamRole, type Role } from '../../../policies/roles';
import { accessibleWhere } from '../core/accessible';

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

export async function careTeamsFor(db: Db, athleteIds: string[]): Promise<CareTeamAssignmentDto[]> {
  if (athleteIds.length === 0) return [];
  const rows: {
    id: string;
    organization_id: string;
    athlete_id: string;
    athlete_name: string;
    member_id: string;
    member_name: string;
    role: CareTeamRole;
  }[] = await db.query(
    `SELECT c.id, c.organization_id, c.athlete_id, au.display_name AS athlete_name, c.member_id,
              mu.display_name AS member_name, c.role
         FROM care_team_assignments c
         JOIN memberships am ON am.id = c.athlete_id JOIN users au ON au.id = am.user_id
         JOIN memberships mm ON mm.id = c.member_id AND mm.active AND c.role = ANY(mm.roles) JOIN users mu ON mu.id = mm.user_id
        WHERE c.athlete_id = ANY($1) ORDER BY c.role, mu.display_name`,
    [athleteIds],
  );
  return rows.map((r) => ({
    id: r.id,
    organizationId: r.organization_id,
    athleteId: r.athlete_id,
    athleteName: r.athlete_name,
    memberId: r.member_id,
    memberName: r.member_name,
    role: r.role,
  }));
}

export async function guardianLinksFor(db: Db, where: { athleteIds?: string[]; guardianIds?: string[] }): Promise<GuardianLinkDto[]> {
  const ids = where.athleteIds ?? where.guardianIds ?? [];
  if (ids.length === 0) return [];
  const column = where.athleteIds ? 'g.athlete_id' : 'g.guardian_id';
  const rows: {
    id: string;
    organization_id: string;
    athlete_id: string;
    athlete_name: string;
    guardian_id: string;
    guardian_name: string;
  }[] = await db.query(
    `SELECT g.id, g.organization_id, g.athlete_id, au.display_name AS athlete_name, g.guardian_id,
              gu.display_name AS guardian_name
         FROM guardian_links g
         JOIN memberships am ON am.id = g.athlete_id JOIN users au ON au.id = am.user_id
         JOIN memberships gm ON gm.id = g.guardian_id AND gm.active AND 'guardian' = ANY(gm.roles) JOIN users gu ON gu.id = gm.user_id
        WHERE ${column} = ANY($1) ORDER BY gu.display_name`,
    [ids],
  );
  return rows.map((r) => ({
    id: r.id,
    organizationId: r.organization_id,
    athleteId: r.athlete_id,
    athleteName: r.athlete_name,
    guardianId: r.guardian_id,
    guardianName: r.guardian_name,
  }));
}

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

/** The athletes this ability may read, in three queries whatever the count. */
export async function listAthletes(db: Db, ability: AppAbility, organizationId: string, onlyId?: string): Promise<AthleteProfileDto[]> {
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
  const [careTeam, guardians] = await Promise.all([careTeamsFor(db, ids), guardianLinksFor(db, { athleteIds: ids })]);
  const today = todayIso();
  return rows.map((r) => toAthleteDto(r, careTeam, guardians, today));
}

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
export async function listPeople(db: Db, ability: AppAbility, organizationId: string, onlyId?: string): Promise<PersonDto[]> {
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
  const athleteIds = rows.filter((r) => r.roles.includes('athlete')).map((r) => r.id);
  const athletes = athleteIds.length ? await listAthletes(db, ability, organizationId, onlyId) : [];
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
