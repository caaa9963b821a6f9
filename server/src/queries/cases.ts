import type { DataSource, EntityManager } from 'typeorm';
import type { AppAbility } from '../../../policies/access';
import type { CaseDto, CaseloadRowDto, StatusChangeDto } from '../../../policies/dto';
import type { ParticipationStatus } from '../../../policies/load/patterns';
import { ageOn, isMinor } from '../../../policies/roles';
import { accessibleWhere } from '../core/accessible';
import { orgQuery } from '../core/command';
import { athleteStatuses, statusesOn } from '../services/cases';
import { pickPermitted } from '../services/fields';

type Db = DataSource | EntityManager;

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

/** The caseload (clinicians), roster (coaches) or overview (admins): every athlete the reader may see. */
async function caseload(db: Db, ability: AppAbility, organizationId: string, date: string): Promise<CaseloadRowDto[]> {
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
  const reports: { id: string; athlete_id: string; reported_at: Date; pain_now: number }[] = ids.length
    ? await db.query(
        `SELECT DISTINCT ON (athlete_id) id, athlete_id, reported_at, pain_now FROM pain_reports
          WHERE athlete_id = ANY($1) ORDER BY athlete_id, reported_at DESC`,
        [ids],
      )
    : [];
  const latest = new Map(
    reports.map((r) => [r.athlete_id, { id: r.id, reportedAt: new Date(r.reported_at).toISOString(), painNow: r.pain_now }]),
  );
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

/** The caseload, roster or overview of the reader, with each athlete's status on the organization's today. */
export const caseloadQuery = orgQuery({
  name: 'caseload',
  run: (ctx, _input: void) => caseload(ctx.db, ctx.ability, ctx.actor.organizationId, ctx.today),
});

/** Cases the reader may see, with the fields their role may read, and each case's status today. */
export const casesQuery = orgQuery({
  name: 'cases',
  run: (ctx, input: { athleteId?: string; state: 'open' | 'closed' | 'all' }) =>
    listCases(ctx.db, ctx.ability, ctx.actor.organizationId, input, ctx.today),
});
