import type { Unit } from '../schemas/common';
import type { Breach, BreachRule } from './breach';
import type { EngineExercise, ExerciseRules } from './exercise-rules';
import { overCap, percentOf, suggestFit, suggestPercent, type Fit, type LoadCaps } from './fitting';
import { bySessionThenOrder, memo, n, unreadable } from './check-support';
import { isFiniteNumber } from './guard';
import type { PlanInput } from './in-force';
import { estimateRpe } from './intensity';
import { MOVEMENT_PATTERNS, PATTERN_LABELS, type MovementPattern, type ParticipationStatus } from './patterns';
import { PreparedRules, type StageRules } from './prepared-rules';
import { HARD_SET_RPE, isHardSet, plannedKg, type EngineSet } from './sets';
import { describeSteps, type LoadSteps } from './steps';
import { formatLoad } from './units';
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
  const unit = ctx.unit ?? 'kg';
  const show = memo((kg: number) => formatLoad(kg, unit));
  const showCap = memo((kg: number) => formatLoad(kg, unit, 'down'));
  const num = memo(n);
  // The rules per day and per exercise: those prepared for this athlete, or worked out for this check.
  const rules = prepared?.fits(ctx) ? prepared : new PreparedRules(ctx);
  const breaches: Breach[] = [];
  // Callers usually pass sets already in order; a stable sort would return them unchanged.
  let sorted = true;
  for (let i = 1; i < sets.length && sorted; i++) sorted = bySessionThenOrder(sets[i - 1], sets[i]) <= 0;
  const ordered = sorted ? sets : [...sets].sort(bySessionThenOrder);
  // Counts per session and per week, one slot per movement pattern.
  const sessionCounts = new Map<string, Int32Array>();
  const weekCounts = new Map<string, Int32Array>();
  const countsFor = (map: Map<string, Int32Array>, key: string) => {
    let c = map.get(key);
    if (!c) map.set(key, (c = new Int32Array(MOVEMENT_PATTERNS.length)));
    return c;
  };

  let date: string | null = null;
  // Sets come sorted by date: a date is read once, when the loop moves to it (only valid dates become `date`).
  const validDate = (d: string) => d === date || rules.on(d) !== null;
  let stages!: StageRules;
  let out = false;
  let week = '';
  let weekCount: Int32Array | null = null;
  let sessionId: string | null = null;
  let sessionCount!: Int32Array;
  let set: EngineSet = ordered[0];
  let waived = false;
  const push = (
    rule: BreachRule,
    pattern: MovementPattern | null,
    limit: string,
    planned: string,
    fits: string | null,
    fit: Fit | null,
    message: string,
  ) =>
    breaches.push({
      setId: set.id,
      sessionId: set.sessionId,
      date: set.date,
      exerciseId: set.exerciseId,
      waived,
      rule,
      pattern,
      limit,
      planned,
      fits,
      fittingKg: fit?.kg ?? null,
      ...(fit && fit.reps !== set.reps ? { fittingReps: fit.reps } : {}),
      message,
    });

  // One fit per set, the load that passes all of its load caps, worked out at most once and only when
  // one of them is breached. Helpers are made once per check, not per set: this loop is the hot path.
  let fitted: { of: EngineSet; fit: Fit | null } | null = null;
  const fitFor = (steps: LoadSteps, r: ExerciseRules, oneRm: number | undefined): Fit | null => {
    if (fitted?.of !== set) {
      const caps: LoadCaps = {
        oneRmKg: oneRm,
        pct: r.pct?.value ?? null,
        abs: r.abs?.value ?? null,
        rpe: set.targetRpe == null ? (r.rpe?.value ?? null) : null,
      };
      fitted = { of: set, fit: suggestFit(steps, set.reps, caps) };
    }
    return fitted.fit;
  };
  /** The fix in words: the fitting load at these reps (on the steps, or × reps), fewer reps when no load fits, or none. */
  const fitWords = (f: Fit | null, steps: LoadSteps, form: 'steps' | 'reps'): string | null => {
    if (f === null) return null;
    if (f.reps !== set.reps) return `cut to ${f.reps} reps: ${show(f.kg)} × ${f.reps} fits`;
    return form === 'steps' ? `${show(f.kg)} fits on ${describeSteps(steps)}` : `${show(f.kg)} × ${set.reps} fits`;
  };
  const fixSentence = (f: Fit | null, words: string | null, steps: LoadSteps): string =>
    words === null
      ? 'no load on this exercise fits — choose a lighter one'
      : f!.reps === set.reps
        ? words
        : `no load on ${describeSteps(steps)} fits ${set.reps} reps — ${words}`;

  for (set of ordered) {
    const ex = ctx.exercises[set.exerciseId];
    waived = ctx.waivedSetIds?.has(set.id) ?? false;
    if (!ex) {
      // An exercise the engine does not know has no patterns to check: fail closed, never a pass.
      push(
        'unreadable',
        null,
        'an exercise of the library',
        'an unknown exercise',
        null,
        null,
        'This set names an exercise that is not in the library, so it cannot be checked. Choose an exercise from the library.',
      );
      continue;
    }
    const name = ex.name;
    const problem = unreadable(set, validDate);
    if (problem) {
      // Unknown is never a pass: a set the engine cannot read is a breach, and nothing else is said of it.
      push(
        'unreadable',
        null,
        'a set the check can read',
        name,
        null,
        null,
        `${name}: this set cannot be checked: ${problem}. Fix the set.`,
      );
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
      push(
        'status_out',
        null,
        'Out: no training until a clinician sets what is allowed',
        `${name}`,
        null,
        null,
        `The athlete is Out on ${humanDate(set.date)} and no restriction plan says what they may train. Ask the clinician for a plan or an exception.`,
      );
      continue;
    }
    if (r.blocked) {
      const label = PATTERN_LABELS[r.blocked];
      push(
        'blocked',
        r.blocked,
        `${label} is blocked`,
        name,
        null,
        null,
        `${label} is blocked on ${humanDate(set.date)}: ${name} cannot be programmed. Swap to an exercise that fits.`,
      );
      continue;
    }
    if (r.impactOff && ex.ballistic) {
      push(
        'impact',
        r.impactOff,
        'no impact',
        `${name} (impact)`,
        null,
        null,
        `${PATTERN_LABELS[r.impactOff]}: no impact allowed on ${humanDate(set.date)}; ${name} is ballistic. Swap to a non-impact exercise.`,
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
        push(
          'no_baseline',
          pct.pattern,
          `max ${num(pct.value)}% of 1RM`,
          set.load.kind === 'percent' ? `${num(set.load.value)}%` : loadKg !== null ? show(loadKg) : 'bodyweight',
          null,
          null,
          `${PATTERN_LABELS[pct.pattern]}: capped at ${num(pct.value)}% of 1RM, but ${name} has no baseline — enter a tested max or use a load cap.`,
        );
      } else if (percent !== null && overCap(percent, pct.value)) {
        const capKg = (pct.value / 100) * oneRm;
        const f = fitFor(steps, r, oneRm);
        const fits = fitWords(f, steps, 'steps');
        const planned = loadKg !== null ? show(loadKg) : `${num(percent)}%`;
        const limit = `max ${num(pct.value)}% of ${show(oneRm)} = ${showCap(capKg)}`;
        push(
          'percent_1rm',
          pct.pattern,
          limit,
          planned,
          fits,
          f,
          `${PATTERN_LABELS[pct.pattern]}: ${limit}: planned ${planned}; ${fixSentence(f, fits, steps)}.`,
        );
      }
    }

    const abs = r.abs;
    if (abs) {
      if (loadKg === null && set.load.kind === 'percent') {
        push(
          'no_baseline',
          abs.pattern,
          `max ${showCap(abs.value)}`,
          `${num(set.load.value)}%`,
          null,
          null,
          `${PATTERN_LABELS[abs.pattern]}: capped at ${showCap(abs.value)}, but the load is a % of 1RM and ${name} has no baseline — enter a tested max or plan a load.`,
        );
      } else if (loadKg !== null && overCap(loadKg, abs.value)) {
        const f = fitFor(steps, r, oneRm);
        const fits = fitWords(f, steps, 'steps');
        push(
          'absolute_load',
          abs.pattern,
          `max ${showCap(abs.value)}`,
          show(loadKg),
          fits,
          f,
          `${PATTERN_LABELS[abs.pattern]}: max ${showCap(abs.value)}: planned ${show(loadKg)}; ${fixSentence(f, fits, steps)}.`,
        );
      }
    }

    const rpeCap = r.rpe;
    if (rpeCap) {
      if (rpe === null) {
        push(
          'rpe',
          rpeCap.pattern,
          `max RPE ${num(rpeCap.value)}`,
          'no target RPE',
          `target RPE ${num(rpeCap.value)} or lower`,
          null,
          `${PATTERN_LABELS[rpeCap.pattern]}: max RPE ${num(rpeCap.value)}: this set has no target RPE and no baseline to estimate one — set a target RPE of ${num(rpeCap.value)} or lower.`,
        );
      } else if (overCap(rpe, rpeCap.value)) {
        const plannedWords = estimated !== null ? `RPE ${num(rpe)} (estimated from ${num(percent!)}% × ${set.reps})` : `RPE ${num(rpe)}`;
        let f: Fit | null = null;
        let words: string | null;
        let sentence: string;
        if (estimated === null) {
          // A target RPE is the coach's own reading of the set: the fix is a lower target, not a load.
          words = sentence = `target RPE ${num(rpeCap.value)} or lower`;
        } else if (oneRm === undefined) {
          // A % load with no 1RM to turn it into kg: the fix can only be said as a %.
          const p = suggestPercent(set.reps, rpeCap.value, r.pct?.value ?? null);
          words = p === null ? null : `${p.reps === set.reps ? '' : `cut to ${p.reps} reps: `}${p.percent}% × ${p.reps} fits`;
          sentence =
            words === null
              ? 'no load fits — choose a lighter exercise'
              : p!.reps === set.reps
                ? words
                : `no % fits ${set.reps} reps — ${words}`;
        } else {
          f = fitFor(steps, r, oneRm);
          words = fitWords(f, steps, 'reps');
          sentence = fixSentence(f, words, steps);
        }
        push(
          'rpe',
          rpeCap.pattern,
          `max RPE ${num(rpeCap.value)}`,
          plannedWords,
          words,
          f,
          `${PATTERN_LABELS[rpeCap.pattern]}: max RPE ${num(rpeCap.value)}: planned ${plannedWords}; ${sentence}.`,
        );
      }
    }

    const reps = r.reps;
    if (reps && overCap(set.reps, reps.value)) {
      push(
        'reps_per_set',
        reps.pattern,
        `max ${num(reps.value)} reps per set`,
        `${set.reps} reps`,
        `${num(reps.value)} reps`,
        null,
        `${PATTERN_LABELS[reps.pattern]}: max ${num(reps.value)} reps per set: planned ${set.reps}; ${num(reps.value)} reps fits.`,
      );
    }

    if (r.capped.length === 0) continue;
    if (set.sessionId !== sessionId) {
      sessionId = set.sessionId;
      sessionCount = countsFor(sessionCounts, sessionId);
    }
    const hard = isHardSet(rpe, set.warmUp);
    // Counted per pattern: a set of a two-pattern exercise counts toward both patterns' limits.
    for (const c of r.capped) {
      const sCount = ++sessionCount[c.index];
      if (c.maxSets !== undefined && sCount > c.maxSets) {
        push(
          'sets_per_session',
          c.pattern,
          `max ${c.maxSets} sets per session`,
          `set ${sCount}`,
          `${c.maxSets} sets`,
          null,
          `${PATTERN_LABELS[c.pattern]}: max ${c.maxSets} sets per session: this is set ${sCount}; remove it or move it to another day.`,
        );
      }
      if (!hard) continue;
      weekCount ??= countsFor(weekCounts, week);
      const wCount = ++weekCount[c.index];
      if (c.maxHard !== undefined && wCount > c.maxHard) {
        push(
          'hard_sets_per_week',
          c.pattern,
          `max ${c.maxHard} hard sets per week`,
          `hard set ${wCount} of the week of ${humanDate(week)}`,
          `${c.maxHard} hard sets, or make this set easier than RPE ${HARD_SET_RPE}`,
          null,
          `${PATTERN_LABELS[c.pattern]}: max ${c.maxHard} hard sets (RPE ${HARD_SET_RPE}+) in the week of ${humanDate(week)}: this is hard set ${wCount}; lighten it below RPE ${HARD_SET_RPE} or drop it.`,
        );
      }
    }
  }
  return breaches;
}
