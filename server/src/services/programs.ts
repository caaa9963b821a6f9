import { createHash } from 'node:crypto';
import type { EntityManager } from 'typeorm';
import { checkSets, weekOf, type Breach, type EngineContext, type EngineExercise, type EngineSet } from '../../../policies/load/compliance';
import type { ParticipationStatus } from '../../../policies/load/patterns';
import type { Unit } from '../../../policies/schemas/common';
import type { PlannedSetInput, SessionContent } from '../../../policies/schemas/programs';
import { todayIso } from '../../../policies/roles';
import { Exercise, ProgramSession, SessionHold } from '../entities';
import { activePlans } from './cases';
import { statusOnDate } from '../../../policies/load/status-on';
import { athleteCircle, notify } from './notify';

/** A set's content, hashed: a granted exception covers the set only while it stays as granted. */
export function setFingerprint(exerciseId: string, set: PlannedSetInput, date: string): string {
  return createHash('sha256').update(JSON.stringify([exerciseId, date, set.reps, set.load, set.targetRpe ?? null])).digest('hex').slice(0, 32);
}

export function toEngineExercise(e: Exercise): EngineExercise {
  return { id: e.id, name: e.name, patterns: e.patterns, ballistic: e.ballistic, steps: e.steps, referenceId: e.referenceId };
}

export function engineSets(session: Pick<ProgramSession, 'id' | 'date' | 'content'>): EngineSet[] {
  const out: EngineSet[] = [];
  let order = 0;
  for (const ex of session.content.exercises) {
    for (const s of ex.sets) {
      out.push({ id: s.id, sessionId: session.id, date: session.date, exerciseId: ex.exerciseId, reps: s.reps, load: s.load, targetRpe: s.targetRpe ?? null, order: order++ });
    }
  }
  return out;
}

/** The engine's 1RM per lift: the latest tested or estimated baseline (logged sets are history only). */
export async function currentBaselines(m: EntityManager, athleteId: string): Promise<Record<string, number>> {
  const rows: { exercise_id: string; e1rm_kg: string }[] = await m.query(
    `SELECT DISTINCT ON (exercise_id) exercise_id, e1rm_kg FROM baselines
      WHERE athlete_id = $1 AND kind IN ('tested', 'estimated') ORDER BY exercise_id, tested_on DESC, created_at DESC`,
    [athleteId],
  );
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
  return statusOnDate(rows.map((r) => ({ caseId: r.case_id, status: r.status, effectiveFrom: r.effective_from, createdAt: new Date(r.created_at).toISOString() })));
}

/** Set ids of this athlete covered by granted exceptions whose sets are unchanged since the grant. */
async function waivedSets(m: EntityManager, athleteId: string, sessions: Pick<ProgramSession, 'id' | 'date' | 'content'>[]): Promise<Set<string>> {
  if (sessions.length === 0) return new Set();
  const rows: { session_id: string; granted_set_ids: string[]; set_fingerprints: Record<string, string> }[] = await m.query(
    `SELECT session_id, granted_set_ids, set_fingerprints FROM program_exceptions
      WHERE athlete_id = $1 AND status = 'granted' AND session_id = ANY($2)`,
    [athleteId, sessions.map((s) => s.id)],
  );
  const current = new Map<string, string>();
  for (const s of sessions) for (const ex of s.content.exercises) for (const set of ex.sets) current.set(set.id, setFingerprint(ex.exerciseId, set, s.date));
  const out = new Set<string>();
  for (const r of rows) for (const id of r.granted_set_ids) if (r.set_fingerprints[id] && r.set_fingerprints[id] === current.get(id)) out.add(id);
  return out;
}

