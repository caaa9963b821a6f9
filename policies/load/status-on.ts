import type { ParticipationStatus } from './patterns';

const SEVERITY: Record<ParticipationStatus, number> = { full: 0, limited: 1, out: 2 };

/**
 * The most restrictive status wins when an athlete has several open cases. A status that is not one
 * of the three (stored data gone wrong) reads as Out: an unknown status is never a pass.
 */
export function mostRestrictive(statuses: ParticipationStatus[]): ParticipationStatus {
  return statuses.reduce<ParticipationStatus>((acc, s) => {
    const known: ParticipationStatus = Object.hasOwn(SEVERITY, s) ? s : 'out';
    return SEVERITY[known] > SEVERITY[acc] ? known : acc;
  }, 'full');
}

/** One participation-status decision on an open case. */
export interface StatusChangeInput {
  caseId: string;
  status: ParticipationStatus;
  /** 'YYYY-MM-DD' the decision takes effect. */
  effectiveFrom: string;
  /** When it was decided (ISO); a later decision replaces an earlier one from its own date on. */
  createdAt: string;
}

/**
 * The athlete's participation status on any date, from the decisions of their open cases: per case,
 * the last decision made that is in effect on that date; across cases, the most restrictive. The
 * server checks each planned set against the status of its own date, and the program builder runs
 * this same function, so both agree for sessions planned after a status change.
 */
export function statusOnDate(changes: readonly StatusChangeInput[]): (date: string) => ParticipationStatus {
  const ordered = [...changes].sort((a, b) => a.createdAt.localeCompare(b.createdAt) || a.effectiveFrom.localeCompare(b.effectiveFrom));
  return (date) => {
    const latest = new Map<string, ParticipationStatus>();
    for (const c of ordered) if (c.effectiveFrom <= date) latest.set(c.caseId, c.status);
    return mostRestrictive([...latest.values()]);
  };
}
