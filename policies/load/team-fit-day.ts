import type { SessionContent } from '../schemas/programs';
import type { EngineContext } from './compliance';
import { suggestSwaps } from './exercise-rules';
import type { InForce } from './in-force';
import type { PreparedRules } from './prepared-rules';
import { sessionEngineSets, type EngineSet } from './sets';

/**
 * What the team fitting (team-fit.ts) reads of one day's rules and of the athlete's other sessions,
 * kept with the day's rules where it depends on nothing else: one athlete's sessions of the same
 * stages share one InForce (PreparedRules), so each is worked out once per athlete and stage.
 */

/** A session as stored: its id, date and content. */
export type SessionOf = { id: string; date: string; content: SessionContent };

/** Whether a weekly hard-set limit is in force on the day (kept per day's rules). */
const weeklyByDay = new WeakMap<InForce, boolean>();
export function weeklyLimit(day: InForce): boolean {
  let weekly = weeklyByDay.get(day);
  if (weekly === undefined) {
    weekly = Object.values(day.patterns).some((p) => p.mode === 'capped' && p.caps?.maxHardSetsPerWeek !== undefined);
    weeklyByDay.set(day, weekly);
  }
  return weekly;
}

/**
 * The athlete's other sets of the same weeks, counted toward weekly limits: `otherSets` as given, and
 * `otherSessions` turned into engine sets here, only when a weekly limit needs them. With `counted`
 * (the session's date, valid, and the athlete's rules), only the sets that can change a count the
 * session's own sets read are kept: the check counts a set only when its exercise is known, its date
 * is a calendar day and a capped pattern is in force for it; counts per week are kept per week, and
 * a set is counted in date, then session, then set order (bySessionThenOrder), so a set of another
 * week, or one ordered after every set of the session, is read after what it could change. The
 * session's own breaches are then the same as with every other set checked along.
 */
export function otherSetsOf(
  opts: { otherSets?: EngineSet[]; otherSessions?: readonly SessionOf[] },
  team: { id: string; date: string },
  counted: { prepared: PreparedRules; week: string } | null,
): EngineSet[] {
  const out: EngineSet[] = [];
  for (const s of opts.otherSets ?? [])
    if (s.sessionId !== team.id && (counted === null || mayCount(s.date, s.sessionId, s.exerciseId, team, counted))) out.push(s);
  for (const session of opts.otherSessions ?? []) {
    if (session.id === team.id) continue;
    if (counted === null) {
      out.push(...sessionEngineSets(session));
      continue;
    }
    // Numbered as sessionEngineSets numbers them, the sets left out included.
    let order = 0;
    for (const row of session.content.exercises)
      for (const s of row.sets) {
        if (mayCount(session.date, session.id, row.exerciseId, team, counted))
          out.push({
            id: s.id,
            sessionId: session.id,
            date: session.date,
            exerciseId: row.exerciseId,
            reps: s.reps,
            load: s.load,
            targetRpe: s.targetRpe ?? null,
            warmUp: s.warmUp ?? false,
            order,
          });
        order++;
      }
  }
  return out;
}

/** Whether another set may change a count that the session's own sets read (see otherSetsOf). */
function mayCount(
  date: string,
  sessionId: string,
  exerciseId: string,
  team: { id: string; date: string },
  counted: { prepared: PreparedRules; week: string },
): boolean {
  if (date > team.date || (date === team.date && sessionId > team.id)) return false;
  const ex = counted.prepared.exercises[exerciseId];
  const day = ex && counted.prepared.on(date);
  if (!day) return true;
  return day.week === counted.week && counted.prepared.rulesFor(day.stages, ex).capped.length > 0;
}

/**
 * The exercises a row of `teamExerciseId` may be swapped to on a day, in the order they are tried. The
 * list depends only on the exercise, the library and the day's rules, so it is kept with the day's
 * rules (shared by every session of the same stages of one athlete) for the same library.
 */
const swapLists = new WeakMap<InForce, { exercises: EngineContext['exercises']; byExercise: Map<string, string[]> }>();
export function swapCandidates(teamExerciseId: string, ctx: EngineContext, day: InForce | undefined, max: number): readonly string[] {
  let kept = day && swapLists.get(day);
  if (day && kept?.exercises !== ctx.exercises) swapLists.set(day, (kept = { exercises: ctx.exercises, byExercise: new Map() }));
  let list = kept?.byExercise.get(teamExerciseId);
  if (list) return list;
  const original = ctx.exercises[teamExerciseId];
  // The pattern family only: no-pattern exercises come from "use instead" (see (c) above).
  const library = Object.values(ctx.exercises).filter((e) => e.patterns.length > 0);
  const preferred = (original?.useInstead ?? []).filter((id) => id !== teamExerciseId && ctx.exercises[id]);
  const family = original && day ? suggestSwaps(original, library, day, max).map((e) => e.id) : [];
  list = [...new Set([...preferred, ...family])].slice(0, max);
  kept?.byExercise.set(teamExerciseId, list);
  return list;
}
