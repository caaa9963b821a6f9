import { createHash } from 'node:crypto';
import type { DataSource, EntityManager } from 'typeorm';
import type { AppAbility } from '../../../policies/access';
import type { PlanInput } from '../../../policies/load/in-force';
import { checkSets, type Breach, type EngineContext, type EngineExercise, type EngineSet } from '../../../policies/load/compliance';
import type { ParticipationStatus } from '../../../policies/load/patterns';
import type { Unit } from '../../../policies/schemas/common';
import type { PlannedSetInput, SessionContent } from '../../../policies/schemas/programs';
import { Exercise, ProgramSession, type SessionHold } from '../entities';
import { accessibleWhere } from '../core/accessible';
import { activePlans, mostRestrictive, statusOnOrder } from './cases';
import { statusOnDate } from '../../../policies/load/status-on';

/** A set's content, hashed: a granted exception covers the set only while it stays as granted. */
export function setFingerprint(exerciseId: string, set: PlannedSetInput, date: string): string {
  return createHash('sha256')
    .update(JSON.stringify([exerciseId, date, set.reps, set.load, set.targetRpe ?? null]))
    .digest('hex')
    .slice(0, 32);
}

export function toEngineExercise(e: Exercise): EngineExercise {
  return { id: e.id, name: e.name, patterns: e.patterns, ballistic: e.ballistic, steps: e.steps, referenceId: e.referenceId };
}

export function engineSets(session: Pick<ProgramSession, 'id' | 'date' | 'content'>): EngineSet[] {
  const out: EngineSet[] = [];
  let order = 0;
  for (const ex of session.content.exercises) {
    for (const s of ex.sets) {
      out.push({
        id: s.id,
        sessionId: session.id,
        date: session.date,
        exerciseId: ex.exerciseId,
        reps: s.reps,
        load: s.load,
        targetRpe: s.targetRpe ?? null,
        order: order++,
      });
    }
  }
  return out;
}

/**
 * A read outside any transaction as a named (prepared) statement on the pool's connection: the
 * roster and today queries took longer to plan than to run, and PostgreSQL keeps a prepared
 * statement's plan per connection. The name is the text's hash, so a text is prepared once per
 * connection; callers keep the text independent of the data (lists as arrays, not IN lists).
 */
async function preparedRead<T>(ds: DataSource, text: string, values: unknown[]): Promise<T[]> {
  const pool = (ds.driver as unknown as { master: import('pg').Pool }).master;
  const name = `read_${createHash('sha256').update(text).digest('base64url').slice(0, 24)}`;
  return (await pool.query({ name, text, values })).rows as T[];
}

export interface RosterRow {
  athleteId: string;
  athleteName: string;
  status: ParticipationStatus;
  /** Plans of the athlete's cases open on the date, current versions (as activePlans). */
  plans: PlanInput[];
  sessionsOnHold: number;
  pendingExceptions: number;
  nextSession: { id: string; date: string; title: string } | null;
}

/**
 * The coach's roster in one query: every athlete the reader may see (the same CASL filter as the
 * caseload), with the status of each open case (as statusesOn), the plans in force (as
 * activePlans), held upcoming sessions, pending exceptions and the next published session. One
 * round trip instead of nine: on the roster each one cost more than the SQL it ran.
 */
