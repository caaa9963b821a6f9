import { z } from 'zod';
import { IsoDateSchema, UuidSchema, wholeNumber } from './common';

/** Request shapes of the injury report and of the team session hours that feed its exposure. */

export const TEAM_SESSION_KINDS = ['practice', 'competition'] as const;
export type TeamSessionKind = (typeof TEAM_SESSION_KINDS)[number];

export const TeamSessionHoursCreateSchema = z.strictObject({
  date: IsoDateSchema,
  minutes: wholeNumber(1, 600),
  kind: z.enum(TEAM_SESSION_KINDS, { message: `must be one of ${TEAM_SESSION_KINDS.join(', ')}` }),
  /** The athletes present; left out, the whole group. Each must be an athlete of the group. */
  athleteIds: z
    .array(UuidSchema, { message: 'must be a list of ids' })
    .max(200, { message: 'must name at most 200 athletes' })
    .transform((ids) => [...new Set(ids)])
    .optional(),
});
export type TeamSessionHoursCreateInput = z.infer<typeof TeamSessionHoursCreateSchema>;

/** At most about two seasons in one report, so one request stays a bounded amount of work. */
export const REPORT_MAX_DAYS = 731;

export const InjuryReportQuerySchema = z
  .strictObject({ from: IsoDateSchema, to: IsoDateSchema })
  .refine((q) => q.from <= q.to, { message: 'must not be before from', path: ['to'] })
  .refine((q) => (Date.parse(q.to) - Date.parse(q.from)) / 86_400_000 < REPORT_MAX_DAYS, {
    message: `must be within ${REPORT_MAX_DAYS} days of from`,
    path: ['to'],
  });
export type InjuryReportQuery = z.infer<typeof InjuryReportQuerySchema>;
