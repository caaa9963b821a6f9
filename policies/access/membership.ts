import { hasRole } from './actor';
import type { RuleSet } from './builder';

/** A person's place in the organization: their roles. Only admins see and change everyone's. */
export const membershipRules: RuleSet = ({ can }, actor) => {
  const org = actor.organizationId;
  can('read', 'Membership', { id: actor.membershipId });
  if (hasRole(actor, 'admin')) {
    can('read', 'Membership', { organizationId: org });
    can('create', 'Membership', { organizationId: org });
    can('update', 'Membership', ['roles'], { organizationId: org });
    can('delete', 'Membership', { organizationId: org });
  }
  const myAthletes = [...actor.coachOf, ...actor.clinicianOf, ...actor.guardianOf];
  if (hasRole(actor, 'coach') || hasRole(actor, 'clinician') || hasRole(actor, 'guardian'))
    can('read', 'Membership', { organizationId: org, id: { $in: myAthletes } });
};
