import type { Relation } from './matrix';
import type { Action, SubjectName } from './subjects';

/** Rows of the access matrix (matrix.ts) about the organization and its people: accounts, memberships, profiles, care teams, guardians, the audit trail. */
// prettier-ignore
export const PEOPLE_GRID: [SubjectName, Action, Relation, string][] = [
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

  // Groups. 'self' is a group the actor is in (a coach coaching it, an athlete training in it);
  // 'own-care-team' a group, coached by someone else, holding the athlete the actor is linked to;
  // 'other-athlete' a group of another athlete; 'same-org' a new group with nobody in it yet.
  // Being on an athlete's care team never opens the athlete's groups to a coach.
  ['Group',              'read',   'self',            'n   Y   -   -   -'],
  ['Group',              'read',   'own-care-team',   '-   n   Y   n   -'],
  ['Group',              'read',   'other-athlete',   'n   n   n   n   Y'],
  ['Group',              'read',   'same-org',        'n   n   n   n   Y'],
  ['Group',              'read',   'other-org',       'n   n   n   n   n'],
  ['Group',              'create', 'same-org',        'n   Y   n   n   Y'],
  ['Group',              'create', 'other-org',       'n   n   n   n   n'],
  ['Group',              'update', 'self',            'n   Y   -   -   -'],
  ['Group',              'update', 'own-care-team',   '-   n   n   n   -'],
  ['Group',              'update', 'other-athlete',   'n   n   n   n   Y'],
  ['Group',              'update', 'other-org',       'n   n   n   n   n'],
  ['Group',              'delete', 'other-athlete',   'n   n   n   n   n'],

  // The injury report: aggregates of the whole organization, for admins and clinicians only.
  ['InjuryReport',       'read',   'same-org',        'n   n   Y   n   Y'],
  ['InjuryReport',       'read',   'other-org',       'n   n   n   n   n'],
  ['InjuryReport',       'update', 'same-org',        'n   n   n   n   n'],

  // A person's whole record: the athlete for themself, a guardian for a linked minor (the matrix's
  // linked athlete is a minor); 'read' rows are about a request the actor made themself.
  ['RecordExport',       'create', 'self',            'Y   n   n   n   n'],
  ['RecordExport',       'create', 'own-care-team',   '-   n   n   Y   -'],
  ['RecordExport',       'create', 'other-athlete',   'n   n   n   n   n'],
  ['RecordExport',       'create', 'other-org',       'n   n   n   n   n'],
  ['RecordExport',       'read',   'self',            'Y   n   n   n   n'],
  ['RecordExport',       'read',   'own-care-team',   '-   n   n   Y   -'],
  ['RecordExport',       'read',   'other-athlete',   'n   n   n   n   n'],
  ['RecordExport',       'read',   'other-org',       'n   n   n   n   n'],

  // A private calendar feed: each athlete, coach or guardian turns on, reads and turns off only their
  // own (a guardian's lists the sessions of the athletes they are linked to, never the athlete's feed).
  ['CalendarFeed',       'read',   'self',            'Y   Y   n   Y   n'],
  ['CalendarFeed',       'read',   'own-care-team',   '-   n   n   n   -'],
  ['CalendarFeed',       'read',   'same-org',        'n   n   n   n   n'],
  ['CalendarFeed',       'read',   'other-org',       'n   n   n   n   n'],
  ['CalendarFeed',       'create', 'self',            'Y   Y   n   Y   n'],
  ['CalendarFeed',       'create', 'same-org',        'n   n   n   n   n'],
  ['CalendarFeed',       'create', 'other-org',       'n   n   n   n   n'],
  ['CalendarFeed',       'delete', 'self',            'Y   Y   n   Y   n'],
  ['CalendarFeed',       'delete', 'own-care-team',   '-   n   n   n   -'],
  ['CalendarFeed',       'delete', 'other-org',       'n   n   n   n   n'],

  // A case as a FHIR R4 Bundle (diagnosis, pain reports, the letter): the care team's clinicians only.
  ['CaseExport',         'read',   'self',            'n   -   -   -   -'],
  ['CaseExport',         'read',   'own-care-team',   '-   n   Y   n   -'],
  ['CaseExport',         'read',   'other-athlete',   'n   n   n   n   n'],
  ['CaseExport',         'read',   'other-org',       'n   n   n   n   n'],
];
