import { z } from 'zod';
import { CLINICIAN_MEASURES, RECORD_RULES, THRESHOLD_DIRECTIONS } from '../load/stage-criteria';
import { IsoDateSchema, UuidSchema, VersionSchema, line, text, numberError } from './common';

const zeroToTen = z
  .number(numberError('must be a number'))
  .int({ message: 'must be a whole number' })
  .min(0, { message: 'must be 0–10' })
  .max(10, { message: 'must be 0–10' });

const RecordCriterionSchema = z
  .strictObject({
    id: UuidSchema,
    kind: z.literal('record'),
    rule: z.enum(RECORD_RULES, { message: 'must be a rule from the list' }),
    count: z
      .number(numberError('must be a number'))
      .int({ message: 'must be a whole number' })
      .min(1, { message: 'must be at least 1' })
      .max(50, { message: 'must be at most 50' })
      .optional(),
    maxPain: zeroToTen.optional(),
    maxRpe: zeroToTen.optional(),
  })
  .superRefine((c, ctx) => {
    const needsCount = c.rule !== 'no_red_flags';
    if (needsCount && c.count === undefined) ctx.addIssue({ code: 'custom', path: ['count'], message: 'is needed: how many sessions' });
    if (!needsCount && c.count !== undefined) ctx.addIssue({ code: 'custom', path: ['count'], message: 'does not apply to this rule' });
    if (c.rule === 'pain_settled_sessions' && c.maxPain === undefined)
      ctx.addIssue({ code: 'custom', path: ['maxPain'], message: 'is needed: the highest pain during training that still counts' });
    if (c.rule !== 'pain_settled_sessions' && c.maxPain !== undefined)
      ctx.addIssue({ code: 'custom', path: ['maxPain'], message: 'does not apply to this rule' });
    if (c.rule === 'rpe_at_most' && c.maxRpe === undefined)
      ctx.addIssue({ code: 'custom', path: ['maxRpe'], message: 'is needed: the highest session effort that still counts' });
    if (c.rule !== 'rpe_at_most' && c.maxRpe !== undefined)
      ctx.addIssue({ code: 'custom', path: ['maxRpe'], message: 'does not apply to this rule' });
  });

const ClinicianCriterionSchema = z
  .strictObject({
    id: UuidSchema,
    kind: z.literal('clinician'),
    label: line(120),
    measure: z.enum(CLINICIAN_MEASURES, { message: 'must be threshold or yes_no' }),
    threshold: z.number(numberError('must be a number')).min(-100_000).max(100_000).optional(),
    direction: z.enum(THRESHOLD_DIRECTIONS, { message: 'must be at_least or at_most' }).optional(),
    unit: line(20).nullable().optional(),
  })
  .superRefine((c, ctx) => {
    if (c.measure === 'threshold' && c.threshold === undefined)
      ctx.addIssue({ code: 'custom', path: ['threshold'], message: 'is needed for a measured test' });
    if (c.measure === 'yes_no' && c.threshold !== undefined)
      ctx.addIssue({ code: 'custom', path: ['threshold'], message: 'does not apply to a yes/no judgement' });
  });

const AthleteCriterionSchema = z.strictObject({
  id: UuidSchema,
  kind: z.literal('athlete'),
  threshold: zeroToTen,
});

/** One exit criterion of a stage (policies/load/stage-criteria.ts). */
export const StageCriterionSchema = z.discriminatedUnion(
  'kind',
  [RecordCriterionSchema, ClinicianCriterionSchema, AthleteCriterionSchema],
  {
    message: 'must be a criterion of kind record, clinician or athlete',
  },
);

export const StageCriteriaListSchema = z
  .array(StageCriterionSchema)
  .max(12, { message: 'must have at most 12 criteria' })
  .superRefine((list, ctx) => {
    const seen = new Set<string>();
    list.forEach((c, i) => {
      if (seen.has(c.id)) ctx.addIssue({ code: 'custom', path: [i, 'id'], message: 'is used twice in this stage' });
      seen.add(c.id);
    });
  });

/** The clinician records a test or a judgement for one criterion of a stage. */
export const StageAssessmentSchema = z
  .strictObject({
    stageId: UuidSchema,
    criterionId: UuidSchema,
    date: IsoDateSchema,
    value: z.number(numberError('must be a number')).min(-100_000).max(100_000).nullable().optional(),
    met: z.boolean({ message: 'must be yes or no' }).nullable().optional(),
    note: text(500).optional(),
  })
  .superRefine((a, ctx) => {
    if ((a.value === undefined || a.value === null) && (a.met === undefined || a.met === null))
      ctx.addIssue({ code: 'custom', path: ['value'], message: 'give the measured value or the yes/no judgement' });
  });
export type StageAssessmentInput = z.infer<typeof StageAssessmentSchema>;

/** The athlete says how ready they feel to move on, 0–10, today. */
export const ReadinessRatingSchema = z.strictObject({
  stageId: UuidSchema,
  value: zeroToTen,
});
export type ReadinessRatingInput = z.infer<typeof ReadinessRatingSchema>;

export const AGREEING_PARTIES = ['athlete', 'guardian', 'coach', 'clinician'] as const;
export type AgreeingParty = (typeof AGREEING_PARTIES)[number];

/** Moving to the next stage: a shared decision (Bern consensus, Ardern et al. 2016), recorded with who agreed. */
export const StageAdvanceSchema = z.strictObject({
  fromStageId: UuidSchema,
  effectiveDate: IsoDateSchema,
  agreedBy: z
    .array(z.enum(AGREEING_PARTIES, { message: 'must be athlete, guardian, coach or clinician' }))
    .min(1, { message: 'must name who agreed' })
    .max(AGREEING_PARTIES.length)
    .refine((a) => new Set(a).size === a.length, { message: 'names someone twice' }),
  note: text(500).optional(),
  version: VersionSchema,
});
export type StageAdvanceInput = z.infer<typeof StageAdvanceSchema>;
