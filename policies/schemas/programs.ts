import { z } from 'zod';
import { MOVEMENT_PATTERNS } from '../load/patterns';
import { IsoDateSchema, UuidSchema, VersionSchema, text, numberError } from './common';
import { SetRpeSchema } from './athlete';

export const EQUIPMENT = [
  'barbell',
  'dumbbell',
  'kettlebell',
  'machine',
  'cable',
  'bodyweight',
  'band',
  'sled',
  'medicine_ball',
  'other',
] as const;
export type Equipment = (typeof EQUIPMENT)[number];

export const LoadStepsSchema = z.discriminatedUnion(
  'kind',
  [
    z.strictObject({
      kind: z.literal('increment'),
      step: z.number(numberError('must be a number')).positive({ message: 'must be above 0' }).max(50, { message: 'must be at most 50' }),
      unit: z.enum(['kg', 'lb'], { message: 'must be kg or lb' }),
    }),
    z.strictObject({
      kind: z.literal('list'),
      valuesKg: z.array(z.number().positive().max(500)).min(1, { message: 'must list at least one load' }).max(60),
    }),
  ],
  { message: 'must be an increment or a list of loads' },
);

/**
 * "Use instead": the library exercises to use, in order of preference, when this one is not allowed for an
 * athlete (the team fitting tries them before any other of the same pattern family). At most six.
 */
export const MAX_USE_INSTEAD = 6;

/** An exercise's fields, each as sent: no defaults here, so neither schema below can invent a value. */
const ExerciseFields = {
  name: text(120).min(1, { message: 'is required' }),
  patterns: z.array(z.enum(MOVEMENT_PATTERNS, { message: 'must be a movement pattern from the list' })).max(4),
  equipment: z.enum(EQUIPMENT, { message: 'must be one of the equipment types' }),
  ballistic: z.boolean({ message: 'must be yes or no' }),
  steps: LoadStepsSchema,
  referenceId: UuidSchema.nullable(),
  useInstead: z
    .array(UuidSchema)
    .max(MAX_USE_INSTEAD, { message: `must name at most ${MAX_USE_INSTEAD} exercises` })
    .refine((ids) => new Set(ids.map((id) => id.toLowerCase())).size === ids.length, { message: 'must not name an exercise twice' }),
};

/** A new exercise: one that names no movement pattern counts toward none. */
export const ExerciseCreateSchema = z.strictObject({
  ...ExerciseFields,
  patterns: ExerciseFields.patterns.default([]),
  referenceId: ExerciseFields.referenceId.optional(),
  useInstead: ExerciseFields.useInstead.default([]),
});
export type ExerciseCreateInput = z.infer<typeof ExerciseCreateSchema>;

/**
 * An edit writes exactly the keys it was sent. Built from the fields, not as `ExerciseCreateSchema.partial()`:
 * a default survives `.partial()`, and the create schema's `patterns: []` then erased the patterns of every
 * exercise archived or restored (`{ archived, version }`), so its sets escaped every block and cap.
 */
export const ExerciseUpdateSchema = z.strictObject({
  name: ExerciseFields.name.optional(),
  patterns: ExerciseFields.patterns.optional(),
  equipment: ExerciseFields.equipment.optional(),
  ballistic: ExerciseFields.ballistic.optional(),
  steps: ExerciseFields.steps.optional(),
  referenceId: ExerciseFields.referenceId.optional(),
  useInstead: ExerciseFields.useInstead.optional(),
  archived: z.boolean({ message: 'must be yes or no' }).optional(),
  version: VersionSchema,
});
export type ExerciseUpdateInput = z.infer<typeof ExerciseUpdateSchema>;

export const BaselineCreateSchema = z
  .strictObject({
    exerciseId: UuidSchema,
    kind: z.enum(['tested', 'estimated'], { message: 'must be tested or estimated' }),
    loadKg: z
      .number(numberError('must be a number'))
      .positive({ message: 'must be above 0' })
      .max(1000, { message: 'must be at most 1000 kg' }),
    reps: z
      .number(numberError('must be a number'))
      .int({ message: 'must be a whole number' })
      .min(1, { message: 'must be at least 1' })
      .max(36, { message: 'must be at most 36 (the estimates break down beyond)' }),
    rpe: SetRpeSchema.nullable().optional(),
    testedOn: IsoDateSchema,
  })
  .refine((b) => b.kind === 'estimated' || b.reps === 1, { message: 'a tested max is one rep', path: ['reps'] });
export type BaselineCreateInput = z.infer<typeof BaselineCreateSchema>;

