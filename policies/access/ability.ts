import { AbilityBuilder, createMongoAbility, subject as tagSubject } from '@casl/ability';
import type { Actor } from './actor';
import type { RuleSet } from './builder';
import type { AppAbility, SubjectName, SubjectShapes } from './subjects';
import { organizationRules } from './organization';
import { userRules } from './user';
import { membershipRules } from './membership';
import { athleteRules } from './athlete';
import { invitationRules } from './invitation';
import { careTeamRules } from './care-team';
import { guardianLinkRules } from './guardian-link';
import { auditRules } from './audit';
import { caseRules } from './case';
import { restrictionPlanRules } from './restriction-plan';
import { athleteReportRules } from './athlete-reports';
import { programRules } from './program';
import { letterRules } from './letter';
import { uploadRules } from './uploads';
import { groupRules } from './group';
import { planTemplateRules } from './plan-template';
import { injuryReportRules } from './injury-report';
import { recordExportRules } from './record-export';
import { exportRules } from './exports';

const RULE_SETS: RuleSet[] = [
  organizationRules,
  userRules,
  membershipRules,
  athleteRules,
  invitationRules,
  careTeamRules,
  guardianLinkRules,
  auditRules,
  caseRules,
  restrictionPlanRules,
  athleteReportRules,
  programRules,
  letterRules,
  uploadRules,
  groupRules,
  planTemplateRules,
  injuryReportRules,
  recordExportRules,
  exportRules,
];

/** The one rule set, used by the server to decide and by the client to show. Deny by default. */
export function defineAbilityFor(actor: Actor | null): AppAbility {
  const builder = new AbilityBuilder<AppAbility>(createMongoAbility);
  if (actor) for (const rules of RULE_SETS) rules(builder, actor);
  return builder.build();
}

/** Tags a copy of a record as a subject; CASL's own `subject()` mutates its argument. */
export function asSubject<K extends SubjectName>(type: K, record: SubjectShapes[K]) {
  return tagSubject(type, { ...record });
}
