import { randomUUID } from 'node:crypto';
import { describe, expect, it } from 'vitest';
import type { ExerciseDto } from '../../../../policies/dto';
import { MAX_USE_INSTEAD } from '../../../../policies/schemas/programs';
import { DEFAULT_LIBRARY, DEFAULT_USE_INSTEAD } from '../../services/exercise-library';
import { useHarness } from '../../test/harness';
import { MONDAY, teamWorld } from '../../test/worlds/team-world';
import { addDays, createOrg, pinClock, programWorld } from '../../test/worlds/test-world';

/**
 * Team programming keeps a "use instead" relation in the library. An exercise names, in order, library
 * exercises to use when it is not allowed; the team fitting tries them before dropping a set. The
 * starter relations are common practice (see DEFAULT_USE_INSTEAD), not a published rule.
 */
describe('the library’s "use instead" relation', () => {
  const h = useHarness();
  pinClock();

  const newExercise = (extra: object = {}) => ({
    name: `Pin squat ${randomUUID().slice(0, 6)}`,
    patterns: ['squat'],
    equipment: 'barbell',
    ballistic: false,
    steps: { kind: 'increment', step: 2.5, unit: 'kg' },
    ...extra,
  });

  it('the starter relations name only exercises of the starter library, at most six each, never themselves', () => {
    const names = new Set(DEFAULT_LIBRARY.map(([name]) => name));
    for (const [name, instead] of Object.entries(DEFAULT_USE_INSTEAD)) {
      expect(names.has(name), name).toBe(true);
      expect(instead.length, name).toBeLessThanOrEqual(MAX_USE_INSTEAD);
      expect(new Set(instead).size, name).toBe(instead.length);
      expect(instead, name).not.toContain(name);
      for (const other of instead) expect(names.has(other), `${name} → ${other}`).toBe(true);
    }
  });

  it('is seeded in order with the library: non-impact conditioning without a loaded pattern, sprint → bike → arm bike, swing → RDL → hip thrust', async () => {
    const w = await programWorld(h);
    const lib = (await w.coach.get(`${w.base}/exercises`)).body as ExerciseDto[];
    const by = (name: string) => lib.find((e) => e.name === name)!;
    for (const name of ['Bike intervals', 'Rowing machine intervals', 'Arm bike intervals'])
      expect(by(name), name).toMatchObject({ patterns: [], ballistic: false, equipment: 'machine' });
    const ids = (...names: string[]) => names.map((n) => by(n).id);
    expect(by('Sprint 20 m').useInstead).toEqual(ids('Bike intervals', 'Arm bike intervals'));
    expect(by('Bike intervals').useInstead).toEqual(ids('Arm bike intervals'));
    expect(by('Box jump').useInstead[0]).toBe(by('Bike intervals').id);
    expect(by('Kettlebell swing').useInstead).toEqual(ids('Romanian deadlift', 'Hip thrust'));
    expect(by('Romanian deadlift').useInstead).toEqual(ids('Hip thrust'));
    expect(by('Medicine ball rotational throw').useInstead).toEqual(ids('Pallof press', 'Dead bug'));
    expect(by('Pallof press').useInstead).toEqual(ids('Dead bug'));
    expect(by('Back squat').useInstead).toEqual([]);
  });

  it('a coach sets it on create and edit, in the order given; the edit is audited with the list before and after', async () => {
    const w = await programWorld(h);
    const created = await w.coach.post(`${w.base}/exercises`, newExercise({ useInstead: [w.ex('Goblet squat'), w.ex('Box squat')] }));
    expect(created.status, JSON.stringify(created.body)).toBe(201);
    expect(created.body.useInstead).toEqual([w.ex('Goblet squat'), w.ex('Box squat')]);
    expect((await w.coach.post(`${w.base}/exercises`, newExercise())).body.useInstead).toEqual([]);

    const edited = await w.coach.patch(`${w.base}/exercises/${created.body.id}`, {
      useInstead: [w.ex('Box squat'), w.ex('Split squat'), w.ex('Goblet squat')],
      version: 1,
    });
    expect(edited.status, JSON.stringify(edited.body)).toBe(200);
    expect(edited.body).toMatchObject({ version: 2, useInstead: [w.ex('Box squat'), w.ex('Split squat'), w.ex('Goblet squat')] });
    const listed = ((await w.coach.get(`${w.base}/exercises`)).body as ExerciseDto[]).find((e) => e.id === created.body.id)!;
    expect(listed.useInstead).toEqual(edited.body.useInstead);
    const [entry] = await w.audit('exercise.updated', created.body.id);
    expect(entry.before).toEqual({ useInstead: [w.ex('Goblet squat'), w.ex('Box squat')] });
    expect(entry.after).toEqual({ useInstead: edited.body.useInstead });

    // Emptying it is allowed; a stale version is 409 as for any edit.
    expect((await w.coach.patch(`${w.base}/exercises/${created.body.id}`, { useInstead: [], version: 2 })).body.useInstead).toEqual([]);
    expect((await w.coach.patch(`${w.base}/exercises/${created.body.id}`, { useInstead: [], version: 2 })).status).toBe(409);
  });

  it('bad lists are a 400 naming useInstead: more than six, twice the same, not an id, unknown, another organization’s, itself, newly archived', async () => {
    const w = await programWorld(h);
    const other = await createOrg(h.ds);
    const theirs = ((await (await w.as(other.coach)).get(`/api/orgs/${other.id}/exercises`)).body as ExerciseDto[])[0];
    const squat = w.ex('Back squat');
    const seven = ['Front squat', 'Goblet squat', 'Box squat', 'Split squat', 'Walking lunge', 'Step-up', 'Trap-bar deadlift'].map(w.ex);
    const cases: [object, RegExp][] = [
      [{ useInstead: seven }, /at most 6/],
      [{ useInstead: [squat, squat] }, /twice/],
      [{ useInstead: ['bike'] }, /valid id/],
      [{ useInstead: [randomUUID()] }, /exercises of this library/],
      [{ useInstead: [squat, theirs.id] }, /exercises of this library/],
    ];
    for (const [extra, message] of cases) {
      const res = await w.coach.post(`${w.base}/exercises`, newExercise(extra));
      expect(res.status, JSON.stringify(extra)).toBe(400);
      expect(
        Object.keys(res.body.error.fields).some((f) => f.startsWith('useInstead')),
        JSON.stringify(res.body),
      ).toBe(true);
      expect(JSON.stringify(res.body.error.fields)).toMatch(message);
    }
    const front = w.lib.find((e) => e.name === 'Front squat')!;
    const self = await w.coach.patch(`${w.base}/exercises/${front.id}`, { useInstead: [squat, front.id], version: front.version });
    expect(self.status).toBe(400);
    expect(self.body.error.fields).toEqual({ useInstead: ['cannot name the exercise itself'] });
    // Another organization's exercise reads as unknown, and its own list is untouched.
    const cross = await w.coach.patch(`${w.base}/exercises/${front.id}`, { useInstead: [theirs.id], version: front.version });
    expect(cross.body.error.fields).toEqual({ useInstead: ['must name exercises of this library'] });

    // Archived: not newly named, but one named before it was archived may stay (an edit still sends the list).
    const goblet = w.lib.find((e) => e.name === 'Goblet squat')!;
    expect((await w.coach.patch(`${w.base}/exercises/${front.id}`, { useInstead: [goblet.id], version: front.version })).status).toBe(200);
    expect((await w.coach.patch(`${w.base}/exercises/${goblet.id}`, { archived: true, version: goblet.version })).status).toBe(200);
    const kept = await w.coach.patch(`${w.base}/exercises/${front.id}`, {
      name: 'Front squat (clean grip)',
      useInstead: [goblet.id],
      version: 2,
    });
    expect(kept.status, JSON.stringify(kept.body)).toBe(200);
    const added = await w.coach.post(`${w.base}/exercises`, newExercise({ useInstead: [goblet.id] }));
    expect(added.status).toBe(400);
    expect(added.body.error.fields).toEqual({ useInstead: ['must not name an archived exercise'] });
  });

  it('only roles that edit the library set it (an athlete is refused)', async () => {
    const w = await programWorld(h);
    const sprint = w.lib.find((e) => e.name === 'Sprint 20 m')!;
    const athlete = await w.as(w.org.athlete);
    const res = await athlete.patch(`${w.base}/exercises/${sprint.id}`, { useInstead: [], version: sprint.version });
    expect(res.status).toBe(403);
  });

  describe('in the team fitting', () => {
    it('a blocked sprint becomes the first allowed exercise to use instead (bike intervals), not a dropped set', async () => {
      const w = await teamWorld(h);
      const sprint = w.lib.find((e) => e.name === 'Sprint 20 m')!;
      // The squad world empties the sprint's list; put the starter library's back.
      const set = await w.coach.patch(`${w.base}/exercises/${sprint.id}`, {
        useInstead: [w.ex('Bike intervals'), w.ex('Arm bike intervals')],
        version: sprint.version,
      });
      expect(set.status, JSON.stringify(set.body)).toBe(200);
      const p = await w.createProgram();
      const team = await w.addSession(p.id);
      const g = await w.grid(p.id);
      expect(w.cell(g, w.sprint).state).toBe('fitted');
      const v = await w.version(team.id, w.sprint);
      const rows = v.version.content.exercises.map((e) => e.exerciseId);
      expect(rows).toContain(w.ex('Bike intervals'));
      expect(rows).not.toContain(w.ex('Sprint 20 m'));
      const swaps = v.changes.filter((c) => c.kind === 'swapped');
      expect(swaps).toHaveLength(4);
      expect(swaps.every((c) => c.swappedToExerciseId === w.ex('Bike intervals'))).toBe(true);
      expect(v.changes.some((c) => c.kind === 'dropped')).toBe(false);
      expect(v.breaches).toEqual([]);
      // The athlete without limits keeps the sprint as written.
      const plain = await w.version(team.id, w.plainAthlete.membershipId);
      expect(plain.version.content.exercises.map((e) => e.exerciseId)).toContain(w.ex('Sprint 20 m'));
      expect(plain.changes).toEqual([]);
    });

    it('follows the coach’s order, and skips an exercise archived since it was named', async () => {
      const w = await teamWorld(h);
      const sprint = w.lib.find((e) => e.name === 'Sprint 20 m')!;
      const arm = w.lib.find((e) => e.name === 'Arm bike intervals')!;
      expect(
        (
          await w.coach.patch(`${w.base}/exercises/${sprint.id}`, {
            useInstead: [arm.id, w.ex('Bike intervals')],
            version: sprint.version,
          })
        ).status,
      ).toBe(200);
      const p = await w.createProgram();
      const first = await w.addSession(p.id);
      const armFirst = await w.version(first.id, w.sprint);
      expect(armFirst.changes.filter((c) => c.kind === 'swapped').map((c) => c.swappedToExerciseId)).toEqual(
        [1, 2, 3, 4].map(() => arm.id),
      );

      expect((await w.coach.patch(`${w.base}/exercises/${arm.id}`, { archived: true, version: arm.version })).status).toBe(200);
      const second = await w.addSession(p.id, w.squadContent(), addDays(MONDAY, 2));
      const bike = await w.version(second.id, w.sprint);
      expect(bike.changes.filter((c) => c.kind === 'swapped').map((c) => c.swappedToExerciseId)).toEqual(
        [1, 2, 3, 4].map(() => w.ex('Bike intervals')),
      );
    });
  });
});
