import { z } from 'zod';
import { BODY_REGIONS } from '../body-regions';
import { MOVEMENT_PATTERNS } from '../load/patterns';
import { checkRedFlagAnswers, RED_FLAG_ITEMS, redFlagQuestion } from '../red-flags';
import { IsoDateSchema, UuidSchema, VersionSchema, text, numberError } from './common';

/** 0–10 verbal numeric rating, whole numbers (LOINC 72514-3 takes integers 0–10). */
export const PainScoreSchema = z
  .number(numberError('must be a number from 0 to 10'))
  .int({ message: 'must be a whole number from 0 to 10' })
  .min(0, { message: 'must be from 0 to 10' })
  .max(10, { message: 'must be from 0 to 10' });

/** Session RPE on Foster's modified CR-10: whole numbers 0–10 (Foster et al. 2001). */
export const SessionRpeSchema = z
  .number(numberError('must be a number from 0 to 10'))
  .int({ message: 'must be a whole number from 0 to 10' })
  .min(0, { message: 'must be from 0 to 10' })
  .max(10, { message: 'must be from 0 to 10' });

/** Set RPE on the reps-in-reserve scale: 1–10 in half steps (Zourdos et al. 2016). */
export const SetRpeSchema = z
  .number(numberError('must be a number from 1 to 10'))
  .min(1, { message: 'must be from 1 to 10' })
  .max(10, { message: 'must be from 1 to 10' })
  .multipleOf(0.5, { message: 'must be a whole or half step' });

/** Question ids are short snake_case words; the count is bounded so a body cannot carry thousands of keys. */
const RedFlagAnswersSchema = z
  .record(
    z.string().regex(/^[a-z][a-z0-9_]{0,63}$/, { message: 'is not a warning question' }),
    z.boolean({ message: 'must be answered yes or no' }),
  )
  .refine((o) => Object.keys(o).length <= 2 * RED_FLAG_ITEMS.length, { message: 'has more answers than there are questions' });

export const PainReportCreateSchema = z
  .strictObject({
    athleteId: UuidSchema,
    bodyRegions: z
      .array(z.enum(BODY_REGIONS, { message: 'must be a body region from the list' }))
      .min(1, { message: 'choose at least one place' })
      .max(BODY_REGIONS.length),
    painNow: PainScoreSchema,
    painWorst24h: PainScoreSchema,
    onsetDate: IsoDateSchema,
    aggravatingPatterns: z.array(z.enum(MOVEMENT_PATTERNS, { message: 'must be a movement from the list' })).default([]),
    startedInTraining: z.boolean({ message: 'must be yes or no' }),
    note: text(2000).optional(),
    /**
     * The answers to exactly the questions the chosen places ask (`redFlagQuestionsFor`): every one
     * answered, so "not answered" is never read as "no", and none from another place's screen.
     */
    redFlags: RedFlagAnswersSchema,
  })
  .superRefine((report, ctx) => {
    // With no place chosen there is no question set to check against; bodyRegions already says so.
    if (report.bodyRegions.length === 0) return;
    const { missing, unknown } = checkRedFlagAnswers(report.bodyRegions, report.redFlags);
    for (const id of missing) ctx.addIssue({ code: 'custom', path: ['redFlags', id], message: 'must be answered yes or no' });
    for (const id of unknown) {
      const retired = redFlagQuestion(id);
      const message = !retired
        ? 'is not a warning question'
        : 'retired' in retired
          ? `is no longer asked${retired.replacedBy ? `; answer ${retired.replacedBy} instead` : ''}`
          : 'is not asked for the places chosen';
      ctx.addIssue({ code: 'custom', path: ['redFlags', id], message });
    }
  });
export type PainReportCreateInput = z.infer<typeof PainReportCreateSchema>;

export const CheckInSchema = z.strictObject({
  athleteId: UuidSchema,
  date: IsoDateSchema,
  sleepHours: z
    .number(numberError('must be a number'))
    .min(0, { message: 'must be 0–16' })
    .max(16, { message: 'must be 0–16' })
    .multipleOf(0.5, { message: 'must be in half hours' }),
  soreness: PainScoreSchema,
  readiness: PainScoreSchema,
  painNow: PainScoreSchema,
});
export type CheckInInput = z.infer<typeof CheckInSchema>;

export const LoggedSetSchema = z.strictObject({
  exercise: text(120).min(1, { message: 'is required' }),
  /** The library exercise, when the set comes from a planned session: the limits check reads its patterns. */
  exerciseId: UuidSchema.nullable().optional(),
  /** Kilograms; the client converts from the athlete's unit. 0 for bodyweight. */
  loadKg: z
    .number(numberError('must be a number'))
    .min(0, { message: 'must be 0 or more' })
    .max(1000, { message: 'must be at most 1000 kg' }),
  reps: z
    .number(numberError('must be a number'))
    .int({ message: 'must be a whole number' })
    .min(0, { message: 'must be 0 or more' })
    .max(100, { message: 'must be at most 100' }),
  rpe: SetRpeSchema.nullable().optional(),
});
export type LoggedSetInput = z.infer<typeof LoggedSetSchema>;

export const TrainingLogCreateSchema = z.strictObject({
  athleteId: UuidSchema,
  date: IsoDateSchema,
  durationMinutes: z
    .number(numberError('must be a number'))
    .int({ message: 'must be whole minutes' })
    .min(1, { message: 'must be at least 1 minute' })
    .max(600, { message: 'must be at most 600 minutes' }),
  sessionRpe: SessionRpeSchema,
  painBefore: PainScoreSchema,
  painDuring: PainScoreSchema,
  /** Pain after the session (that evening), when the athlete logs in the evening; otherwise added later that day. */
  painAfter: PainScoreSchema.optional(),
  sets: z.array(LoggedSetSchema).max(200, { message: 'must be at most 200 sets' }).default([]),
  notes: text(1000).optional(),
  /** The published session this log records ("Log this session"); absent for unplanned training. */
  sessionId: UuidSchema.optional(),
});
export type TrainingLogCreateInput = z.infer<typeof TrainingLogCreateSchema>;

export const NextMorningSchema = z.strictObject({
  painNextMorning: PainScoreSchema,
  version: VersionSchema,
});
export type NextMorningInput = z.infer<typeof NextMorningSchema>;

export const PainAfterSchema = z.strictObject({
  painAfter: PainScoreSchema,
  version: VersionSchema,
});
export type PainAfterInput = z.infer<typeof PainAfterSchema>;

export const AthleteRangeQuerySchema = z.strictObject({
  from: IsoDateSchema.optional(),
  to: IsoDateSchema.optional(),
});

export const FlagListQuerySchema = z.strictObject({
  athleteId: UuidSchema.optional(),
  state: z.enum(['open', 'acknowledged', 'all'], { message: 'must be open, acknowledged or all' }).default('open'),
});
