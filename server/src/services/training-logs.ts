import type { EntityManager } from 'typeorm';
import { addDays, formatISO, parseISO } from 'date-fns';
import { evaluatePain, withoutJudged, type PainFlagKind, type PainRuleResult } from '../../../policies/load/pain-rule';
import { inForceOn } from '../../../policies/load/in-force';
import type { TrainingLogCreateInput } from '../../../policies/schemas';
import { Baseline, Flag, TrainingLog } from '../entities';
import { estimateOneRm } from '../../../policies/load/one-rm';
import type { AuditFn } from '../core/tx';
import { activePlans } from './cases';
import { athleteCircle, notify } from './notify';
import { humanDate } from '../../../policies/words/dates';

const iso = (d: Date) => formatISO(d, { representation: 'date' });
export const shiftDate = (date: string, days: number) => iso(addDays(parseISO(date), days));

/** The clinician's pain ceiling in force for the athlete on that date (default 5 with no plan). */
export async function painCeilingOn(m: EntityManager, athleteId: string, date: string): Promise<number> {
  const plans = (await activePlans(m, [athleteId], date)).get(athleteId) ?? [];
  return inForceOn(plans, date).painCeiling;
}

/**
 * Mean pain-during of this 7-day window (ending on `date`) and the one before it, oldest first; empty
 * unless both windows have a log, since a rise needs two weeks to compare (Silbernagel et al. 2007).
 */
async function weeklyPainMeans(m: EntityManager, athleteId: string, date: string): Promise<number[]> {
  const rows: { week: number; mean: string }[] = await m.query(
    `SELECT floor(($2::date - date) / 7)::int AS week, avg(pain_during) AS mean
       FROM training_logs WHERE athlete_id = $1 AND date > $2::date - 14 AND date <= $2::date
      GROUP BY 1 ORDER BY 1 DESC`,
    [athleteId, date],
  );
  return rows.length === 2 ? rows.map((r) => Number(r.mean)) : [];
}

/** Short names of the failed conditions, for the coach: what to change, not the athlete's account of it. */
const CONDITION_NAMES: Record<PainFlagKind, string> = {
  during_over_ceiling: 'pain during training above the ceiling',
  after_over_ceiling: 'pain after the session above the ceiling',
  not_settled_next_morning: 'pain not settled by the next morning',
  next_morning_above_baseline: 'next-morning pain above the pre-session level',
  weekly_rise: 'pain rising from week to week',
};

/**
 * One flag per evaluation that failed a condition, raised at once: the clinician's notice explains
 * each failed condition in plain words; the coach's names the conditions and the suggested action
 * only (minimum necessary: the coach changes the load, the clinician reads the pain).
 */
async function raiseFlags(m: EntityManager, log: TrainingLog, result: PainRuleResult, athleteName: string) {
  if (result.action !== 'reduce') return;
  const message = `${athleteName}, session of ${humanDate(log.date)}: ${result.flags.map((f) => f.message).join(' ')} Suggested: reduce the next session.`;
  await m.insert(Flag, {
    organizationId: log.organizationId,
    athleteId: log.athleteId,
    kind: 'pain_rule',
    severity: 'routine',
    message,
    suggestedAction: 'reduce',
    sourceType: 'TrainingLog',
    sourceId: log.id,
  });
  const circle = await athleteCircle(m, log.athleteId);
  const notice = { organizationId: log.organizationId, athleteId: log.athleteId, kind: 'pain_rule' as const, severity: 'routine' as const };
  const title = `Pain response: ${athleteName}`;
  await notify(m, circle.clinicians, { ...notice, title, body: message });
  const conditions = result.flags.map((f) => CONDITION_NAMES[f.kind]).join('; ');
  await notify(m, circle.coaches, {
    ...notice,
    title,
    body: `${athleteName}, session of ${humanDate(log.date)}: reduce the next session (${conditions}).`,
  });
}

