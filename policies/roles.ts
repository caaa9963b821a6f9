export const ROLES = ['athlete', 'coach', 'clinician', 'guardian', 'admin'] as const;
export type Role = (typeof ROLES)[number];

export const ROLE_LABELS: Record<Role, string> = {
  athlete: 'Athlete',
  coach: 'Coach',
  clinician: 'Clinician',
  guardian: 'Guardian',
  admin: 'Admin',
};

/** Roles that sit on an athlete's care team. */
export const CARE_TEAM_ROLES = ['coach', 'clinician'] as const;
export type CareTeamRole = (typeof CARE_TEAM_ROLES)[number];

/** Age of majority used to flag minors. Jurisdictions differ (from memory: 18 in most US states). */
export const AGE_OF_MAJORITY = 18;

/**
 * Whole years between a date of birth and a day, both 'YYYY-MM-DD'. Computed on the calendar, not
 * on milliseconds, so the birthday itself is the first day of the new age.
 */
export function ageOn(dateOfBirth: string, onDate: string): number {
  const [by, bm, bd] = dateOfBirth.split('-').map(Number);
  const [y, m, d] = onDate.split('-').map(Number);
  let age = y - by;
  if (m < bm || (m === bm && d < bd)) age -= 1;
  return age;
}

export function isMinor(dateOfBirth: string | null | undefined, onDate: string): boolean {
  return dateOfBirth != null && ageOn(dateOfBirth, onDate) < AGE_OF_MAJORITY;
}

/** Today's date, 'YYYY-MM-DD', in UTC. */
export function todayIso(now: Date = new Date()): string {
  return now.toISOString().slice(0, 10);
}
