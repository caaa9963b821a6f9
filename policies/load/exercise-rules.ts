import type { InForce } from './in-force';
import { MOVEMENT_PATTERNS, type MovementPattern, type PatternRule } from './patterns';
import type { LoadSteps } from './steps';

export interface EngineExercise {
  id: string;
  name: string;
  patterns: MovementPattern[];
  /** Ballistic or impact work (jumps, landings, throws, sprints). */
  ballistic: boolean;
  steps: LoadSteps;
  /** The lift whose 1RM sets this exercise's intensity; itself when null. */
  referenceId?: string | null;
  /** Library exercises to use instead when this one is not allowed, in order of preference (team fitting). */
  useInstead?: string[];
}

export interface TightestCap {
  value: number;
  pattern: MovementPattern;
}

type NumericCap = 'maxPercent1RM' | 'maxLoadKg' | 'maxRpe' | 'maxSetsPerSession' | 'maxRepsPerSet' | 'maxHardSetsPerWeek';

/** The lowest value of one cap across the exercise's patterns, and the pattern it comes from. */
function tightest(rules: [MovementPattern, PatternRule][], key: NumericCap): TightestCap | null {
  let best: TightestCap | null = null;
  for (const [p, r] of rules) {
    const v = r.mode === 'capped' ? r.caps?.[key] : undefined;
    if (v !== undefined && (!best || v < best.value)) best = { value: v, pattern: p };
  }
  return best;
}

const PATTERN_INDEX = new Map<MovementPattern, number>(MOVEMENT_PATTERNS.map((p, i) => [p, i]));

/**
 * What the rules in force mean for one exercise. It depends only on the stages in force and the
 * exercise, so the engine works it out once per (stages, exercise) pair instead of once per set.
 */
export interface ExerciseRules {
  rules: [MovementPattern, PatternRule][];
  blocked: MovementPattern | null;
  impactOff: MovementPattern | null;
  pct: TightestCap | null;
  abs: TightestCap | null;
  rpe: TightestCap | null;
  reps: TightestCap | null;
  /** The capped patterns in the exercise's order, each counted toward its own session and week limits. */
  capped: { pattern: MovementPattern; index: number; maxSets: number | undefined; maxHard: number | undefined }[];
}

/** The caps come from inForceOn, whose merge already reads a cap that is not a number as 0. */
export function exerciseRules(ex: EngineExercise, day: Pick<InForce, 'patterns'>): ExerciseRules {
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

/**
 * Library exercises that would fit where `exercise` does not: no blocked pattern, no impact if impact
 * is off. The exercise's own "use instead" list comes first, in its order; then the exercises sharing
 * a pattern with it, most shared first, then by name. An exercise without a pattern (a bike, a rower)
 * shares nothing to judge it by, so it is offered only when the "use instead" list names it.
 */
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
  const byId = new Map(library.map((e) => [e.id, e]));
  const named = [...new Set(exercise.useInstead ?? [])]
    .map((id) => byId.get(id))
    .filter((e): e is EngineExercise => !!e && e.id !== exercise.id && allowed(e));
  // Patterns shared with the exercise, counted once per candidate (not in every comparison of the sort).
  const shared = new Map<EngineExercise, number>();
  for (const e of library) shared.set(e, e.patterns.filter((p) => exercise.patterns.includes(p)).length);
  const family = library
    .filter((e) => e.id !== exercise.id && !named.includes(e) && allowed(e) && shared.get(e)! > 0)
    .sort((a, b) => shared.get(b)! - shared.get(a)! || a.name.localeCompare(b.name));
  return [...named, ...family].slice(0, limit);
}