export async function rosterRows(ds: DataSource, ability: AppAbility, organizationId: string, date: string): Promise<RosterRow[]> {
  const acl = accessibleWhere(ability, 'read', 'Athlete', { id: 'm.id', organizationId: 'm.organization_id' }, 'acl', { arrays: true });
  const [sql, params] = ds.driver.escapeQueryWithParameters(
    `WITH athletes AS (
       SELECT m.id, u.display_name AS name FROM memberships m JOIN users u ON u.id = m.user_id
        WHERE m.organization_id = :org AND m.active AND 'athlete' = ANY(m.roles) AND ${acl.sql}
     ), open_cases AS (
       SELECT c.id, c.athlete_id FROM cases c
        WHERE c.organization_id = :org AND c.athlete_id IN (SELECT id FROM athletes) AND (c.closed_on IS NULL OR c.closed_on > :date)
     ), statuses AS (
       SELECT DISTINCT ON (s.case_id) s.case_id, s.status FROM participation_status_changes s
        WHERE s.case_id IN (SELECT id FROM open_cases)
        ORDER BY ${statusOnOrder(':date')}
     ), next_sessions AS (
       -- One pass over the programs holding any of these athletes (the GIN index finds them).
       SELECT DISTINCT ON (pa.athlete_id) pa.athlete_id, s.id, s.date, s.title
         FROM programs p CROSS JOIN LATERAL unnest(p.athlete_ids) AS pa(athlete_id)
         JOIN program_sessions s ON s.program_id = p.id AND s.status = 'published' AND s.date >= :date
        WHERE p.athlete_ids && ARRAY(SELECT id FROM athletes) AND pa.athlete_id IN (SELECT id FROM athletes)
        ORDER BY pa.athlete_id, s.date, s.created_at
     ), plans AS (
       SELECT p.athlete_id, json_agg(json_build_object('planId', p.id, 'caseId', p.case_id, 'version', p.version, 'stages', v.stages)) AS plans
         FROM restriction_plans p
         JOIN cases c ON c.id = p.case_id AND (c.closed_on IS NULL OR c.closed_on > :date)
         JOIN restriction_plan_versions v ON v.plan_id = p.id AND v.version = p.version
        WHERE p.organization_id = :org AND p.athlete_id IN (SELECT id FROM athletes)
        GROUP BY p.athlete_id
     ), holds AS (
       SELECT h.athlete_id, count(*)::int AS n FROM session_holds h JOIN program_sessions s ON s.id = h.session_id
        WHERE h.athlete_id IN (SELECT id FROM athletes) AND s.date >= :date GROUP BY h.athlete_id
     ), pending AS (
       SELECT e.athlete_id, count(*)::int AS n FROM program_exceptions e
        WHERE e.athlete_id IN (SELECT id FROM athletes) AND e.status = 'pending' GROUP BY e.athlete_id
     ), case_statuses AS (
       SELECT oc.athlete_id, array_agg(st.status::text) AS statuses FROM open_cases oc JOIN statuses st ON st.case_id = oc.id GROUP BY oc.athlete_id
     )
     SELECT a.id AS athlete_id, a.name AS athlete_name, COALESCE(cs.statuses, '{}') AS statuses, pl.plans,
       COALESCE(ho.n, 0) AS sessions_on_hold, COALESCE(pe.n, 0) AS pending_exceptions,
       n.id AS next_id, n.date AS next_date, n.title AS next_title
     FROM athletes a
     LEFT JOIN case_statuses cs ON cs.athlete_id = a.id
     LEFT JOIN plans pl ON pl.athlete_id = a.id
     LEFT JOIN holds ho ON ho.athlete_id = a.id
     LEFT JOIN pending pe ON pe.athlete_id = a.id
     LEFT JOIN next_sessions n ON n.athlete_id = a.id
     ORDER BY a.name, a.id`,
    { ...acl.params, org: organizationId, date },
  );
  const rows: {
    athlete_id: string;
    athlete_name: string;
    statuses: ParticipationStatus[];
    plans: PlanInput[] | null;
    sessions_on_hold: number;
    pending_exceptions: number;
    next_id: string | null;
    next_date: string;
    next_title: string;
  }[] = await preparedRead(ds, sql, params);
  return rows.map((r) => ({
    athleteId: r.athlete_id,
    athleteName: r.athlete_name,
    status: mostRestrictive(r.statuses),
    plans: r.plans ?? [],
    sessionsOnHold: r.sessions_on_hold,
    pendingExceptions: r.pending_exceptions,
    nextSession: r.next_id ? { id: r.next_id, date: r.next_date, title: r.next_title } : null,
  }));
}

