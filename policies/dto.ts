/** Response shapes shared by server and client. Types only: no runtime code. */
import type { Actor } from './access/actor';
import type { Role, CareTeamRole } from './roles';
import type { Unit } from './schemas/common';

export interface UserDto {
  id: string;
  email: string;
  displayName: string;
  unitPref: Unit;
}

export interface MembershipSummaryDto {
  id: string;
  organizationId: string;
  organizationName: string;
  roles: Role[];
  /** What the client needs to build the same CASL ability the server uses. */
  actor: Actor;
}

export interface SessionDto {
  user: UserDto | null;
  memberships: MembershipSummaryDto[];
  csrfToken: string;
}

export interface CareTeamAssignmentDto {
  id: string;
  organizationId: string;
  athleteId: string;
  athleteName: string;
  memberId: string;
  memberName: string;
  role: CareTeamRole;
}

export interface GuardianLinkDto {
  id: string;
  organizationId: string;
  athleteId: string;
  athleteName: string;
  guardianId: string;
  guardianName: string;
}

export interface AthleteProfileDto {
  id: string;
  organizationId: string;
  displayName: string;
  dateOfBirth: string | null;
  age: number | null;
  isMinor: boolean;
  /** A minor with no linked guardian: the admin must link one. */
  needsGuardian: boolean;
  sport: string | null;
  position: string | null;
  version: number;
  careTeam: CareTeamAssignmentDto[];
  guardians: GuardianLinkDto[];
}

export interface PersonDto {
  id: string;
  organizationId: string;
  userId: string;
  email: string;
  displayName: string;
  roles: Role[];
  version: number;
  createdAt: string;
  athlete: AthleteProfileDto | null;
}

export type InvitationStatus = 'pending' | 'accepted' | 'expired' | 'revoked';

export interface InvitationDto {
  id: string;
  organizationId: string;
  email: string;
  roles: Role[];
  displayName: string | null;
  status: InvitationStatus;
  expiresAt: string;
  createdAt: string;
  invitedByName: string | null;
  /** Only in the response that creates it: the one-time link, shown to the admin until e-mail exists. */
  link?: string;
}

export interface InvitationPreviewDto {
  organizationName: string;
  email: string;
  roles: Role[];
  displayName: string | null;
  hasAccount: boolean;
  expiresAt: string;
}

export interface AuditEntryDto {
  id: string;
  occurredAt: string;
  actorUserId: string | null;
  actorName: string | null;
  action: string;
  subjectType: string;
  subjectId: string | null;
  before: unknown;
  after: unknown;
  requestId: string | null;
}

export interface OrganizationDto {
  id: string;
  name: string;
  emergencyNumber: string;
}

export interface ErrorBody {
  error: { code: string; message: string; fields?: Record<string, string[]> };
  requestId: string;
}

export interface HealthDto {
  status: 'ok' | 'degraded';
  database: 'up' | 'down';
}
