import { z } from 'zod';
import { BODY_REGIONS } from '../body-regions';
import { CAP_KEYS, DEFAULT_PAIN_CEILING, MOVEMENT_PATTERNS, PARTICIPATION_STATUSES, PATTERN_MODES } from '../load/patterns';
import { stageIssues } from '../load/in-force';
import { StageCriteriaListSchema } from './stage-criteria';
import { IsoDateSchema, UuidSchema, VersionSchema, text, wholeNumberText, numberError } from './common';

export const ParticipationStatusSchema = z.enum(PARTICIPATION_STATUSES, { message: 'must be out, limited or full' });
export const BodyRegionSchema = z.enum(BODY_REGIONS, { message: 'must be a body region from the list' });

const ClinicalText = text(20_000);
const PlainWords = text(2_000);

export const CaseCreateSchema = z.strictObject({
  athleteId: UuidSchema,
  bodyRegions: z.array(BodyRegionSchema).min(1, { message: 'must name at least one body region' }).max(BODY_REGIONS.length),
  onsetDate: IsoDateSchema,
  /** The clinician's own working label. Clinician-only, like the notes. */
  diagnosis: text(200).optional(),
  clinicalNotes: ClinicalText.optional(),
  status: ParticipationStatusSchema,
  statusEffectiveFrom: IsoDateSchema,
  /** Shown to the athlete and guardian with the status, in plain words. */
  statusNote: PlainWords.optional(),
  reviewDate: IsoDateSchema.optional(),
  /** Open the case from this pain report (it is linked to the new case). */
  painReportId: UuidSchema.optional(),
});
export type CaseCreateInput = z.infer<typeof CaseCreateSchema>;

export const CaseUpdateSchema = z.strictObject({
  bodyRegions: z.array(BodyRegionSchema).min(1, { message: 'must name at least one body region' }).max(BODY_REGIONS.length).optional(),
  onsetDate: IsoDateSchema.optional(),
  diagnosis: text(200).nullable().optional(),
  clinicalNotes: ClinicalText.nullable().optional(),
  reviewDate: IsoDateSchema.nullable().optional(),
  version: VersionSchema,
});
export type CaseUpdateInput = z.infer<typeof CaseUpdateSchema>;

export const CaseCloseSchema = z.strictObject({
  closedOn: IsoDateSchema,
  closingNote: PlainWords.optional(),
  version: VersionSchema,
});
export type CaseCloseInput = z.infer<typeof CaseCloseSchema>;

export const StatusChangeSchema = z.strictObject({
  status: ParticipationStatusSchema,
  effectiveFrom: IsoDateSchema,
  note: PlainWords.optional(),
  version: VersionSchema,
});
export type StatusChangeInput = z.infer<typeof StatusChangeSchema>;

const positive = (max: number, label: string) =>
  z
    .number(numberError('must be a number'))
    .positive({ message: 'must be above 0' })
    .max(max, { message: `must be at most ${max}${label}` });

export const CapsSchema = z.strictObject({
  maxPercent1RM: positive(100, '%').optional(),
  maxLoadKg: positive(1000, ' kg').optional(),
  maxRpe: z
    .number(numberError('must be a number'))
    .min(1, { message: 'must be at least 1' })
    .max(10, { message: 'must be at most 10' })
    .multipleOf(0.5, { message: 'must be a whole or half step' })
    .optional(),
  maxSetsPerSession: z.number().int({ message: 'must be a whole number' }).min(1, { message: 'must be at least 1' }).max(50).optional(),
  maxRepsPerSet: z.number().int({ message: 'must be a whole number' }).min(1, { message: 'must be at least 1' }).max(100).optional(),
  maxHardSetsPerWeek: z.number().int({ message: 'must be a whole number' }).min(0, { message: 'must be 0 or more' }).max(100).optional(),
  impactAllowed: z.boolean({ message: 'must be yes or no' }).optional(),
});

export const PatternRuleSchema = z
  .strictObject({
    mode: z.enum(PATTERN_MODES, { message: 'must be blocked, capped or free' }),
    caps: CapsSchema.optional(),
  })
  .superRefine((rule, ctx) => {
    const set = CAP_KEYS.filter((k) => rule.caps?.[k] !== undefined);
    if (rule.mode === 'capped' && set.length === 0) {
      ctx.addIssue({ code: 'custom', path: ['caps'], message: 'a capped pattern needs at least one cap' });
    }
    if (rule.mode !== 'capped' && set.length > 0) {
      ctx.addIssue({ code: 'custom', path: ['caps'], message: `caps apply only when the pattern is capped (it is ${rule.mode})` });
    }
  });

export const PlanStageSchema = z.strictObject({
  id: UuidSchema,
  label: text(80).nullable().optional(),
  startDate: IsoDateSchema,
  endDate: IsoDateSchema,
  reviewDate: IsoDateSchema.nullable().optional(),
  painCeiling: z
    .number()
    .int({ message: 'must be a whole number' })
    .min(0, { message: 'must be 0–10' })
    .max(10, { message: 'must be 0–10' })
    .default(DEFAULT_PAIN_CEILING),
  patterns: z.partialRecord(z.enum(MOVEMENT_PATTERNS, { message: 'must be a movement pattern from the list' }), PatternRuleSchema),
  /** Exit criteria (policies/load/stage-criteria.ts); none means the stage moves on by its dates. */
  criteria: StageCriteriaListSchema.optional(),
});
export type PlanStageInput = z.infer<typeof PlanStageSchema>;

const stagesSchema = z
  .array(PlanStageSchema)
  .min(1, { message: 'must have at least one stage' })
  .max(20, { message: 'must have at most 20 stages' })
  .superRefine((stages, ctx) => {
    for (const issue of stageIssues(stages)) ctx.addIssue({ code: 'custom', path: issue.path, message: issue.message });
  });

export const PlanCreateSchema = z.strictObject({
  stages: stagesSchema,
  guidance: PlainWords.default(''),
  changeNote: text(500).optional(),
  /** The template the plan was started from, as the clinician loaded it: recorded in the creation's audit entry. */
  fromTemplate: z.strictObject({ id: UuidSchema, version: VersionSchema }).optional(),
});
export type PlanCreateInput = z.infer<typeof PlanCreateSchema>;

export const PlanUpdateSchema = PlanCreateSchema.omit({ fromTemplate: true }).extend({ version: VersionSchema });
export type PlanUpdateInput = z.infer<typeof PlanUpdateSchema>;

export const InForceQuerySchema = z.strictObject({ date: IsoDateSchema.optional() });

export const CaseItemParamsSchema = z.strictObject({ orgId: UuidSchema, id: UuidSchema });
export const PlanVersionParamsSchema = z.strictObject({ orgId: UuidSchema, id: UuidSchema, version: wholeNumberText(1) });
