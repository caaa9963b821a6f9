import type { Role } from './roles';

/**
 * The kinds of in-app notice that also go out by e-mail, with who receives each and whether a person
 * may switch its e-mail off. In-app notices always appear; only the e-mail copy is a choice.
 * Emergencies are fixed: a person told to make sure someone gets urgent care, or that an athlete is
 * Out after an emergency answer, is told by e-mail too, whatever they chose (common practice: safety
 * messages are not opt-out).
 */
export interface EmailedNoticeKind {
  /** What the settings screen calls it, in the reader's words. */
  label: string;
  /** The roles that receive this kind (the settings screen shows a person only their own). */
  roles: Role[];
  /** Always e-mailed; cannot be switched off. */
  fixed: boolean;
}

export const EMAILED_NOTICE_KINDS = {
  red_flag_emergency: { label: 'An athlete answered yes to an emergency warning sign', roles: ['clinician'], fixed: true },
  red_flag_emergency_guardian: { label: 'Your athlete was told to get urgent medical care', roles: ['guardian'], fixed: true },
  status_out: { label: 'An athlete was set to Out after an emergency warning sign', roles: ['coach'], fixed: true },
  red_flag_urgent: { label: 'A warning sign to review today', roles: ['clinician'], fixed: false },
  sessions_on_hold: { label: 'Published sessions put on hold by a change of limits', roles: ['coach'], fixed: false },
  exception_requested: { label: 'A coach asked for an exception', roles: ['clinician'], fixed: false },
  exception_granted: { label: 'An exception you asked for was granted', roles: ['coach'], fixed: false },
  exception_refused: { label: 'An exception you asked for was refused', roles: ['coach'], fixed: false },
  status_changed: { label: 'A change of training status (Out, Limited, Full)', roles: ['athlete', 'coach', 'guardian'], fixed: false },
  plan_changed: { label: 'A new version of the limits (restriction plan)', roles: ['athlete', 'coach', 'guardian'], fixed: false },
} as const satisfies Record<string, EmailedNoticeKind>;

export type EmailedKind = keyof typeof EMAILED_NOTICE_KINDS;
export const EMAILED_KIND_IDS = Object.keys(EMAILED_NOTICE_KINDS) as EmailedKind[];
export const ALWAYS_EMAILED_KINDS = EMAILED_KIND_IDS.filter((k) => EMAILED_NOTICE_KINDS[k].fixed);
export const SWITCHABLE_KINDS = EMAILED_KIND_IDS.filter((k) => !EMAILED_NOTICE_KINDS[k].fixed);

/** The kinds a person with these roles receives, in the catalogue's order. */
export const kindsForRoles = (roles: readonly Role[]): EmailedKind[] =>
  EMAILED_KIND_IDS.filter((k) => EMAILED_NOTICE_KINDS[k].roles.some((r: Role) => roles.includes(r)));
