import { hasRole } from './actor';
import type { RuleSet } from './builder';

/** Who sits on an athlete's care team. Everyone around the athlete may see it; admins assign. */
export const careTeamRules: RuleSet = ({ can }, actor) => {
  const org = actor.organizationId;
  if (hasRole(actor, 'athlete')) {
    can('read', 'CareTeamAssignment', { organizationId: org, athleteId: actor.membershipId });
  }
  const around = [...actor.coachOf, ...actor.clinicianOf, ...actor.guardianOf];
  if (hasRole(actor, 'coach') || hasRole(actor, 'clinician') || hasRole(actor, 'guardian'))
    can('read', 'CareTeamAssignment', { organizationId: org, athleteId: { $in: around } });
  if (hasRole(actor, 'admin')) {
    can('read', 'CareTeamAssignment', { organizationId: org });
    can('create', 'CareTeamAssignment', { organizationId: org });
    can('delete', 'CareTeamAssignment', { organizationId: org });
  }
};
