import { hasRole } from './actor';
import type { RuleSet } from './builder';

/**
 * Clearance letters carry status and limits only (no diagnosis, no notes), so everyone around the
 * athlete may read them; clinicians on the care team write and sign; guardians acknowledge; admins
 * see them for the record. Delivery status per recipient is for clinicians and admins.
 */
export const letterRules: RuleSet = ({ can }, actor) => {
  const org = actor.organizationId;
  if (hasRole(actor, 'clinician')) {
    const mine = { organizationId: org, athleteId: { $in: actor.clinicianOf } };
    can('read', 'Letter', ['content', 'deliveries'], mine);
    can('create', 'Letter', mine);
    can('update', 'Letter', mine);
  }
  if (hasRole(actor, 'coach')) can('read', 'Letter', ['content'], { organizationId: org, athleteId: { $in: actor.coachOf } });
  if (hasRole(actor, 'athlete')) can('read', 'Letter', ['content'], { organizationId: org, athleteId: actor.membershipId });
  if (hasRole(actor, 'guardian')) {
    can('read', 'Letter', ['content'], { organizationId: org, athleteId: { $in: actor.guardianOf } });
    can('read', 'LetterAcknowledgement', { organizationId: org, athleteId: { $in: actor.guardianOf } });
    can('create', 'LetterAcknowledgement', { organizationId: org, athleteId: { $in: actor.guardianOf } });
  }
  if (hasRole(actor, 'admin')) {
    can('read', 'Letter', ['content', 'deliveries'], { organizationId: org });
    can('read', 'Outbox', { organizationId: org });
  }
};
