import { describe, expect, it } from 'vitest';
import { setsFromPlan } from './from-plan';

const session = {
  exerciseNames: { dl: 'Deadlift', pu: 'Push-up', rdl: 'Romanian deadlift' },
  loadsKg: { a: 40, b: 95 * 0.45359237, c: null, d: null },
  content: {
    exercises: [
      {
        id: 'e1',
        exerciseId: 'dl',
        sets: [
          { id: 'a', reps: 5, load: { kind: 'kg' as const, value: 40 }, targetRpe: 6 },
          { id: 'b', reps: 3, load: { kind: 'lb' as const, value: 95 } },
        ],
      },
      { id: 'e2', exerciseId: 'pu', sets: [{ id: 'c', reps: 10, load: { kind: 'bodyweight' as const } }] },
      { id: 'e3', exerciseId: 'rdl', sets: [{ id: 'd', reps: 8, load: { kind: 'percent' as const, value: 50 } }] },
    ],
  },
};

describe('"Log this session": the form starts from the planned sets', () => {
  it('in kg: every set in order with its library exercise, reps and target RPE; body weight is 0; a % with no best lift is left to type', () => {
    expect(setsFromPlan(session, 'kg')).toEqual([
      { exercise: 'Deadlift', exerciseId: 'dl', load: 40, reps: 5, rpe: 6 },
      // 95 lb = 43.09 kg (NIST SP 811: 1 lb = 0.45359237 kg).
      { exercise: 'Deadlift', exerciseId: 'dl', load: 43.09, reps: 3, rpe: null },
      { exercise: 'Push-up', exerciseId: 'pu', load: 0, reps: 10, rpe: null },
      { exercise: 'Romanian deadlift', exerciseId: 'rdl', load: undefined, reps: 8, rpe: null },
    ]);
  });

  it('in lb: a load planned in lb stays as planned (95, not 94.99…); 40 kg = 88.18 lb (NIST SP 811), loaded as 85 lb (5 lb steps, common practice)', () => {
    expect(setsFromPlan(session, 'lb').map((s) => s.load)).toEqual([85, 95, 0, undefined]);
  });
});
