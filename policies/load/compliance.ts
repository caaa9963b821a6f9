import type { Unit } from '../schemas/common';
import type { Breach } from './breach';
import type { EngineExercise, ExerciseRules } from './exercise-rules';
import { overCap, percentOf, suggestPercent, type Fit } from './fitting';
import { BreachList, LEAN_WORDS, leanBreachList } from './check-breaches';
import { bySessionThenOrder, unreadableFields } from './check-support';
import { isFiniteNumber } from './guard';
import type { PlanInput } from './in-force';
import { estimateRpe } from './intensity';
import { MOVEMENT_PATTERNS, PATTERN_LABELS, type ParticipationStatus } from './patterns';
import { PreparedRules, type StageRules } from './prepared-rules';
import { HARD_SET_RPE, isHardSet, plannedKg, type EngineSet } from './sets';
import type { LoadSteps } from './steps';
import { humanDate } from '../words/dates';

/**
 * The compliance engine: every planned set checked on its own date against the restriction plans
 * in force. Pure and shared: the server enforces it on publish, the client mirrors it while typing.
 * The types and helpers it is built from live beside it and are re-exported here.
 */
export type { Breach, BreachRule } from './breach';
export { blockingBreaches } from './breach';
export { PreparedRules, prepareRules } from './prepared-rules';
export type { EngineExercise } from './exercise-rules';
export { suggestSwaps } from './exercise-rules';
export type { EngineSet, PlannedLoad } from './sets';
export { HARD_SET_DEFINITION, HARD_SET_RPE, isHardSet, plannedKg, weekOf } from './sets';

export interface EngineContext {
  plans: PlanInput[];
  exercises: Record<string, EngineExercise>;
  /** Current estimated (or tested) 1RM in kg per exercise id. */
  baselines: Record<string, number>;
  /** The athlete's participation status on a date. */
  statusOn?: (date: string) => ParticipationStatus;
  /** Set ids covered by a granted exception. */
  waivedSetIds?: ReadonlySet<string>;
  unit?: Unit;
}

/**
 * This loop is the hot path of every publish and of the builder's live check (a 16-week program is
 * ~2,000 sets), so work that does not change from set to set is done once: the rules in force per
 * distinct combination of stages, what they mean per exercise, status and week per date; counts
 * are kept per pattern index rather than under built string keys. The results are the same, in the
 * same order, as checking every set from scratch. `prepared` (prepareRules(ctx)) keeps the rules per
 * day and per exercise across many checks of one athlete (team fitting); it is used only when it was
 * prepared from this context's plans, library and status, and gives the same breaches as none.
 */
export function checkSets(sets: EngineSet[], ctx: EngineContext, prepared?: PreparedRules): Breach[] {
  return check(sets, ctx, prepared, false);
}

/**
 * checkSets for the team fitting, which reads of a breach only its set, rule, pattern, limit and
 * fitting load: the same breaches in the same order, but a breach that names a pattern comes with
 * empty planned words, fix and message (they are not built). Property-tested against checkSets.
 */
export function checkSetsToFit(sets: EngineSet[], ctx: EngineContext, prepared?: PreparedRules): Breach[] {
  return check(sets, ctx, prepared, true);
}

function countsFor(map: Map<string, Int32Array>, key: string): Int32Array {
  let c = map.get(key);
  if (!c) map.set(key, (c = new Int32Array(MOVEMENT_PATTERNS.length)));
  return c;
}

