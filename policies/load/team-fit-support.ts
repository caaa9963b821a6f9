import type { Unit } from '../schemas/common';
import type { PlannedSetInput } from '../schemas/programs';
import { loadTimesReps } from '../words/loads';
import { n } from './check-support';
import type { EngineExercise } from './exercise-rules';
import { isFiniteNumber } from './guard';
import { plannedKg, type PlannedLoad } from './sets';
import { largestFitting, type LoadSteps } from './steps';
import { KG_PER_LB } from './units';

/** Helpers of the team fitting (team-fit.ts): reading a 1RM, turning a % into a load on the steps, words for a set. */

/** The 1RM the engine reads for an exercise (through its referenceId), or undefined when there is no usable one — as checkSets reads it. */
export function oneRmFor(ex: EngineExercise, baselines: Record<string, number>): number | undefined {
  const raw = baselines[ex.referenceId ?? ex.id];
  return isFiniteNumber(raw) && raw > 0 ? raw : undefined;
}

/**
 * A number rounded to six decimals, as Number(v.toFixed(6)) gives it, kept per value: the loads of a
 * squad's versions are a few steps repeated thousands of times, and toFixed is a slow call. Bounded:
 * the table is emptied when it grows large.
 */
const rounded = new Map<number, number>();
function sixDecimals(v: number): number {
  let r = rounded.get(v);
  if (r === undefined) {
    if (rounded.size >= 4096) rounded.clear();
    rounded.set(v, (r = Number(v.toFixed(6))));
  }
  return r;
}

/** A load in kg as a planned load on these steps: pound steps stay in pounds (an exact multiple of the step), others in kg. */
export function loadOnSteps(kg: number, steps: LoadSteps): PlannedLoad {
  if (steps.kind === 'increment' && steps.unit === 'lb' && isFiniteNumber(steps.step) && steps.step > 0) {
    const count = Math.round(kg / KG_PER_LB / steps.step);
    return { kind: 'lb', value: sixDecimals(count * steps.step) };
  }
  return { kind: 'kg', value: sixDecimals(kg) };
}

/**
 * The load on the exercise's steps nearest to `kg` (ties go down). For a prescription ("75 % of 1RM")
 * the nearest step is common practice; under a cap the engine's own fit rounds down instead, and the
 * fitting lowers a nearest step that crosses a cap. Never below the lightest step. Null when the
 * steps cannot be read.
 */
export function nearestStepKg(kg: number, steps: LoadSteps): number | null {
  if (!isFiniteNumber(kg) || kg < 0) return null;
  if (steps.kind === 'list') {
    const values = (steps.valuesKg ?? []).filter((v) => isFiniteNumber(v) && v > 0).sort((a, b) => a - b);
    if (values.length === 0) return null;
    let best = values[0];
    for (const v of values) if (Math.abs(v - kg) < Math.abs(best - kg) - 1e-9) best = v;
    return best;
  }
  const stepKg = steps.unit === 'lb' ? steps.step * KG_PER_LB : steps.step;
  if (!isFiniteNumber(stepKg) || stepKg <= 0) return null;
  const count = Math.max(1, Math.round(kg / stepKg - 1e-9));
  return steps.unit === 'lb' ? count * steps.step * KG_PER_LB : sixDecimals(count * steps.step);
}

/**
 * A % of 1RM load resolved against the athlete's 1RM for this exercise: a real load on its steps. Any
 * other load, or a % with no usable 1RM, is returned as written.
 */
export function resolveLoad(load: PlannedLoad, ex: EngineExercise, baselines: Record<string, number>): PlannedLoad {
  if (load.kind !== 'percent') return load;
  const oneRm = oneRmFor(ex, baselines);
  const kg = plannedKg(load, oneRm);
  if (kg === null) return load;
  const step = nearestStepKg(kg, ex.steps);
  return step === null ? load : loadOnSteps(step, ex.steps);
}

/**
 * The load a % prescription would reach rounded down on the steps (what "not lowered" means): a fitted
 * load at or above it is the prescription, not a change. Null when the load is not a resolvable %.
 */
export function floorOfPrescription(load: PlannedLoad, ex: EngineExercise, baselines: Record<string, number>): number | null {
  const kg = plannedKg(load, oneRmFor(ex, baselines));
  return kg === null ? null : largestFitting(kg, ex.steps);
}

/** "80 kg × 5", "75% × 5", "body weight × 10 at RPE 7" — a planned set in the reader's unit. */
export function setWords(set: Pick<PlannedSetInput, 'reps' | 'load' | 'targetRpe'>, unit: Unit): string {
  const load = set.load;
  const base =
    load.kind === 'percent' ? `${n(load.value)}% of 1RM × ${set.reps}` : loadTimesReps(plannedKg(load, undefined), unit, set.reps);
  return set.targetRpe != null ? `${base} at RPE ${n(set.targetRpe)}` : base;
}

/** The same set (same exercise, reps, load, RPE): fitting changed nothing in it. */
export function sameSet(a: Pick<PlannedSetInput, 'reps' | 'load' | 'targetRpe'>, b: Pick<PlannedSetInput, 'reps' | 'load' | 'targetRpe'>) {
  return (
    a.reps === b.reps &&
    (a.targetRpe ?? null) === (b.targetRpe ?? null) &&
    a.load.kind === b.load.kind &&
    (a.load.kind === 'bodyweight' || a.load.value === (b.load as { value: number }).value)
  );
}

/** Half RPE steps, rounded down: a target RPE lowered to a cap stays on the scale the schema accepts. */
export const rpeAtOrBelow = (cap: number) => Math.floor(cap * 2 + 1e-9) / 2;
