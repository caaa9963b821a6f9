/** The signed-in person, their memberships and two-step sign-in. Response shapes shared by server and client; types only. */
import type { Actor } from '../access/actor';
import type { Role } from '../roles';
import type { Unit } from '../schemas/common';

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
  /** The organization's IANA time zone: "today" on every screen is its local day (policies/today.ts). */
  timeZone: string;
  roles: Role[];
  /** What the client needs to build the same CASL ability the server uses. */
  actor: Actor;
}
export interface SessionDto {
  user: UserDto | null;
  memberships: MembershipSummaryDto[];
  csrfToken: string;
  /** The password was right and two-step sign-in is on: a code is needed before the person is signed in. */
  secondStep?: boolean;
}
/** Two-step sign-in on the signed-in person's own account. */
export interface TwoStepStatusDto {
  enabled: boolean;
  enabledAt: string | null;
  recoveryCodesLeft: number;
}
/** A new authenticator secret, shown once while the person sets up their app. */
export interface TwoStepSetupDto {
  secret: string;
  otpauthUri: string;
  /** The otpauth URI as a QR code image (data: URL, PNG). */
  qrDataUrl: string;
}
/** Two-step sign-in is on: the recovery codes, shown this once. */
export interface TwoStepEnabledDto {
  recoveryCodes: string[];
}