export async function engineContext(m: EntityManager, organizationId: string, athleteId: string, sessions: Pick<ProgramSession, 'id' | 'date' | 'content'>[], unit: Unit): Promise<EngineContext> {
  const [exercises, baselines, plans, statusOn, waived] = await Promise.all([
    m.find(Exercise, { where: { organizationId } }),
    currentBaselines(m, athleteId),
    activePlans(m, [athleteId], todayIso()),
    statusLookup(m, athleteId),
    waivedSets(m, athleteId, sessions),
  ]);
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
export async function breachesFor(m: EntityManager, organizationId: string, athleteId: string, sessions: Pick<ProgramSession, 'id' | 'date' | 'content'>[], unit: Unit): Promise<Breach[]> {
  const others = await publishedInWeeks(m, athleteId, sessions.map((s) => s.date), sessions.map((s) => s.id));
  const all = [...sessions, ...others];
  const ctx = await engineContext(m, organizationId, athleteId, all, unit);
  const ids = new Set(sessions.map((s) => s.id));
  return checkSets(all.flatMap(engineSets), ctx).filter((b) => ids.has(b.sessionId));
}

/**
 * After a plan, status or exception changes: re-check every published session of the athlete from
 * today on. Sessions that now breach go on hold for the athlete (and the coaches are told);
 * sessions that fit again come off hold. Runs in the caller's transaction.
 */
export async function recheckAthlete(m: EntityManager, organizationId: string, athleteId: string, reason: string): Promise<{ held: string[]; released: string[] }> {
  const today = todayIso();
  // From the Monday of this week, so this week's earlier sessions count toward the weekly limits (as
  // on publish); only sessions from today on are held or released.
  const thisWeek = await m
    .createQueryBuilder(ProgramSession, 's')
    .innerJoin('programs', 'p', 'p.id = s.program_id')
    .where(':athlete = ANY(p.athlete_ids)', { athlete: athleteId })
    .andWhere(`s.status = 'published'`)
    .andWhere('s.date >= :from', { from: weekOf(today) })
    .orderBy('s.date')
    .getMany();
  const sessions = thisWeek.filter((s) => s.date >= today);
  const ctx = await engineContext(m, organizationId, athleteId, thisWeek, 'kg');
  const breaches = checkSets(thisWeek.flatMap(engineSets), ctx).filter((b) => !b.waived);
  const bySession = new Map<string, Breach[]>();
  for (const b of breaches) bySession.set(b.sessionId, [...(bySession.get(b.sessionId) ?? []), b]);
  const existing = await m.find(SessionHold, { where: { athleteId } });
  const wasHeld = new Set(existing.map((h) => h.sessionId));
  const held: string[] = [];
  const released: string[] = [];
  for (const s of sessions) {
    const list = bySession.get(s.id);
    if (list) {
      await m.createQueryBuilder().insert().into(SessionHold).values({ sessionId: s.id, athleteId, organizationId, breaches: list as never })
        .orUpdate(['breaches'], ['session_id', 'athlete_id']).execute();
      if (!wasHeld.has(s.id)) held.push(s.id);
    } else if (wasHeld.has(s.id)) {
      await m.delete(SessionHold, { sessionId: s.id, athleteId });
      released.push(s.id);
    }
  }
  if (held.length) {
    const circle = await athleteCircle(m, athleteId);
    const names: { name: string }[] = await m.query(`SELECT u.display_name AS name FROM memberships m JOIN users u ON u.id = m.user_id WHERE m.id = $1`, [athleteId]);
    const dates = sessions.filter((s) => held.includes(s.id)).map((s) => s.date).join(', ');
    await notify(m, circle.coaches, {
      organizationId,
      athleteId,
      kind: 'sessions_on_hold',
      severity: 'urgent',
      title: `${names[0]?.name ?? 'An athlete'}: ${held.length} session${held.length > 1 ? 's' : ''} on hold`,
      body: `${reason} These published sessions now go past a cap and are on hold until you update them: ${dates}.`,
    });
  }
  return { held, released };
}

export function emptyContent(): SessionContent {
  return { exercises: [] };
}
