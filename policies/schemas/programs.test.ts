import { describe, expect, it } from 'vitest';
import fc from 'fast-check';
import { z } from 'zod';
import { ExerciseCreateSchema, ExerciseUpdateSchema, ProgramUpdateSchema, SessionUpdateSchema } from './programs';

const ID = '11111111-1111-4111-8111-111111111111';

/** One valid value per field of each update schema (version aside). */
const FULL = {
  exercise: {
    schema: ExerciseUpdateSchema,
    values: {
      name: 'Pin squat',
      patterns: ['squat', 'hinge'],
      equipment: 'barbell',
      ballistic: true,
      steps: { kind: 'increment', step: 2.5, unit: 'kg' },
      referenceId: ID,
      archived: true,
    },
  },
  program: { schema: ProgramUpdateSchema, values: { name: 'Block', athleteIds: [ID] } },
  session: {
    schema: SessionUpdateSchema,
    values: { date: '2026-12-03', title: 'Day', content: { exercises: [] } },
  },
} as const;

describe('update schemas write exactly the keys they were sent', () => {
  for (const [what, { schema, values }] of Object.entries(FULL) as [string, { schema: z.ZodType; values: Record<string, unknown> }][]) {
    it(`${what}: any subset of fields parses to that subset and the version, nothing added`, () => {
      fc.assert(
        fc.property(fc.subarray(Object.keys(values)), (keys) => {
          const sent = { ...Object.fromEntries(keys.map((k) => [k, values[k]])), version: 3 };
          const parsed = schema.parse(sent) as Record<string, unknown>;
          expect(Object.keys(parsed).sort()).toEqual(Object.keys(sent).sort());
        }),
      );
    });
  }

  it('an archive or restore is { archived, version } and nothing else (the patterns default of create is not inherited)', () => {
    expect(ExerciseUpdateSchema.parse({ archived: true, version: 2 })).toEqual({ archived: true, version: 2 });
    expect(ExerciseUpdateSchema.parse({ archived: false, version: 3 })).toEqual({ archived: false, version: 3 });
    // Why the update is not `ExerciseCreateSchema.partial()`: zod keeps a default through `.partial()`.
    const derived = ExerciseCreateSchema.partial().extend({ archived: z.boolean().optional() });
    expect(derived.parse({ archived: true })).toEqual({ archived: true, patterns: [], useInstead: [] });
  });

  it('create still fills patterns with [] when none are named, and the update accepts every field create does', () => {
    const created = ExerciseCreateSchema.parse({
      name: 'Carry',
      equipment: 'dumbbell',
      ballistic: false,
      steps: { kind: 'increment', step: 2, unit: 'kg' },
    });
    expect(created.patterns).toEqual([]);
    expect(created.useInstead).toEqual([]);
    expect(Object.keys(ExerciseUpdateSchema.shape).sort()).toEqual(
      [...Object.keys(ExerciseCreateSchema.shape), 'archived', 'version'].sort(),
    );
  });

  it('an update refuses unknown keys and a missing version, as every update does', () => {
    expect(ExerciseUpdateSchema.safeParse({ archived: true }).success).toBe(false);
    expect(ExerciseUpdateSchema.safeParse({ archived: true, version: 1, deleted: true }).success).toBe(false);
    expect(ExerciseUpdateSchema.safeParse({ patterns: ['not_a_pattern'], version: 1 }).success).toBe(false);
  });
});
