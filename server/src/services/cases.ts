import type { DataSource, EntityManager } from 'typeorm';
import type { AppAbility } from '../../../policies/access';
import type { CaseDto, CaseloadRowDto, PlanVersionDto, StatusChangeDto } from '../../../policies/dto';
import type { PlanInput } from '../../../policies/load/in-force';
import type { ParticipationStatus } from '../../../policies/load/patterns';
import { ageOn, isMinor } from '../../../policies/roles';
import { accessibleWhere } from '../core/accessible';
import { pickPermitted } from './fields';
import type { RestrictionPlanVersion } from '../entities';

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

interface CaseRow {
  id: string;
  organization_id: string;
  athlete_id: string;
  athlete_name: string;
  body_regions: NonNullable<CaseDto['bodyRegions']>;
  onset_date: string;
  diagnosis: string | null;
  clinical_notes: string | null;
  review_date: string | null;
  opened_at: Date;
  opened_by_name: string | null;
  closed_on: string | null;
  closing_note: string | null;
  plan_id: string | null;
  version: number;
}

export interface CaseQuery {
  athleteId?: string;
  caseId?: string;
  state?: 'open' | 'closed' | 'all';
}

/** Cases this ability may read, with each reader's fields only; clinical notes only when asked. */
export async function listCases(
  db: Db,
  ability: AppAbility,
  organizationId: string,
  q: CaseQuery,
  today: string,
  withNotes = false,
): Promise<CaseDto[]> {
  const acl = accessibleWhere(ability, 'read', 'Case', { organizationId: 'c.organization_id', athleteId: 'c.athlete_id', id: 'c.id' });
  const qb = db
    .createQueryBuilder()
    .select([
      'c.id AS id',
      'c.organization_id AS organization_id',
      'c.athlete_id AS athlete_id',
      'au.display_name AS athlete_name',
      'c.body_regions AS body_regions',
      'c.onset_date AS onset_date',
      'c.diagnosis AS diagnosis',
      withNotes ? 'c.clinical_notes AS clinical_notes' : 'NULL AS clinical_notes',
      'c.review_date AS review_date',
      'c.opened_at AS opened_at',
      'ou.display_name AS opened_by_name',
      'c.closed_on AS closed_on',
      'c.closing_note AS closing_note',
      'p.id AS plan_id',
      'c.version AS version',
    ])
    .from('cases', 'c')
    .innerJoin('memberships', 'am', 'am.id = c.athlete_id')
    .innerJoin('users', 'au', 'au.id = am.user_id')
    .leftJoin('users', 'ou', 'ou.id = c.opened_by')
    .leftJoin('restriction_plans', 'p', 'p.case_id = c.id')
    .where('c.organization_id = :org', { org: organizationId })
    .andWhere(acl.sql, acl.params)
    .orderBy('c.opened_at', 'DESC');
  if (q.athleteId) qb.andWhere('c.athlete_id = :athleteId', { athleteId: q.athleteId });
  if (q.caseId) qb.andWhere('c.id = :caseId', { caseId: q.caseId });
  if (q.state === 'open') qb.andWhere('c.closed_on IS NULL');
  if (q.state === 'closed') qb.andWhere('c.closed_on IS NOT NULL');
  const rows = await qb.getRawMany<CaseRow>();
  const statuses = await statusesOn(
    db,
    rows.map((r) => r.id),
    today,
  );
  return rows.map((r) => {
    const st = statuses.get(r.id);
    const full: Required<CaseDto> = {
      id: r.id,
      organizationId: r.organization_id,
      athleteId: r.athlete_id,
      athleteName: r.athlete_name,
      status: st?.status ?? 'full',
      statusEffectiveFrom: st?.effective_from ?? r.onset_date,
      statusNote: st?.note ?? null,
      openedAt: new Date(r.opened_at).toISOString(),
      closedOn: r.closed_on,
      version: r.version,
      bodyRegions: r.body_regions,
      onsetDate: r.onset_date,
      diagnosis: r.diagnosis,
      clinicalNotes: r.clinical_notes,
      reviewDate: r.review_date,
      openedByName: r.opened_by_name,
      closingNote: r.closing_note,
      planId: r.plan_id,
    };
    if (!withNotes) delete (full as Partial<CaseDto>).clinicalNotes;
    return pickPermitted(ability, 'Case', full) as CaseDto;
  });
}

