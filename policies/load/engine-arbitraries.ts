import fc from 'fast-check';
import type { EngineExercise } from './exercise-rules';
import { plan, stage } from './compliance-fixtures';
import { MOVEMENT_PATTERNS } from './patterns';

/** fast-check arbitraries of the engine's inputs, shared by the property tests (compliance and team fitting). */

export const capsArb = fc.record(
  {
    maxPercent1RM: fc.integer({ min: 40, max: 90 }),
    maxLoadKg: fc.integer({ min: 20, max: 150 }),
    maxRpe: fc.constantFrom(6, 7, 8, 9),
    maxSetsPerSession: fc.integer({ min: 1, max: 5 }),
    maxRepsPerSet: fc.integer({ min: 3, max: 12 }),
    maxHardSetsPerWeek: fc.integer({ min: 0, max: 8 }),
    impactAllowed: fc.boolean(),
  },
  { requiredKeys: [] },
);

export const ruleArb = fc.oneof(
  fc.constant({ mode: 'blocked' as const }),
  fc.constant({ mode: 'free' as const }),
  capsArb.map((caps) => ({ mode: 'capped' as const, caps })),
);

/** One plan of one stage, 2–22 March 2026, with rules for up to `max` patterns (five unless told). */
export const plansOf = (min = 0, max = 5) =>
  fc
    .array(fc.tuple(fc.constantFrom(...MOVEMENT_PATTERNS), ruleArb), { minLength: min, maxLength: max })
    .map((entries) => plan(stage(Object.fromEntries(entries), '2026-03-02', '2026-03-22')));
export const plansArb = plansOf();

export const loadArb = fc.oneof(
  fc.integer({ min: 0, max: 200 }).map((v) => ({ kind: 'kg' as const, value: v })),
  fc.integer({ min: 0, max: 400 }).map((v) => ({ kind: 'lb' as const, value: v })),
  fc.integer({ min: 30, max: 100 }).map((v) => ({ kind: 'percent' as const, value: v })),
  fc.constant({ kind: 'bodyweight' as const }),
);

export const baselinesArb = (library: EngineExercise[]) =>
  fc.dictionary(fc.constantFrom(...library.map((e) => e.id)), fc.integer({ min: 40, max: 250 }));
