import type { Unit } from '../schemas/common';
import { inForceOn, type InForce, type PlanInput } from './in-force';
import { estimateRpe, percentForReps } from './intensity';
import { PATTERN_LABELS, type MovementPattern, type ParticipationStatus, type PatternRule } from './patterns';
import { describeSteps, largestFitting, type LoadSteps } from './steps';
import { formatLoad, KG_PER_LB } from './units';

/**
 * The compliance engine: every planned set checked on its own date against the restriction plans
 * in force. Pure and shared: the server enforces it on publish, the client mirrors it while typing.
 */
export interface EngineExercise {
  id: string;
  name: string;
  patterns: MovementPattern[];
  /** Ballistic or impact work (jumps, landings, throws, sprints). */
  ballistic: boolean;
  steps: LoadSteps;
  /** The lift whose 1RM sets this exercise's intensity; itself when null. */
  referenceId?: string | null;
}

export type PlannedLoad =
  | { kind: 'kg'; value: number }
  | { kind: 'lb'; value: number }
  | { kind: 'percent'; value: number }
  | { kind: 'bodyweight' };

export interface EngineSet {
  id: string;
  sessionId: string;
  date: string;
  exerciseId: string;
  reps: number;
  load: PlannedLoad;
  targetRpe?: number | null;
  /** Position within its session, for "the sets beyond the cap". */
  order: number;
}

export type BreachRule =
  | 'status_out'
  | 'blocked'
  | 'impact'
  | 'no_baseline'
  | 'percent_1rm'
  | 'absolute_load'
  | 'rpe'
  | 'reps_per_set'
  | 'sets_per_session'
  | 'hard_sets_per_week';

export interface Breach {
  setId: string;
  sessionId: string;
  date: string;
  exerciseId: string;
  rule: BreachRule;
  pattern: MovementPattern | null;
  /** The limit, the planned value and what would fit, in words (loads in the reader's unit). */
  limit: string;
  planned: string;
  fits: string | null;
  message: string;
  /** The largest load that fits on the exercise's steps, kg, when a load cap was breached. */
  fittingKg: number | null;
  /** Covered by a granted exception: shown, but does not stop publishing. */
  waived: boolean;
}

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
 * A hard set, for the weekly limit: a working set to within three reps of failure, i.e. RPE ≥ 7
 * (common practice). A set whose RPE cannot be known (no target, no baseline) counts as hard.
 */
export const HARD_SET_RPE = 7;

/** Monday of the ISO week containing `date` (YYYY-MM-DD), computed on the calendar in UTC. */
export function weekOf(date: string): string {
  const d = new Date(`${date}T00:00:00Z`);
  const dow = (d.getUTCDay() + 6) % 7;
  d.setUTCDate(d.getUTCDate() - dow);
  return d.toISOString().slice(0, 10);
}

export function plannedKg(load: PlannedLoad, oneRmKg: number | undefined): number | null {
  switch (load.kind) {
    case 'kg':
      return load.value;
    case 'lb':
      return load.value * KG_PER_LB;
    case 'percent':
      return oneRmKg === undefined ? null : (load.value / 100) * oneRmKg;
    case 'bodyweight':
      return null;
  }
}

type NumericCap = 'maxPercent1RM' | 'maxLoadKg' | 'maxRpe' | 'maxSetsPerSession' | 'maxRepsPerSet' | 'maxHardSetsPerWeek';

/** The lowest value of one cap across the exercise's patterns, and the pattern it comes from. */
function tightest(rules: [MovementPattern, PatternRule][], key: NumericCap): { value: number; pattern: MovementPattern } | null {
  let best: { value: number; pattern: MovementPattern } | null = null;
  for (const [p, r] of rules) {
    const v = r.mode === 'capped' ? r.caps?.[key] : undefined;
    if (v !== undefined && (!best || v < best.value)) best = { value: v, pattern: p };
  }
  return best;
}

const n = (v: number) => String(Number(v.toFixed(2)));

