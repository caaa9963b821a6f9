import { hasRole } from './actor';
import type { RuleSet } from './builder';

/**
 * A person's whole record (the right of access): the athlete asks for their own, and a guardian for
 * a linked athlete while that athlete is a minor — once the athlete comes of age the record is theirs
 * alone to ask for. Only the person who asked reads the request and downloads the file: the link is
 * for one person, not for everyone around the athlete. Staff roles never ask for someone's record here.
 */
export const recordExportRules: RuleSet = ({ can }, actor) => {
  const org = actor.organizationId;
  if (hasRole(actor, 'athlete')) {
    const own = { organizationId: org, athleteId: actor.membershipId };
    can('create', 'RecordExport', own);
    can('read', 'RecordExport', { ...own, requestedByUserId: actor.userId });
  }
  if (hasRole(actor, 'guardian')) {
    const wards = { organizationId: org, athleteId: { $in: actor.guardianOf }, athleteIsMinor: true };
    can('create', 'RecordExport', wards);
    can('read', 'RecordExport', { ...wards, requestedByUserId: actor.userId });
  }
};