export interface TodaySessionRow {
  session: Pick<ProgramSession, 'id' | 'programId' | 'date' | 'title' | 'content' | 'status' | 'publishedAt' | 'version'>;
  programName: string;
  /** This athlete's hold on the session, if any (never a teammate's). */
  holds: Pick<SessionHold, 'athleteId' | 'breaches'>[];
  /** The organization's exercises the session names: name and the lift whose 1RM sets the intensity. */
  exercises: Record<string, { name: string; referenceId: string | null }>;
  /** The athlete's current 1RM per lift (as currentBaselines). */
  baselines: Record<string, number>;
}

/**
 * An athlete's published sessions on `date`, in one query with this athlete's holds, the exercises
 * they name and the athlete's baselines (the today view; six round trips before).
 */
export async function todaySessions(ds: DataSource, organizationId: string, athleteId: string, date: string): Promise<TodaySessionRow[]> {
  const rows: {
    id: string;
    program_id: string;
    program_name: string;
    date: string;
    title: string;
    content: SessionContent;
    status: ProgramSession['status'];
    published_at: Date | null;
    version: number;
    holds: TodaySessionRow['holds'];
    exercises: TodaySessionRow['exercises'];
    baselines: TodaySessionRow['baselines'];
  }[] = await preparedRead(
    ds,
    `SELECT s.id, s.program_id, p.name AS program_name, s.date, s.title, s.content, s.status, s.published_at, s.version,
       COALESCE((SELECT json_agg(json_build_object('athleteId', h.athlete_id, 'breaches', h.breaches))
                   FROM session_holds h WHERE h.session_id = s.id AND h.athlete_id = $2), '[]') AS holds,
       (SELECT COALESCE(json_object_agg(e.id, json_build_object('name', e.name, 'referenceId', e.reference_id)), '{}')
          FROM exercises e WHERE e.organization_id = $1
           AND e.id::text IN (SELECT x ->> 'exerciseId' FROM jsonb_array_elements(s.content -> 'exercises') x)) AS exercises,
       (SELECT COALESCE(json_object_agg(b.exercise_id, b.e1rm_kg), '{}') FROM (${baselinesSql('$2')}) b) AS baselines
     FROM programs p JOIN program_sessions s ON s.program_id = p.id
    WHERE s.organization_id = $1 AND p.athlete_ids @> ARRAY[$2::uuid] AND s.status = 'published' AND s.date = $3
    ORDER BY s.created_at`,
    [organizationId, athleteId, date],
  );
  return rows.map((r) => ({
    session: {
      id: r.id,
      programId: r.program_id,
      date: r.date,
      title: r.title,
      content: r.content,
      status: r.status,
      publishedAt: r.published_at,
      version: r.version,
    },
    programName: r.program_name,
    holds: r.holds,
    exercises: r.exercises,
    baselines: Object.fromEntries(Object.entries(r.baselines).map(([k, v]) => [k, Number(v)])),
  }));
}

/** The latest tested or estimated 1RM per exercise of one athlete (currentBaselines, todaySessions). */
const baselinesSql = (athleteId: string) => `SELECT DISTINCT ON (exercise_id) exercise_id, e1rm_kg FROM baselines
  WHERE athlete_id = ${athleteId} AND kind IN ('tested', 'estimated') ORDER BY exercise_id, tested_on DESC, created_at DESC`;

/** The engine's 1RM per lift: the latest tested or estimated baseline (logged sets are history only). */
export async function currentBaselines(m: EntityManager, athleteId: string): Promise<Record<string, number>> {
  const rows: { exercise_id: string; e1rm_kg: string }[] = await m.query(baselinesSql('$1'), [athleteId]);
  return Object.fromEntries(rows.map((r) => [r.exercise_id, Number(r.e1rm_kg)]));
}

/** Participation status by date: per open case, the most recently recorded change in effect (as statusesOn). */
async function statusLookup(m: EntityManager, athleteId: string): Promise<(date: string) => ParticipationStatus> {
  const rows: { case_id: string; status: ParticipationStatus; effective_from: string; created_at: Date }[] = await m.query(
    `SELECT s.case_id, s.status, s.effective_from, s.created_at FROM participation_status_changes s
       JOIN cases c ON c.id = s.case_id AND c.closed_on IS NULL
      WHERE s.athlete_id = $1`,
    [athleteId],
  );
  return statusOnDate(
    rows.map((r) => ({
      caseId: r.case_id,
      status: r.status,
      effectiveFrom: r.effective_from,
      createdAt: new Date(r.created_at).toISOString(),
    })),
  );
}

