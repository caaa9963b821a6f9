import type { Unit } from '../schemas/common';
import { inForceOn, type InForce, type PlanInput } from './in-force';
import { estimateRpe, percentForReps } from './intensity';
import { MOVEMENT_PATTERNS, PATTERN_LABELS, type MovementPattern, type ParticipationStatus, type PatternRule } from './patterns';
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
  { kind: 'kg'; value: number } | { kind: 'lb'; value: number } | { kind: 'percent'; value: number } | { kind: 'bodyweight' };

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

const PATTERN_INDEX = new Map<MovementPattern, number>(MOVEMENT_PATTERNS.map((p, i) => [p, i]));

/**
 * What the rules in force mean for one exercise. It depends only on the stages in force and the
 * exercise, so it is worked out once per (stages, exercise) pair instead of once per set.
 */
interface ExerciseRules {
  rules: [MovementPattern, PatternRule][];
  blocked: MovementPattern | null;
  impactOff: MovementPattern | null;
  pct: { value: number; pattern: MovementPattern } | null;
  abs: { value: number; pattern: MovementPattern } | null;
  rpe: { value: number; pattern: MovementPattern } | null;
  reps: { value: number; pattern: MovementPattern } | null;
  /** The capped patterns in the exercise's order, each counted toward its own session and week limits. */
  capped: { pattern: MovementPattern; index: number; maxSets: number | undefined; maxHard: number | undefined }[];
}

function exerciseRules(ex: EngineExercise, day: InForce): ExerciseRules {
  const rules = ex.patterns.map((p) => [p, day.patterns[p]] as [MovementPattern, PatternRule]);
  const capped: ExerciseRules['capped'] = [];
  for (const [p, r] of rules)
    if (r.mode === 'capped')
      capped.push({ pattern: p, index: PATTERN_INDEX.get(p)!, maxSets: r.caps?.maxSetsPerSession, maxHard: r.caps?.maxHardSetsPerWeek });
  return {
    rules,
    blocked: rules.find(([, r]) => r.mode === 'blocked')?.[0] ?? null,
    impactOff: rules.find(([, r]) => r.mode === 'capped' && r.caps?.impactAllowed === false)?.[0] ?? null,
    pct: tightest(rules, 'maxPercent1RM'),
    abs: tightest(rules, 'maxLoadKg'),
    rpe: tightest(rules, 'maxRpe'),
    reps: tightest(rules, 'maxRepsPerSet'),
    capped,
  };
}

/** A pure function of its argument, remembered for the length of one check (messages repeat the same numbers). */
function memo<K, V>(fn: (k: K) => V): (k: K) => V {
  const cache = new Map<K, V>();
  return (k) => {
    let v = cache.get(k);
    if (v === undefined && !cache.has(k)) cache.set(k, (v = fn(k)));
    return v as V;
  };
}

const bySessionThenOrder = (a: EngineSet, b: EngineSet) =>
  a.date < b.date ? -1 : a.date > b.date ? 1 : a.sessionId < b.sessionId ? -1 : a.sessionId > b.sessionId ? 1 : a.order - b.order;

/**
 * This loop is the hot path of every publish and of the builder's live check (a 16-week program is
 * ~2,000 sets), so work that does not change from set to set is done once: the rules in force per
 * distinct combination of stages, what they mean per exercise, status and week per date; counts
 * are kept per pattern index rather than under built string keys. The results are the same, in the
 * same order, as checking every set from scratch.
 */
