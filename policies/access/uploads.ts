import { hasRole } from './actor';
import type { RuleSet } from './builder';

/**
 * Outside documents on a case and technique clips.
 * - Case documents hold clinical detail: only the clinicians on the care team and the athlete see
 *   them (minimum necessary, 45 CFR 164.502(b)); coaches, guardians and admins never do. Whoever
 *   uploaded a document may remove it, and so may a clinician on the team.
 * - Clips: the athlete and the whole care team watch them (the coach needs them to coach); guardians
 *   only when the organization turns that on. The athlete or a coach on the team uploads; the
 *   uploader or the athlete removes. Coaches and clinicians pin notes; the author removes a note.
 */
export const uploadRules: RuleSet = ({ can }, actor) => {
  const org = actor.organizationId;
  // Every member holds a read rule on clips, over no athlete unless a role below adds some, so a
  // clip one may not watch answers 404 like any hidden record (ASVS 5.0 V8.2.2), never a 403 that
  // confirms it exists — also for a role with no clip rule of its own, such as an admin.
  const nobody = { organizationId: org, athleteId: { $in: [] as string[] } };
  can('read', 'Clip', nobody);
  can('read', 'ClipNote', nobody);
  if (hasRole(actor, 'athlete')) {
    const own = { organizationId: org, athleteId: actor.membershipId };
    can('read', 'CaseDocument', own);
    can('create', 'CaseDocument', own);
    can('delete', 'CaseDocument', { ...own, uploadedByUserId: actor.userId });
    can('read', 'Clip', own);
    can('create', 'Clip', own);
    can('delete', 'Clip', own);
    can('read', 'ClipNote', own);
  }
  if (hasRole(actor, 'clinician')) {
    const team = { organizationId: org, athleteId: { $in: actor.clinicianOf } };
    can('read', 'CaseDocument', team);
    can('create', 'CaseDocument', team);
    can('delete', 'CaseDocument', team);
    can('read', 'Clip', team);
    can('read', 'ClipNote', team);
    can('create', 'ClipNote', team);
    can('delete', 'ClipNote', { ...team, authorUserId: actor.userId });
  }
  if (hasRole(actor, 'coach')) {
    const team = { organizationId: org, athleteId: { $in: actor.coachOf } };
    can('read', 'Clip', team);
    can('create', 'Clip', team);
    can('delete', 'Clip', { ...team, uploadedByUserId: actor.userId });
    can('read', 'ClipNote', team);
    can('create', 'ClipNote', team);
    can('delete', 'ClipNote', { ...team, authorUserId: actor.userId });
  }
  if (hasRole(actor, 'guardian') && actor.guardiansSeeClips) {
    const wards = { organizationId: org, athleteId: { $in: actor.guardianOf } };
    can('read', 'Clip', wards);
    can('read', 'ClipNote', wards);
  }
};
