import type { Role } from '../roles';
import type { Action, SubjectName } from './subjects';

/**
 * The role × action table, kept as data (SECURITY item 13). The policy unit tests check every row
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
 */
export const MATRIX_ROLES: readonly Role[] = ['athlete', 'coach', 'clinician', 'guardian', 'admin'];

// prettier-ignore
const GRID: [SubjectName, Action, Relation, string][] = [
  //                                                     ath coa cli gua adm
  ['Organization',       'read',   'same-org',        'Y   Y   Y   Y   Y'],
  ['Organization',       'read',   'other-org',       'n   n   n   n   n'],
  ['Organization',       'update', 'same-org',        'n   n   n   n   Y'],
  ['Organization',       'update', 'other-org',       'n   n   n   n   n'],
  ['Organization',       'delete', 'same-org',        'n   n   n   n   n'],

  // A person's own account; admins manage people through Membership, never other accounts.
  ['User',               'read',   'self',            'Y   Y   Y   Y   Y'],
  ['User',               'read',   'same-org',        'n   n   n   n   n'],
  ['User',               'read',   'other-org',       'n   n   n   n   n'],
  ['User',               'update', 'self',            'Y   Y   Y   Y   Y'],
  ['User',               'update', 'same-org',        'n   n   n   n   n'],
  ['User',               'update', 'other-org',       'n   n   n   n   n'],
  ['User',               'delete', 'self',            'n   n   n   n   n'],

  // Admins may change and remove their own membership as far as the rules go; the server still
  // refuses dropping their own admin role or removing themselves (409), so an org keeps an admin.
  ['Membership',         'read',   'self',            'Y   Y   Y   Y   Y'],
  ['Membership',         'read',   'own-care-team',   '-   Y   Y   Y   -'],
  ['Membership',         'read',   'other-athlete',   'n   n   n   n   Y'],
  ['Membership',         'read',   'same-org',        'n   n   n   n   Y'],
  ['Membership',         'read',   'other-org',       'n   n   n   n   n'],
  ['Membership',         'create', 'same-org',        'n   n   n   n   Y'],
  ['Membership',         'create', 'other-org',       'n   n   n   n   n'],
  ['Membership',         'update', 'self',            'n   n   n   n   Y'],
  ['Membership',         'update', 'own-care-team',   '-   n   n   n   -'],
  ['Membership',         'update', 'other-athlete',   'n   n   n   n   Y'],
  ['Membership',         'update', 'same-org',        'n   n   n   n   Y'],
  ['Membership',         'update', 'other-org',       'n   n   n   n   n'],
  ['Membership',         'delete', 'self',            'n   n   n   n   Y'],
  ['Membership',         'delete', 'own-care-team',   '-   n   n   n   -'],
  ['Membership',         'delete', 'other-athlete',   'n   n   n   n   Y'],
  ['Membership',         'delete', 'same-org',        'n   n   n   n   Y'],
  ['Membership',         'delete', 'other-org',       'n   n   n   n   n'],

  ['Athlete',            'read',   'self',            'Y   -   -   -   -'],
  ['Athlete',            'read',   'own-care-team',   '-   Y   Y   Y   -'],
  ['Athlete',            'read',   'other-athlete',   'n   n   n   n   Y'],
  ['Athlete',            'read',   'other-org',       'n   n   n   n   n'],
  ['Athlete',            'update', 'self',            'n   -   -   -   -'],
  ['Athlete',            'update', 'own-care-team',   '-   n   n   n   -'],
  ['Athlete',            'update', 'other-athlete',   'n   n   n   n   Y'],
  ['Athlete',            'update', 'other-org',       'n   n   n   n   n'],
  // A profile goes with its membership: removing the person is the only way to remove it.
  ['Athlete',            'delete', 'other-athlete',   'n   n   n   n   n'],

  ['Invitation',         'read',   'same-org',        'n   n   n   n   Y'],
  ['Invitation',         'read',   'other-org',       'n   n   n   n   n'],
  ['Invitation',         'create', 'same-org',        'n   n   n   n   Y'],
  ['Invitation',         'create', 'other-org',       'n   n   n   n   n'],
  ['Invitation',         'delete', 'same-org',        'n   n   n   n   Y'],
  ['Invitation',         'delete', 'other-org',       'n   n   n   n   n'],

  ['CareTeamAssignment', 'read',   'self',            'Y   -   -   -   -'],
  ['CareTeamAssignment', 'read',   'own-care-team',   '-   Y   Y   Y   -'],
  ['CareTeamAssignment', 'read',   'other-athlete',   'n   n   n   n   Y'],
  ['CareTeamAssignment', 'read',   'other-org',       'n   n   n   n   n'],
  ['CareTeamAssignment', 'create', 'self',            'n   -   -   -   -'],
  ['CareTeamAssignment', 'create', 'own-care-team',   '-   n   n   n   -'],
  ['CareTeamAssignment', 'create', 'other-athlete',   'n   n   n   n   Y'],
  ['CareTeamAssignment', 'create', 'other-org',       'n   n   n   n   n'],
  ['CareTeamAssignment', 'delete', 'self',            'n   -   -   -   -'],
  ['CareTeamAssignment', 'delete', 'own-care-team',   '-   n   n   n   -'],
  ['CareTeamAssignment', 'delete', 'other-athlete',   'n   n   n   n   Y'],
  ['CareTeamAssignment', 'delete', 'other-org',       'n   n   n   n   n'],

  // A guardian sees their own link only, not a co-guardian's (see 'own-care-team').
  ['GuardianLink',       'read',   'self',            'Y   -   -   Y   -'],
  ['GuardianLink',       'read',   'own-care-team',   '-   Y   Y   Y   -'],
  ['GuardianLink',       'read',   'other-athlete',   'n   n   n   n   Y'],
  ['GuardianLink',       'read',   'other-org',       'n   n   n   n   n'],
  ['GuardianLink',       'create', 'self',            'n   -   -   n   -'],
  ['GuardianLink',       'create', 'own-care-team',   '-   n   n   n   -'],
  ['GuardianLink',       'create', 'other-athlete',   'n   n   n   n   Y'],
  ['GuardianLink',       'create', 'other-org',       'n   n   n   n   n'],
  ['GuardianLink',       'delete', 'self',            'n   -   -   n   -'],
  ['GuardianLink',       'delete', 'own-care-team',   '-   n   n   n   -'],
  ['GuardianLink',       'delete', 'other-athlete',   'n   n   n   n   Y'],
  ['GuardianLink',       'delete', 'other-org',       'n   n   n   n   n'],

  // Append-only: entries are written by the server in the change's transaction, never through the rules.
  // 'same-org' is an entry about no athlete; the others are entries about that athlete. Clinicians
  // follow the trail of the athletes in their care; only admins see (and verify) the whole trail.
  ['AuditEntry',         'read',   'self',            'n   -   -   -   -'],
  ['AuditEntry',         'read',   'own-care-team',   '-   n   Y   n   -'],
  ['AuditEntry',         'read',   'other-athlete',   'n   n   n   n   Y'],
  ['AuditEntry',         'read',   'same-org',        'n   n   n   n   Y'],
  ['AuditEntry',         'read',   'other-org',       'n   n   n   n   n'],
  ['AuditEntry',         'create', 'same-org',        'n   n   n   n   n'],
  ['AuditEntry',         'update', 'own-care-team',   '-   n   n   n   -'],
  ['AuditEntry',         'update', 'same-org',        'n   n   n   n   n'],
  ['AuditEntry',         'update', 'other-org',       'n   n   n   n   n'],
  ['AuditEntry',         'delete', 'own-care-team',   '-   n   n   n   -'],
  ['AuditEntry',         'delete', 'same-org',        'n   n   n   n   n'],
  ['AuditEntry',         'delete', 'other-org',       'n   n   n   n   n'],

  // The whole chain, checked end to end: it speaks of every entry, so it is the admins' alone.
  ['AuditChain',         'read',   'same-org',        'n   n   n   n   Y'],
  ['AuditChain',         'read',   'other-org',       'n   n   n   n   n'],
  ['AuditChain',         'update', 'same-org',        'n   n   n   n   n'],
  ['AuditChain',         'delete', 'same-org',        'n   n   n   n   n'],

  // Injury cases. Everyone around the athlete reads one, each a different set of fields (case.ts,
  // checked field by field in ability.test.ts); admins see only that a case exists. Only the
  // athlete's own clinicians open and update cases; nobody deletes one.
  ['Case',               'read',   'self',            'Y   -   -   -   -'],
  ['Case',               'read',   'own-care-team',   '-   Y   Y   Y   -'],
  ['Case',               'read',   'other-athlete',   'n   n   n   n   Y'],
  ['Case',               'read',   'other-org',       'n   n   n   n   n'],
  ['Case',               'create', 'self',            'n   -   -   -   -'],
  ['Case',               'create', 'own-care-team',   '-   n   Y   n   -'],
  ['Case',               'create', 'other-athlete',   'n   n   n   n   n'],
  ['Case',               'create', 'other-org',       'n   n   n   n   n'],
  ['Case',               'update', 'self',            'n   -   -   -   -'],
  ['Case',               'update', 'own-care-team',   '-   n   Y   n   -'],
  ['Case',               'update', 'other-athlete',   'n   n   n   n   n'],
  ['Case',               'update', 'other-org',       'n   n   n   n   n'],
  ['Case',               'delete', 'own-care-team',   '-   n   n   n   -'],
  ['Case',               'delete', 'other-athlete',   'n   n   n   n   n'],

  ['ParticipationStatus', 'read',  'self',            'Y   -   -   -   -'],
  ['ParticipationStatus', 'read',  'own-care-team',   '-   Y   Y   Y   -'],
  ['ParticipationStatus', 'read',  'other-athlete',   'n   n   n   n   Y'],
  ['ParticipationStatus', 'read',  'other-org',       'n   n   n   n   n'],
  ['ParticipationStatus', 'create', 'self',           'n   -   -   -   -'],
  ['ParticipationStatus', 'create', 'own-care-team',  '-   n   Y   n   -'],
  ['ParticipationStatus', 'create', 'other-athlete',  'n   n   n   n   n'],
  ['ParticipationStatus', 'create', 'other-org',      'n   n   n   n   n'],

  // Functional limits, not clinical content: the athlete's circle reads them; admins see none.
  ['RestrictionPlan',    'read',   'self',            'Y   -   -   -   -'],
  ['RestrictionPlan',    'read',   'own-care-team',   '-   Y   Y   Y   -'],
  ['RestrictionPlan',    'read',   'other-athlete',   'n   n   n   n   n'],
  ['RestrictionPlan',    'read',   'other-org',       'n   n   n   n   n'],
  ['RestrictionPlan',    'create', 'self',            'n   -   -   -   -'],
  ['RestrictionPlan',    'create', 'own-care-team',   '-   n   Y   n   -'],
  ['RestrictionPlan',    'create', 'other-athlete',   'n   n   n   n   n'],
  ['RestrictionPlan',    'create', 'other-org',       'n   n   n   n   n'],
  ['RestrictionPlan',    'update', 'self',            'n   -   -   -   -'],
  ['RestrictionPlan',    'update', 'own-care-team',   '-   n   Y   n   -'],
  ['RestrictionPlan',    'update', 'other-athlete',   'n   n   n   n   n'],
  ['RestrictionPlan',    'update', 'other-org',       'n   n   n   n   n'],
  ['RestrictionPlan',    'delete', 'own-care-team',   '-   n   n   n   -'],

  // What the athlete reports: they write their own; their coaches and clinicians read it (coaches
  // without the pain narrative or red-flag answers, checked in ability.test.ts); guardians and admins
  // read none of it.
  ['PainReport',         'read',   'self',            'Y   -   -   -   -'],
  ['PainReport',         'read',   'own-care-team',   '-   Y   Y   n   -'],
  ['PainReport',         'read',   'other-athlete',   'n   n   n   n   n'],
  ['PainReport',         'read',   'other-org',       'n   n   n   n   n'],
  ['PainReport',         'create', 'self',            'Y   -   -   -   -'],
  ['PainReport',         'create', 'own-care-team',   '-   n   n   n   -'],
  ['PainReport',         'create', 'other-athlete',   'n   n   n   n   n'],
  ['PainReport',         'create', 'other-org',       'n   n   n   n   n'],
  ['PainReport',         'update', 'self',            'n   -   -   -   -'],
  ['PainReport',         'update', 'own-care-team',   '-   n   n   n   -'],

  ['CheckIn',            'read',   'self',            'Y   -   -   -   -'],
  ['CheckIn',            'read',   'own-care-team',   '-   Y   Y   n   -'],
  ['CheckIn',            'read',   'other-athlete',   'n   n   n   n   n'],
  ['CheckIn',            'read',   'other-org',       'n   n   n   n   n'],
  ['CheckIn',            'create', 'self',            'Y   -   -   -   -'],
  ['CheckIn',            'create', 'own-care-team',   '-   n   n   n   -'],
  ['CheckIn',            'create', 'other-athlete',   'n   n   n   n   n'],
  ['CheckIn',            'create', 'other-org',       'n   n   n   n   n'],

  ['TrainingLog',        'read',   'self',            'Y   -   -   -   -'],
  ['TrainingLog',        'read',   'own-care-team',   '-   Y   Y   n   -'],
  ['TrainingLog',        'read',   'other-athlete',   'n   n   n   n   n'],
  ['TrainingLog',        'read',   'other-org',       'n   n   n   n   n'],
  ['TrainingLog',        'create', 'self',            'Y   -   -   -   -'],
  ['TrainingLog',        'create', 'own-care-team',   '-   n   n   n   -'],
  ['TrainingLog',        'create', 'other-athlete',   'n   n   n   n   n'],
  ['TrainingLog',        'create', 'other-org',       'n   n   n   n   n'],
  ['TrainingLog',        'update', 'self',            'Y   -   -   -   -'],
  ['TrainingLog',        'update', 'own-care-team',   '-   n   n   n   -'],
  ['TrainingLog',        'update', 'other-athlete',   'n   n   n   n   n'],
  ['TrainingLog',        'update', 'other-org',       'n   n   n   n   n'],

  // Flags raised from reports are for the care team to see and resolve, not the athlete or guardian.
  ['Flag',               'read',   'self',            'n   -   -   -   -'],
  ['Flag',               'read',   'own-care-team',   '-   Y   Y   n   -'],
  ['Flag',               'read',   'other-athlete',   'n   n   n   n   n'],
  ['Flag',               'read',   'other-org',       'n   n   n   n   n'],
  ['Flag',               'update', 'self',            'n   -   -   -   -'],
  ['Flag',               'update', 'own-care-team',   '-   Y   Y   n   -'],
  ['Flag',               'update', 'other-athlete',   'n   n   n   n   n'],
  ['Flag',               'update', 'other-org',       'n   n   n   n   n'],

  // 'self' is a notice to the actor; 'same-org' a notice to someone else.
  ['Notification',       'read',   'self',            'Y   Y   Y   Y   Y'],
  ['Notification',       'read',   'same-org',        'n   n   n   n   n'],
  ['Notification',       'read',   'other-org',       'n   n   n   n   n'],
  ['Notification',       'update', 'self',            'Y   Y   Y   Y   Y'],
  ['Notification',       'update', 'same-org',        'n   n   n   n   n'],
  ['Notification',       'update', 'other-org',       'n   n   n   n   n'],

  // The organization's exercise library: names and movement patterns, nothing about a person, so
  // every member reads it (athletes and guardians see exercise names in sessions). Coaches and
  // admins keep it; nobody deletes an exercise (archiving is an update), so old sessions still resolve.
  ['Exercise',           'read',   'same-org',        'Y   Y   Y   Y   Y'],
  ['Exercise',           'read',   'other-org',       'n   n   n   n   n'],
  ['Exercise',           'create', 'same-org',        'n   Y   n   n   Y'],
  ['Exercise',           'create', 'other-org',       'n   n   n   n   n'],
  ['Exercise',           'update', 'same-org',        'n   Y   n   n   Y'],
  ['Exercise',           'update', 'other-org',       'n   n   n   n   n'],
  ['Exercise',           'delete', 'same-org',        'n   n   n   n   n'],

  // Strength baselines (tested or estimated 1RM): the care team records and reads them, the athlete
  // reads their own; guardians and admins none. Append-only: a new baseline replaces, never edits.
  ['Baseline',           'read',   'self',            'Y   -   -   -   -'],
  ['Baseline',           'read',   'own-care-team',   '-   Y   Y   n   -'],
  ['Baseline',           'read',   'other-athlete',   'n   n   n   n   n'],
  ['Baseline',           'read',   'other-org',       'n   n   n   n   n'],
  ['Baseline',           'create', 'self',            'n   -   -   -   -'],
  ['Baseline',           'create', 'own-care-team',   '-   Y   Y   n   -'],
  ['Baseline',           'create', 'other-athlete',   'n   n   n   n   n'],
  ['Baseline',           'create', 'other-org',       'n   n   n   n   n'],
  ['Baseline',           'update', 'own-care-team',   '-   n   n   n   -'],
  ['Baseline',           'delete', 'own-care-team',   '-   n   n   n   -'],

  // A program as seen for one of its athletes (a group program is checked athlete by athlete).
  // Coaches build and edit programs for their care-team athletes; clinicians read them; the athlete
  // reads their own, published sessions only (the 'published' field, checked in ability.test.ts).
  // Guardians and admins see none. Sessions are removed through 'update'; a program is never deleted.
  ['Program',            'read',   'self',            'Y   -   -   -   -'],
  ['Program',            'read',   'own-care-team',   '-   Y   Y   n   -'],
  ['Program',            'read',   'other-athlete',   'n   n   n   n   n'],
  ['Program',            'read',   'other-org',       'n   n   n   n   n'],
  ['Program',            'create', 'self',            'n   -   -   -   -'],
  ['Program',            'create', 'own-care-team',   '-   Y   n   n   -'],
  ['Program',            'create', 'other-athlete',   'n   n   n   n   n'],
  ['Program',            'create', 'other-org',       'n   n   n   n   n'],
  ['Program',            'update', 'self',            'n   -   -   -   -'],
  ['Program',            'update', 'own-care-team',   '-   Y   n   n   -'],
  ['Program',            'update', 'other-athlete',   'n   n   n   n   n'],
  ['Program',            'update', 'other-org',       'n   n   n   n   n'],
  ['Program',            'delete', 'own-care-team',   '-   n   n   n   -'],

  // Going past a cap: the athlete's coach asks, the athlete's clinician decides ('update'); both read
  // the requests. The athlete, guardians and admins neither ask, decide nor read.
  ['ProgramException',   'read',   'self',            'n   -   -   -   -'],
  ['ProgramException',   'read',   'own-care-team',   '-   Y   Y   n   -'],
  ['ProgramException',   'read',   'other-athlete',   'n   n   n   n   n'],
  ['ProgramException',   'read',   'other-org',       'n   n   n   n   n'],
  ['ProgramException',   'create', 'self',            'n   -   -   -   -'],
  ['ProgramException',   'create', 'own-care-team',   '-   Y   n   n   -'],
  ['ProgramException',   'create', 'other-athlete',   'n   n   n   n   n'],
  ['ProgramException',   'create', 'other-org',       'n   n   n   n   n'],
  ['ProgramException',   'update', 'self',            'n   -   -   -   -'],
  ['ProgramException',   'update', 'own-care-team',   '-   n   Y   n   -'],
  ['ProgramException',   'update', 'other-athlete',   'n   n   n   n   n'],
  ['ProgramException',   'update', 'other-org',       'n   n   n   n   n'],
  ['ProgramException',   'delete', 'own-care-team',   '-   n   n   n   -'],

  // Clearance letters carry status and limits only (SECURITY item 26), so the athlete's whole circle
  // reads them (the 'content' field; who sent what, 'deliveries', is for clinicians and admins,
  // checked in ability.test.ts); admins read every letter for the record. Only the athlete's own
  // clinicians draft and sign; a signed letter is never deleted, a later one supersedes it.
  ['Letter',             'read',   'self',            'Y   -   -   -   -'],
  ['Letter',             'read',   'own-care-team',   '-   Y   Y   Y   -'],
  ['Letter',             'read',   'other-athlete',   'n   n   n   n   Y'],
  ['Letter',             'read',   'other-org',       'n   n   n   n   n'],
  ['Letter',             'create', 'self',            'n   -   -   -   -'],
  ['Letter',             'create', 'own-care-team',   '-   n   Y   n   -'],
  ['Letter',             'create', 'other-athlete',   'n   n   n   n   n'],
  ['Letter',             'create', 'other-org',       'n   n   n   n   n'],
  ['Letter',             'update', 'self',            'n   -   -   -   -'],
  ['Letter',             'update', 'own-care-team',   '-   n   Y   n   -'],
  ['Letter',             'update', 'other-athlete',   'n   n   n   n   n'],
  ['Letter',             'update', 'other-org',       'n   n   n   n   n'],
  ['Letter',             'delete', 'self',            'n   -   -   -   -'],
  ['Letter',             'delete', 'own-care-team',   '-   n   n   n   -'],
  ['Letter',             'delete', 'other-athlete',   'n   n   n   n   n'],

  // A guardian acknowledges a letter about the athlete they are linked to, and reads that they did.
  ['LetterAcknowledgement', 'read',   'self',          'n   -   -   -   -'],
  ['LetterAcknowledgement', 'read',   'own-care-team', '-   n   n   Y   -'],
  ['LetterAcknowledgement', 'read',   'other-athlete', 'n   n   n   n   n'],
  ['LetterAcknowledgement', 'read',   'other-org',     'n   n   n   n   n'],
  ['LetterAcknowledgement', 'create', 'self',          'n   -   -   -   -'],
  ['LetterAcknowledgement', 'create', 'own-care-team', '-   n   n   Y   -'],
  ['LetterAcknowledgement', 'create', 'other-athlete', 'n   n   n   n   n'],
  ['LetterAcknowledgement', 'create', 'other-org',     'n   n   n   n   n'],
  ['LetterAcknowledgement', 'delete', 'own-care-team', '-   n   n   n   -'],

  // The local fake mail server's messages: the admin's outbox page, read-only.
  ['Outbox',             'read',   'same-org',        'n   n   n   n   Y'],
  ['Outbox',             'read',   'other-org',       'n   n   n   n   n'],
  ['Outbox',             'create', 'same-org',        'n   n   n   n   n'],
  ['Outbox',             'update', 'same-org',        'n   n   n   n   n'],
  ['Outbox',             'delete', 'same-org',        'n   n   n   n   n'],
  // Outside documents on a case: clinicians on the team and the athlete only (coaches, guardians
  // and admins never). 'delete' rows are about the actor's own upload.
  ['CaseDocument',       'read',   'self',            'Y   -   -   -   -'],
  ['CaseDocument',       'read',   'own-care-team',   '-   n   Y   n   -'],
  ['CaseDocument',       'read',   'other-athlete',   'n   n   n   n   n'],
  ['CaseDocument',       'read',   'other-org',       'n   n   n   n   n'],
  ['CaseDocument',       'create', 'self',            'Y   -   -   -   -'],
  ['CaseDocument',       'create', 'own-care-team',   '-   n   Y   n   -'],
  ['CaseDocument',       'create', 'other-athlete',   'n   n   n   n   n'],
  ['CaseDocument',       'create', 'other-org',       'n   n   n   n   n'],
  ['CaseDocument',       'delete', 'self',            'Y   -   -   -   -'],
  ['CaseDocument',       'delete', 'own-care-team',   '-   n   Y   n   -'],
  ['CaseDocument',       'delete', 'other-athlete',   'n   n   n   n   n'],
  ['CaseDocument',       'delete', 'other-org',       'n   n   n   n   n'],

  // Technique clips: the athlete and the care team; guardians only when the organization turns it
  // on (the matrix's actor has the setting off). 'delete' rows are about the actor's own upload.
  ['Clip',               'read',   'self',            'Y   -   -   -   -'],
  ['Clip',               'read',   'own-care-team',   '-   Y   Y   n   -'],
  ['Clip',               'read',   'other-athlete',   'n   n   n   n   n'],
  ['Clip',               'read',   'other-org',       'n   n   n   n   n'],
  ['Clip',               'create', 'self',            'Y   -   -   -   -'],
  ['Clip',               'create', 'own-care-team',   '-   Y   n   n   -'],
  ['Clip',               'create', 'other-athlete',   'n   n   n   n   n'],
  ['Clip',               'create', 'other-org',       'n   n   n   n   n'],
  ['Clip',               'delete', 'self',            'Y   -   -   -   -'],
  ['Clip',               'delete', 'own-care-team',   '-   Y   n   n   -'],
  ['Clip',               'delete', 'other-athlete',   'n   n   n   n   n'],
  ['Clip',               'delete', 'other-org',       'n   n   n   n   n'],
  ['ClipNote',           'read',   'self',            'Y   -   -   -   -'],
  ['ClipNote',           'read',   'own-care-team',   '-   Y   Y   n   -'],
  ['ClipNote',           'read',   'other-athlete',   'n   n   n   n   n'],
  ['ClipNote',           'read',   'other-org',       'n   n   n   n   n'],
  ['ClipNote',           'create', 'self',            'n   -   -   -   -'],
  ['ClipNote',           'create', 'own-care-team',   '-   Y   Y   n   -'],
  ['ClipNote',           'create', 'other-athlete',   'n   n   n   n   n'],
  ['ClipNote',           'create', 'other-org',       'n   n   n   n   n'],
  ['ClipNote',           'delete', 'own-care-team',   '-   Y   Y   n   -'],
  ['ClipNote',           'delete', 'other-athlete',   'n   n   n   n   n'],
  ['ClipNote',           'delete', 'other-org',       'n   n   n   n   n'],
];

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
