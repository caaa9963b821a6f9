import type { Unit } from '../schemas/common';
import { barStepFor, capOnTheBarWords } from './bar-cap';
import type { Breach } from './breach';
import type { EngineContext } from './compliance';
import { describeDate } from './describe';
import { patternInWords } from './day-words';
import { exerciseRules } from './exercise-rules';
import { inForceOn } from './in-force';
import type { EngineSet } from './sets';
import { formatLoad } from './units';

/**
 * Sets an athlete logged, checked by the same engine as planned sets (compliance.ts). What was done
 * is recorded whatever it was; a set over a limit is told to the care team, never refused.
 */
export interface LoggedSet {
  exercise: string;
  /** The library exercise, when the set was logged from a planned session. */
  exerciseId?: string | null;
  loadKg: number;
  reps: number;
  rpe?: number | null;
}

/**
 * A log's sets in the engine's shape, one "session" per log (`sessionKey` orders logs of one day:
 * the engine counts per session and per week in that order). A set of no library exercise, or of
 * no reps (nothing lifted), has nothing the engine can check and is left out. The set id is the
 * log's key and the set's position, so a breach points back at the logged set.
 */
export function loggedEngineSets(
  log: { sessionKey: string; date: string; sets: LoggedSet[] },
  exerciseOf: (set: LoggedSet) => string | null,
): EngineSet[] {
  const out: EngineSet[] = [];
  log.sets.forEach((s, i) => {
    const exerciseId = exerciseOf(s);
    if (!exerciseId || !(s.reps >= 1)) return;
    out.push({
      id: `${log.sessionKey}/${i}`,
      sessionId: log.sessionKey,
      date: log.date,
      exerciseId,
      reps: s.reps,
      load: { kind: 'kg', value: s.loadKg },
      targetRpe: s.rpe ?? null,
      order: i,
    });
  });
  return out;
}

/**
 * Whether a breach of a logged set says the set was over a limit. A plan fails closed on what it
 * does not know (no RPE and no best lift to estimate one, no best lift for a % cap), so the coach
 * fixes it before publishing; a log records what happened, and an RPE the athlete did not give is
 * not a set over the RPE limit. Only what is known to be over is told to the care team.
 */
export function knownOverLimit(breach: Pick<Breach, 'rule' | 'planned'>): boolean {
  if (breach.rule === 'no_baseline' || breach.rule === 'unreadable') return false;
  return !(breach.rule === 'rpe' && breach.planned === NO_TARGET_RPE);
}

/** What the engine says of a set with no RPE and nothing to estimate one from (compliance.ts). */
const NO_TARGET_RPE = 'no target RPE';

/** The position in the log of the set a breach of loggedEngineSets names. */
export const loggedSetIndex = (breach: Pick<Breach, 'setId'>) => Number(breach.setId.slice(breach.setId.lastIndexOf('/') + 1));

/**
 * One logged set over one limit, in the trade's words for the care team: "Deadlift 100 kg × 5 is over
 * the limit for lifting from the floor and bending at the hips (hinge): max 80 kg." No date in ISO
 * form inside the sentence.
 */
export function overLimitWords(breach: Breach, set: LoggedSet, exerciseName: string, unit: Unit): string {
  const load = set.loadKg > 0 ? ` ${formatLoad(set.loadKg, unit)}` : '';
  const what = `${exerciseName}${load} × ${set.reps}${set.rpe != null ? ` at RPE ${set.rpe}` : ''}`;
  const where = breach.pattern ? patternInWords(breach.pattern) : 'this exercise';
  const day = describeDate(breach.date);
  switch (breach.rule) {
    case 'blocked':
      return `${what}: ${where} is not allowed on ${day}.`;
    case 'status_out':
      return `${what}: the athlete is Out on ${day} and no plan says what they may train.`;
    case 'impact':
      return `${what}: no explosive or impact work (throws, jumps, landings) is allowed for ${where} on ${day}.`;
    case 'sets_per_session':
      return `${exerciseName} ${breach.planned} is over the limit for ${where}: ${breach.limit}.`;
    case 'hard_sets_per_week':
      return `${what} is over the limit for ${where}: ${breach.limit} (this was ${breach.planned}).`;
    default:
      return `${what} is over the limit for ${where}: ${breach.limit}.`;
  }
}

/**
 * The load cap (kg) a load breach was over, read from the same rules the engine used: the tightest
 * absolute cap of the exercise's patterns, or the tightest % of the athlete's best lift. Null for
 * other breaches, or when it cannot be known.
 */
export function loadCapKg(breach: Pick<Breach, 'rule' | 'exerciseId' | 'date'>, ctx: EngineContext): number | null {
  const ex = ctx.exercises[breach.exerciseId];
  if (!ex) return null;
  const rules = exerciseRules(ex, inForceOn(ctx.plans, breach.date));
  if (breach.rule === 'absolute_load') return rules.abs?.value ?? null;
  const oneRm = ctx.baselines[ex.referenceId ?? ex.id];
  if (breach.rule === 'percent_1rm' && rules.pct && oneRm > 0) return (rules.pct.value / 100) * oneRm;
  return null;
}

/**
 * The same for the athlete who logged it, in their unit: a load limit as a load they can put on the
 * bar ("up to 95 lb", never "99.2 lb"), rounded down on the exercise's own increments when they are
 * in that unit, otherwise 2.5 kg / 5 lb (bar-cap.ts); other limits as the care team reads them.
 */
export function overLimitForAthlete(breach: Breach, set: LoggedSet, exerciseName: string, unit: Unit, ctx: EngineContext): string {
  const capKg = loadCapKg(breach, ctx);
  if (capKg === null) return overLimitWords(breach, set, exerciseName, unit);
  const load = set.loadKg > 0 ? ` ${formatLoad(set.loadKg, unit)}` : '';
  const where = breach.pattern ? patternInWords(breach.pattern) : 'this exercise';
  const step = barStepFor(ctx.exercises[breach.exerciseId]?.steps, unit);
  return `${exerciseName}${load} × ${set.reps} was more than your limit for ${where} on ${describeDate(breach.date)}: ${capOnTheBarWords(capKg, unit, step)}.`;
}
