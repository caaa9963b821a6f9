import type { CriterionResult, StageCriterion } from '../load/stage-criteria';

export interface StageCriterionView {
  criterion: StageCriterion;
  result: CriterionResult;
  /** What the athlete and family read: the criterion, and how far along it is. */
  plain: string;
  plainProgress: string;
}

export interface StageDecisionDto {
  id: string;
  fromStageId: string;
  toStageId: string;
  effectiveDate: string;
  plannedDate: string;
  /** Positive: earlier than the dates; negative: later. */
  daysEarly: number;
  agreedBy: string[];
  criteriaMet: number;
  criteriaTotal: number;
  planVersion: number;
  note: string | null;
  decidedByName: string | null;
  createdAt: string;
}

export interface StageCriteriaDto {
  planId: string;
  planVersion: number;
  today: string;
  /** The stage in force today (null in a gap or outside the plan). */
  stage: { id: string; label: string | null; startDate: string; endDate: string; number: number; of: number } | null;
  nextStage: { id: string; label: string | null; startDate: string; number: number } | null;
  criteria: StageCriterionView[];
  allMet: boolean;
  metCount: number;
  /** All met and a next stage exists: the clinician is asked whether to move on (never automatic). */
  promptToMove: boolean;
  canAssess: boolean;
  canRate: boolean;
  decisions: StageDecisionDto[];
}
