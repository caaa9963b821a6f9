import type { DataSource, EntityManager } from 'typeorm';
import type { PlanInput } from '../../../policies/load/in-force';
import type { ParticipationStatus } from '../../../policies/load/patterns';

type Db = DataSource | EntityManager;

export { mostRestrictive } from '../../../policies/load/status-on';
import { mostRestrictive } from '../../../policies/load/status-on';

interface StatusRow {
  case_id: string;
  status: ParticipationStatus;
  effective_from: string;
  note: string | null;
}

/** `DISTINCT ON (s.case_id) … ORDER BY` this picks each case's status on `date` (see statusesOn). */
export const statusOnOrder = (date: string) => `s.case_id, (s.effective_from <= ${date}) DESC,
  CASE WHEN s.effective_from <= ${date} THEN s.created_at END DESC NULLS LAST,
  CASE WHEN s.effective_from <= ${date} THEN s.effective_from END DESC NULLS LAST,
  s.effective_from ASC`;

/**
 * Status of each case on `date`: among the changes already in effect, the most recently recorded
 * one wins — so an emergency Out recorded today overrides a Full that was scheduled earlier for a
 * later day. A case whose first status starts later shows that first status.
 */
export async function statusesOn(db: Db, caseIds: string[], date: string): Promise<Map<string, StatusRow>> {
  if (caseIds.length === 0) return new Map();
  const rows: StatusRow[] = await db.query(
    `SELECT DISTINCT ON (s.case_id) s.case_id, s.status, s.effective_from, s.note
       FROM participation_status_changes s
      WHERE s.case_id = ANY($1)
      ORDER BY ${statusOnOrder('$2')}`,
    [caseIds, date],
  );
  return new Map(rows.map((r) => [r.case_id, r]));
}

/**
 * The current version of every plan whose case is open on `date` (a case closed on D stops counting
 * from D), as the in-force lookup takes them.
 */
export async function activePlans(db: Db, athleteIds: string[], date: string): Promise<Map<string, (PlanInput & { guidance: string })[]>> {
  const out = new Map<string, (PlanInput & { guidance: string })[]>();
  if (athleteIds.length === 0) return out;
  const rows: { athlete_id: string; plan_id: string; case_id: string; version: number; stages: PlanInput['stages']; guidance: string }[] =
    await db.query(
      `SELECT p.athlete_id, p.id AS plan_id, p.case_id, p.version, v.stages, v.guidance
       FROM restriction_plans p
       JOIN cases c ON c.id = p.case_id AND (c.closed_on IS NULL OR c.closed_on > $2)
       JOIN restriction_plan_versions v ON v.plan_id = p.id AND v.version = p.version
      WHERE p.athlete_id = ANY($1)`,
      [athleteIds, date],
    );
  for (const r of rows) {
    const list = out.get(r.athlete_id) ?? [];
    list.push({ planId: r.plan_id, caseId: r.case_id, version: r.version, stages: r.stages, guidance: r.guidance });
    out.set(r.athlete_id, list);
  }
  return out;
}

/** Each athlete's participation status on `date`: the most restrictive of their open cases, else Full. */
export async function athleteStatuses(
  db: Db,
  athleteIds: string[],
  date: string,
): Promise<Map<string, { status: ParticipationStatus; since: string | null; openCaseIds: string[]; nextReview: string | null }>> {
  const out = new Map<string, { status: ParticipationStatus; since: string | null; openCaseIds: string[]; nextReview: string | null }>();
  if (athleteIds.length === 0) return out;
  const cases: { id: string; athlete_id: string; review_date: string | null }[] = await db.query(
    `SELECT id, athlete_id, review_date FROM cases WHERE athlete_id = ANY($1) AND (closed_on IS NULL OR closed_on > $2) ORDER BY opened_at DESC`,
    [athleteIds, date],
  );
  const statuses = await statusesOn(
    db,
    cases.map((c) => c.id),
    date,
  );
  const plans = await activePlans(db, athleteIds, date);
  for (const id of athleteIds) {
    const mine = cases.filter((c) => c.athlete_id === id);
    const rows = mine.map((c) => statuses.get(c.id)).filter((s): s is StatusRow => !!s);
    const status = mostRestrictive(rows.map((r) => r.status));
    const since =
      rows
        .filter((r) => r.status === status)
        .map((r) => r.effective_from)
        .sort()
        .pop() ?? null;
    const reviewDates = [
      ...mine.map((c) => c.review_date),
      ...(plans.get(id) ?? []).flatMap((p) => p.stages.map((s) => s.reviewDate ?? null)),
    ].filter((d): d is string => !!d && d >= date);
    out.set(id, { status, since, openCaseIds: mine.map((c) => c.id), nextReview: reviewDates.sort()[0] ?? null });
  }
  return out;
}
