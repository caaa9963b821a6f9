import { createHash } from 'node:crypto';
import { EntityManager, type DataSource } from 'typeorm';
import type { RosterRowDto, TodayDto } from '../../../policies/dto';
import { plannedKg } from '../../../policies/load/compliance';
import { describeRule } from '../../../policies/load/describe';
import { inForceOn, type PlanInput } from '../../../policies/load/in-force';
import { MOVEMENT_PATTERNS, type ParticipationStatus } from '../../../policies/load/patterns';
import { mostRestrictive } from '../../../policies/load/status-on';
import type { Unit } from '../../../policies/schemas/common';
import type { SessionContent } from '../../../policies/schemas/programs';
import { accessibleWhere } from '../core/accessible';
import { authorize } from '../core/authorize';
import { orgQuery } from '../core/command';
import type { ProgramSession, SessionHold } from '../entities';
import { statusOnOrder } from '../services/cases';
import { latestBaselinesSql } from '../services/programs';
import { toSessionDto } from './programs';

/**
 * A read as a named (prepared) statement on the pool's connection: the roster and today queries
 * took longer to plan than to run, and PostgreSQL keeps a prepared statement's plan per connection.
 * The name is the text's hash, so a text is prepared once per connection; callers keep the text
 * independent of the data (lists as arrays, not IN lists). Inside a transaction it is a plain query
 * on the transaction's connection.
 */
async function preparedRead<T>(db: DataSource | EntityManager, text: string, values: unknown[]): Promise<T[]> {
  if (db instanceof EntityManager) return db.query(text, values);
  const pool = (db.driver as unknown as { master: import('pg').Pool }).master;
  const name = `read_${createHash('sha256').update(text).digest('base64url').slice(0, 24)}`;
  return (await pool.query({ name, text, values })).rows as T[];
}

const driverOf = (db: DataSource | EntityManager) => (db instanceof EntityManager ? db.connection.driver : db.driver);