export function checkSets(sets: EngineSet[], ctx: EngineContext): Breach[] {
  const unit = ctx.unit ?? 'kg';
  const show = (kg: number) => formatLoad(kg, unit);
  const showCap = (kg: number) => formatLoad(kg, unit, 'down');
  const inForceCache = new Map<string, InForce>();
  const inForce = (date: string) => {
    let v = inForceCache.get(date);
    if (!v) inForceCache.set(date, (v = inForceOn(ctx.plans, date)));
    return v;
  };
  const breaches: Breach[] = [];
  const ordered = [...sets].sort((a, b) => (a.date < b.date ? -1 : a.date > b.date ? 1 : a.sessionId < b.sessionId ? -1 : a.sessionId > b.sessionId ? 1 : a.order - b.order));
  const sessionCounts = new Map<string, number>();
  const weekCounts = new Map<string, number>();
  const weekCache = new Map<string, string>();
  const weekFor = (date: string) => {
    let w = weekCache.get(date);
    if (w === undefined) weekCache.set(date, (w = weekOf(date)));
    return w;
  };
  let set: EngineSet = ordered[0];
  // One closure for the whole run (not one per set): this loop is the hot path of every publish.
  const push = (b: Omit<Breach, 'setId' | 'sessionId' | 'date' | 'exerciseId' | 'waived'>) =>
    breaches.push({ setId: set.id, sessionId: set.sessionId, date: set.date, exerciseId: set.exerciseId, waived: ctx.waivedSetIds?.has(set.id) ?? false, ...b });

  for (set of ordered) {
    const ex = ctx.exercises[set.exerciseId];
    if (!ex) continue;
    const day = inForce(set.date);
    const name = ex.name;

    if (ctx.statusOn?.(set.date) === 'out' && day.stages.length === 0) {
      push({ rule: 'status_out', pattern: null, limit: 'Out: no training until a clinician sets what is allowed', planned: `${name}`, fits: null, fittingKg: null,
        message: `The athlete is Out on ${set.date} and no restriction plan says what they may train. Ask the clinician for a plan or an exception.` });
      continue;
    }
    const rules = ex.patterns.map((p) => [p, day.patterns[p]] as [MovementPattern, PatternRule]);
    const blocked = rules.find(([, r]) => r.mode === 'blocked');
    if (blocked) {
      push({ rule: 'blocked', pattern: blocked[0], limit: `${PATTERN_LABELS[blocked[0]]} is blocked`, planned: name, fits: null, fittingKg: null,
        message: `${PATTERN_LABELS[blocked[0]]} is blocked on ${set.date}: ${name} cannot be programmed. Swap to an exercise that fits.` });
      continue;
    }
    const impactOff = rules.find(([, r]) => r.mode === 'capped' && r.caps?.impactAllowed === false);
    if (impactOff && ex.ballistic) {
      push({ rule: 'impact', pattern: impactOff[0], limit: 'no impact', planned: `${name} (impact)`, fits: null, fittingKg: null,
        message: `${PATTERN_LABELS[impactOff[0]]}: no impact allowed on ${set.date}; ${name} is ballistic. Swap to a non-impact exercise.` });
    }

    const oneRm = ctx.baselines[ex.referenceId ?? ex.id];
    const loadKg = plannedKg(set.load, oneRm);
    const percent = set.load.kind === 'percent' ? set.load.value : loadKg !== null && oneRm ? (loadKg / oneRm) * 100 : null;
    const limitsKg: number[] = [];

    const pct = tightest(rules, 'maxPercent1RM');
    if (pct) {
      if (oneRm === undefined) {
        push({ rule: 'no_baseline', pattern: pct.pattern, limit: `max ${n(pct.value)}% of 1RM`, planned: set.load.kind === 'percent' ? `${n(set.load.value)}%` : loadKg !== null ? show(loadKg) : 'bodyweight',
          fits: null, fittingKg: null,
          message: `${PATTERN_LABELS[pct.pattern]}: capped at ${n(pct.value)}% of 1RM, but ${name} has no baseline — enter a tested max or use a load cap.` });
      } else {
        const capKg = (pct.value / 100) * oneRm;
        limitsKg.push(capKg);
        if (percent !== null && percent > pct.value + 1e-9) {
          const fit = largestFitting(capKg, ex.steps);
          push({ rule: 'percent_1rm', pattern: pct.pattern, limit: `max ${n(pct.value)}% of ${show(oneRm)} = ${showCap(capKg)}`, planned: loadKg !== null ? show(loadKg) : `${n(percent)}%`,
            fits: fit === null ? null : `${show(fit)} fits on ${describeSteps(ex.steps)}`, fittingKg: fit,
            message: `${PATTERN_LABELS[pct.pattern]}: max ${n(pct.value)}% of ${show(oneRm)} = ${showCap(capKg)}: planned ${loadKg !== null ? show(loadKg) : `${n(percent)}%`}; ${fit === null ? 'no load on this exercise fits — choose a lighter one' : `${show(fit)} fits on ${describeSteps(ex.steps)}`}.` });
        }
      }
    }

    const abs = tightest(rules, 'maxLoadKg');
    if (abs) {
      limitsKg.push(abs.value);
      if (loadKg === null && set.load.kind === 'percent') {
        push({ rule: 'no_baseline', pattern: abs.pattern, limit: `max ${showCap(abs.value)}`, planned: `${n(set.load.value)}%`, fits: null, fittingKg: null,
          message: `${PATTERN_LABELS[abs.pattern]}: capped at ${showCap(abs.value)}, but the load is a % of 1RM and ${name} has no baseline — enter a tested max or plan a load.` });
      } else if (loadKg !== null && loadKg > abs.value + 1e-9) {
        const fit = largestFitting(abs.value, ex.steps);
        push({ rule: 'absolute_load', pattern: abs.pattern, limit: `max ${showCap(abs.value)}`, planned: show(loadKg),
          fits: fit === null ? null : `${show(fit)} fits on ${describeSteps(ex.steps)}`, fittingKg: fit,
          message: `${PATTERN_LABELS[abs.pattern]}: max ${showCap(abs.value)}: planned ${show(loadKg)}; ${fit === null ? 'no load on this exercise fits — choose a lighter one' : `${show(fit)} fits on ${describeSteps(ex.steps)}`}.` });
      }
    }

    const estimated = set.targetRpe == null && percent !== null ? estimateRpe(percent, set.reps) : null;
    const rpe = set.targetRpe ?? estimated;
    const rpeCap = tightest(rules, 'maxRpe');
    if (rpeCap) {
      if (rpe === null) {
        push({ rule: 'rpe', pattern: rpeCap.pattern, limit: `max RPE ${n(rpeCap.value)}`, planned: 'no target RPE', fits: `target RPE ${n(rpeCap.value)} or lower`, fittingKg: null,
          message: `${PATTERN_LABELS[rpeCap.pattern]}: max RPE ${n(rpeCap.value)}: this set has no target RPE and no baseline to estimate one — set a target RPE of ${n(rpeCap.value)} or lower.` });
      } else if (rpe > rpeCap.value + 1e-9) {
        // The heaviest load whose estimated RPE stays at the cap: reps + reps in reserve to failure.
        const rpeLimitKg = oneRm !== undefined ? (percentForReps(set.reps + (10 - rpeCap.value)) / 100) * oneRm : null;
        const fit = rpeLimitKg !== null && estimated !== null ? largestFitting(Math.min(rpeLimitKg, ...limitsKg), ex.steps) : null;
        const plannedWords = estimated !== null ? `RPE ${n(rpe)} (estimated from ${n(percent!)}% × ${set.reps})` : `RPE ${n(rpe)}`;
        const fitWords = fit !== null ? `${show(fit)} × ${set.reps} fits` : `target RPE ${n(rpeCap.value)} or lower`;
        push({ rule: 'rpe', pattern: rpeCap.pattern, limit: `max RPE ${n(rpeCap.value)}`, planned: plannedWords, fits: fitWords, fittingKg: fit,
          message: `${PATTERN_LABELS[rpeCap.pattern]}: max RPE ${n(rpeCap.value)}: planned ${plannedWords}; ${fitWords}.` });
      }
    }

    const reps = tightest(rules, 'maxRepsPerSet');
    if (reps && set.reps > reps.value) {
      push({ rule: 'reps_per_set', pattern: reps.pattern, limit: `max ${n(reps.value)} reps per set`, planned: `${set.reps} reps`, fits: `${n(reps.value)} reps`, fittingKg: null,
        message: `${PATTERN_LABELS[reps.pattern]}: max ${n(reps.value)} reps per set: planned ${set.reps}; ${n(reps.value)} reps fits.` });
    }

    // Counted per pattern: a set of a two-pattern exercise counts toward both patterns' limits.
    for (const [p, r] of rules) {
      if (r.mode !== 'capped') continue;
      const sKey = `${set.sessionId}|${p}`;
      const sCount = (sessionCounts.get(sKey) ?? 0) + 1;
      sessionCounts.set(sKey, sCount);
      const maxSets = r.caps?.maxSetsPerSession;
      if (maxSets !== undefined && sCount > maxSets) {
        push({ rule: 'sets_per_session', pattern: p, limit: `max ${maxSets} sets per session`, planned: `set ${sCount}`, fits: `${maxSets} sets`, fittingKg: null,
          message: `${PATTERN_LABELS[p]}: max ${maxSets} sets per session: this is set ${sCount}; remove it or move it to another day.` });
      }
      const hard = rpe === null || rpe >= HARD_SET_RPE;
      if (!hard) continue;
      const week = weekFor(set.date);
      const wKey = `${week}|${p}`;
      const wCount = (weekCounts.get(wKey) ?? 0) + 1;
      weekCounts.set(wKey, wCount);
      const maxHard = r.caps?.maxHardSetsPerWeek;
      if (maxHard !== undefined && wCount > maxHard) {
        push({ rule: 'hard_sets_per_week', pattern: p, limit: `max ${maxHard} hard sets per week`, planned: `hard set ${wCount} of the week of ${week}`, fits: `${maxHard} hard sets, or make this set easier than RPE ${HARD_SET_RPE}`, fittingKg: null,
          message: `${PATTERN_LABELS[p]}: max ${maxHard} hard sets (RPE ${HARD_SET_RPE}+) in the week of ${week}: this is hard set ${wCount}; lighten it below RPE ${HARD_SET_RPE} or drop it.` });
      }
    }
  }
  return breaches;
}

/** Library exercises that would fit where `exercise` does not: no blocked pattern, no impact if impact is off. */
export function suggestSwaps(exercise: EngineExercise, library: EngineExercise[], day: Pick<InForce, 'patterns'>, limit = 3): EngineExercise[] {
  const allowed = (e: EngineExercise) => {
    const rules = e.patterns.map((p) => day.patterns[p]);
    if (rules.some((r) => r.mode === 'blocked')) return false;
    if (e.ballistic && rules.some((r) => r.mode === 'capped' && r.caps?.impactAllowed === false)) return false;
    return true;
  };
  const shared = (e: EngineExercise) => e.patterns.filter((p) => exercise.patterns.includes(p)).length;
  return library
    .filter((e) => e.id !== exercise.id && allowed(e) && (shared(e) > 0 || e.patterns.length === 0))
    .sort((a, b) => shared(b) - shared(a) || a.name.localeCompare(b.name))
    .slice(0, limit);
}

/** A session may be published only when none of its breaches is unwaived. */
export function blockingBreaches(breaches: Breach[]): Breach[] {
  return breaches.filter((b) => !b.waived);
}
