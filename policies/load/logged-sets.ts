import type { Unit } from '../schemas/common';
import type { Breach } from './breach';
import { describeDate } from './describe';
import { patternInWords } from './day-words';
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
      return `${what}: no jumping, landing or other impact is allowed for ${where} on ${day}.`;
    case 'sets_per_session':
      return `${exerciseName} ${breach.planned} is over the limit for ${where}: ${breach.limit}.`;
    case 'hard_sets_per_week':
      return `${what} is over the limit for ${where}: ${breach.limit} (this was ${breach.planned}).`;
    default:
      return `${what} is over the limit for ${where}: ${breach.limit}.`;
  }
}
