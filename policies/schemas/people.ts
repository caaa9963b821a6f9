import { z } from 'zod';
import { ROLES } from '../roles';
import { CARE_TEAM_ROLES } from '../roles';
import {
  BIGINT_ID_MAX,
  DisplayNameSchema,
  EmailSchema,
  IsoDateSchema,
  UNITS,
  UuidSchema,
  VersionSchema,
  text,
  wholeNumberText,
} from './common';

export const RoleSchema = z.enum(ROLES, { message: `must be one of ${ROLES.join(', ')}` });
export const RolesSchema = z
  .array(RoleSchema)
  .min(1, { message: 'must include at least one role' })
  .max(ROLES.length)
  .refine((roles) => new Set(roles).size === roles.length, { message: 'must not repeat a role' });

const OptionalText = text(80);

export const InvitationCreateSchema = z
  .strictObject({
    email: EmailSchema,
    roles: RolesSchema,
    displayName: DisplayNameSchema.optional(),
    dateOfBirth: IsoDateSchema.optional(),
    sport: OptionalText.optional(),
  })
  .refine((v) => !v.dateOfBirth || v.roles.includes('athlete'), {
    message: 'is only for athletes',
    path: ['dateOfBirth'],
  });
export type InvitationCreateInput = z.infer<typeof InvitationCreateSchema>;

export const MembershipUpdateSchema = z.strictObject({
  roles: RolesSchema,
  version: VersionSchema,
});
export type MembershipUpdateInput = z.infer<typeof MembershipUpdateSchema>;

export const AthleteProfileUpdateSchema = z.strictObject({
  dateOfBirth: IsoDateSchema.nullable().optional(),
  sport: OptionalText.nullable().optional(),
  position: OptionalText.nullable().optional(),
  version: VersionSchema,
});
export type AthleteProfileUpdateInput = z.infer<typeof AthleteProfileUpdateSchema>;

export const CareTeamRoleSchema = z.enum(CARE_TEAM_ROLES, { message: 'must be coach or clinician' });
export const CareTeamAssignmentCreateSchema = z.strictObject({
  athleteId: UuidSchema,
  memberId: UuidSchema,
  role: CareTeamRoleSchema,
});
export type CareTeamAssignmentCreateInput = z.infer<typeof CareTeamAssignmentCreateSchema>;

export const GuardianLinkCreateSchema = z.strictObject({
  athleteId: UuidSchema,
  guardianId: UuidSchema,
});
export type GuardianLinkCreateInput = z.infer<typeof GuardianLinkCreateSchema>;

export const ProfileUpdateSchema = z.strictObject({
  displayName: DisplayNameSchema.optional(),
  unitPref: z.enum(UNITS, { message: 'must be kg or lb' }).optional(),
});
export type ProfileUpdateInput = z.infer<typeof ProfileUpdateSchema>;

export const AuditQuerySchema = z.strictObject({
  action: text(80).optional(),
  actorId: UuidSchema.optional(),
  subjectId: UuidSchema.optional(),
  athleteId: UuidSchema.optional(),
  from: IsoDateSchema.optional(),
  to: IsoDateSchema.optional(),
  limit: wholeNumberText(1, 500).default(100),
  before: wholeNumberText(1, BIGINT_ID_MAX).optional(),
});
export type AuditQueryInput = z.infer<typeof AuditQuerySchema>;

export const OrgParamsSchema = z.strictObject({ orgId: UuidSchema });
export const OrgItemParamsSchema = z.strictObject({ orgId: UuidSchema, id: UuidSchema });
