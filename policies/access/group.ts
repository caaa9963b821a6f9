import { hasRole } from './actor';
import type { RuleSet } from './builder';

/**
 * Groups (a team, a position group, a training block). Admins keep every group of the organization;
 * a coach starts groups (becoming their coach) and reads and keeps the groups they coach — through
 * them they see the group's athletes (services/actor.ts adds those to `coachOf`); a clinician reads
 * the groups holding an athlete in their care. Athletes and guardians read none: who else trains
 * in which group is not theirs to see. Nobody deletes a group; archiving is an update.
 */
export const groupRules: RuleSet = ({ can }, actor) => {
  const org = actor.organizationId;
  if (hasRole(actor, 'admin')) {
    can('read', 'Group', { organizationId: org });
    can('create', 'Group', { organizationId: org });
    can('update', 'Group', { organizationId: org });
  }
  if (hasRole(actor, 'coach')) {
    can('create', 'Group', { organizationId: org });
    can('read', 'Group', { organizationId: org, coachIds: actor.membershipId });
    can('update', 'Group', { organizationId: org, coachIds: actor.membershipId });
  }
  if (hasRole(actor, 'clinician')) can('read', 'Group', { organizationId: org, athleteIds: { $in: actor.clinicianOf } });
};
