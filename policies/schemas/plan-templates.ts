import { z } from 'zod';
import { templateStageIssues } from '../load/plan-template';
import { PlanStageSchema } from './cases';
import { UuidSchema, VersionSchema, line, text, numberError } from './common';

/**
 * Request shapes of plan templates: a restriction plan's stages counted in days from the plan's start
 * (policies/load/plan-template.ts). A template stage is the plan stage's own schema without its id and
 * dates, so whatever a stage may carry (limits, pain ceiling, exit criteria) a template stage may too.
 */

/** Ten years of days: longer than any rehabilitation plan, and well inside int4. */
const MAX_OFFSET = 3650;
const Offset = z
  .number(numberError('must be a number of days'))
  .int({ message: 'must be a whole number of days' })
  .min(0, { message: 'must be 0 (the first day) or more' })
  .max(MAX_OFFSET, { message: `must be at most ${MAX_OFFSET} days` });

export const TemplateStageSchema = PlanStageSchema.omit({ id: true, startDate: true, endDate: true, reviewDate: true }).extend({
  startOffset: Offset,
  endOffset: Offset,
  reviewOffset: Offset.nullable().optional(),
});
export type TemplateStageInput = z.infer<typeof TemplateStageSchema>;

const templateStages = z
  .array(TemplateStageSchema)
  .min(1, { message: 'must have at least one stage' })
  .max(20, { message: 'must have at most 20 stages' })
  .superRefine((stages, ctx) => {
    for (const issue of templateStageIssues(stages)) ctx.addIssue({ code: 'custom', path: issue.path, message: issue.message });
  });

const TemplateName = line(120);
/** When the template fits and when it does not, in the clinician's words; shown to clinicians only. */
const TemplateDescription = text(2_000);
const Guidance = text(2_000);

export const PlanTemplateCreateSchema = z.strictObject({
  name: TemplateName,
  description: TemplateDescription.default(''),
  stages: templateStages,
  guidance: Guidance.default(''),
});
export type PlanTemplateCreateInput = z.infer<typeof PlanTemplateCreateSchema>;

/** Save a case's plan, as it stands now, as a template: the server copies its stages whole. */
export const PlanTemplateFromPlanSchema = z.strictObject({
  planId: UuidSchema,
  name: TemplateName,
  description: TemplateDescription.default(''),
});
export type PlanTemplateFromPlanInput = z.infer<typeof PlanTemplateFromPlanSchema>;

export const PlanTemplateUpdateSchema = PlanTemplateCreateSchema.extend({ version: VersionSchema });
export type PlanTemplateUpdateInput = z.infer<typeof PlanTemplateUpdateSchema>;

/** A copy of someone's template, owned by the one who copies it. */
export const PlanTemplateCopySchema = z.strictObject({ name: TemplateName.optional() });
export type PlanTemplateCopyInput = z.infer<typeof PlanTemplateCopySchema>;

export const PlanTemplateArchiveSchema = z.strictObject({ version: VersionSchema });
