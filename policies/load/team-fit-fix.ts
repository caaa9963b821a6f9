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
  // The set's breaches read in one pass, without closures: this runs for every blocked set of a squad.
  let unreadable = !ex;
  let swap = false;
  let counted = false;
  let repCap: Breach | undefined;
  let loads: Breach[] | null = null;
  for (const b of bs) {
    if (b.rule === 'unreadable' || b.rule === 'status_out') unreadable = true;
    else if (SWAP_RULES.has(b.rule)) swap = true;
    else if (b.rule === 'reps_per_set') repCap ??= b;
    else if (LOAD_RULES.has(b.rule)) (loads ??= []).push(b);
    else if (COUNT_RULES.has(b.rule)) counted = true;
  }
  if (unreadable || !ex) {
    drop(slot, bs.map(noteOf));
    return 'fixed';
  }
  if (swap) return 'swap';
  const rules = prepared && stages ? prepared.rulesFor(stages, ex) : undefined;
  let next: PlannedSetInput;
  let notes: string[];
  if (repCap) {
    const capValue = rules?.reps?.value;
    if (capValue === undefined || capValue === null || !(capValue >= 1)) return 'swap';
    next = { ...set, reps: Math.min(set.reps, Math.floor(capValue)) };
    slot.repsCut = true;
    notes = [noteOf(repCap)];
  } else if (loads !== null) {
    const fix = loadFix(set, loads, ex, ctx, rules);
    if (fix === null) return 'swap';
    if (fix.reps < set.reps) slot.repsCut = true;
    next = fix;
    notes = loads.map(noteOf);
  } else {
    if (!counted || !onlyCounts) return 'none';
    const cut: string[] = [];
    for (const b of bs) if (COUNT_RULES.has(b.rule)) cut.push(noteOf(b));
    slot.set = null;
    slot.removed = 'sets_cut';
    addNotes(slot, cut);
    return 'fixed';
  }
  slot.set = next;
  addNotes(slot, notes);
  return 'fixed';
}

/** (a) and the reps part of (b) for the load caps: the engine's fit, a lower target RPE, or a lower %. Null when no load fits. */
function loadFix(
  set: PlannedSetInput,
  loads: Breach[],
  ex: EngineExercise,
  ctx: EngineContext,
  rules: ExerciseRules | undefined,
): PlannedSetInput | null {
  // The lightest of the engine's fits, at the fewest reps any of them needs.
  let kg: number | null = null;
  let reps = set.reps;
  let onlyRpe = true;
  for (const b of loads) {
    if (b.rule !== 'rpe') onlyRpe = false;
    if (b.fittingKg === null) continue;
    kg = kg === null ? b.fittingKg : Math.min(kg, b.fittingKg);
    reps = Math.min(reps, b.fittingReps ?? set.reps);
  }
  if (kg !== null) return { ...set, reps, load: loadOnSteps(kg, ex.steps) };
  const rpeCap = rules?.rpe?.value;
  if (onlyRpe && rpeCap !== undefined && rpeCap >= 1) {
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
