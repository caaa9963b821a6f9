import { hasRole } from './actor';
import type { RuleSet } from './builder';

/**
 * Records leaving in open standards (iCalendar, RFC 5545; HL7 FHIR R4).
 * - CalendarFeed: a member's own private iCalendar feed. Athletes (their sessions and stages), coaches
 *   (their athletes' sessions) and guardians (the sessions of the athletes they are linked to, with no
 *   limits) turn one on, read its state and turn it off — only their own. Clinicians and admins have
 *   none: their days are not a training calendar.
 * - CaseExport: the FHIR R4 Bundle of a case carries the diagnosis, pain reports and the letter, so
 *   only a clinician on the athlete's care team downloads it (minimum necessary, 45 CFR 164.502(b)).
 */
export const exportRules: RuleSet = ({ can }, actor) => {
  const org = actor.organizationId;
  if (hasRole(actor, 'athlete') || hasRole(actor, 'coach') || hasRole(actor, 'guardian')) {
    const own = { organizationId: org, membershipId: actor.membershipId };
    can('read', 'CalendarFeed', own);
    can('create', 'CalendarFeed', own);
    can('delete', 'CalendarFeed', own);
  }
  if (hasRole(actor, 'clinician')) can('read', 'CaseExport', { organizationId: org, athleteId: { $in: actor.clinicianOf } });
};