/** Set ids of this athlete covered by granted exceptions whose sets are unchanged since the grant. */
async function waivedSets(
  m: EntityManager,
  athleteId: string,
  sessions: Pick<ProgramSession, 'id' | 'date' | 'content'>[],
): Promise<Set<string>> {
  if (sessions.length === 0) return new Set();
  const rows: { session_id: string; granted_set_ids: string[]; set_fingerprints: Record<string, string> }[] = await m.query(
    `SELECT session_id, granted_set_ids, set_fingerprints FROM program_exceptions
      WHERE athlete_id = $1 AND status = 'granted' AND session_id = ANY($2)`,
    [athleteId, sessions.map((s) => s.id)],
  );
  const current = new Map<string, string>();
  for (const s of sessions)
    for (const ex of s.content.exercises) for (const set of ex.sets) current.set(set.id, setFingerprint(ex.exerciseId, set, s.date));
  const out = new Set<string>();
  for (const r of rows)
    for (const id of r.granted_set_ids) if (r.set_fingerprints[id] && r.set_fingerprints[id] === current.get(id)) out.add(id);
  return out;
}

export async function engineContext(
  m: EntityManager,
  organizationId: string,
  athleteId: string,
  sessions: Pick<ProgramSession, 'id' | 'date' | 'content'>[],
  unit: Unit,
  today: string,
): Promise<EngineContext> {
  // One after another: these share the transaction's single connection, and pg refuses (from 9.0)
  // a query started while another is running on the same client.
  const exercises = await m.find(Exercise, { where: { organizationId } });
  const baselines = await currentBaselines(m, athleteId);
  const plans = await activePlans(m, [athleteId], today);
  const statusOn = await statusLookup(m, athleteId);
  const waived = await waivedSets(m, athleteId, sessions);
  return {
    plans: plans.get(athleteId) ?? [],
    exercises: Object.fromEntries(exercises.map((e) => [e.id, toEngineExercise(e)])),
    baselines,
    statusOn,
    waivedSetIds: waived,
    unit,
  };
}

/** Published sessions of the athlete (any program) in the ISO weeks of the given dates, for weekly counts. */
async function publishedInWeeks(m: EntityManager, athleteId: string, dates: string[], exceptIds: string[]): Promise<ProgramSession[]> {
  if (dates.length === 0) return [];
  return m
    .createQueryBuilder(ProgramSession, 's')
    .innerJoin('programs', 'p', 'p.id = s.program_id')
    .where(':athlete = ANY(p.athlete_ids)', { athlete: athleteId })
    .andWhere(`s.status = 'published'`)
    .andWhere(`date_trunc('week', s.date) = ANY(SELECT date_trunc('week', d::date) FROM unnest(CAST(:dates AS text[])) AS d)`, { dates })
    .andWhere(exceptIds.length ? 's.id NOT IN (:...exceptIds)' : 'TRUE', { exceptIds })
    .getMany();
}

/**
 * Breaches of `sessions` for one athlete: each set on its own date, counting the athlete's other
 * published sessions of the same weeks toward the weekly hard-set limits.
 */
export async function breachesFor(
  m: EntityManager,
  organizationId: string,
  athleteId: string,
  sessions: Pick<ProgramSession, 'id' | 'date' | 'content'>[],
  unit: Unit,
  today: string,
): Promise<Breach[]> {
  const others = await publishedInWeeks(
    m,
    athleteId,
    sessions.map((s) => s.date),
    sessions.map((s) => s.id),
  );
  const all = [...sessions, ...others];
  const ctx = await engineContext(m, organizationId, athleteId, all, unit, today);
  const ids = new Set(sessions.map((s) => s.id));
  return checkSets(all.flatMap(engineSets), ctx).filter((b) => ids.has(b.sessionId));
}

export function emptyContent(): SessionContent {
  return { exercises: [] };
}
