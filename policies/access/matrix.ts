import type { Role } from '../roles';
import { CARE_GRID } from './matrix-care';
import { PEOPLE_GRID } from './matrix-people';
import type { Action, SubjectName } from './subjects';

/**
 * The role × action table, kept as data (ASVS 5.0 V8.1.1). The policy unit tests check every row
 * against `defineAbilityFor`, and the HTTP tests check the routes against the same rows, so a change
 * to who may do what shows up here as a reviewed diff — never only in a rules file.
 *
 * Each row is about one role acting on a record that stands in one relation to them. The actor is
 * the role's "linked" person: a coach or clinician on one athlete's care team, a guardian linked to
 * one athlete, an athlete (whose care team and guardian those are), an admin with no links.
 */
export type Relation =
  /** The actor's own record: their account, membership, athlete profile, own care team or guardian link. */
  | 'self'
  /**
   * About the athlete whose circle includes the actor: the athlete a coach or clinician is on the
   * care team of, or a guardian is linked to. For GuardianLink as a guardian: another guardian's link
   * to that same athlete.
   */
  | 'own-care-team'
  /** About an athlete of the same organization the actor has no link to. */
  | 'other-athlete'
  /** A record of the same organization tied to no athlete: the organization, another member, an invitation, the audit trail. */
  | 'same-org'
  /** Any record of another organization. */
  | 'other-org';

export const RELATIONS: Relation[] = ['self', 'own-care-team', 'other-athlete', 'same-org', 'other-org'];

export interface MatrixRow {
  role: Role;
  relation: Relation;
  action: Action;
  subject: SubjectName;
  allowed: boolean;
}

/**
 * Columns, in order: athlete, coach, clinician, guardian, admin.
 * Y = allowed, n = refused, - = the relation does not exist for that role (no row is made).
 * The rows are kept by subject group in matrix-people.ts and matrix-care.ts.
 */
export const MATRIX_ROLES: readonly Role[] = ['athlete', 'coach', 'clinician', 'guardian', 'admin'];

const GRID: [SubjectName, Action, Relation, string][] = [...PEOPLE_GRID, ...CARE_GRID];

function expand(): MatrixRow[] {
  const rows: MatrixRow[] = [];
  for (const [subject, action, relation, cells] of GRID) {
    const marks = cells.trim().split(/\s+/);
    if (marks.length !== MATRIX_ROLES.length)
      throw new Error(`matrix: ${subject} ${action} ${relation} needs ${MATRIX_ROLES.length} cells`);
    marks.forEach((mark, i) => {
      if (mark === '-') return;
      if (mark !== 'Y' && mark !== 'n') throw new Error(`matrix: unknown cell "${mark}" in ${subject} ${action} ${relation}`);
      rows.push({ role: MATRIX_ROLES[i], relation, action, subject, allowed: mark === 'Y' });
    });
  }
  return rows;
}

export const ACCESS_MATRIX: readonly MatrixRow[] = expand();

/** The row for one case; throws when the table has none, so a test never checks against a guess. */
export function matrixRow(role: Role, subject: SubjectName, action: Action, relation: Relation): MatrixRow {
  const row = ACCESS_MATRIX.find((r) => r.role === role && r.subject === subject && r.action === action && r.relation === relation);
  if (!row) throw new Error(`matrix: no row for ${role} ${action} ${subject} (${relation})`);
  return row;
}

export const allows = (role: Role, subject: SubjectName, action: Action, relation: Relation): boolean =>
  matrixRow(role, subject, action, relation).allowed;

/** Whether the role may take `action` on some `subject` at all (the route-level check). */
export const roleMay = (role: Role, subject: SubjectName, action: Action): boolean =>
  ACCESS_MATRIX.some((r) => r.role === role && r.subject === subject && r.action === action && r.allowed);

export type Outcome = 'allowed' | 'forbidden' | 'not_found';

/**
 * How the server answers a role acting, through its own organization's routes, on a record in
 * `relation`: a role that may never take the action is refused outright (403); a record it may not
 * read is not revealed (404); one it may read but not change is refused (403).
 */
export function expectedOutcome(role: Role, subject: SubjectName, action: Action, relation: Relation): Outcome {
  if (!roleMay(role, subject, action)) return 'forbidden';
  if (!allows(role, subject, 'read', relation)) return 'not_found';
  return allows(role, subject, action, relation) ? 'allowed' : 'forbidden';
}
