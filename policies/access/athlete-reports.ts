import { hasRole } from './actor';
import type { RuleSet } from './builder';

/**
 * Pain reports, check-ins and training logs. The athlete writes their own; the care team reads them.
 * Coaches get the scores and places but never the pain narrative or the red-flag answers (minimum
 * necessary); guardians and admins read none of it (guardians are told of emergencies by notice).
 */
export const PAIN_REPORT_FIELDS = {
  all: [
    'id',
    'organizationId',
    'athleteId',
    'athleteName',
    'reportedAt',
    'bodyRegions',
    'painNow',
    'painWorst24h',
    'onsetDate',
    'aggravatingPatterns',
    'startedInTraining',
    'note',
    'redFlags',
    'route',
    'caseId',
  ],
  coach: [
    'id',
    'organizationId',
    'athleteId',
    'athleteName',
    'reportedAt',
    'bodyRegions',
    'painNow',
    'painWorst24h',
    'onsetDate',
    'aggravatingPatterns',
    'startedInTraining',
    'route',
    'caseId',
  ],
} as const;

export const athleteReportRules: RuleSet = ({ can }, actor) => {
  const org = actor.organizationId;
  if (hasRole(actor, 'athlete')) {
    const own = { organizationId: org, athleteId: actor.membershipId };
    can('create', 'PainReport', own);
    can('read', 'PainReport', [...PAIN_REPORT_FIELDS.all], own);
    can('create', 'TrainingLog', own);
    can('read', 'TrainingLog', own);
    can('update', 'TrainingLog', own);
    can('create', 'CheckIn', own);
    can('read', 'CheckIn', own);
  }
  if (hasRole(actor, 'clinician')) {
    const team = { organizationId: org, athleteId: { $in: actor.clinicianOf } };
    can('read', 'PainReport', [...PAIN_REPORT_FIELDS.all], team);
    can('read', 'TrainingLog', team);
    can('read', 'CheckIn', team);
    can('read', 'Flag', team);
    can('update', 'Flag', team);
  }
  if (hasRole(actor, 'coach')) {
    const team = { organizationId: org, athleteId: { $in: actor.coachOf } };
    can('read', 'PainReport', [...PAIN_REPORT_FIELDS.coach], team);
    can('read', 'TrainingLog', team);
    can('read', 'CheckIn', team);
    can('read', 'Flag', team);
    can('update', 'Flag', team);
  }
  // Everyone reads and clears their own notices.
  can('read', 'Notification', { organizationId: org, recipientId: actor.membershipId });
  can('update', 'Notification', { organizationId: org, recipientId: actor.membershipId });
};
