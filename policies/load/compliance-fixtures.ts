import type { EngineContext } from './compliance';
import type { Breach } from './breach';
import type { EngineExercise } from './exercise-rules';
import type { PlanInput, PlanStage } from './in-force';
import type { EngineSet } from './sets';
import { KETTLEBELL_KG } from './steps';

/** Shared by the compliance-*.test.ts files: a small library, a four-week stage from Monday 2 March 2026, sets and context. */
export const kg25 = { kind: 'increment' as const, step: 2.5, unit: 'kg' as const };
export const ex = (id: string, name: string, patterns: EngineExercise['patterns'], more: Partial<EngineExercise> = {}): EngineExercise => ({
  id,
  name,
  patterns,
  ballistic: false,
  steps: kg25,
  ...more,
});
export const deadlift = ex('dl', 'Deadlift', ['hinge']);
export const rdl = ex('rdl', 'Romanian deadlift', ['hinge'], { referenceId: 'dl' });
export const squat = ex('sq', 'Back squat', ['squat']);
export const trapBar = ex('tb', 'Trap-bar deadlift', ['hinge', 'squat']);
export const sumo = ex('sumo', 'Sumo deadlift', ['hinge', 'squat']);
export const bench = ex('bp', 'Bench press', ['horizontal_push']);
export const benchLb = ex('bplb', 'Bench press (lb plates)', ['horizontal_push'], { steps: { kind: 'increment', step: 5, unit: 'lb' } });
export const boxJump = ex('bj', 'Box jump', ['jump'], { ballistic: true });
export const kbSwing = ex('kbs', 'Kettlebell swing', ['swing', 'hinge'], {
  ballistic: true,
  steps: { kind: 'list', valuesKg: KETTLEBELL_KG },
});
export const library = [deadlift, rdl, squat, trapBar, sumo, bench, benchLb, boxJump, kbSwing];
export const exercises = Object.fromEntries(library.map((e) => [e.id, e]));

export const stage = (patterns: PlanStage['patterns'], startDate = '2026-03-02', endDate = '2026-03-29'): PlanStage => ({
  id: `${startDate}`,
  startDate,
  endDate,
  painCeiling: 5,
  patterns,
});
export const plan = (...stages: PlanStage[]): PlanInput[] => [{ planId: 'p', caseId: 'c', version: 1, stages }];
let nextId = 0;
export const set = (over: Partial<EngineSet> = {}): EngineSet => ({
  id: `s${nextId++}`,
  sessionId: 'mon',
  date: '2026-03-02',
  exerciseId: 'dl',
  reps: 5,
  load: { kind: 'kg', value: 60 },
  targetRpe: 6,
  order: 0,
  ...over,
});
export const ctx = (plans: PlanInput[], baselines: Record<string, number> = {}, more: Partial<EngineContext> = {}): EngineContext => ({
  plans,
  exercises,
  baselines,
  ...more,
});
export const rules = (bs: Breach[]) => bs.map((b) => b.rule);
export const hinge60 = plan(stage({ hinge: { mode: 'capped', caps: { maxPercent1RM: 60 } } }));
