import { hasRole } from './actor';
import type { RuleSet } from './builder';

/**
 * The athlete's profile (date of birth, sport, minor flag, care team, guardians). Read by the athlete,
 * their care team, their guardians and admins; only admins edit it.
 */
export const athleteRules: RuleSet = ({ can }, actor) => {
  const org = actor.organizationId;
  if (hasRole(actor, 'athlete')) can('read', 'Athlete', { organizationId: org, id: actor.membershipId });
  // Granted by role even while the list is empty: a coach with no athlete yet is shown an empty list,
  // and another team's athlete answers 404 (not revealed), not 403 (ASVS 5.0 V8.2.2).
  if (hasRole(actor, 'coach')) can('read', 'Athlete', { organizationId: org, id: { $in: actor.coachOf } });
  if (hasRole(actor, 'clinician')) can('read', 'Athlete', { organizationId: org, id: { $in: actor.clinicianOf } });
  if (hasRole(actor, 'guardian')) can('read', 'Athlete', { organizationId: org, id: { $in: actor.guardianOf } });
  if (hasRole(actor, 'admin')) {
    can('read', 'Athlete', { organizationId: org });
    can('update', 'Athlete', ['dateOfBirth', 'sport', 'position'], { organizationId: org });
  }
};
