import { hasRole } from './actor';
import type { RuleSet } from './builder';

/**
 * The athlete's profile (date of birth, sport, minor flag, care team, guardians). Read by the athlete,
 * their care team, their guardians and admins; only admins edit it.
 */
export const athleteRules: RuleSet = ({ can }, actor) => {
  const org = actor.organizationId;
  if (hasRole(actor, 'athlete')) can('read', 'Athlete', { organizationId: org, id: actor.membershipId });
  if (actor.coachOf.length > 0) can('read', 'Athlete', { organizationId: org, id: { $in: actor.coachOf } });
  if (actor.clinicianOf.length > 0) {
    can('read', 'Athlete', { organizationId: org, id: { $in: actor.clinicianOf } });
  }
  if (actor.guardianOf.length > 0) {
    can('read', 'Athlete', { organizationId: org, id: { $in: actor.guardianOf } });
  }
  if (hasRole(actor, 'admin')) {
    can('read', 'Athlete', { organizationId: org });
    can('update', 'Athlete', ['dateOfBirth', 'sport', 'position'], { organizationId: org });
  }
};
