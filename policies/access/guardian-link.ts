import { hasRole } from './actor';
import type { RuleSet } from './builder';

export const guardianLinkRules: RuleSet = ({ can }, actor) => {
  const org = actor.organizationId;
  can('read', 'GuardianLink', { organizationId: org, guardianId: actor.membershipId });
  if (hasRole(actor, 'athlete')) can('read', 'GuardianLink', { organizationId: org, athleteId: actor.membershipId });
  const team = [...actor.coachOf, ...actor.clinicianOf];
  if (team.length > 0) can('read', 'GuardianLink', { organizationId: org, athleteId: { $in: team } });
  if (hasRole(actor, 'admin')) {
    can('read', 'GuardianLink', { organizationId: org });
    can('create', 'GuardianLink', { organizationId: org });
    can('delete', 'GuardianLink', { organizationId: org });
  }
};