export function checkSets(sets: EngineSet[], ctx: EngineContext): Breach[] {
  const unit = ctx.unit ?? 'kg';
  const show = memo((kg: number) => formatLoad(kg, unit));
  const showCap = memo((kg: number) => formatLoad(kg, unit, 'down'));
  const num = memo(n);
  // Days with the same stage of every plan in force share one InForce (only its date differs, which
  // the check does not read) and one table of exercise rules.
  const byStages = new Map<string, { day: InForce; exercises: Map<string, ExerciseRules> }>();
  const dayOf = (date: string) => {
    let key = '';
    for (const plan of ctx.plans) key += `${plan.stages.findIndex((s) => s.startDate <= date && date <= s.endDate)},`;
    let v = byStages.get(key);
    if (!v) byStages.set(key, (v = { day: inForceOn(ctx.plans, date), exercises: new Map() }));
    return v;
  };
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
  let stages!: { day: InForce; exercises: Map<string, ExerciseRules> };
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
    fittingKg: number | null,
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
      fittingKg,
      message,
    });

  for (set of ordered) {
    const ex = ctx.exercises[set.exerciseId];
    if (!ex) continue;
    if (set.date !== date) {
      date = set.date;
      stages = dayOf(date);
      out = ctx.statusOn?.(date) === 'out';
      week = weekOf(date);
      weekCount = null;
    }
    const day = stages.day;
    let r = stages.exercises.get(ex.id);
    if (!r) stages.exercises.set(ex.id, (r = exerciseRules(ex, day)));
    waived = ctx.waivedSetIds?.has(set.id) ?? false;
    const name = ex.name;

    if (out && day.stages.length === 0) {
      push(
        'status_out',
        null,
        'Out: no training until a clinician sets what is allowed',
        `${name}`,
        null,
        null,
        `The athlete is Out on ${set.date} and no restriction plan says what they may train. Ask the clinician for a plan or an exception.`,
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
        `${label} is blocked on ${set.date}: ${name} cannot be programmed. Swap to an exercise that fits.`,
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
        `${PATTERN_LABELS[r.impactOff]}: no impact allowed on ${set.date}; ${name} is ballistic. Swap to a non-impact exercise.`,
      );
    }

    const oneRm = ctx.baselines[ex.referenceId ?? ex.id];
    const loadKg = plannedKg(set.load, oneRm);
    const percent = set.load.kind === 'percent' ? set.load.value : loadKg !== null && oneRm ? (loadKg / oneRm) * 100 : null;
    let limitKg = Infinity;

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
      } else {
        const capKg = (pct.value / 100) * oneRm;
        limitKg = Math.min(limitKg, capKg);
        if (percent !== null && percent > pct.value + 1e-9) {
          const fit = largestFitting(capKg, ex.steps);
          const fits = fit === null ? null : `${show(fit)} fits on ${describeSteps(ex.steps)}`;
          const planned = loadKg !== null ? show(loadKg) : `${num(percent)}%`;
          const limit = `max ${num(pct.value)}% of ${show(oneRm)} = ${showCap(capKg)}`;
          push(
            'percent_1rm',
            pct.pattern,
            limit,
            planned,
            fits,
            fit,
            `${PATTERN_LABELS[pct.pattern]}: ${limit}: planned ${planned}; ${fits ?? 'no load on this exercise fits — choose a lighter one'}.`,
          );
        }
      }
    }

    const abs = r.abs;
    if (abs) {
      limitKg = Math.min(limitKg, abs.value);
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
      } else if (loadKg !== null && loadKg > abs.value + 1e-9) {
        const fit = largestFitting(abs.value, ex.steps);
        const fits = fit === null ? null : `${show(fit)} fits on ${describeSteps(ex.steps)}`;
        push(
          'absolute_load',
          abs.pattern,
          `max ${showCap(abs.value)}`,
          show(loadKg),
          fits,
          fit,
          `${PATTERN_LABELS[abs.pattern]}: max ${showCap(abs.value)}: planned ${show(loadKg)}; ${fits ?? 'no load on this exercise fits — choose a lighter one'}.`,
        );
      }
    }

    const estimated = set.targetRpe == null && percent !== null ? estimateRpe(percent, set.reps) : null;
    const rpe = set.targetRpe ?? estimated;
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
      } else if (rpe > rpeCap.value + 1e-9) {
        // The heaviest load whose estimated RPE stays at the cap: reps + reps in reserve to failure.
        const rpeLimitKg = oneRm !== undefined ? (percentForReps(set.reps + (10 - rpeCap.value)) / 100) * oneRm : null;
        const fit = rpeLimitKg !== null && estimated !== null ? largestFitting(Math.min(rpeLimitKg, limitKg), ex.steps) : null;
        const plannedWords = estimated !== null ? `RPE ${num(rpe)} (estimated from ${num(percent!)}% × ${set.reps})` : `RPE ${num(rpe)}`;
        const fitWords = fit !== null ? `${show(fit)} × ${set.reps} fits` : `target RPE ${num(rpeCap.value)} or lower`;
        push(
          'rpe',
          rpeCap.pattern,
          `max RPE ${num(rpeCap.value)}`,
          plannedWords,
          fitWords,
          fit,
          `${PATTERN_LABELS[rpeCap.pattern]}: max RPE ${num(rpeCap.value)}: planned ${plannedWords}; ${fitWords}.`,
        );
      }
    }

    const reps = r.reps;
    if (reps && set.reps > reps.value) {
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
    const hard = rpe === null || rpe >= HARD_SET_RPE;
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
          `hard set ${wCount} of the week of ${week}`,
          `${c.maxHard} hard sets, or make this set easier than RPE ${HARD_SET_RPE}`,
          null,
          `${PATTERN_LABELS[c.pattern]}: max ${c.maxHard} hard sets (RPE ${HARD_SET_RPE}+) in the week of ${week}: this is hard set ${wCount}; lighten it below RPE ${HARD_SET_RPE} or drop it.`,
        );
      }
    }
  }
  return breaches;
}

/** Library exercises that would fit where `exercise` does not: no blocked pattern, no impact if impact is off. */
export function suggestSwaps(
  exercise: EngineExercise,
  library: EngineExercise[],
  day: Pick<InForce, 'patterns'>,
  limit = 3,
): EngineExercise[] {
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
