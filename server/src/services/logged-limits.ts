import type { EntityManager } from 'typeorm';
import { checkSets } from '../../../policies/load/compliance';
import { describeDate } from '../../../policies/load/describe';
import {
  knownOverLimit,
  loggedEngineSets,
  loggedSetIndex,
  overLimitForAthlete,
  overLimitWords,
  type LoggedSet,
} from '../../../policies/load/logged-sets';
import type { Unit } from '../../../policies/schemas/common';
import { Exercise, Flag, TrainingLog } from '../entities';
import { AppError } from '../core/errors';
import type { AuditFn } from '../core/tx';
import { athleteCircle, notify } from './notify';
import { engineContext } from './programs';

/**
 * A log made from a planned session names a published session of a program the athlete is in;
 * anything else is refused naming the field, so a log can never point at someone else's plan.
 */
export async function requirePlannedSession(m: EntityManager, organizationId: string, athleteId: string, sessionId: string): Promise<void> {
  const rows: unknown[] = await m.query(
    `SELECT 1 FROM program_sessions s JOIN programs p ON p.id = s.program_id
      WHERE s.id = $1 AND s.organization_id = $2 AND s.status = 'published' AND p.athlete_ids @> ARRAY[$3::uuid]`,
    [sessionId, organizationId, athleteId],
  );
  if (rows.length === 0) {
    throw new AppError('validation_failed', 'Please check the form: sessionId is not a published session planned for this athlete.', {
      sessionId: ['must be a published session planned for this athlete'],
    });
  }
}

/** Orders the logs of one day by when they were saved, so weekly counts follow what happened first. */
const sessionKey = (l: Pick<TrainingLog, 'createdAt' | 'id'>) => `${new Date(l.createdAt).toISOString()}#${l.id}`;

/**
 * What the athlete did, checked by the same engine as planned sets against the limits in force on
 * the log's date (the plan stages covering it and the participation status); the earlier logs of
 * the same week count toward the weekly hard-set limits. A set over a limit is recorded as logged —
 * it happened — and raises one flag with a notice to the care team's clinicians and coaches, saying
 * what is over which limit, in each reader's unit. Returns the athlete's own sentences (empty when
 * everything was within the limits), load limits as a load they can put on the bar.
 */
export async function flagLoggedSetsOverLimits(m: EntityManager, log: TrainingLog, athleteName: string, audit: AuditFn): Promise<string[]> {
  if (log.sets.length === 0) return [];
  // One after another: these share the transaction's single connection.
  const library = await m.find(Exercise, { where: { organizationId: log.organizationId } });
  const byId = new Map(library.map((e) => [e.id, e]));
  const byName = new Map(library.map((e) => [e.name.trim().toLowerCase(), e.id]));
  const exerciseOf = (s: LoggedSet) =>
    s.exerciseId && byId.has(s.exerciseId) ? s.exerciseId : (byName.get(s.exercise.trim().toLowerCase()) ?? null);
  const earlier = await m
    .createQueryBuilder(TrainingLog, 'l')
    .where('l.athlete_id = :athlete AND l.id <> :id', { athlete: log.athleteId, id: log.id })
    .andWhere(`date_trunc('week', l.date) = date_trunc('week', CAST(:date AS date))`, { date: log.date })
    .getMany();
  const mine = sessionKey(log);
  const sets = [...earlier, log].flatMap((l) => loggedEngineSets({ sessionKey: sessionKey(l), date: l.date, sets: l.sets }, exerciseOf));
  if (!sets.some((s) => s.sessionId === mine)) return [];
  const ctx = await engineContext(m, log.organizationId, log.athleteId, [], 'kg', log.date);
  const breaches = checkSets(sets, ctx).filter((b) => b.sessionId === mine && knownOverLimit(b));
  if (breaches.length === 0) return [];

  const setOf = (b: (typeof breaches)[number]) => log.sets[loggedSetIndex(b)];
  const nameOf = (b: (typeof breaches)[number]) => byId.get(b.exerciseId)?.name ?? setOf(b).exercise;
  const staffMessage = (unit: Unit) =>
    `${athleteName} logged a session on ${describeDate(log.date)} with sets over the limits in force that day (recorded as done): ${[
      ...new Set(breaches.map((b) => overLimitWords(b, setOf(b), nameOf(b), unit))),
    ].join(' ')}`;
  await m.insert(Flag, {
    organizationId: log.organizationId,
    athleteId: log.athleteId,
    kind: 'over_limit',
    severity: 'routine',
    // One flag for the whole care team, in kg (stored units); each notice below is in its reader's unit.
    message: staffMessage('kg'),
    suggestedAction: null,
    sourceType: 'TrainingLog',
    sourceId: log.id,
  });
  const circle = await athleteCircle(m, log.athleteId);
  const units = await unitsOf(m, [log.athleteId, ...circle.clinicians, ...circle.coaches]);
  for (const unit of ['kg', 'lb'] as const) {
    await notify(
      m,
      [...circle.clinicians, ...circle.coaches].filter((id) => (units.get(id) ?? 'kg') === unit),
      {
        organizationId: log.organizationId,
        athleteId: log.athleteId,
        kind: 'over_limit',
        severity: 'routine',
        title: `Logged over a limit: ${athleteName}`,
        body: staffMessage(unit),
      },
    );
  }
  await audit({
    action: 'training_log.over_limit',
    subjectType: 'TrainingLog',
    subjectId: log.id,
    athleteId: log.athleteId,
    after: { breaches: breaches.map((b) => ({ set: loggedSetIndex(b) + 1, rule: b.rule, pattern: b.pattern, limit: b.limit })) },
  });
  const athleteUnit = units.get(log.athleteId) ?? 'kg';
  return [...new Set(breaches.map((b) => overLimitForAthlete(b, setOf(b), nameOf(b), athleteUnit, ctx)))];
}

/** Each member's display unit (their user's preference). */
async function unitsOf(m: EntityManager, membershipIds: string[]): Promise<Map<string, Unit>> {
  const rows: { id: string; unit: Unit }[] = await m.query(
    `SELECT mm.id, u.unit_pref AS unit FROM memberships mm JOIN users u ON u.id = mm.user_id WHERE mm.id = ANY($1)`,
    [membershipIds],
  );
  return new Map(rows.map((r) => [r.id, r.unit]));
}
