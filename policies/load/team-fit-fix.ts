import type { PlannedSetInput } from '../schemas/programs';
import type { Breach, BreachRule } from './breach';
import type { EngineContext } from './compliance';
import type { EngineExercise, ExerciseRules } from './exercise-rules';
import { suggestPercent } from './fitting';
import { PATTERN_LABELS } from './patterns';
import type { PreparedRules, StageRules } from './prepared-rules';
import { plannedKg } from './sets';
import { addNotes, type Row, type Slot } from './team-fit-rows';
import { loadOnSteps, oneRmFor, rpeAtOrBelow } from './team-fit-support';

/** One round's fix of one blocked set in the team fitting (team-fit.ts): (a) and (b) of its order, or a swap to ask for. */

const SWAP_RULES = new Set<BreachRule>(['blocked', 'impact', 'no_baseline']);
const LOAD_RULES = new Set<BreachRule>(['percent_1rm', 'absolute_load', 'rpe']);
export const COUNT_RULES = new Set<BreachRule>(['sets_per_session', 'hard_sets_per_week']);

export const noteOf = (b: Breach) => (b.pattern ? `${PATTERN_LABELS[b.pattern]}: ${b.limit}` : b.message);

/** One round's fix of one set; 'swap' when only another exercise can help. */
export function fixSet(
  slot: Slot,
  bs: Breach[],
  row: Row,
  ctx: EngineContext,
  prepared: PreparedRules | undefined,
  stages: StageRules | undefined,
  onlyCounts: boolean,
): 'fixed' | 'swap' | 'none' {
  const set = slot.set!;
  const ex = ctx.exercises[row.exerciseId];
  if (!ex || bs.some((b) => b.rule === 'unreadable' || b.rule === 'status_out')) {
    drop(slot, bs.map(noteOf));
    return 'fixed';
  }
  if (bs.some((b) => SWAP_RULES.has(b.rule))) return 'swap';
  const rules = prepared && stages ? prepared.rulesFor(stages, ex) : undefined;
  let next: PlannedSetInput = { ...set };
  const notes: string[] = [];
  const repCap = bs.find((b) => b.rule === 'reps_per_set');
  const capValue = repCap && rules?.reps?.value;
  if (repCap && capValue !== undefined && capValue !== null && capValue >= 1) {
    next.reps = Math.min(next.reps, Math.floor(capValue));
    slot.repsCut = true;
    notes.push(noteOf(repCap));
  } else if (repCap) return 'swap';
  const loads = bs.filter((b) => LOAD_RULES.has(b.rule));
  if (loads.length > 0 && !repCap) {
    const fix = loadFix(next, loads, ex, ctx, rules);
    if (fix === null) return 'swap';
    if (fix.reps < next.reps) slot.repsCut = true;
    next = fix;
    notes.push(...loads.map(noteOf));
  }
  if (notes.length > 0) {
    slot.set = next;
    addNotes(slot, notes);
    return 'fixed';
  }
  const counts = bs.filter((b) => COUNT_RULES.has(b.rule));
  if (counts.length > 0 && onlyCounts) {
    slot.set = null;
    slot.removed = 'sets_cut';
    addNotes(slot, counts.map(noteOf));
    return 'fixed';
  }
  return 'none';
}

/** (a) and the reps part of (b) for the load caps: the engine's fit, a lower target RPE, or a lower %. Null when no load fits. */
function loadFix(
  set: PlannedSetInput,
  loads: Breach[],
  ex: EngineExercise,
  ctx: EngineContext,
  rules: ExerciseRules | undefined,
): PlannedSetInput | null {
  const withFit = loads.filter((b) => b.fittingKg !== null);
  if (withFit.length > 0) {
    const kg = Math.min(...withFit.map((b) => b.fittingKg!));
    const reps = Math.min(set.reps, ...withFit.map((b) => b.fittingReps ?? set.reps));
    return { ...set, reps, load: loadOnSteps(kg, ex.steps) };
  }
  const rpeCap = rules?.rpe?.value;
  if (loads.every((b) => b.rule === 'rpe') && rpeCap !== undefined && rpeCap >= 1) {
    if (set.targetRpe != null) return { ...set, targetRpe: rpeAtOrBelow(rpeCap) };
    const oneRm = oneRmFor(ex, ctx.baselines);
    if (set.load.kind === 'percent' && oneRm === undefined) {
      const p = suggestPercent(set.reps, rpeCap, rules?.pct?.value ?? null);
      return p && { ...set, reps: p.reps, load: { kind: 'percent', value: p.percent } };
    }
    if (plannedKg(set.load, oneRm) === null || oneRm === undefined) return { ...set, targetRpe: rpeAtOrBelow(rpeCap) };
  }
  return null;
}

export function drop(slot: Slot, notes: string[]) {
  slot.set = null;
  slot.removed = 'dropped';
  addNotes(slot, notes);
}
