/** Athletes' reports: pain reports, check-ins, training logs, workload, flags and notices. Response shapes shared by server and client; types only. */
import type { BodyRegion } from '../body-regions';

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
/** One person the app told about a report, by the notice they were sent with it. */
export interface PainReportToldDto {
  name: string;
  /** The notice's kind: red_flag_emergency, red_flag_urgent, status_out, red_flag_emergency_guardian or pain_report. */
  kind: string;
}
/** One pain report read on its own page: the report (fields by role) and what the app did with it. */
export interface PainReportDetailDto {
  report: PainReportDto;
  /** Everyone notified when the report was filed, in the same moment; empty when nobody was. */
  told: PainReportToldDto[];
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
  /** Pain after the session (that evening), once reported. */
  painAfter: number | null;
  painNextMorning: number | null;
  painCeiling: number;
  sets: { exercise: string; exerciseId?: string | null; loadKg: number; reps: number; rpe?: number | null }[];
  notes: string | null;
  /** The planned session this log records, when it was logged from one. */
  sessionId: string | null;
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
  /** Logged sets over a limit in force that day, in words; the clinician and coach were told. */
  overLimits: string[];
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
  kind: 'red_flag_emergency' | 'red_flag_urgent' | 'pain_report' | 'pain_rule' | 'over_limit';
  severity: 'emergency' | 'urgent' | 'routine';
  message: string;
  suggestedAction: 'keep' | 'reduce' | null;
  createdAt: string;
  acknowledgedAt: string | null;
  acknowledgedByName: string | null;
  /** The pain report that raised this flag, when one did. */
  painReportId: string | null;
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
  /** The pain report this notice was sent with, when it was. */
  painReportId: string | null;
}
