import type { Role } from '../../../policies/roles';

/**
 * Each role has its own home. The switcher's words are ours and say what the view is for, not the
 * job title, since one person may hold several roles.
 */
export const ROLE_VIEWS: Record<Role, { path: string; tab: string }> = {
  clinician: { path: '/clinician', tab: 'Clinic' },
  coach: { path: '/coach', tab: 'Coaching' },
  admin: { path: '/admin', tab: 'Organization' },
  athlete: { path: '/athlete', tab: 'My training' },
  guardian: { path: '/guardian', tab: 'Family' },
};

/**
 * When someone holds several roles, open the view where safety work happens first: clinical triage,
 * then coaching, then running the organization, then the athlete's and guardian's own views.
 */
export const ROLE_PRIORITY: readonly Role[] = ['clinician', 'coach', 'admin', 'athlete', 'guardian'];

export function orderedRoles(roles: readonly Role[]): Role[] {
  return ROLE_PRIORITY.filter((r) => roles.includes(r));
}

/** The view to open: the one last chosen in this organization if still held, otherwise by priority. */
export function defaultRole(roles: readonly Role[], remembered?: string | null): Role | null {
  const held = orderedRoles(roles);
  const last = held.find((r) => r === remembered);
  return last ?? held[0] ?? null;
}

const viewKey = (orgId: string) => `loadline.view.${orgId}`;

/** Remembers the chosen view for this browser tab only (not a secret: a role name). */
export function rememberView(orgId: string, role: Role): void {
  try {
    sessionStorage.setItem(viewKey(orgId), role);
  } catch {
    // Storage may be blocked (private mode); the default order still works.
  }
}

export function recallView(orgId: string): string | null {
  try {
    return sessionStorage.getItem(viewKey(orgId));
  } catch {
    return null;
  }
}
