/** Plan templates: a plan's stages in days from its start, shared in the organization. Types only. */
import type { PlanStage } from '../load/in-force';
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

/** A new plan's stages from a template and a start date, to edit before saving. */
export interface PlanFromTemplateDto {
  templateId: string;
  templateVersion: number;
  stages: PlanStage[];
  guidance: string;
}
