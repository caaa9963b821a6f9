/** Response shapes shared by server and client. Types only: no runtime code. */
import type { Actor } from './access/actor';
import type { Role, CareTeamRole } from './roles';
import type { Unit } from './schemas/common';
import type { BodyRegion } from './body-regions';
import type { InForce, PlanStage } from './load/in-force';
import type { ParticipationStatus } from './load/patterns';

export interface UserDto {
  id: string;
  email: string;
  displayName: string;
  unitPref: Unit;
}

export interface MembershipSummaryDto {
  id: string;
  organizationId: string;
  organizationName: string;
  /** The organization's IANA time zone: "today" on every screen is its local day (policies/today.ts). */
  timeZone: string;
  roles: Role[];
  /** What the client needs to build the same CASL ability the server uses. */
  actor: Actor;
}

export interface SessionDto {
  user: UserDto | null;
  memberships: MembershipSummaryDto[];
  csrfToken: string;
  /** The password was right and two-step sign-in is on: a code is needed before the person is signed in. */
  secondStep?: boolean;
}

/** Two-step sign-in on the signed-in person's own account. */
export interface TwoStepStatusDto {
  enabled: boolean;
  enabledAt: string | null;
  recoveryCodesLeft: number;
}

/** A new authenticator secret, shown once while the person sets up their app. */
export interface TwoStepSetupDto {
  secret: string;
  otpauthUri: string;
  /** The otpauth URI as a QR code image (data: URL, PNG). */
  qrDataUrl: string;
}

/** Two-step sign-in is on: the recovery codes, shown this once. */
export interface TwoStepEnabledDto {
  recoveryCodes: string[];
}

export interface CareTeamAssignmentDto {
  id: string;
  organizationId: string;
  athleteId: string;
  athleteName: string;
  memberId: string;
  memberName: string;
  role: CareTeamRole;
}

export interface GuardianLinkDto {
  id: string;
  organizationId: string;
  athleteId: string;
  athleteName: string;
  guardianId: string;
  guardianName: string;
}

export interface AthleteProfileDto {
  id: string;
  organizationId: string;
  displayName: string;
  dateOfBirth: string | null;
  age: number | null;
  isMinor: boolean;
  /** A minor with no linked guardian: the admin must link one. */
  needsGuardian: boolean;
  sport: string | null;
  position: string | null;
  version: number;
  careTeam: CareTeamAssignmentDto[];
  guardians: GuardianLinkDto[];
}

export interface PersonDto {
  id: string;
  organizationId: string;
  userId: string;
  email: string;
  displayName: string;
  roles: Role[];
  version: number;
  createdAt: string;
  athlete: AthleteProfileDto | null;
}

export type InvitationStatus = 'pending' | 'accepted' | 'expired' | 'revoked';

export interface InvitationDto {
  id: string;
  organizationId: string;
  email: string;
  roles: Role[];
  displayName: string | null;
  status: InvitationStatus;
  expiresAt: string;
  createdAt: string;
  invitedByName: string | null;
  /** Only in the response that creates it: the one-time link, shown to the admin until e-mail exists. */
  link?: string;
}

export interface InvitationPreviewDto {
  organizationName: string;
  email: string;
  roles: Role[];
  displayName: string | null;
  hasAccount: boolean;
  expiresAt: string;
}

export interface AuditEntryDto {
  id: string;
  occurredAt: string;
  actorUserId: string | null;
  actorName: string | null;
  action: string;
  subjectType: string;
  subjectId: string | null;
  athleteId: string | null;
  athleteName: string | null;
  before: unknown;
  after: unknown;
  requestId: string | null;
}

export interface OrganizationDto {
  id: string;
  name: string;
  emergencyNumber: string;
}

export interface ErrorBody {
  error: { code: string; message: string; fields?: Record<string, string[]>; details?: unknown };
  requestId: string;
}

export interface HealthDto {
  status: 'ok' | 'degraded';
  database: 'up' | 'down';
}

// ---- Cases, status and restriction plans ----

/** Fields beyond the first few are present only when the reader's role may see them. */
export interface CaseDto {
  id: string;
  organizationId: string;
  athleteId: string;
  athleteName: string;
  status: ParticipationStatus;
  statusEffectiveFrom: string;
  openedAt: string;
  closedOn: string | null;
  version: number;
  bodyRegions?: BodyRegion[];
  onsetDate?: string;
  diagnosis?: string | null;
  clinicalNotes?: string | null;
  statusNote?: string | null;
  reviewDate?: string | null;
  openedByName?: string | null;
  closingNote?: string | null;
  planId?: string | null;
}

export interface StatusChangeDto {
  id: string;
  status: ParticipationStatus;
  effectiveFrom: string;
  note: string | null;
  setByName: string | null;
  createdAt: string;
}

export interface CaseDetailDto extends CaseDto {
  statusHistory?: StatusChangeDto[];
}

export interface PlanVersionDto {
  planId: string;
  version: number;
  stages: PlanStage[];
  guidance: string;
  changeNote: string | null;
  createdAt: string;
  createdByName: string | null;
}

