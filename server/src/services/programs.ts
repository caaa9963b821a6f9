import { createHash } from 'node:crypto';
import type { EntityManager } from 'typeorm';
import type { Action, AppAbility } from '../../../policies/access';
import { checkSets, type Breach, type EngineContext, type EngineExercise, type EngineSet } from '../../../policies/load/compliance';
import type { ParticipationStatus } from '../../../policies/load/patterns';
import { statusOnDate } from '../../../policies/load/status-on';
import { sessionEngineSets, setFingerprintText } from '../../../policies/load/sets';
import type { Unit } from '../../../policies/schemas/common';
import type { PlannedSetInput } from '../../../policies/schemas/programs';
import { Exercise, ProgramSession, type Program } from '../entities';
import { authorize } from '../core/authorize';
import { AppError } from '../core/errors';
import type { ActorWithOrg } from './actor';
import { activePlans } from './cases';

/**
 * A program is authorised athlete by athlete. Staff need the action on every athlete of the program
 * (a coach cannot touch a group program that includes someone else's athlete); an athlete may read a
 * program they are part of, and then only its published sessions. The list query
 * (queries/programs.ts) says the same in SQL.
 */
export function authorizeProgram(
  ability: AppAbility,
  actor: ActorWithOrg,
  action: Action,
  program: (Pick<Program, 'id' | 'athleteIds'> & { groupId?: string | null }) | null,
): asserts program is Program {
  // A team program has no athletes of its own, so the loop below would let anyone through: it is
  // authorised by its group (services/team-access.ts) and never through the routes of one athlete's program.
  if (program?.groupId) throw new AppError('not_found', 'That program was not found.');
  const rec = (athleteId: string) => ({ id: program?.id ?? '', organizationId: actor.organizationId, athleteId });
  if (program && action === 'read' && actor.roles.includes('athlete') && program.athleteIds.includes(actor.membershipId)) {
    authorize(ability, 'read', 'Program', rec(actor.membershipId));
    return;
  }
  if (!program) authorize(ability, action, 'Program', null);
  for (const athleteId of program!.athleteIds) authorize(ability, action, 'Program', rec(athleteId));
}

/** Whether the reader sees only the published sessions of the program (an athlete, not its staff). */
export function onlyPublished(actor: ActorWithOrg, program: Pick<Program, 'athleteIds'>): boolean {
  return (
    !(actor.roles.includes('coach') || actor.roles.includes('clinician')) ||
    !program.athleteIds.some((a) => actor.coachOf.includes(a) || actor.clinicianOf.includes(a))
  );
}

/** A set's content, hashed: a granted exception covers the set only while it stays as granted. */
export function setFingerprint(exerciseId: string, set: PlannedSetInput, date: string): string {
  return createHash('sha256')
    .update(setFingerprintText(exerciseId, set, date))
    .digest('hex')
    .slice(0, 32);
}

export function toEngineExercise(e: Exercise): EngineExercise {
  return {
    id: e.id,
    name: e.name,
    patterns: e.patterns,
    ballistic: e.ballistic,
    steps: e.steps,
    referenceId: e.referenceId,
    useInstead: e.useInstead ?? [],
  };
}

/** An archived exercise is no longer offered in place of another ("use instead"); its own old sessions still name it. */
function withoutArchivedUseInstead(e: EngineExercise, archived: ReadonlySet<string>): EngineExercise {
  if (!e.useInstead?.length || archived.size === 0) return e;
  return { ...e, useInstead: e.useInstead.filter((id) => !archived.has(id)) };
}

/** The engine's sets of a session, warm-up marks included (one reading of session content for both sides). */
export function engineSets(session: Pick<ProgramSession, 'id' | 'date' | 'content'>): EngineSet[] {
  return sessionEngineSets(session);
}

/** The latest tested or estimated 1RM per exercise of one athlete (currentBaselines, the athlete's day in queries/roster.ts). */
export const latestBaselinesSql = (athleteId: string) => `SELECT DISTINCT ON (exercise_id) exercise_id, e1rm_kg FROM baselines
  WHERE athlete_id = ${athleteId} AND kind IN ('tested', 'estimated') ORDER BY exercise_id, tested_on DESC, created_at DESC`;

/** The engine's 1RM per lift: the latest tested or estimated baseline (logged sets are history only). */
export async function currentBaselines(m: EntityManager, athleteId: string): Promise<Record<string, number>> {
  const rows: { exercise_id: string; e1rm_kg: string }[] = await m.query(latestBaselinesSql('$1'), [athleteId]);
  return Object.fromEntries(rows.map((r) => [r.exercise_id, Number(r.e1rm_kg)]));
}

/** Participation status by date: per open case, the most recently recorded change in effect (as statusesOn). */
export async function statusLookup(m: EntityManager, athleteId: string): Promise<(date: string) => ParticipationStatus> {
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
  const archived = new Set(exercises.filter((e) => e.archived).map((e) => e.id));
  return {
    plans: plans.get(athleteId) ?? [],
    exercises: Object.fromEntries(exercises.map((e) => [e.id, withoutArchivedUseInstead(toEngineExercise(e), archived)])),
    baselines,
    statusOn,
    waivedSetIds: waived,
    unit,
  };
}

/** Published sessions of the athlete (any program) in the ISO weeks of the given dates, for weekly counts. */
export async function publishedInWeeks(
  m: EntityManager,
  athleteId: string,
  dates: string[],
  exceptIds: string[],
): Promise<ProgramSession[]> {
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
  const withNew = checkSets(all.flatMap(engineSets), ctx);
  // Weekly limits count a week's hard sets in date order, so publishing an earlier session can push a
  // later, already published one past the limit: that breach is caused by this change and stops it too.
  const before = new Set(checkSets(others.flatMap(engineSets), ctx).map(breachKey));
  return withNew.filter((b) => ids.has(b.sessionId) || (b.date >= today && !before.has(breachKey(b))));
}

const breachKey = (b: Breach) => `${b.setId}:${b.rule}:${b.pattern ?? ''}`;

/** Every athlete of the program, each checked on the sessions' dates (a publish, an edit of a published session, a dry run). */
export async function breachesForAthletes(
  m: EntityManager,
  program: Pick<Program, 'organizationId' | 'athleteIds'>,
  sessions: Pick<ProgramSession, 'id' | 'date' | 'content'>[],
  unit: Unit,
  today: string,
): Promise<{ athleteId: string; breaches: Breach[] }[]> {
  const out: { athleteId: string; breaches: Breach[] }[] = [];
  // One athlete after another: each check reads on the same connection (see engineContext).
  for (const athleteId of program.athleteIds)
    out.push({ athleteId, breaches: await breachesFor(m, program.organizationId, athleteId, sessions, unit, today) });
  return out;
}
