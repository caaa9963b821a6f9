import type { Unit } from '../schemas/common';
import { isFiniteNumber } from './guard';
import type { LoadSteps } from './steps';
import { fromUnit, toUnit } from './units';

/**
 * The total-load step an athlete can add to a bar when nothing more precise is known: 2.5 kg or
 * 5 lb (common practice: the smallest pair of plates in a gym, 1.25 kg or 2.5 lb a side).
 */
export const DEFAULT_BAR_STEP: Record<Unit, number> = { kg: 2.5, lb: 5 };

/**
 * The step to round to, in the reader's unit: an exercise's own increments ("Load steps" in the
 * library) when they are counted in that unit, otherwise the default for the unit. Steps in the
 * other unit (5 lb plates for a kg reader) or a list of fixed implements do not give a step in the
 * reader's unit, so the default is used.
 */
export function barStepFor(steps: LoadSteps | undefined, unit: Unit): number {
  if (steps?.kind === 'increment' && steps.unit === unit && isFiniteNumber(steps.step) && steps.step > 0) return steps.step;
  return DEFAULT_BAR_STEP[unit];
}

/**
 * The heaviest load an athlete can actually put on the bar under a cap, in their unit: the cap
 * converted exactly (1 lb = 0.45359237 kg, NIST SP 811) and rounded DOWN to a multiple of the step —
 * never to nearest, because under a cap the nearest step can be over it. 0 when even one step is
 * over the cap; null when the cap, the unit or the step cannot be read (never a plausible number).
 */
export function capOnTheBar(capKg: number, unit: Unit, step: number = DEFAULT_BAR_STEP[unit]): number | null {
  const v = toUnit(capKg, unit);
  if (!isFiniteNumber(v) || v < 0 || !isFiniteNumber(step) || step <= 0) return null;
  // 1e-9 absorbs floating-point noise: a cap of exactly 135 lb stored as 61.23496995 kg is 27 steps, not 26.
  const count = Math.floor(v / step + 1e-9);
  return Number((count * step).toFixed(6));
}

/** A cap as the athlete reads it: "up to 95 lb"; a cap under one step says so instead of "up to 0 lb". */
export function capOnTheBarWords(capKg: number, unit: Unit, step: number = DEFAULT_BAR_STEP[unit]): string {
  const load = capOnTheBar(capKg, unit, step);
  if (load === null) return 'a load limit that cannot be read — ask your coach';
  if (load === 0) return `less than ${step} ${unit} — ask your coach what to use`;
  return `up to ${load} ${unit}`;
}

/**
 * A planned load (kg) as an athlete reading pounds loads it: rounded DOWN to a 5 lb step, returned in
 * kg so it can be shown, plated and logged like any load. Loads are planned in kg on the exercise's
 * own steps, so a kg reader gets them unchanged; a set planned in the reader's own unit is shown as
 * planned by the caller and never comes here.
 */
export function plannedLoadOnTheBarKg(kg: number, unit: Unit): number {
  if (unit === 'kg') return kg;
  const lb = capOnTheBar(kg, unit);
  return lb === null ? kg : fromUnit(lb, unit);
}
