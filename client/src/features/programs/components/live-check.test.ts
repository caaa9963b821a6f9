import { describe, expect, it } from 'vitest';
import type { EngineExercise } from '../../../../../policies/load/compliance';
import type { ExerciseDto } from '../../../../../policies/dto';
import { inForceOn } from '../../../../../policies/load/in-force';
import { suggestSwaps } from '../../../../../policies/load/compliance';
import { engineLibrary, liveBreaches, type AthleteEngine } from './live-check';

const SQUAT: EngineExercise = {
  id: 'squat',
  name: 'Back squat',
  patterns: ['squat'],
  ballistic: false,
  steps: { kind: 'increment', step: 2.5, unit: 'kg' },
  referenceId: null,
};
const session = (date: string) => ({
  id: 's1',
  date,
  content: {
    exercises: [
      { id: 'e1', exerciseId: 'squat', sets: [{ id: 'set-1', reps: 5, load: { kind: 'kg' as const, value: 60 }, targetRpe: 6 }] },
    ],
  },
});

// Out from 1 Dec with no plan yet; on 2 Dec the clinician decided "limited from 8 Dec".
const athlete: AthleteEngine = {
  athleteId: 'a1',
  athleteName: 'Sam',
  status: 'out',
  oneRms: { squat: 100 },
  published: [],
  plans: [],
  statusChanges: [
    { caseId: 'c1', status: 'out', effectiveFrom: '2026-12-01', createdAt: '2026-12-01T09:00:00.000Z' },
    { caseId: 'c1', status: 'limited', effectiveFrom: '2026-12-08', createdAt: '2026-12-02T09:00:00.000Z' },
  ],
};

describe("the live check uses the status of each set's own date, as the server does", () => {
  const run = (date: string, engine: AthleteEngine = athlete) =>
    liveBreaches({ session: session(date), engine, exercises: { squat: SQUAT }, unit: 'kg' }).map((b) => b.rule);

  it('refuses a session while the athlete is out', () => {
    expect(run('2026-12-05')).toContain('status_out');
  });

  it('does not call a session after the status changes "out"', () => {
    expect(run('2026-12-09')).not.toContain('status_out');
  });

  it("falls back to today's status when no history is loaded", () => {
    const { statusChanges: _unused, ...withoutHistory } = athlete;
    expect(run('2026-12-09', withoutHistory)).toContain('status_out');
  });
});

describe('the editor’s swap suggestions', () => {
  const dto = (id: string, name: string, patterns: ExerciseDto['patterns'], useInstead: string[] = []): ExerciseDto => ({
    id,
    name,
    patterns,
    equipment: 'barbell',
    ballistic: false,
    steps: { kind: 'increment', step: 2.5, unit: 'kg' },
    referenceId: null,
    useInstead,
    archived: false,
    version: 1,
  });

  it('carry the library’s "use instead" list, so a blocked exercise offers it first and a no-pattern exercise only through it', () => {
    const library = engineLibrary([
      dto('sq', 'Back squat', ['squat'], ['bike']),
      dto('fs', 'Front squat', ['squat']),
      dto('lp', 'Leg press', ['squat']),
      dto('bike', 'Bike intervals', []),
      dto('row', 'Rower', []),
    ]);
    const day = inForceOn([], '2026-12-01');
    expect(library.sq.useInstead).toEqual(['bike']);
    expect(suggestSwaps(library.sq, Object.values(library), day).map((e) => e.name)).toEqual([
      'Bike intervals',
      'Front squat',
      'Leg press',
    ]);
    expect(suggestSwaps(library.fs, Object.values(library), day).map((e) => e.name)).toEqual(['Back squat', 'Leg press']);
  });
});
