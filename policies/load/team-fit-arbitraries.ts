import fc from 'fast-check';
import { ex, library } from './compliance-fixtures';
import { loadArb } from './engine-arbitraries';
import type { SessionContent } from '../schemas/programs';

/** fast-check arbitraries of the team fitting's inputs, shared by its property tests. */

export const lib = [
  ...library.map((e) => (e.id === 'sq' ? { ...e, useInstead: ['lp', 'bike'] } : e)),
  ex('spr', 'Flying sprint', ['sprint'], { ballistic: true, useInstead: ['bike'] }),
  ex('bike', 'Bike intervals', []),
  ex('lp', 'Leg press', ['squat'], { steps: { kind: 'increment', step: 5, unit: 'lb' } }),
  ex('gob', 'Goblet squat', ['squat'], { steps: { kind: 'list', valuesKg: [8, 12, 16, 20, 24] } }),
];
export const exercises = Object.fromEntries(lib.map((e) => [e.id, e]));
/** Without the one exercise with no pattern, a blocked pattern may leave nothing to swap to: the set is dropped. */
export const withoutBike = Object.fromEntries(lib.filter((e) => e.id !== 'bike').map((e) => [e.id, e]));
export const uuid = (k: number) => `00000000-0000-4000-8000-${String(k).padStart(12, '0')}`;
export const TEAM_ID = uuid(999_999);
export const teamArb = fc
  .record({
    day: fc.integer({ min: 0, max: 24 }),
    rows: fc.array(
      fc.record({
        exerciseId: fc.constantFrom(...lib.map((e) => e.id)),
        sets: fc.array(
          fc.record({
            reps: fc.integer({ min: 1, max: 40 }),
            load: loadArb,
            targetRpe: fc.option(fc.constantFrom(4, 5.5, 6, 7, 8, 9, 10), { nil: null }),
            warmUp: fc.boolean(),
          }),
          { minLength: 1, maxLength: 6 },
        ),
      }),
      { maxLength: 6 },
    ),
  })
  .map(({ day, rows }) => {
    let k = 0;
    const content: SessionContent = {
      exercises: rows.map((r) => ({
        id: uuid(k++),
        exerciseId: r.exerciseId,
        sets: r.sets.map(({ warmUp, ...s }) => ({ id: uuid(k++), ...s, ...(warmUp ? { warmUp } : {}) })),
      })),
    };
    return {
      id: TEAM_ID,
      date: new Date(Date.UTC(2026, 2, 2 + day)).toISOString().slice(0, 10),
      content,
    };
  });

/** The athlete's other sets: hard sets of the same exercises across the three weeks, in other sessions. */
export const othersArb = fc.array(
  fc.record({ day: fc.integer({ min: 0, max: 24 }), exerciseId: fc.constantFrom(...lib.map((e) => e.id)), rpe: fc.constantFrom(6, 8) }),
  { maxLength: 12 },
);