export const PlannedLoadSchema = z.discriminatedUnion(
  'kind',
  [
    z.strictObject({
      kind: z.literal('kg'),
      value: z.number(numberError('must be a number')).min(0).max(1000, { message: 'must be at most 1000' }),
    }),
    z.strictObject({
      kind: z.literal('lb'),
      value: z.number(numberError('must be a number')).min(0).max(2200, { message: 'must be at most 2200' }),
    }),
    z.strictObject({
      kind: z.literal('percent'),
      value: z
        .number(numberError('must be a number'))
        .positive({ message: 'must be above 0' })
        .max(110, { message: 'must be at most 110%' }),
    }),
    z.strictObject({ kind: z.literal('bodyweight') }),
  ],
  { message: 'must be kg, lb, % of 1RM or bodyweight' },
);

export const PlannedSetSchema = z.strictObject({
  id: UuidSchema,
  reps: z
    .number(numberError('must be a number'))
    .int({ message: 'must be a whole number' })
    .min(1, { message: 'must be at least 1' })
    .max(100, { message: 'must be at most 100' }),
  load: PlannedLoadSchema,
  targetRpe: SetRpeSchema.nullable().optional(),
  /** A warm-up: checked against every cap, but not counted as a hard set. Absent means a working set. */
  warmUp: z.boolean({ message: 'must be yes or no' }).optional(),
  restSeconds: z.number().int().min(0).max(1800, { message: 'must be at most 1800 s' }).nullable().optional(),
  notes: text(300).nullable().optional(),
});
export type PlannedSetInput = z.infer<typeof PlannedSetSchema>;

export const SessionExerciseSchema = z.strictObject({
  id: UuidSchema,
  exerciseId: UuidSchema,
  notes: text(500).nullable().optional(),
  sets: z.array(PlannedSetSchema).min(1, { message: 'must have at least one set' }).max(30),
});

export const SessionContentSchema = z.strictObject({
  exercises: z.array(SessionExerciseSchema).max(30, { message: 'must have at most 30 exercises' }),
});
export type SessionContent = z.infer<typeof SessionContentSchema>;

export const ProgramCreateSchema = z.strictObject({
  name: text(120).min(1, { message: 'is required' }),
  athleteIds: z.array(UuidSchema).min(1, { message: 'must include at least one athlete' }).max(60),
});
export type ProgramCreateInput = z.infer<typeof ProgramCreateSchema>;

/** As ExerciseUpdateSchema: each field optional by itself, so an edit never carries a key it was not sent. */
export const ProgramUpdateSchema = z.strictObject({
  name: ProgramCreateSchema.shape.name.optional(),
  athleteIds: ProgramCreateSchema.shape.athleteIds.optional(),
  version: VersionSchema,
});

export const SessionCreateSchema = z.strictObject({
  date: IsoDateSchema,
  title: text(120).min(1, { message: 'is required' }),
  content: SessionContentSchema.default({ exercises: [] }),
});
export type SessionCreateInput = z.infer<typeof SessionCreateSchema>;

export const SessionUpdateSchema = z.strictObject({
  date: IsoDateSchema.optional(),
  title: text(120).min(1, { message: 'is required' }).optional(),
  content: SessionContentSchema.optional(),
  version: VersionSchema,
});
export type SessionUpdateInput = z.infer<typeof SessionUpdateSchema>;

export const CopyWeekSchema = z.strictObject({
  fromWeekStart: IsoDateSchema,
  toWeekStart: IsoDateSchema,
});

export const ShiftDatesSchema = z.strictObject({
  fromDate: IsoDateSchema,
  days: z
    .number()
    .int()
    .min(-365)
    .max(365)
    .refine((d) => d !== 0, { message: 'must not be 0' }),
});

export const ExceptionCreateSchema = z.strictObject({
  athleteId: UuidSchema,
  setIds: z.array(UuidSchema).min(1, { message: 'must name at least one set' }).max(100),
  reason: text(1000).min(5, { message: 'must say why (at least 5 characters)' }),
});
export type ExceptionCreateInput = z.infer<typeof ExceptionCreateSchema>;

export const ExceptionDecisionSchema = z.strictObject({
  decision: z.enum(['grant', 'refuse'], { message: 'must be grant or refuse' }),
  /** Grant only some of the requested sets (narrowing); default all. */
  setIds: z.array(UuidSchema).min(1).max(100).optional(),
  note: text(1000).min(1, { message: 'is required' }),
});
export type ExceptionDecisionInput = z.infer<typeof ExceptionDecisionSchema>;

export const ProgramItemParamsSchema = z.strictObject({ orgId: UuidSchema, id: UuidSchema });