interface RosterRow {
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
 * The roster in one query: every athlete the reader may see (the same CASL filter as the caseload),
 * with the status of each open case (as statusesOn), the plans in force (as activePlans), held
 * upcoming sessions, pending exceptions and the next published session. One round trip instead of
 * nine: on the roster each one cost more than the SQL it ran.
 */
async function rosterRows(db: DataSource | EntityManager, acl: ReturnType<typeof accessibleWhere>, organizationId: string, date: string) {
  const [sql, params] = driverOf(db).escapeQueryWithParameters(
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
  }[] = await preparedRead(db, sql, params);
  return rows.map((r): RosterRow => ({
    athleteId: r.athlete_id,
    athleteName: r.athlete_name,
    status: mostRestrictive(r.statuses),
    plans: r.plans ?? [],
    sessionsOnHold: r.sessions_on_hold,
    pendingExceptions: r.pending_exceptions,
    nextSession: r.next_id ? { id: r.next_id, date: r.next_date, title: r.next_title } : null,
  }));
}

/** The coach's roster on the organization's today: status, limits in force, holds ahead, pending exceptions, next session. */
export const roster = orgQuery({
  name: 'roster',
  async run(ctx, input: { unit: Unit }): Promise<RosterRowDto[]> {
    const acl = accessibleWhere(ctx.ability, 'read', 'Athlete', { id: 'm.id', organizationId: 'm.organization_id' }, 'acl', {
      arrays: true,
    });
    const rows = await rosterRows(ctx.db, acl, ctx.actor.organizationId, ctx.today);
    return rows.map((r): RosterRowDto => {
      // Without a plan every pattern is free: nothing to work out.
      const inForce = r.plans.length ? inForceOn(r.plans, ctx.today) : null;
      return {
        athleteId: r.athleteId,
        athleteName: r.athleteName,
        status: r.status,
        limitsToday: inForce
          ? MOVEMENT_PATTERNS.filter((p) => inForce.patterns[p].mode !== 'free').map((p) =>
              describeRule(p, inForce.patterns[p], input.unit, 'staff'),
            )
          : [],
        sessionsOnHold: r.sessionsOnHold,
        pendingExceptions: r.pendingExceptions,
        nextSession: r.nextSession,
      };
    });
  },
});

interface DayRow {
  id: string;
  program_id: string;
  program_name: string;
  date: string;
  title: string;
  content: SessionContent;
  status: ProgramSession['status'];
  published_at: Date | null;
  version: number;
  /** This athlete's hold on the session, if any (never a teammate's). */
  holds: Pick<SessionHold, 'athleteId' | 'breaches'>[];
  /** The organization's exercises the session names: name and the lift whose 1RM sets the intensity. */
  exercises: Record<string, { name: string; referenceId: string | null }>;
  /** The athlete's current 1RM per lift (as currentBaselines). */
  baselines: Record<string, string | number>;
}

/**
 * An athlete's published sessions on a day (the organization's today unless a date is given), with
 * loads worked out and on-hold sessions marked. One query with this athlete's holds, the exercises
 * the sessions name and the athlete's baselines (six round trips before).
 */
export const athleteDay = orgQuery({
  name: 'athlete_day',
  async run(ctx, input: { athleteId: string; date?: string; unit: Unit }): Promise<TodayDto> {
    authorize(ctx.ability, 'read', 'Program', { id: '', organizationId: ctx.actor.organizationId, athleteId: input.athleteId });
    const date = input.date ?? ctx.today;
    const rows: DayRow[] = await preparedRead(
      ctx.db,
      `SELECT s.id, s.program_id, p.name AS program_name, s.date, s.title, s.content, s.status, s.published_at, s.version,
         COALESCE((SELECT json_agg(json_build_object('athleteId', h.athlete_id, 'breaches', h.breaches))
                     FROM session_holds h WHERE h.session_id = s.id AND h.athlete_id = $2), '[]') AS holds,
         (SELECT COALESCE(json_object_agg(e.id, json_build_object('name', e.name, 'referenceId', e.reference_id)), '{}')
            FROM exercises e WHERE e.organization_id = $1
             AND e.id::text IN (SELECT x ->> 'exerciseId' FROM jsonb_array_elements(s.content -> 'exercises') x)) AS exercises,
         (SELECT COALESCE(json_object_agg(b.exercise_id, b.e1rm_kg), '{}') FROM (${latestBaselinesSql('$2')}) b) AS baselines
       FROM programs p JOIN program_sessions s ON s.program_id = p.id
      WHERE s.organization_id = $1 AND p.athlete_ids @> ARRAY[$2::uuid] AND s.status = 'published' AND s.date = $3
      ORDER BY s.created_at`,
      [ctx.actor.organizationId, input.athleteId, date],
    );
    return {
      athleteId: input.athleteId,
      date,
      unit: input.unit,
      sessions: rows.map((r) => {
        const baselines = Object.fromEntries(Object.entries(r.baselines).map(([k, v]) => [k, Number(v)]));
        const exerciseNames: Record<string, string> = {};
        const loadsKg: Record<string, number | null> = {};
        for (const e of r.content.exercises) {
          const ex = r.exercises[e.exerciseId];
          exerciseNames[e.exerciseId] = ex?.name ?? 'Exercise';
          for (const set of e.sets) loadsKg[set.id] = plannedKg(set.load, baselines[ex?.referenceId ?? e.exerciseId]);
        }
        const session = {
          id: r.id,
          programId: r.program_id,
          date: r.date,
          title: r.title,
          content: r.content,
          status: r.status,
          publishedAt: r.published_at,
          version: r.version,
        };
        // Athletes see only their own hold, never other athletes' breaches in a group session.
        return { ...toSessionDto(session, r.program_name, r.holds), onHold: r.holds.length > 0, exerciseNames, loadsKg };
      }),
    };
  },
});
