import { hasRole } from './actor';
import type { RuleSet } from './builder';

export const organizationRules: RuleSet = ({ can }, actor) => {
  can('read', 'Organization', { id: actor.organizationId });
  if (hasRole(actor, 'admin')) can('update', 'Organization', { id: actor.organizationId });
};
