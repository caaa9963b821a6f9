/**
 * Engine timing: a 16-week program (~2,000 planned sets) checked against a 4-stage plan, and the
 * same at other sizes to show the time grows linearly. Reported, never asserted.
 */
import { randomUUID } from 'node:crypto';
import { checkSets, type EngineContext, type EngineExercise, type EngineSet } from '../policies/load/compliance';
import type { PlanStage } from '../policies/load/in-force';
import { MOVEMENT_PATTERNS } from '../policies/load/patterns';

const exercises: EngineExercise[] = MOVEMENT_PATTERNS.map((p, i) => ({
  id: `ex${i}`,
  name: `Exercise ${i}`,
  patterns: [p, MOVEMENT_PATTERNS[(i + 3) % MOVEMENT_PATTERNS.length]],
  ballistic: i % 4 === 0,
  steps: { kind: 'increment', step: 2.5, unit: 'kg' },
}));
const start = new Date('2027-01-04T00:00:00Z');
const day = (n: number) => new Date(start.getTime() + n * 86_400_000).toISOString().slice(0, 10);
/** 'strict': most sets breach (every message is built); 'typical': a loose plan most sets fit. */
export type Variant = 'strict' | 'typical';
function stagesFor(variant: Variant): PlanStage[] {
  return [0, 1, 2, 3].map((k) => ({
    id: randomUUID(),
    startDate: day(k * 28),
    endDate: day(k * 28 + 27),
    painCeiling: 5,
    patterns: Object.fromEntries(
      MOVEMENT_PATTERNS.map((p, i) => [
        p,
        variant === 'strict'
          ? i % 5 === 0
            ? { mode: 'blocked' }
            : {
                mode: 'capped',
                caps: {
                  maxPercent1RM: 60 + k * 10,
                  maxRpe: 7 + k * 0.5,
                  maxSetsPerSession: 6,
                  maxHardSetsPerWeek: 12,
                  impactAllowed: k > 1,
                },
              }
          : i === 12 && k === 0
            ? { mode: 'blocked' }
            : { mode: 'capped', caps: { maxPercent1RM: 95, maxLoadKg: 200, maxRpe: 10, maxSetsPerSession: 40, maxHardSetsPerWeek: 200 } },
      ]),
    ),
  }));
}
const ctxFor = (variant: Variant): EngineContext => ({
  plans: [{ planId: 'p', caseId: 'c', version: 1, stages: stagesFor(variant) }],
  exercises: Object.fromEntries(exercises.map((e) => [e.id, e])),
  baselines: Object.fromEntries(exercises.map((e) => [e.id, 100 + Number(e.id.slice(2)) * 5])),
});

/** Four sessions a week, each with ~31 sets: 16 weeks ≈ 2,000 sets. */
export function program(weeks: number): EngineSet[] {
  const sets: EngineSet[] = [];
  for (let w = 0; w < weeks; w++) {
    for (const d of [0, 1, 3, 4]) {
      const sessionId = `w${w}d${d}`;
      for (let k = 0; k < 31; k++) {
        sets.push({
          id: `${sessionId}s${k}`,
          sessionId,
          date: day(w * 7 + d),
          exerciseId: `ex${k % exercises.length}`,
          reps: 3 + (k % 8),
          load: k % 3 === 0 ? { kind: 'percent', value: 55 + (k % 30) } : { kind: 'kg', value: 40 + (k % 20) * 5 },
          targetRpe: k % 2 ? 6 + (k % 4) : null,
          order: k,
        });
      }
    }
  }
  return sets;
}

export function timeEngine(
  weeks: number,
  variant: Variant = 'typical',
  runs = 60,
): { sets: number; breaches: number; medianMs: number; p95Ms: number } {
  const sets = program(weeks);
  const ctx = ctxFor(variant);
  let breaches = 0;
  for (let i = 0; i < 10; i++) breaches = checkSets(sets, ctx).length;
  const times: number[] = [];
  for (let i = 0; i < runs; i++) {
    const t0 = performance.now();
    checkSets(sets, ctx);
    times.push(performance.now() - t0);
  }
  times.sort((a, b) => a - b);
  return { sets: sets.length, breaches, medianMs: times[Math.floor(runs / 2)], p95Ms: times[Math.floor(runs * 0.95)] };
}

if (import.meta.url === `file://${process.argv[1]}`) {
  // Warm the JIT on the largest case first, so the small sizes are not measured cold.
  for (const variant of ['typical', 'strict'] as const) timeEngine(64, variant, 30);
  for (const variant of ['typical', 'strict'] as const)
    for (const weeks of [4, 8, 16, 32, 64]) {
      const r = timeEngine(weeks, variant);
      console.log(
        `${variant.padEnd(8)} ${String(weeks).padStart(3)} weeks  ${String(r.sets).padStart(6)} sets  ${r.breaches} breaches  median ${r.medianMs.toFixed(2)} ms  p95 ${r.p95Ms.toFixed(2)} ms  (${((r.medianMs / r.sets) * 1000).toFixed(2)} µs/set)`,
      );
    }
}
