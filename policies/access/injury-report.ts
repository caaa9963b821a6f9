import { hasRole } from './actor';
import type { RuleSet } from './builder';

/**
 * The organization's injury report (policies/load/injury-report.ts): aggregates only, with small cells
 * suppressed, for admins and clinicians. Coaches record exposure through their groups (Group update)
 * but do not read the report; athletes and guardians never do.
 */
export const injuryReportRules: RuleSet = ({ can }, actor) => {
  if (hasRole(actor, 'admin') || hasRole(actor, 'clinician')) can('read', 'InjuryReport', { organizationId: actor.organizationId });
};
