import { hasRole } from './actor';
import type { RuleSet } from './builder';

/** The audit trail is append-only for everyone: nobody may update or delete an entry. */
export const auditRules: RuleSet = ({ can }, actor) => {
  if (hasRole(actor, 'admin')) {
    can('read', 'AuditEntry', { organizationId: actor.organizationId });
    can('read', 'AuditChain', { organizationId: actor.organizationId });
  }
  // Clinicians follow the trail of the athletes in their care.
  if (hasRole(actor, 'clinician')) {
    can('read', 'AuditEntry', { organizationId: actor.organizationId, athleteId: { $in: actor.clinicianOf } });
  }
};
