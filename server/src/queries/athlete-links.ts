import type { DataSource, EntityManager } from 'typeorm';
import type { CareTeamAssignmentDto, GuardianLinkDto } from '../../../policies/dto';
import type { CareTeamRole } from '../../../policies/roles';

type Db = DataSource | EntityManager;

/**
 * The two links between an athlete and the people around them — a coach or clinician on the care
 * team, a guardian — have one shape and one rule: a link counts while its member is active and
 * still holds the link's role. One reader for both (commands/athlete-links.ts writes them).
 */
export type LinkKind = 'careTeam' | 'guardian';

const TABLES: Record<LinkKind, { table: string; member: string; role: string; order: string }> = {
  careTeam: { table: 'care_team_assignments', member: 'member_id', role: 'l.role', order: 'l.role, mu.display_name' },
  guardian: { table: 'guardian_links', member: 'guardian_id', role: `'guardian'`, order: 'mu.display_name' },
};

interface LinkRow {
  id: string;
  organization_id: string;
  athlete_id: string;
  athlete_name: string;
  member_id: string;
  member_name: string;
  member_email: string;
  role: CareTeamRole | 'guardian';
}

async function linkRows(db: Db, kind: LinkKind, athleteIds: readonly string[]): Promise<LinkRow[]> {
  if (athleteIds.length === 0) return [];
  const t = TABLES[kind];
  return db.query(
    `SELECT l.id, l.organization_id, l.athlete_id, au.display_name AS athlete_name, l.${t.member} AS member_id,
            mu.display_name AS member_name, mu.email AS member_email, ${t.role} AS role
       FROM ${t.table} l
       JOIN memberships am ON am.id = l.athlete_id JOIN users au ON au.id = am.user_id
       JOIN memberships mm ON mm.id = l.${t.member} AND mm.active AND ${t.role} = ANY(mm.roles) JOIN users mu ON mu.id = mm.user_id
      WHERE l.athlete_id = ANY($1) ORDER BY ${t.order}`,
    [athleteIds],
  );
}

/** The care teams of these athletes: coaches and clinicians who still hold that role. */
export async function careTeamsFor(db: Db, athleteIds: readonly string[]): Promise<CareTeamAssignmentDto[]> {
  return (await linkRows(db, 'careTeam', athleteIds)).map((r) => ({
    id: r.id,
    organizationId: r.organization_id,
    athleteId: r.athlete_id,
    athleteName: r.athlete_name,
    memberId: r.member_id,
    memberName: r.member_name,
    memberEmail: r.member_email,
    role: r.role as CareTeamRole,
  }));
}

/** The guardians of these athletes who are still active guardians. */
export async function guardianLinksFor(db: Db, athleteIds: readonly string[]): Promise<GuardianLinkDto[]> {
  return (await linkRows(db, 'guardian', athleteIds)).map((r) => ({
    id: r.id,
    organizationId: r.organization_id,
    athleteId: r.athlete_id,
    athleteName: r.athlete_name,
    guardianId: r.member_id,
    guardianName: r.member_name,
  }));
}