export interface PlanDto {
  id: string;
  organizationId: string;
  caseId: string;
  athleteId: string;
  version: number;
  current: PlanVersionDto;
  /** Whether the reader may open earlier versions (care team only). */
  canSeeHistory: boolean;
}

export interface InForceDto extends InForce {
  athleteId: string;
  status: ParticipationStatus;
  statusEffectiveFrom: string | null;
  /** Plain-words guidance of each plan in force. */
  guidance: string[];
}

export interface CaseloadRowDto {
  athleteId: string;
  athleteName: string;
  age: number | null;
  isMinor: boolean;
  sport: string | null;
  status: ParticipationStatus;
  statusEffectiveFrom: string | null;
  openCaseCount: number;
  openCaseId: string | null;
  nextReviewDate: string | null;
  latestPainReport: { reportedAt: string; painNow: number } | null;
}

// ---- Athlete reports, logs, workload, flags, notices ----
export interface PainReportDto {
  id: string;
  organizationId: string;
  athleteId: string;
  athleteName: string;
  reportedAt: string;
  bodyRegions: BodyRegion[];
  painNow: number;
  painWorst24h: number;
  onsetDate: string;
  aggravatingPatterns: string[];
  startedInTraining: boolean;
  route: 'emergency' | 'urgent' | 'routine';
  caseId: string | null;
  /** Clinicians and the athlete only. */
  note?: string | null;
  redFlags?: Record<string, boolean>;
}

export interface PainReportOutcomeDto {
  report: PainReportDto;
  route: 'emergency' | 'urgent' | 'routine';
  statusSetToOut: boolean;
  /** What the athlete reads first. */
  message: string;
  emergencyNumber: string;
}

export interface CheckInDto {
  id: string;
  athleteId: string;
  date: string;
  sleepHours: number;
  soreness: number;
  readiness: number;
  painNow: number;
}

export interface TrainingLogDto {
  id: string;
  athleteId: string;
  date: string;
  durationMinutes: number;
  sessionRpe: number;
  sessionLoad: number;
  painBefore: number;
  painDuring: number;
  painNextMorning: number | null;
  painCeiling: number;
  sets: { exercise: string; loadKg: number; reps: number; rpe?: number | null }[];
  notes: string | null;
  version: number;
}

export interface PainRuleDto {
  action: 'keep' | 'reduce';
  flags: { kind: string; message: string }[];
  athleteMessage: string;
}

export interface TrainingLogOutcomeDto {
  log: TrainingLogDto;
  painRule: PainRuleDto;
}

export interface WorkloadDto {
  athleteId: string;
  from: string;
  to: string;
  daily: { date: string; load: number }[];
  weeks: { start: string; end: string; total: number; monotony: number | null; strain: number | null }[];
  acuteChronic: { acute: number; chronic: number; ratio: number | null; description: string; daysOfData: number };
  pain: { date: string; during: number; nextMorning: number | null; ceiling: number; load: number }[];
  e1rm: { exercise: string; date: string; value: number; lowReliability: boolean }[];
  stages: { label: string | null; startDate: string; endDate: string }[];
}

export interface FlagDto {
  id: string;
  athleteId: string;
  athleteName: string;
  kind: 'red_flag_emergency' | 'red_flag_urgent' | 'pain_report' | 'pain_rule';
  severity: 'emergency' | 'urgent' | 'routine';
  message: string;
  suggestedAction: 'keep' | 'reduce' | null;
  createdAt: string;
  acknowledgedAt: string | null;
  acknowledgedByName: string | null;
}

export interface NotificationDto {
  id: string;
  athleteId: string | null;
  kind: string;
  severity: 'emergency' | 'urgent' | 'routine';
  title: string;
  body: string;
  createdAt: string;
  readAt: string | null;
}

// ---- Programming ----
export interface ExerciseDto {
  id: string;
  name: string;
  patterns: import('./load/patterns').MovementPattern[];
  equipment: string;
  ballistic: boolean;
  steps: import('./load/steps').LoadSteps;
  referenceId: string | null;
  archived: boolean;
  version: number;
}

export interface BaselineDto {
  id: string;
  athleteId: string;
  exerciseId: string;
  exerciseName: string;
  kind: 'tested' | 'estimated' | 'logged';
  loadKg: number;
  reps: number;
  rpe: number | null;
  e1rmKg: number;
  formula: string;
  lowReliability: boolean;
  testedOn: string;
}

export interface ProgramSessionDto {
  id: string;
  programId: string;
  programName: string;
  date: string;
  title: string;
  content: import('./schemas/programs').SessionContent;
  status: 'draft' | 'published';
  publishedAt: string | null;
  version: number;
  /** Athletes for whom this published session is on hold after a plan change, with why. */
  holds: { athleteId: string; breaches: import('./load/compliance').Breach[] }[];
}

export interface ProgramDto {
  id: string;
  name: string;
  athleteIds: string[];
  athleteNames: string[];
  version: number;
  createdAt: string;
  sessions: ProgramSessionDto[];
}

