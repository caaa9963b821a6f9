import type { Role } from '../roles';

/**
 * Who is acting, within one organization. Built from the database on every request, so a role or
 * care-team change takes effect at once.
 */
export interface Actor {
  userId: string;
  organizationId: string;
  /** The actor's own membership in this organization. */
  membershipId: string;
  roles: Role[];
  /** Athlete membership ids whose care team includes the actor as coach. */
  coachOf: string[];
  /** Athlete membership ids whose care team includes the actor as clinician. */
  clinicianOf: string[];
  /** Athlete membership ids the actor is linked to as guardian. */
  guardianOf: string[];
  /** Organization setting: guardians may watch their athlete's technique clips. Off when absent. */
  guardiansSeeClips?: boolean;
}

export function hasRole(actor: Actor, role: Role): boolean {
  return actor.roles.includes(role);
}
