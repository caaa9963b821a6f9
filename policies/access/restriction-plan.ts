import { hasRole } from './actor';
import type { RuleSet } from './builder';

/**
 * Restriction plans are functional limits, not clinical content: the whole care team, the athlete and
 * guardians see what is in force ('current'); the care team also sees every earlier version
 * ('history'). Admins see none of it. Only clinicians on the care team write plans (case.ts).
 */
export const restrictionPlanRules: RuleSet = ({ can }, actor) => {
  const org = actor.organizationId;
  if (hasRole(actor, 'coach') || hasRole(actor, 'clinician')) {
    const team = [...actor.coachOf, ...actor.clinicianOf];
    can('read', 'RestrictionPlan', ['current', 'history'], { organizationId: org, athleteId: { $in: team } });
  }
  if (hasRole(actor, 'guardian'))
    can('read', 'RestrictionPlan', ['current'], { organizationId: org, athleteId: { $in: actor.guardianOf } });
  if (hasRole(actor, 'athlete')) can('read', 'RestrictionPlan', ['current'], { organizationId: org, athleteId: actor.membershipId });
};
