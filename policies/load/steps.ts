import { isFiniteNumber } from './guard';
import { KG_PER_LB } from './units';

/**
 * The loads an exercise can actually be set to: multiples of an increment (2.5 kg, 5 lb…), or a
 * list of fixed implements (kettlebells 8–48 kg).
 */
export type LoadSteps = { kind: 'increment'; step: number; unit: 'kg' | 'lb' } | { kind: 'list'; valuesKg: number[] };

/** Competition kettlebells, 8–32 kg in 4 kg steps, 36–48 kg also made (IWF/IKSFA sizes, secondary). */
export const KETTLEBELL_KG = [8, 12, 16, 20, 24, 28, 32, 36, 40, 44, 48];

/** The heaviest load a planned set may name (PlannedLoadSchema: 1000 kg), so no search runs without end. */
export const MAX_LOAD_KG = 1000;

const EPS = 1e-9;

/**
 * To the micro-kilogram, rounded down (within 1e-12 kg for floating-point noise): a step shown as
 * 61.234969 kg for 135 lb never reads a hair over a cap of exactly 135 lb.
 */
function downToMicroKg(v: number) {
  return Math.floor(v * 1e6 + 1e-6) / 1e6;
}

/** The step in kg, or null for steps that cannot be read (a step that is not a positive finite number, an unknown unit). */
function stepKg(steps: Extract<LoadSteps, { kind: 'increment' }>): number | null {
  if (!isFiniteNumber(steps.step) || steps.step <= 0) return null;
  if (steps.unit === 'kg') return steps.step;
  if (steps.unit === 'lb') return steps.step * KG_PER_LB;
  return null;
}

/** count steps, in kg, worked out in the step's own unit so 5 lb steps stay exact multiples of 5 lb. */
function stepValue(steps: Extract<LoadSteps, { kind: 'increment' }>, count: number): number {
  return downToMicroKg(steps.unit === 'kg' ? count * steps.step : count * steps.step * KG_PER_LB);
}

type Increment = Extract<LoadSteps, { kind: 'increment' }>;

/** The i-th load of a search, lightest first: a list's sorted value, or i + 1 steps. */
function loadAt(steps: LoadSteps, values: number[] | null, i: number): number {
  return values !== null ? values[i] : stepValue(steps as Increment, i + 1);
}

/** `ok` for a load of the search; on pound steps also for the exact multiple of the step (see heaviestPassing). */
function passesAt(steps: LoadSteps, values: number[] | null, ok: (kg: number) => boolean, v: number): boolean {
  if (!ok(v)) return false;
  if (values !== null || steps.kind !== 'increment' || steps.unit !== 'lb') return true;
  return ok(Math.round(v / KG_PER_LB / steps.step) * steps.step * KG_PER_LB);
}

/**
 * The largest load that does not exceed `limitKg` on these steps — rounded down, never to nearest,
 * because under a cap the nearest step can be over it. Null (nothing fits, or cannot compute) when
 * even the lightest step is over, or the limit or the steps are not finite numbers.
 */
export function largestFitting(limitKg: number, steps: LoadSteps): number | null {
  if (!isFiniteNumber(limitKg) || limitKg < 0) return null;
  return heaviestPassing(steps, limitKg, (kg) => kg <= limitKg + EPS);
}

/**
 * The heaviest load on these steps, at most `upperKg` (plus one step, for rounding), for which `ok`
 * holds. `ok` must hold for every load below one it holds for (true for every cap the engine has:
 * a lighter load never breaks a cap a heavier one keeps), so a binary search finds it; `guessKg`,
 * a likely answer, is tried first (two calls of `ok` when it is right). On pound steps `ok` must
 * hold both for the load rounded to a micro-kilogram (what the engine suggests) and for the exact
 * multiple of the step (what the builder enters in pounds).
 */
export function heaviestPassing(steps: LoadSteps, upperKg: number, ok: (kg: number) => boolean, guessKg?: number): number | null {
  if (!isFiniteNumber(upperKg) || upperKg < 0) return null;
  const upper = Math.min(upperKg, MAX_LOAD_KG);
  // Plain values and module-level helpers, no closures made per search: this runs for every fitted set.
  let count: number;
  let values: number[] | null = null;
  let kg = 0;
  if (steps.kind === 'list') {
    values = [...new Set((steps.valuesKg ?? []).filter((v) => isFiniteNumber(v) && v > 0 && v <= MAX_LOAD_KG))].sort((a, b) => a - b);
    count = values.length;
  } else {
    const k = stepKg(steps);
    if (k === null) return null;
    kg = k;
    count = Math.floor(upper / kg + EPS) + 1;
  }
  // The largest index whose value passes lies in lo … hi − 1 (lo = −1: none passes).
  let lo = -1;
  let hi = count;
  if (guessKg !== undefined && isFiniteNumber(guessKg)) {
    const g = Math.min(
      count - 1,
      values !== null ? values.filter((v) => v <= guessKg + EPS).length - 1 : Math.floor(guessKg / kg + EPS) - 1,
    );
    if (g >= 0) {
      if (!passesAt(steps, values, ok, loadAt(steps, values, g))) hi = g;
      else if (g + 1 >= count || !passesAt(steps, values, ok, loadAt(steps, values, g + 1))) return loadAt(steps, values, g);
      else lo = g + 1;
    }
  }
  while (hi - lo > 1) {
    const mid = (lo + hi) >> 1;
    if (passesAt(steps, values, ok, loadAt(steps, values, mid))) lo = mid;
    else hi = mid;
  }
  return lo < 0 ? null : loadAt(steps, values, lo);
}

export function describeSteps(steps: LoadSteps): string {
  if (steps.kind === 'list') return 'the available implements';
  return isFiniteNumber(steps.step) && steps.step > 0 ? `${steps.step} ${steps.unit} increments` : 'the available increments';
}
