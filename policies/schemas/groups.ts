import { z } from 'zod';
import { line, UuidSchema, VersionSchema } from './common';

/** Request shapes of groups: a team, a position group or a training block, with its coaches and athletes. */

export const GROUP_KINDS = ['team', 'position', 'block'] as const;
export type GroupKind = (typeof GROUP_KINDS)[number];

/** How a kind reads in a form and a list. */
export const GROUP_KIND_WORDS: Record<GroupKind, string> = { team: 'Team', position: 'Position group', block: 'Training block' };

const GroupName = line(120);
const GroupKindSchema = z.enum(GROUP_KINDS, { message: `must be one of ${GROUP_KINDS.join(', ')}` });
/** Membership ids of one side of a group; a person named twice counts once. */
const MemberIds = (what: string) =>
  z
    .array(UuidSchema, { message: 'must be a list of ids' })
    .max(200, { message: `must name at most 200 ${what}` })
    .transform((ids) => [...new Set(ids)]);

export const GroupCreateSchema = z.strictObject({
  name: GroupName,
  kind: GroupKindSchema,
  athleteIds: MemberIds('athletes'),
  /** Only admins may name coaches; a coach who starts a group is its coach. */
  coachIds: MemberIds('coaches').optional(),
});
export type GroupCreateInput = z.infer<typeof GroupCreateSchema>;

export const GroupUpdateSchema = z.strictObject({
  name: GroupName.optional(),
  kind: GroupKindSchema.optional(),
  version: VersionSchema,
});
export type GroupUpdateInput = z.infer<typeof GroupUpdateSchema>;

export const GroupMembersSchema = z.strictObject({
  coachIds: MemberIds('coaches'),
  athleteIds: MemberIds('athletes'),
  version: VersionSchema,
});
export type GroupMembersInput = z.infer<typeof GroupMembersSchema>;

export const GroupArchiveSchema = z.strictObject({ version: VersionSchema });

export const GroupListQuerySchema = z.strictObject({
  /** "true" lists archived groups too (admins keep them for the record). */
  archived: z.enum(['true', 'false'], { message: 'must be true or false' }).optional(),
});
