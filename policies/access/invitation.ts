import { hasRole } from './actor';
import type { RuleSet } from './builder';

export const invitationRules: RuleSet = ({ can }, actor) => {
  if (!hasRole(actor, 'admin')) return;
  const org = actor.organizationId;
  can('read', 'Invitation', { organizationId: org });
  can('create', 'Invitation', { organizationId: org });
  can('delete', 'Invitation', { organizationId: org });
};
