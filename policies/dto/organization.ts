/** The organization, its audit trail, errors and health. Response shapes shared by server and client; types only. */

export interface AuditEntryDto {
  id: string;
  occurredAt: string;
  actorUserId: string | null;
  actorName: string | null;
  action: string;
  subjectType: string;
  subjectId: string | null;
  athleteId: string | null;
  athleteName: string | null;
  before: unknown;
  after: unknown;
  requestId: string | null;
}
export interface OrganizationDto {
  id: string;
  name: string;
  emergencyNumber: string;
  /** The organization's IANA time zone: its calendar day is "today" for everyone in it (policies/today.ts). */
  timeZone: string;
}
export interface OrganizationSettingsDto extends OrganizationDto {
  /** Whether guardians of an athlete may watch that athlete's technique clips (off by default). */
  guardiansSeeClips: boolean;
  /** The organization's IANA time zone: which day counts as today for everyone in it (policies/today.ts). */
  timeZone: string;
  /** Paper for clearance letters as chosen; null: by the time zone's country. */
  letterPaper: 'letter' | 'a4' | null;
  /** The paper letters are printed on now (the choice, or the country's). */
  letterPaperInUse: 'letter' | 'a4';
  /** ISO 3166-1 alpha-2; null for organizations made before it was asked. */
  country: string | null;
  /** The emergency number is the country's own, so it changes with the country (false: set by hand, kept). */
  emergencyNumberFollowsCountry: boolean;
  version: number;
}
export interface ErrorBody {
  error: { code: string; message: string; fields?: Record<string, string[]>; details?: unknown };
  requestId: string;
}
export interface HealthDto {
  status: 'ok' | 'degraded';
  database: 'up' | 'down';
}
/** Whether this installation lets anyone start an organization (off for a private installation). */
export interface OrganizationSignupStatusDto {
  open: boolean;
}
/** The one answer to every sign-up request, whether or not the address already has an account. */
export interface OrganizationSignupRequestedDto {
  message: string;
}
export interface OrganizationSignupConfirmedDto {
  organizationId: string;
  organizationName: string;
  email: string;
  /** The address already had an account: it signs in with its existing password (the form's was not used). */
  existingAccount: boolean;
}
