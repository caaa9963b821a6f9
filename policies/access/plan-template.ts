import { hasRole } from './actor';
import type { RuleSet } from './builder';

/**
 * Plan templates are the organization's shared protocols, tied to no athlete: every clinician reads
 * them all and starts plans from them, writes their own, and copies anyone's; only a template's
 * author changes or archives it — or an admin, who keeps the organization's library in order but
 * writes no plans. Coaches, athletes and guardians see none: templates are the clinicians' tools,
 * and a plan reaches the athlete only once a clinician saves it on a case.
 */
export const planTemplateRules: RuleSet = ({ can }, actor) => {
  const org = actor.organizationId;
  if (hasRole(actor, 'clinician')) {
    can('read', 'PlanTemplate', { organizationId: org });
    can('create', 'PlanTemplate', { organizationId: org });
    can('update', 'PlanTemplate', { organizationId: org, authorId: actor.membershipId });
  }
  if (hasRole(actor, 'admin')) {
    can('read', 'PlanTemplate', { organizationId: org });
    can('update', 'PlanTemplate', { organizationId: org });
  }
};
