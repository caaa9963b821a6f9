import { hasRole } from './actor';
import type { RuleSet } from './builder';

export const guardianLinkRules: RuleSet = ({ can }, actor) => {
  const org = actor.organizationId;
  // A guardian sees every guardian link of the athletes they are linked to (e.g. the other parent).
  if (hasRole(actor, 'guardian')) can('read', 'GuardianLink', { organizationId: org, athleteId: { $in: actor.guardianOf } });
  if (hasRole(actor, 'athlete')) can('read', 'GuardianLink', { organizationId: org, athleteId: actor.membershipId });
  const team = [...actor.coachOf, ...actor.clinicianOf];
  if (hasRole(actor, 'coach') || hasRole(actor, 'clinician'))
    can('read', 'GuardianLink', { organizationId: org, athleteId: { $in: team } });
  if (hasRole(actor, 'admin')) {
    can('read', 'GuardianLink', { organizationId: org });
    can('create', 'GuardianLink', { organizationId: org });
    can('delete', 'GuardianLink', { organizationId: org });
  }
};