export async function createTrainingLog(
  m: EntityManager,
  input: TrainingLogCreateInput,
  ctx: { organizationId: string; athleteName: string },
  audit: AuditFn,
): Promise<{ log: TrainingLog; painRule: PainRuleResult }> {
  const painCeiling = await painCeilingOn(m, input.athleteId, input.date);
  const log = await m.save(
    m.create(TrainingLog, {
      organizationId: ctx.organizationId,
      athleteId: input.athleteId,
      date: input.date,
      durationMinutes: input.durationMinutes,
      sessionRpe: input.sessionRpe,
      painBefore: input.painBefore,
      painDuring: input.painDuring,
      painAfter: input.painAfter ?? null,
      painNextMorning: null,
      painCeiling,
      sets: input.sets,
      notes: input.notes ?? null,
      sessionId: input.sessionId ?? null,
    }),
  );
  await recordLoggedBaselines(m, log);
  const painRule = evaluatePain({
    ceiling: painCeiling,
    during: input.painDuring,
    before: input.painBefore,
    after: input.painAfter ?? null,
    nextMorning: null,
    weeklyMeans: await weeklyPainMeans(m, input.athleteId, input.date),
  });
  await raiseFlags(m, log, painRule, ctx.athleteName);
  await audit({
    action: 'training_log.created',
    subjectType: 'TrainingLog',
    subjectId: log.id,
    athleteId: input.athleteId,
    after: {
      date: input.date,
      durationMinutes: input.durationMinutes,
      sessionRpe: input.sessionRpe,
      painDuring: input.painDuring,
      painAfter: input.painAfter ?? null,
      sets: input.sets.length,
      painRule: painRule.action,
    },
  });
  return { log, painRule };
}

/**
 * Pain after the session, added later on the session's day. Only the evening condition is new
 * information (during and the weekly rise were judged when the session was logged), so only it is
 * evaluated: a flag already raised is not raised again.
 */
export async function recordPainAfter(
  m: EntityManager,
  log: TrainingLog,
  painAfter: number,
  athleteName: string,
  audit: AuditFn,
): Promise<PainRuleResult> {
  log.painAfter = painAfter;
  const painRule = evaluatePain({ ceiling: log.painCeiling, during: null, before: log.painBefore, after: painAfter, nextMorning: null });
  await raiseFlags(m, log, painRule, athleteName);
  await audit({
    action: 'training_log.pain_after',
    subjectType: 'TrainingLog',
    subjectId: log.id,
    athleteId: log.athleteId,
    before: { painAfter: null },
    after: { painAfter, painRule: painRule.action },
  });
  return painRule;
}

/**
 * Next-morning pain: judged against the pre-session level, and against the evening score when there
 * is one (settled by next morning). The evening's own ceiling was judged when it was recorded.
 */
export async function recordNextMorning(
  m: EntityManager,
  log: TrainingLog,
  painNextMorning: number,
  athleteName: string,
  audit: AuditFn,
): Promise<PainRuleResult> {
  log.painNextMorning = painNextMorning;
  const painRule = withoutJudged(
    evaluatePain({ ceiling: log.painCeiling, during: null, before: log.painBefore, after: log.painAfter, nextMorning: painNextMorning }),
    ['after_over_ceiling'],
    log.painCeiling,
  );
  await raiseFlags(m, log, painRule, athleteName);
  await audit({
    action: 'training_log.next_morning',
    subjectType: 'TrainingLog',
    subjectId: log.id,
    athleteId: log.athleteId,
    before: { painNextMorning: null },
    after: { painNextMorning, painRule: painRule.action },
  });
  return painRule;
}

/**
 * Logged sets feed the athlete's strength history: each set of a library exercise (matched by name)
 * becomes a 'logged' baseline with its Epley estimate (RIR-adjusted when an RPE was logged). They are
 * history only; the engine's 1RM stays the latest tested or estimated baseline staff recorded.
 */
async function recordLoggedBaselines(m: EntityManager, log: TrainingLog): Promise<void> {
  if (log.sets.length === 0) return;
  const names = [...new Set(log.sets.map((s) => s.exercise.trim().toLowerCase()))];
  const exercises: { id: string; name: string }[] = await m.query(
    `SELECT id, lower(name) AS name FROM exercises WHERE organization_id = $1 AND lower(name) = ANY($2)`,
    [log.organizationId, names],
  );
  const byName = new Map(exercises.map((e) => [e.name, e.id]));
  const rows = log.sets.flatMap((s) => {
    const exerciseId = byName.get(s.exercise.trim().toLowerCase());
    const est = exerciseId && s.loadKg > 0 ? estimateOneRm(s.loadKg, s.reps, s.rpe ?? null) : null;
    if (!exerciseId || !est) return [];
    return [
      {
        organizationId: log.organizationId,
        athleteId: log.athleteId,
        exerciseId,
        kind: 'logged' as const,
        loadKg: s.loadKg,
        reps: s.reps,
        rpe: s.rpe ?? null,
        e1rmKg: Math.round(est.value * 100) / 100,
        formula: 'epley' as const,
        lowReliability: est.lowReliability,
        testedOn: log.date,
        createdBy: null,
      },
    ];
  });
  if (rows.length) await m.insert(Baseline, rows);
}
