/** Plan templates: a plan's stages in days from its start, shared in the organization. Types only. */
import type { TemplateStage } from '../load/plan-template';

export interface PlanTemplateSummaryDto {
  id: string;
  name: string;
  description: string;
  /** The author's membership id (the access rules look at it) and name. */
  authorId: string;
  authorName: string;
  stageCount: number;
  /** From day 1 to the last stage's end. */
  lengthDays: number;
  /** Whether the reader may change or archive it: its author, or an admin. */
  canEdit: boolean;
  updatedAt: string;
  version: number;
}

export interface PlanTemplateDto extends PlanTemplateSummaryDto {
  stages: TemplateStage[];
  guidance: string;
}
