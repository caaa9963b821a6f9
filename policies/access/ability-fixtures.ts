/** Actors and records standing in each relation of the access matrix, shared by the ability tests. */
import type { Role } from '../roles';
import type { Actor } from './actor';
import type { Relation } from './matrix';
import type { SubjectName, SubjectShapes } from './subjects';

export const ORG = 'org-a';
export const OTHER_ORG = 'org-b';
/** The athlete whose care team and guardian the coach, clinician and guardian actors are. */
export const LINKED_ATHLETE = 'member-athlete';
export const OTHER_ATHLETE = 'member-other-athlete';
export const STAFF = 'member-staff';
const CO_GUARDIAN = 'member-co-guardian';
const GUARDIAN = 'member-guardian';

/** One actor per role, each the "linked" person the matrix describes. */
export function actorFor(role: Role): Actor {
  return {
    userId: `user-${role}`,
    organizationId: ORG,
    membershipId: role === 'athlete' ? LINKED_ATHLETE : role === 'guardian' ? GUARDIAN : `member-${role}`,
    roles: [role],
    coachOf: role === 'coach' ? [LINKED_ATHLETE] : [],
    clinicianOf: role === 'clinician' ? [LINKED_ATHLETE] : [],
    guardianOf: role === 'guardian' ? [LINKED_ATHLETE] : [],
  };
}

/** A record of `subject` standing in `relation` to `actor`, as the matrix means it. */
export function recordFor<K extends SubjectName>(subject: K, relation: Relation, actor: Actor): SubjectShapes[K] {
  const me = actor.membershipId;
  const isGuardian = actor.roles.includes('guardian');
  const athleteOf: Record<Relation, string> = {
    self: me,
    'own-care-team': LINKED_ATHLETE,
    'other-athlete': OTHER_ATHLETE,
    'same-org': STAFF,
    'other-org': 'member-in-org-b',
  };
  const org = relation === 'other-org' ? OTHER_ORG : ORG;
  const athleteId = athleteOf[relation];
  const records: { [S in SubjectName]: SubjectShapes[S] } = {
    Organization: { id: org },
    User: { id: relation === 'self' ? actor.userId : relation === 'other-org' ? 'user-in-org-b' : 'user-staff' },
    Membership: { id: athleteId, organizationId: org, userId: relation === 'self' ? actor.userId : `user-of-${athleteId}` },
    Athlete: { id: athleteId, organizationId: org },
    Invitation: { id: `invitation-${relation}`, organizationId: org },
    CareTeamAssignment: { id: `assignment-${relation}`, organizationId: org, athleteId },
    GuardianLink: {
      id: `link-${relation}`,
      organizationId: org,
      // 'self' for a guardian is their own link to the athlete; for the athlete, a link to them.
      athleteId: relation === 'self' && isGuardian ? LINKED_ATHLETE : athleteId,
      guardianId: relation === 'self' ? (isGuardian ? me : GUARDIAN) : CO_GUARDIAN,
    },
    // An entry about an athlete, except 'same-org': an entry about no athlete (a sign-in, an invitation).
    AuditEntry: { organizationId: org, athleteId: relation === 'same-org' ? null : athleteId },
    AuditChain: { organizationId: org },
    Case: { id: `case-${relation}`, organizationId: org, athleteId },
    ParticipationStatus: { organizationId: org, athleteId },
    RestrictionPlan: { id: `plan-${relation}`, organizationId: org, athleteId },
    PainReport: { id: `pain-${relation}`, organizationId: org, athleteId },
    CheckIn: { organizationId: org, athleteId },
    TrainingLog: { id: `log-${relation}`, organizationId: org, athleteId },
    Flag: { id: `flag-${relation}`, organizationId: org, athleteId },
    Notification: {
      id: `notice-${relation}`,
      organizationId: org,
      recipientId: relation === 'self' ? me : relation === 'other-org' ? 'member-in-org-b' : STAFF,
    },
    // The library belongs to the organization, not to a person: only 'same-org' and 'other-org' apply.
    Exercise: { id: `exercise-${relation}`, organizationId: org },
    Baseline: { organizationId: org, athleteId },
    Program: { id: `program-${relation}`, organizationId: org, athleteId },
    ProgramException: { id: `exception-${relation}`, organizationId: org, athleteId },
    Letter: { id: `letter-${relation}`, organizationId: org, athleteId },
    LetterAcknowledgement: { organizationId: org, athleteId },
    // The organization's outbox is about no athlete: only 'same-org' and 'other-org' apply.
    Outbox: { organizationId: org },
    // Uploads and notes made by the actor themself, so 'delete' rows read as "their own upload".
    CaseDocument: { id: `document-${relation}`, organizationId: org, athleteId, uploadedByUserId: actor.userId },
    Clip: { id: `clip-${relation}`, organizationId: org, athleteId, uploadedByUserId: actor.userId },
    ClipNote: { id: `clip-note-${relation}`, organizationId: org, athleteId, authorUserId: actor.userId },
    // 'self': a group the actor is in (as its coach, or training in it); 'same-org': a group with nobody in it yet.
    Group: {
      id: `group-${relation}`,
      organizationId: org,
      coachIds: relation === 'self' ? [me] : relation === 'same-org' ? [] : [STAFF],
      athleteIds: relation === 'self' ? [me] : relation === 'same-org' ? [] : [athleteId],
    },
    // 'self': a template the actor wrote; 'same-org': one another member of the organization wrote.
    PlanTemplate: { id: `template-${relation}`, organizationId: org, authorId: relation === 'self' ? me : STAFF },
    // The injury report is about no athlete: only 'same-org' and 'other-org' apply.
    InjuryReport: { organizationId: org },
    // A request the actor made themself, about an athlete who is a minor (the factory's linked athlete is one).
    RecordExport: { organizationId: org, athleteId, athleteIsMinor: true, requestedByUserId: actor.userId },
    // 'self': the actor's own feed; any other relation: the feed of that relation's member.
    CalendarFeed: { organizationId: org, membershipId: athleteId },
    CaseExport: { organizationId: org, athleteId },
  };
  return records[subject] as SubjectShapes[K];
}
