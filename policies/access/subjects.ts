import type { ForcedSubject, MongoAbility } from '@casl/ability';

export const ACTIONS = ['read', 'create', 'update', 'delete', 'manage'] as const;
export type Action = (typeof ACTIONS)[number];

/**
 * Subjects and the attributes the rules look at. The server passes loaded records (or copies of
 * them) tagged with `subject(type, obj)`; the client passes the DTOs it received.
 */
export interface SubjectShapes {
  Organization: { id: string };
  User: { id: string };
  Membership: { id: string; organizationId: string; userId: string };
  Athlete: { id: string; organizationId: string };
  Invitation: { id: string; organizationId: string };
  CareTeamAssignment: { id: string; organizationId: string; athleteId: string };
  GuardianLink: { id: string; organizationId: string; athleteId: string; guardianId: string };
  AuditEntry: { organizationId: string; athleteId?: string | null };
  /** The organization's whole hash chain, checked end to end. */
  AuditChain: { organizationId: string };
  Case: { id: string; organizationId: string; athleteId: string };
  ParticipationStatus: { organizationId: string; athleteId: string };
  RestrictionPlan: { id: string; organizationId: string; athleteId: string };
  PainReport: { id: string; organizationId: string; athleteId: string };
  CheckIn: { organizationId: string; athleteId: string };
  TrainingLog: { id: string; organizationId: string; athleteId: string };
  Flag: { id: string; organizationId: string; athleteId: string };
  Notification: { id: string; organizationId: string; recipientId: string };
  Exercise: { id: string; organizationId: string };
  Baseline: { organizationId: string; athleteId: string };
  /** A program as seen for one of its athletes. */
  Program: { id: string; organizationId: string; athleteId: string };
  ProgramException: { id: string; organizationId: string; athleteId: string };
  Letter: { id: string; organizationId: string; athleteId: string };
  LetterAcknowledgement: { organizationId: string; athleteId: string };
  /** The local fake mail server's messages (only while it is in use). */
  Outbox: { organizationId: string };
  /** An outside document on a case: clinicians on the care team and the athlete only. */
  CaseDocument: { id: string; organizationId: string; athleteId: string; uploadedByUserId: string };
  /** A technique clip of a logged set. */
  Clip: { id: string; organizationId: string; athleteId: string; uploadedByUserId: string };
  /** A note pinned to a time in a clip. */
  ClipNote: { id: string; organizationId: string; athleteId: string; authorUserId: string };
  /** A team, position group or training block, with its coaches' and athletes' membership ids. */
  Group: { id: string; organizationId: string; coachIds: string[]; athleteIds: string[] };
  /** A restriction plan written as days from its start, shared in the organization; `authorId` is the author's membership. */
  PlanTemplate: { id: string; organizationId: string; authorId: string };
  /** The organization's injury report: aggregates only, small cells suppressed. */
  InjuryReport: { organizationId: string };
  /**
   * A person's whole record as a ZIP: who it is about, whether that athlete is a minor on the
   * organization's today (a guardian may ask only then), and who asked (only they may download it).
   */
  RecordExport: { organizationId: string; athleteId: string; athleteIsMinor: boolean; requestedByUserId?: string };
  /** A member's own private iCalendar feed (only the token's hash is stored). */
  CalendarFeed: { organizationId: string; membershipId: string };
  /** A case as a FHIR R4 Bundle for the clinician's health record. */
  CaseExport: { organizationId: string; athleteId: string };
}
export type SubjectName = keyof SubjectShapes;
export const SUBJECT_NAMES: SubjectName[] = [
  'Organization',
  'User',
  'Membership',
  'Athlete',
  'Invitation',
  'CareTeamAssignment',
  'GuardianLink',
  'AuditEntry',
  'AuditChain',
  'Case',
  'ParticipationStatus',
  'RestrictionPlan',
  'PainReport',
  'CheckIn',
  'TrainingLog',
  'Flag',
  'Notification',
  'Exercise',
  'Baseline',
  'Program',
  'ProgramException',
  'Letter',
  'LetterAcknowledgement',
  'Outbox',
  'CaseDocument',
  'Clip',
  'ClipNote',
  'Group',
  'PlanTemplate',
  'InjuryReport',
  'RecordExport',
  'CalendarFeed',
  'CaseExport',
];

type TaggedSubjects = {
  [K in SubjectName]: SubjectShapes[K] & ForcedSubject<K>;
}[SubjectName];

export type AppSubject = SubjectName | TaggedSubjects | 'all';
export type AppAbility = MongoAbility<[Action, AppSubject]>;
