/** People of an organization: care teams, guardians, athlete profiles, invitations. Response shapes shared by server and client; types only. */
import type { CareTeamRole, Role } from '../roles';

export interface CareTeamAssignmentDto {
  id: string;
  organizationId: string;
  athleteId: string;
  athleteName: string;
  memberId: string;
  memberName: string;
  /** The coach's or clinician's sign-in e-mail, so the athlete and family can reach them ("contact your clinician"). */
  memberEmail: string;
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