export interface ExceptionDto {
  id: string;
  sessionId: string;
  sessionDate: string;
  sessionTitle: string;
  athleteId: string;
  athleteName: string;
  setIds: string[];
  reason: string;
  requestedByName: string | null;
  status: 'pending' | 'granted' | 'refused';
  grantedSetIds: string[];
  decidedByName: string | null;
  decidedAt: string | null;
  decisionNote: string | null;
  createdAt: string;
}

export interface RosterRowDto {
  athleteId: string;
  athleteName: string;
  status: import('./load/patterns').ParticipationStatus;
  /** Plain-words caps in force today (restricted patterns only). */
  limitsToday: string[];
  sessionsOnHold: number;
  pendingExceptions: number;
  nextSession: { id: string; date: string; title: string } | null;
}

export interface TodayDto {
  athleteId: string;
  date: string;
  unit: import('./schemas/common').Unit;
  sessions: (ProgramSessionDto & { onHold: boolean; exerciseNames: Record<string, string>; loadsKg: Record<string, number | null> })[];
}

// ---- Letters ----
export interface LetterDto {
  id: string;
  athleteId: string;
  athleteName: string;
  decision: 'full' | 'limited';
  effectiveFrom: string;
  validUntil: string | null;
  limits: string[];
  clinicianName: string;
  credential: string;
  licenceNumber: string;
  familyNote: string;
  signature: string | null;
  signedAt: string | null;
  /**
   * As of today (UTC): 'signed' is the letter in force, 'scheduled' a signed letter whose start date is still
   * ahead, 'superseded' one a later-signed letter has replaced from that letter's start date, 'expired' the
   * latest letter once its valid-until day has passed (nothing is in force until a new one is signed).
   */
  status: 'draft' | 'scheduled' | 'signed' | 'expired' | 'superseded';
  /** The letter that took over from this one; null until that letter's start date has come. */
  supersededBy: string | null;
  pdfSha256: string | null;
  version: number;
  createdAt: string;
  acknowledgements: { guardianId: string; guardianName: string; acknowledgedAt: string }[];
  /** Clinicians and admins only. */
  deliveries?: { id: string; to: string; status: string; attempts: number; lastError: string | null; sentAt: string | null }[];
  /** Shown once, in the response that signs the letter. */
  verificationCode?: string;
}

export interface LetterCheckDto {
  /**
   * 'scheduled': genuine and signed, but its start date is still ahead (the earlier letter is in force).
   * 'expired': genuine and not replaced, but its valid-until day has passed.
   */
  status: 'valid' | 'scheduled' | 'expired' | 'superseded' | 'unknown';
  athleteInitials?: string;
  decision?: string;
  effectiveFrom?: string;
  validUntil?: string | null;
  organizationName?: string;
  issuedOn?: string;
}

export interface OutboxMessageDto {
  id: string;
  receivedAt: string;
  to: string[];
  subject: string | null;
  text: string | null;
  attachments: { filename: string; contentType: string; size: number }[];
}

export interface DeliveryDto {
  id: string;
  kind: string;
  to: string;
  subject: string;
  status: 'queued' | 'sending' | 'sent' | 'failed';
  attempts: number;
  lastError: string | null;
  createdAt: string;
  sentAt: string | null;
}

/** An outside document (physician's note, imaging report, referral) attached to a case. */
export interface CaseDocumentDto {
  id: string;
  caseId: string;
  athleteId: string;
  title: string;
  /** The date written on the document, 'YYYY-MM-DD'. */
  documentDate: string;
  issuedBy: string;
  /** Detected from the file's own bytes, e.g. 'application/pdf', 'image/jpeg', 'image/png', 'image/heic'. */
  mediaType: string;
  sizeBytes: number;
  sha256: string;
  uploadedByName: string;
  uploadedByUserId: string;
  uploadedAt: string;
  /** API path that downloads it (attachment, no-store). */
  downloadPath: string;
}

export interface ClipNoteDto {
  id: string;
  clipId: string;
  /** Where in the clip the note is pinned, in milliseconds. */
  atMs: number;
  body: string;
  authorName: string;
  authorUserId: string;
  authorRole: 'athlete' | 'coach' | 'clinician';
  createdAt: string;
}

/** A short technique video of a set, linked to a logged session and one exercise in it. */
export interface ClipDto {
  id: string;
  athleteId: string;
  athleteName: string;
  trainingLogId: string;
  /** The logged session's date. */
  sessionDate: string;
  exercise: string;
  caption: string | null;
  /** Detected from the file's own bytes: 'video/webm', 'video/mp4' or 'video/quicktime'. */
  mediaType: string;
  sizeBytes: number;
  uploadedByName: string;
  uploadedByUserId: string;
  uploadedAt: string;
  /** API path of the video, served with range requests. */
  videoPath: string;
  noteCount: number;
  /** Present on GET one clip; lists omit it. */
  notes?: ClipNoteDto[];
}

export interface OrganizationSettingsDto extends OrganizationDto {
  /** Whether guardians of an athlete may watch that athlete's technique clips (off by default). */
  guardiansSeeClips: boolean;
  version: number;
}
