import { hasRole } from './actor';
import type { RuleSet } from './builder';

/**
 * Coaches keep the exercise library and program their care-team athletes; clinicians read programs
 * and decide exceptions; athletes read their own published sessions. A program for a group is
 * checked athlete by athlete (its `athleteIds` must all be on the coach's care teams).
 */
export const programRules: RuleSet = ({ can }, actor) => {
  const org = actor.organizationId;
  can('read', 'Exercise', { organizationId: org });
  if (hasRole(actor, 'coach') || hasRole(actor, 'admin')) {
    can('create', 'Exercise', { organizationId: org });
    can('update', 'Exercise', { organizationId: org });
  }
  if (hasRole(actor, 'coach')) {
    const mine = { organizationId: org, athleteId: { $in: actor.coachOf } };
    can('read', 'Program', mine);
    can('create', 'Program', mine);
    can('update', 'Program', mine);
    can('create', 'Baseline', mine);
    can('read', 'Baseline', mine);
    can('create', 'ProgramException', mine);
    can('read', 'ProgramException', mine);
  }
  if (hasRole(actor, 'clinician')) {
    const mine = { organizationId: org, athleteId: { $in: actor.clinicianOf } };
    can('read', 'Program', mine);
    can('read', 'Baseline', mine);
    can('create', 'Baseline', mine);
    can('read', 'ProgramException', mine);
    can('update', 'ProgramException', mine);
  }
  if (hasRole(actor, 'athlete')) {
    const own = { organizationId: org, athleteId: actor.membershipId };
    can('read', 'Program', ['published'], own);
    can('read', 'Baseline', own);
  }
};
