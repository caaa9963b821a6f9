import { CreateFoundation1764600000000 } from './1764600000000-create-foundation';
import { CreateCasesAndPlans1764700000000 } from './1764700000000-create-cases-and-plans';
import { CreateAthleteReports1764800000000 } from './1764800000000-create-athlete-reports';
import { CreatePrograms1764900000000 } from './1764900000000-create-programs';
import { AddAthleteIndexes1765000000000 } from './1765000000000-add-athlete-indexes';
import { CreateLettersAndMail1765100000000 } from './1765100000000-create-letters-and-mail';
import { CreateUploads1765200000000 } from './1765200000000-create-uploads';
import { AddAccountSecurity1765300000000 } from './1765300000000-add-account-security';
import { AddRateLimits1765400000000 } from './1765400000000-add-rate-limits';
import { AddOrganizationTimeZone1765500000000 } from './1765500000000-add-organization-time-zone';
import { AddRefusalCounters1765610000000 } from './1765610000000-add-refusal-counters';
import { AddTrainingLogPainAfter1765720000000 } from './1765720000000-add-training-log-pain-after';
import { CreateNoticeEmailOptOuts1765813000000 } from './1765813000000-create-notice-email-opt-outs';
import { AddLetterPaperAndBasis1765830000000 } from './1765830000000-add-letter-paper-and-basis';
import { AddTrainingLogSession1765836000000 } from './1765836000000-add-training-log-session';
import { CreateGroupsAndTeamPrograms1765900000000 } from './1765900000000-create-groups-and-team-programs';
import { CreateStageCriteria1766000000000 } from './1766000000000-create-stage-criteria';
import { CreatePlanTemplates1766100000000 } from './1766100000000-create-plan-templates';
import { CreateTeamSessionHours1766200000000 } from './1766200000000-create-team-session-hours';
import { CreateIdempotencyKeys1766500000000 } from './1766500000000-create-idempotency-keys';
import { AddActorCacheNotices1766600000000 } from './1766600000000-add-actor-cache-notices';
import { CreateOrganizationSignups1766700000000 } from './1766700000000-create-organization-signups';
import { CreateRosterImports1766800000000 } from './1766800000000-create-roster-imports';
import { CreateCalendarFeeds1766900000000 } from './1766900000000-create-calendar-feeds';
import { CreateRecordExports1767000000000 } from './1767000000000-create-record-exports';

/** Listed explicitly: glob loading of .ts migrations fails under vitest. Append new ones in order. */
export const MIGRATIONS = [
  CreateFoundation1764600000000,
  CreateCasesAndPlans1764700000000,
  CreateAthleteReports1764800000000,
  CreatePrograms1764900000000,
  AddAthleteIndexes1765000000000,
  CreateLettersAndMail1765100000000,
  CreateUploads1765200000000,
  AddAccountSecurity1765300000000,
  AddRateLimits1765400000000,
  AddOrganizationTimeZone1765500000000,
  AddRefusalCounters1765610000000,
  AddTrainingLogPainAfter1765720000000,
  CreateNoticeEmailOptOuts1765813000000,
  AddLetterPaperAndBasis1765830000000,
  AddTrainingLogSession1765836000000,
  CreateGroupsAndTeamPrograms1765900000000,
  CreateStageCriteria1766000000000,
  CreatePlanTemplates1766100000000,
  CreateTeamSessionHours1766200000000,
  CreateIdempotencyKeys1766500000000,
  AddActorCacheNotices1766600000000,
  CreateOrganizationSignups1766700000000,
  CreateRosterImports1766800000000,
  CreateCalendarFeeds1766900000000,
  CreateRecordExports1767000000000,
];
