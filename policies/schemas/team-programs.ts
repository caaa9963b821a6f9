import { z } from 'zod';
import { UuidSchema, VersionSchema } from './common';
import { ProgramCreateSchema } from './programs';

/** Request shapes of team programs (a group's program written once, fitted to each athlete). */

export const TeamProgramCreateSchema = z.strictObject({
  groupId: UuidSchema,
  name: ProgramCreateSchema.shape.name,
});
export type TeamProgramCreateInput = z.infer<typeof TeamProgramCreateSchema>;

export const TeamProgramRenameSchema = z.strictObject({
  name: ProgramCreateSchema.shape.name,
  version: VersionSchema,
});

export const TeamProgramListQuerySchema = z.strictObject({ groupId: UuidSchema.optional() });

export const TeamPublishSchema = z.strictObject({
  teamSessionIds: z
    .array(UuidSchema)
    .min(1, { message: 'must name at least one team session' })
    .max(60, { message: 'must name at most 60 team sessions' }),
});

export const TeamVersionActionSchema = z.strictObject({ version: VersionSchema });

export const TeamVersionParamsSchema = z.strictObject({ orgId: UuidSchema, id: UuidSchema, athleteId: UuidSchema });