export async function statusHistory(db: Db, caseId: string): Promise<StatusChangeDto[]> {
  const rows: {
    id: string;
    status: ParticipationStatus;
    effective_from: string;
    note: string | null;
    set_by_name: string | null;
    created_at: Date;
  }[] = await db.query(
    `SELECT s.id, s.status, s.effective_from, s.note, u.display_name AS set_by_name, s.created_at
         FROM participation_status_changes s LEFT JOIN users u ON u.id = s.set_by
        WHERE s.case_id = $1 ORDER BY s.effective_from DESC, s.created_at DESC`,
    [caseId],
  );
  return rows.map((r) => ({
    id: r.id,
    status: r.status,
    effectiveFrom: r.effective_from,
    note: r.note,
    setByName: r.set_by_name,
    createdAt: new Date(r.created_at).toISOString(),
  }));
}

export function toPlanVersionDto(v: RestrictionPlanVersion, createdByName: string | null): PlanVersionDto {
  return {
    planId: v.planId,
    version: v.version,
    stages: v.stages,
    guidance: v.guidance,
    changeNote: v.changeNote,
    createdAt: v.createdAt.toISOString(),
    createdByName,
  };
}

export async function planVersions(db: Db, planId: string, version?: number): Promise<PlanVersionDto[]> {
  const rows: (RestrictionPlanVersion & { created_by_name: string | null })[] = await db.query(
    `SELECT v.plan_id AS "planId", v.version, v.stages, v.guidance, v.change_note AS "changeNote", v.created_at AS "createdAt",
            u.display_name AS created_by_name
       FROM restriction_plan_versions v LEFT JOIN users u ON u.id = v.created_by
      WHERE v.plan_id = $1 ${version ? 'AND v.version = $2' : ''} ORDER BY v.version DESC`,
    version ? [planId, version] : [planId],
  );
  return rows.map((r) => toPlanVersionDto({ ...r, createdAt: new Date(r.createdAt) } as RestrictionPlanVersion, r.created_by_name));
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

/** The caseload (clinicians), roster (coaches) or overview (admins): every athlete the reader may see. */
export async function caseload(db: Db, ability: AppAbility, organizationId: string, date: string): Promise<CaseloadRowDto[]> {
  const acl = accessibleWhere(ability, 'read', 'Athlete', { id: 'm.id', organizationId: 'm.organization_id' });
  const athletes = await db
    .createQueryBuilder()
    .select(['m.id AS id', 'u.display_name AS name', 'p.date_of_birth AS dob', 'p.sport AS sport'])
    .from('memberships', 'm')
    .innerJoin('users', 'u', 'u.id = m.user_id')
    .innerJoin('athlete_profiles', 'p', 'p.membership_id = m.id')
    .where('m.organization_id = :org', { org: organizationId })
    .andWhere('m.active')
    .andWhere(`'athlete' = ANY(m.roles)`)
    .andWhere(acl.sql, acl.params)
    .orderBy('u.display_name')
    .getRawMany<{ id: string; name: string; dob: string | null; sport: string | null }>();
  const ids = athletes.map((a) => a.id);
  const statuses = await athleteStatuses(db, ids, date);
  const reports: { athlete_id: string; reported_at: Date; pain_now: number }[] = ids.length
    ? await db.query(
        `SELECT DISTINCT ON (athlete_id) athlete_id, reported_at, pain_now FROM pain_reports
          WHERE athlete_id = ANY($1) ORDER BY athlete_id, reported_at DESC`,
        [ids],
      )
    : [];
  const latest = new Map(reports.map((r) => [r.athlete_id, { reportedAt: new Date(r.reported_at).toISOString(), painNow: r.pain_now }]));
  return athletes.map((a) => {
    const st = statuses.get(a.id)!;
    return {
      athleteId: a.id,
      athleteName: a.name,
      age: a.dob ? ageOn(a.dob, date) : null,
      isMinor: isMinor(a.dob, date),
      sport: a.sport,
      status: st.status,
      statusEffectiveFrom: st.since,
      openCaseCount: st.openCaseIds.length,
      openCaseId: st.openCaseIds[0] ?? null,
      nextReviewDate: st.nextReview,
      latestPainReport: latest.get(a.id) ?? null,
    };
  });
}
