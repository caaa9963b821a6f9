import { describe, expect, it } from 'vitest';
import type { FitChange } from '../../../../../policies/load/team-fit-types';
import type { SessionContent } from '../../../../../policies/schemas/programs';
import { versionLines } from './version-lines';

const row = (id: string, exerciseId: string, setIds: string[]): SessionContent['exercises'][number] => ({
  id,
  exerciseId,
  sets: setIds.map((s) => ({ id: s, reps: 5, load: { kind: 'percent', value: 75 } })),
});
const team: SessionContent = { exercises: [row('r1', 'squat', ['s1']), row('r2', 'sprint', ['s2', 's3']), row('r3', 'deadlift', ['s4'])] };
const dropped = (teamSetId: string | null, rowId = 'r2'): FitChange => ({
  kind: 'dropped',
  teamExerciseRowId: rowId,
  teamSetId,
  exerciseId: 'sprint',
  before: '1 × BW',
  after: null,
  note: 'Sprint blocked',
});

describe('versionLines', () => {
  it('pairs a fitted version row by row, skipping a row whose every set was dropped', () => {
    const mine: SessionContent = { exercises: [row('m1', 'squat', ['x1']), row('m3', 'deadlift', ['x4'])] };
    const lines = versionLines(team, mine, [dropped('s2'), dropped('s3')], false);
    expect(lines.map((l) => [l.team?.id ?? null, l.mine?.id ?? null, l.changes.length])).toEqual([
      ['r1', 'm1', 0],
      ['r2', null, 2],
      ['r3', 'm3', 0],
    ]);
  });

  it('keeps a row with only some sets dropped beside its version', () => {
    const mine: SessionContent = { exercises: [row('m1', 'squat', ['x1']), row('m2', 'sprint', ['x2']), row('m3', 'deadlift', ['x4'])] };
    const lines = versionLines(team, mine, [dropped('s3')], false);
    expect(lines.map((l) => l.mine?.id)).toEqual(['m1', 'm2', 'm3']);
  });

  it('lists a hand-edited version after the team session, unpaired', () => {
    const mine: SessionContent = { exercises: [row('m9', 'bike', ['x9'])] };
    const lines = versionLines(team, mine, [], true);
    expect(lines.map((l) => [l.team?.id ?? null, l.mine?.id ?? null])).toEqual([
      ['r1', null],
      ['r2', null],
      ['r3', null],
      [null, 'm9'],
    ]);
  });
});
