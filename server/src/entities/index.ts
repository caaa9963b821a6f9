import { Organization } from './organization.entity';
import { User } from './user.entity';
import { Membership } from './membership.entity';
import { AthleteProfile } from './athlete-profile.entity';
import { CareTeamAssignment } from './care-team-assignment.entity';
import { GuardianLink } from './guardian-link.entity';
import { Invitation } from './invitation.entity';
import { AuditEntry } from './audit-entry.entity';
import { CaseRecord } from './case.entity';
import { ParticipationStatusChange } from './participation-status-change.entity';
import { RestrictionPlan } from './restriction-plan.entity';
import { RestrictionPlanVersion } from './restriction-plan-version.entity';
import { PainReport } from './pain-report.entity';
import { CheckIn } from './check-in.entity';
import { TrainingLog } from './training-log.entity';
import { Flag } from './flag.entity';
import { Notification } from './notification.entity';
import { Exercise } from './exercise.entity';
import { Baseline } from './baseline.entity';
import { Program } from './program.entity';
import { ProgramSession } from './program-session.entity';
import { SessionHold } from './session-hold.entity';
import { ProgramException } from './program-exception.entity';
import { ClearanceLetter } from './clearance-letter.entity';
import { EmailDelivery } from './email-delivery.entity';
import { LetterAcknowledgement } from './letter-acknowledgement.entity';
import { CaseDocument } from './case-document.entity';
import { Clip } from './clip.entity';
import { ClipNote } from './clip-note.entity';
import { PasswordResetToken } from './password-reset-token.entity';
import { UserTotp, TotpRecoveryCode } from './user-totp.entity';
import { Group, GroupMember } from './group.entity';
import { PlanTemplate } from './plan-template.entity';
import { StageCriterionReading, StageDecision } from './stage-criteria.entity';
import { RecordExport } from './record-export.entity';
import { RosterImport } from './roster-import.entity';
import { OrganizationSignup } from './organization-signup.entity';
import { CalendarFeed } from './calendar-feed.entity';

export {
  Organization,
  User,
  Membership,
  AthleteProfile,
  CareTeamAssignment,
  GuardianLink,
  Invitation,
  AuditEntry,
  CaseRecord,
  ParticipationStatusChange,
  RestrictionPlan,
  RestrictionPlanVersion,
  PainReport,
  CheckIn,
  TrainingLog,
  Flag,
  Notification,
  Exercise,
  Baseline,
  Program,
  ProgramSession,
  SessionHold,
  ProgramException,
  ClearanceLetter,
  EmailDelivery,
  LetterAcknowledgement,
};
export { CaseDocument, Clip, ClipNote };
export { PasswordResetToken, UserTotp, TotpRecoveryCode };
export { Group, GroupMember };
export { PlanTemplate };
export { StageCriterionReading, StageDecision };
export { RecordExport };
export { RosterImport };
export { OrganizationSignup };
export { CalendarFeed };

export const ENTITIES = [
  Organization,
  User,
  Membership,
  AthleteProfile,
  CareTeamAssignment,
  GuardianLink,
  Invitation,
  AuditEntry,
  CaseRecord,
  ParticipationStatusChange,
  RestrictionPlan,
  RestrictionPlanVersion,
  PainReport,
  CheckIn,
  TrainingLog,
  Flag,
  Notification,
  Exercise,
  Baseline,
  Program,
  ProgramSession,
  SessionHold,
  ProgramException,
  ClearanceLetter,
  EmailDelivery,
  LetterAcknowledgement,
  CaseDocument,
  Clip,
  ClipNote,
  PasswordResetToken,
  UserTotp,
  TotpRecoveryCode,
  Group,
  GroupMember,
  PlanTemplate,
  StageCriterionReading,
  StageDecision,
  RecordExport,
  RosterImport,
  OrganizationSignup,
  CalendarFeed,
];
