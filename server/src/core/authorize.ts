import { subject as tagSubject } from '@casl/ability';
import type { Action, AppAbility, SubjectName, SubjectShapes } from '../../../policies/access';
import { AppError } from './errors';

const NOT_FOUND_WORDS: Record<SubjectName, string> = {
  Organization: 'organization',
  User: 'account',
  Membership: 'person',
  Athlete: 'athlete',
  Invitation: 'invitation',
  CareTeamAssignment: 'care-team assignment',
  GuardianLink: 'guardian link',
  AuditEntry: 'audit entry',
  AuditChain: 'audit chain',
  Case: 'case',
  ParticipationStatus: 'participation status',
  RestrictionPlan: 'restriction plan',
  PainReport: 'pain report',
  CheckIn: 'check-in',
  TrainingLog: 'training log',
  Flag: 'flag',
  Notification: 'notice',
  Exercise: 'exercise',
  Baseline: 'baseline',
  Program: 'program',
  ProgramException: 'exception request',
  Letter: 'letter',
  LetterAcknowledgement: 'acknowledgement',
  Outbox: 'outbox',
  CaseDocument: 'document',
  Clip: 'clip',
  ClipNote: 'note',
  Group: 'group',
  PlanTemplate: 'plan template',
  InjuryReport: 'injury report',
  RecordExport: 'record download',
  CalendarFeed: 'calendar feed',
  CaseExport: 'case',
};

/**
 * The object-level check on a loaded record. A record the user may not even read answers 404 (its
 * existence is not revealed); one they may read but not change answers 403 with the reason.
 */
export function authorize<K extends SubjectName>(
  ability: AppAbility,
  action: Action,
  type: K,
  record: (SubjectShapes[K] & object) | null | undefined,
  field?: string,
): asserts record is SubjectShapes[K] {
  if (!record) throw new AppError('not_found', `That ${NOT_FOUND_WORDS[type]} was not found.`);
  const tagged = tagSubject(type, { ...record } as SubjectShapes[K] & Record<string, unknown>);
  // A read of a part the reader may not see (a plan's history for an athlete) answers 404 like the rest.
  if (!ability.can('read', tagged as never) || (action === 'read' && field !== undefined && !ability.can('read', tagged as never, field))) {
    throw new AppError('not_found', `That ${NOT_FOUND_WORDS[type]} was not found.`);
  }
  if (action !== 'read' && !ability.can(action, tagged as never, field)) {
    throw new AppError('forbidden', refusalMessage(action, type));
  }
}

const SUBJECT_WORDS: Record<SubjectName, string> = {
  Organization: 'organization settings',
  User: 'accounts',
  Membership: 'people and roles',
  Athlete: 'athlete profiles',
  Invitation: 'invitations',
  CareTeamAssignment: 'care teams',
  GuardianLink: 'guardian links',
  AuditEntry: 'the audit trail',
  AuditChain: 'the audit chain check',
  Case: 'cases',
  ParticipationStatus: 'participation status',
  RestrictionPlan: 'restriction plans',
  PainReport: 'pain reports',
  CheckIn: 'check-ins',
  TrainingLog: 'training logs',
  Flag: 'flags',
  Notification: 'notices',
  Exercise: 'the exercise library',
  Baseline: 'baselines',
  Program: 'programs',
  ProgramException: 'exceptions',
  Letter: 'clearance letters',
  LetterAcknowledgement: 'letter acknowledgements',
  Outbox: 'the test outbox',
  CaseDocument: 'case documents',
  Clip: 'technique clips',
  ClipNote: 'notes on clips',
  Group: 'groups',
  PlanTemplate: 'plan templates',
  InjuryReport: 'the injury report',
  RecordExport: 'downloads of a whole record',
  CalendarFeed: 'calendar feeds',
  CaseExport: 'health-record exports of cases',
};

export function refusalMessage(action: Action, subject: SubjectName): string {
  const verb = action === 'read' ? 'see' : action === 'create' ? 'add to' : action === 'delete' ? 'remove from' : 'change';
  return `Your role does not allow you to ${verb} ${SUBJECT_WORDS[subject]}. Ask an admin of your organization if you need this.`;
}
