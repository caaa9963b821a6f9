import type { DataSource, EntityManager } from 'typeorm';
import type { Actor } from '../../../policies/access';
import type { Role } from '../../../policies/roles';

export interface ActorRow {
  membership_id: string;
  organization_id: string;
  organization_name: string;
  guardians_see_clips: boolean;
  time_zone: string;
  roles: Role[];
  coach_of: string[];
  clinician_of: string[];
  guardian_of: string[];
}

/**
 * One query for everything the rules need about a user in each active membership. A coach coaches
 * the athletes of their care teams and of the (not archived) groups they coach, alike. Care-team,
 * group and guardian links only count while the person still holds the matching role, and only for athletes
 * still active, so removing a role or a member takes effect on the very next request. Each linked
 * athlete's membership is looked up by its key (a join made PostgreSQL hash every membership of the
 * database on each request).
 */
const actorSql = (userId: string) => `
  SELECT m.id AS membership_id, m.organization_id, o.name AS organization_name, o.guardians_see_clips, o.time_zone, m.roles,
    CASE WHEN 'coach' = ANY(m.roles) THEN COALESCE((
      SELECT array_agg(x.athlete_id ORDER BY x.athlete_id) FROM (
        SELECT c.athlete_id FROM care_team_assignments c WHERE c.member_id = m.id AND c.role = 'coach'
        UNION
        SELECT ga.member_id FROM group_members gc
          JOIN groups g ON g.id = gc.group_id AND NOT g.archived
          JOIN group_members ga ON ga.group_id = gc.group_id AND ga.role = 'athlete'
        WHERE gc.member_id = m.id AND gc.role = 'coach') x
      WHERE (SELECT a.active FROM memberships a WHERE a.id = x.athlete_id)), '{}') ELSE '{}' END AS coach_of,
    CASE WHEN 'clinician' = ANY(m.roles) THEN COALESCE((
      SELECT array_agg(c.athlete_id ORDER BY c.athlete_id) FROM care_team_assignments c
      WHERE c.member_id = m.id AND c.role = 'clinician' AND (SELECT a.active FROM memberships a WHERE a.id = c.athlete_id)), '{}') ELSE '{}' END AS clinician_of,
    CASE WHEN 'guardian' = ANY(m.roles) THEN COALESCE((
      SELECT array_agg(g.athlete_id ORDER BY g.athlete_id) FROM guardian_links g
      WHERE g.guardian_id = m.id AND (SELECT a.active FROM memberships a WHERE a.id = g.athlete_id)), '{}') ELSE '{}' END AS guardian_of
  FROM memberships m JOIN organizations o ON o.id = m.organization_id
  WHERE m.user_id = ${userId} AND m.active`;
const ACTOR_SQL = actorSql('$1');

/**
 * The rows of loadActors as one JSON array, for a query that reads them together with the session
 * (http/security.ts), so a signed-in request costs one round trip before its handler, not three.
 */
export const actorsJsonSql = (userId: string) =>
  `(SELECT COALESCE(json_agg(a ORDER BY a.organization_name), '[]') FROM (${actorSql(userId)}) a)`;

export function actorsFromJson(userId: string, rows: ActorRow[]): ActorWithOrg[] {
  return rows.map((r) => toActor(userId, r));
}

export interface ActorWithOrg extends Actor {
  organizationName: string;
  /** The organization's IANA time zone: its calendar day is everyone's "today" (policies/today.ts). */
  timeZone: string;
}

function toActor(userId: string, row: ActorRow): ActorWithOrg {
  return {
    userId,
    organizationId: row.organization_id,
    organizationName: row.organization_name,
    timeZone: row.time_zone,
    membershipId: row.membership_id,
    roles: row.roles,
    coachOf: row.coach_of,
    clinicianOf: row.clinician_of,
    guardianOf: row.guardian_of,
    guardiansSeeClips: row.guardians_see_clips,
  };
}

export async function loadActors(db: DataSource | EntityManager, userId: string): Promise<ActorWithOrg[]> {
  const rows: ActorRow[] = await db.query(`${ACTOR_SQL} ORDER BY o.name`, [userId]);
  return rows.map((r) => toActor(userId, r));
}

export async function loadActor(db: DataSource | EntityManager, userId: string, organizationId: string): Promise<ActorWithOrg | null> {
  const rows: ActorRow[] = await db.query(`${ACTOR_SQL} AND m.organization_id = $2`, [userId, organizationId]);
  return rows[0] ? toActor(userId, rows[0]) : null;
}
