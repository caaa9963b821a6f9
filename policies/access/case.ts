import { hasRole } from './actor';
import type { RuleSet } from './builder';

/**
 * Which fields of a case each person around the athlete may read (minimum necessary, 45 CFR
 * 164.502(b)): clinicians everything; coaches the functional picture without diagnosis or notes;
 * the athlete all but the clinical notes; guardians the status; admins that a case exists.
 */
export const CASE_FIELDS = {
  all: [
    'id',
    'organizationId',
    'athleteId',
    'athleteName',
    'bodyRegions',
    'onsetDate',
    'diagnosis',
    'clinicalNotes',
    'status',
    'statusEffectiveFrom',
    'statusNote',
    'reviewDate',
    'openedAt',
    'openedByName',
    'closedOn',
    'closingNote',
    'planId',
    'version',
  ],
  coach: [
    'id',
    'organizationId',
    'athleteId',
    'athleteName',
    'bodyRegions',
    'onsetDate',
    'status',
    'statusEffectiveFrom',
    'statusNote',
    'reviewDate',
    'openedAt',
    'openedByName',
    'closedOn',
    'closingNote',
    'planId',
    'version',
  ],
  athlete: [
    'id',
    'organizationId',
    'athleteId',
    'athleteName',
    'bodyRegions',
    'onsetDate',
    'diagnosis',
    'status',
    'statusEffectiveFrom',
    'statusNote',
    'reviewDate',
    'openedAt',
    'openedByName',
    'closedOn',
    'closingNote',
    'planId',
    'version',
  ],
  guardian: [
    'id',
    'organizationId',
    'athleteId',
    'athleteName',
    'status',
    'statusEffectiveFrom',
    'statusNote',
    'reviewDate',
    'openedAt',
    'closedOn',
    'planId',
    'version',
  ],
  admin: ['id', 'organizationId', 'athleteId', 'athleteName', 'status', 'statusEffectiveFrom', 'openedAt', 'closedOn', 'version'],
} as const;

/** Fields clinicians write that never leave the clinical team, and are redacted in the audit trail. */
export const CLINICAL_FIELDS = ['diagnosis', 'clinicalNotes'] as const;

export const caseRules: RuleSet = ({ can }, actor) => {
  const org = actor.organizationId;
  // Granted by role even while the list is empty, so another team's record answers 404, not 403.
  if (hasRole(actor, 'clinician')) {
    const mine = { organizationId: org, athleteId: { $in: actor.clinicianOf } };
    can('read', 'Case', [...CASE_FIELDS.all], mine);
    can('create', 'Case', mine);
    can('update', 'Case', mine);
    can('create', 'ParticipationStatus', mine);
    can('create', 'RestrictionPlan', mine);
    can('update', 'RestrictionPlan', mine);
  }
  if (hasRole(actor, 'coach')) can('read', 'Case', [...CASE_FIELDS.coach], { organizationId: org, athleteId: { $in: actor.coachOf } });
  if (hasRole(actor, 'athlete')) can('read', 'Case', [...CASE_FIELDS.athlete], { organizationId: org, athleteId: actor.membershipId });
  if (hasRole(actor, 'guardian'))
    can('read', 'Case', [...CASE_FIELDS.guardian], { organizationId: org, athleteId: { $in: actor.guardianOf } });
  if (hasRole(actor, 'admin')) can('read', 'Case', [...CASE_FIELDS.admin], { organizationId: org });

  // Everyone around the athlete sees the participation status.
  if (hasRole(actor, 'coach') || hasRole(actor, 'clinician') || hasRole(actor, 'guardian')) {
    const around = [...actor.coachOf, ...actor.clinicianOf, ...actor.guardianOf];
    can('read', 'ParticipationStatus', { organizationId: org, athleteId: { $in: around } });
  }
  if (hasRole(actor, 'athlete')) can('read', 'ParticipationStatus', { organizationId: org, athleteId: actor.membershipId });
  if (hasRole(actor, 'admin')) can('read', 'ParticipationStatus', { organizationId: org });
};
