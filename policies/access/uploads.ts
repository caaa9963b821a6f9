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
  if (hasRole(actor, 'guardian')) {
    // Granted even while the setting is off (an empty list), so a guardian asking for a clip gets
    // 404 like anyone else without access, not a 403 that confirms the clip exists.
    const wards = actor.guardiansSeeClips ? actor.guardianOf : [];
    can('read', 'Clip', { organizationId: org, athleteId: { $in: wards } });
    can('read', 'ClipNote', { organizationId: org, athleteId: { $in: wards } });
  }
};
