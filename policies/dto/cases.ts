/** Cases, participation status and restriction plans. Response shapes shared by server and client; types only. */
import type { BodyRegion } from '../body-regions';
import type { InForce, PlanStage } from '../load/in-force';
import type { ParticipationStatus } from '../load/patterns';

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
  /** The pain reports this case was opened from or joined by, for readers of pain reports; newest first. */
  painReports?: { id: string; reportedAt: string }[];
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
  latestPainReport: { id: string; reportedAt: string; painNow: number } | null;
}