function check(sets: EngineSet[], ctx: EngineContext, prepared: PreparedRules | undefined, lean: boolean): Breach[] {
  // Helpers live on `b` (one object per check, reused by the lean check), not in closures made per check: fitting runs thousands.
  const b = lean ? leanBreachList(ctx.unit ?? 'kg') : new BreachList(ctx.unit ?? 'kg', false);
  // The words of a breach that names a pattern are built only for the full check (see checkSetsToFit).
  const full = !lean;
  // The rules per day and per exercise: those prepared for this athlete, or worked out for this check.
  const rules = prepared?.fits(ctx) ? prepared : new PreparedRules(ctx);
  // Callers usually pass sets already in order; a stable sort would return them unchanged.
  let sorted = true;
  for (let i = 1; i < sets.length && sorted; i++) sorted = bySessionThenOrder(sets[i - 1], sets[i]) <= 0;
  const ordered = sorted ? sets : [...sets].sort(bySessionThenOrder);
  // Counts per session and per week, one slot per movement pattern (made at the first capped set: most small checks have none).
  let sessionCounts: Map<string, Int32Array> | null = null;
  let weekCounts: Map<string, Int32Array> | null = null;

  // Sets come sorted by date: a date is read once, when the loop moves to it (only valid dates become `date`).
  let date: string | null = null;
  let stages!: StageRules;
  let out = false;
  let week = '';
  let weekCount: Int32Array | null = null;
  let sessionId: string | null = null;
  let sessionCount!: Int32Array;

  for (const set of ordered) {
    b.set = set;
    const ex = ctx.exercises[set.exerciseId];
    b.waived = ctx.waivedSetIds?.has(set.id) ?? false;
    if (!ex) {
      // An exercise the engine does not know has no patterns to check: fail closed, never a pass.
      b.push('unreadable', null, 'an exercise of the library', null, [
        'an unknown exercise',
        null,
        'This set names an exercise that is not in the library, so it cannot be checked. Choose an exercise from the library.',
      ]);
      continue;
    }
    const name = ex.name;
    const problem = set.date === date || rules.on(set.date) !== null ? unreadableFields(set) : 'its date is not a calendar day';
    if (problem) {
      // Unknown is never a pass: a set the engine cannot read is a breach, and nothing else is said of it.
      b.push('unreadable', null, 'a set the check can read', null, [
        name,
        null,
        `${name}: this set cannot be checked: ${problem}. Fix the set.`,
      ]);
      continue;
    }
    if (set.date !== date) {
      date = set.date;
      const d = rules.on(date)!;
      stages = d.stages;
      out = d.out;
      week = d.week;
      weekCount = null;
    }
    const day = stages.day;
    const r = rules.rulesFor(stages, ex);

    if (out && day.stages.length === 0) {
      b.push('status_out', null, 'Out: no training until a clinician sets what is allowed', null, [
        `${name}`,
        null,
        `The athlete is Out on ${humanDate(set.date)} and no restriction plan says what they may train. Ask the clinician for a plan or an exception.`,
      ]);
      continue;
    }
    if (r.blocked) {
      const label = PATTERN_LABELS[r.blocked];
      b.push(
        'blocked',
        r.blocked,
        `${label} is blocked`,
        null,
        full
          ? [name, null, `${label} is blocked on ${humanDate(set.date)}: ${name} cannot be programmed. Swap to an exercise that fits.`]
          : LEAN_WORDS,
      );
      continue;
    }
    if (r.impactOff && ex.ballistic) {
      const impactOff = r.impactOff;
      b.push(
        'impact',
        impactOff,
        'no impact',
        null,
        full
          ? [
              `${name} (impact)`,
              null,
              `${PATTERN_LABELS[impactOff]}: no impact allowed on ${humanDate(set.date)}; ${name} is ballistic. Swap to a non-impact exercise.`,
            ]
          : LEAN_WORDS,
      );
    }

    const rawOneRm = ctx.baselines[ex.referenceId ?? ex.id];
    // A 1RM that is not a positive number is no baseline at all.
    const oneRm = isFiniteNumber(rawOneRm) && rawOneRm > 0 ? rawOneRm : undefined;
    const loadKg = plannedKg(set.load, oneRm);
    const percent = set.load.kind === 'percent' ? set.load.value : loadKg !== null ? percentOf(loadKg, oneRm) : null;
    const estimated = set.targetRpe == null && percent !== null ? estimateRpe(percent, set.reps) : null;
    const rpe = set.targetRpe ?? estimated;

    const steps = ex.steps;
    const pct = r.pct;
    if (pct) {
      if (oneRm === undefined) {
        b.push(
          'no_baseline',
          pct.pattern,
          `max ${b.num(pct.value)}% of 1RM`,
          null,
          full
            ? [
                set.load.kind === 'percent' ? `${b.num(set.load.value)}%` : loadKg !== null ? b.show(loadKg) : 'bodyweight',
                null,
                `${PATTERN_LABELS[pct.pattern]}: capped at ${b.num(pct.value)}% of 1RM, but ${name} has no baseline — enter a tested max or use a load cap.`,
              ]
            : LEAN_WORDS,
        );
      } else if (percent !== null && overCap(percent, pct.value)) {
        const capKg = (pct.value / 100) * oneRm;
        const f = b.fitFor(steps, r, oneRm);
        const limit = `max ${b.num(pct.value)}% of ${b.show(oneRm)} = ${b.showCap(capKg)}`;
        let words = LEAN_WORDS;
        if (full) {
          const fits = b.fitWords(f, steps, 'steps');
          const planned = loadKg !== null ? b.show(loadKg) : `${b.num(percent)}%`;
          words = [planned, fits, `${PATTERN_LABELS[pct.pattern]}: ${limit}: planned ${planned}; ${b.fixSentence(f, fits, steps)}.`];
        }
        b.push('percent_1rm', pct.pattern, limit, f, words);
      }
    }

    const abs = r.abs;
    if (abs) {
      if (loadKg === null && set.load.kind === 'percent') {
        const value = set.load.value;
        b.push(
          'no_baseline',
          abs.pattern,
          `max ${b.showCap(abs.value)}`,
          null,
          full
            ? [
                `${b.num(value)}%`,
                null,
                `${PATTERN_LABELS[abs.pattern]}: capped at ${b.showCap(abs.value)}, but the load is a % of 1RM and ${name} has no baseline — enter a tested max or plan a load.`,
              ]
            : LEAN_WORDS,
        );
      } else if (loadKg !== null && overCap(loadKg, abs.value)) {
        const f = b.fitFor(steps, r, oneRm);
        let words = LEAN_WORDS;
        if (full) {
          const fits = b.fitWords(f, steps, 'steps');
          const planned = b.show(loadKg);
          words = [
            planned,
            fits,
            `${PATTERN_LABELS[abs.pattern]}: max ${b.showCap(abs.value)}: planned ${planned}; ${b.fixSentence(f, fits, steps)}.`,
          ];
        }
        b.push('absolute_load', abs.pattern, `max ${b.showCap(abs.value)}`, f, words);
      }
    }

    const rpeCap = r.rpe;
    if (rpeCap) {
      const cap = b.num(rpeCap.value);
      if (rpe === null) {
        b.push(
          'rpe',
          rpeCap.pattern,
          `max RPE ${cap}`,
          null,
          full
            ? [
                'no target RPE',
                `target RPE ${cap} or lower`,
                `${PATTERN_LABELS[rpeCap.pattern]}: max RPE ${cap}: this set has no target RPE and no baseline to estimate one — set a target RPE of ${cap} or lower.`,
              ]
            : LEAN_WORDS,
        );
      } else if (overCap(rpe, rpeCap.value)) {
        // A load fit only for an RPE estimated from a load in kg: a target RPE is lowered, a % with no 1RM said as a %.
        const f = estimated !== null && oneRm !== undefined ? b.fitFor(steps, r, oneRm) : null;
        let words = LEAN_WORDS;
        if (full) {
          const plannedWords =
            estimated !== null ? `RPE ${b.num(rpe)} (estimated from ${b.num(percent!)}% × ${set.reps})` : `RPE ${b.num(rpe)}`;
          const [fits, sentence] = rpeFix(b, f, estimated, oneRm, rpeCap.value, r, steps);
          words = [plannedWords, fits, `${PATTERN_LABELS[rpeCap.pattern]}: max RPE ${cap}: planned ${plannedWords}; ${sentence}.`];
        }
        b.push('rpe', rpeCap.pattern, `max RPE ${cap}`, f, words);
      }
    }

    const reps = r.reps;
    if (reps && overCap(set.reps, reps.value)) {
      const cap = b.num(reps.value);
      b.push(
        'reps_per_set',
        reps.pattern,
        `max ${cap} reps per set`,
        null,
        full
          ? [
              `${set.reps} reps`,
              `${cap} reps`,
              `${PATTERN_LABELS[reps.pattern]}: max ${cap} reps per set: planned ${set.reps}; ${cap} reps fits.`,
            ]
          : LEAN_WORDS,
      );
    }

    if (r.capped.length === 0) continue;
    if (set.sessionId !== sessionId) {
      sessionId = set.sessionId;
      sessionCount = countsFor((sessionCounts ??= new Map()), sessionId);
    }
    const hard = isHardSet(rpe, set.warmUp);
    // Counted per pattern: a set of a two-pattern exercise counts toward both patterns' limits.
    for (const c of r.capped) {
      const sCount = ++sessionCount[c.index];
      if (c.maxSets !== undefined && sCount > c.maxSets) {
        const max = c.maxSets;
        b.push(
          'sets_per_session',
          c.pattern,
          `max ${max} sets per session`,
          null,
          full
            ? [
                `set ${sCount}`,
                `${max} sets`,
                `${PATTERN_LABELS[c.pattern]}: max ${max} sets per session: this is set ${sCount}; remove it or move it to another day.`,
              ]
            : LEAN_WORDS,
        );
      }
      if (!hard) continue;
      weekCount ??= countsFor((weekCounts ??= new Map()), week);
      const wCount = ++weekCount[c.index];
      if (c.maxHard !== undefined && wCount > c.maxHard) {
        const max = c.maxHard;
        const weekOfSet = week;
        b.push(
          'hard_sets_per_week',
          c.pattern,
          `max ${max} hard sets per week`,
          null,
          full
            ? [
                `hard set ${wCount} of the week of ${humanDate(weekOfSet)}`,
                `${max} hard sets, or make this set easier than RPE ${HARD_SET_RPE}`,
                `${PATTERN_LABELS[c.pattern]}: max ${max} hard sets (RPE ${HARD_SET_RPE}+) in the week of ${humanDate(weekOfSet)}: this is hard set ${wCount}; lighten it below RPE ${HARD_SET_RPE} or drop it.`,
              ]
            : LEAN_WORDS,
        );
      }
    }
  }
  return b.list;
}

/** The fix of an RPE over its cap, in words and as the message's sentence. */
function rpeFix(
  b: BreachList,
  f: Fit | null,
  estimated: number | null,
  oneRm: number | undefined,
  cap: number,
  r: ExerciseRules,
  steps: LoadSteps,
): [string | null, string] {
  // A target RPE is the coach's own reading of the set: the fix is a lower target, not a load.
  if (estimated === null) return [`target RPE ${b.num(cap)} or lower`, `target RPE ${b.num(cap)} or lower`];
  if (oneRm === undefined) {
    // A % load with no 1RM to turn it into kg: the fix can only be said as a %.
    const reps = b.set.reps;
    const p = suggestPercent(reps, cap, r.pct?.value ?? null);
    const words = p === null ? null : `${p.reps === reps ? '' : `cut to ${p.reps} reps: `}${p.percent}% × ${p.reps} fits`;
    const sentence =
      words === null ? 'no load fits — choose a lighter exercise' : p!.reps === reps ? words : `no % fits ${reps} reps — ${words}`;
    return [words, sentence];
  }
  const words = b.fitWords(f, steps, 'reps');
  return [words, b.fixSentence(f, words, steps)];
}
