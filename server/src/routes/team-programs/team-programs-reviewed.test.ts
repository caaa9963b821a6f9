import { describe, expect, it } from 'vitest';
import { useHarness } from '../../test/harness';
import { pinClock } from '../../test/worlds/test-world';
import { teamWorld } from '../../test/worlds/team-world';

/**
 * Team programming: the coach's acceptance of a version (say of a drop) is part of what the grid and the
 * version screen read, for as long as it holds for the version's current fit.
 */
describe('team programs: a reviewed version stays reviewed while its fit is the same', () => {
  const h = useHarness();
  pinClock();

  it('an accepted drop reads reviewed on the grid and the version, survives a new title, and is cleared by a new fit or a reset', async () => {
    const w = await teamWorld(h);
    const p = await w.createProgram();
    const team = await w.addSession(p.id);
    const patchTeam = (body: object) =>
      w.coach.agent.patch(`${w.base}/team-sessions/${team.id}`).set('x-csrf-token', w.coach.csrf).send(body);

    let g = await w.grid(p.id);
    expect(g.cells.every((c) => c.reviewed === false)).toBe(true);
    const before = await w.version(team.id, w.sprint);
    expect(before).toMatchObject({ state: 'needs_decision', reviewed: false });

    const accepted = await w.versionAction(team.id, w.sprint, 'accept', before.version.version);
    expect(accepted.status, JSON.stringify(accepted.body)).toBe(200);
    expect(accepted.body).toMatchObject({ state: 'needs_decision', reviewed: true });
    // Read again (the screen left and came back): still reviewed, and the grid says so for this cell only.
    expect(await w.version(team.id, w.sprint)).toMatchObject({ reviewed: true });
    g = await w.grid(p.id);
    expect(w.cell(g, w.sprint)).toMatchObject({ state: 'needs_decision', reviewed: true });
    expect(g.cells.filter((c) => c.reviewed).map((c) => c.athleteId)).toEqual([w.sprint]);
    // The floor sheet no longer asks for a decision on that row (its state column says what is left).
    const csv = await w.coach.get(`${w.base}/team-sessions/${team.id}/floor-sheet.csv`);
    expect(csv.status).toBe(200);
    expect(csv.text).toContain('Fitted, part left out');
    expect(csv.text).not.toContain('Needs a decision');

    // A new title alone does not change the fit: the acceptance stands.
    let res = await patchTeam({ version: team.version, title: 'Squad lift A' });
    expect(res.status, JSON.stringify(res.body)).toBe(200);
    expect(w.cell(await w.grid(p.id), w.sprint)).toMatchObject({ state: 'needs_decision', reviewed: true });

    // Two sprints instead of four: a different drop, which the coach has not looked at.
    const content = {
      exercises: team.content.exercises.map((e, i) => (i === 2 ? { ...e, sets: e.sets.slice(0, 2) } : e)),
    };
    res = await patchTeam({ version: res.body.version, content });
    expect(res.status, JSON.stringify(res.body)).toBe(200);
    const refitted = await w.version(team.id, w.sprint);
    expect(refitted).toMatchObject({ state: 'needs_decision', reviewed: false });
    expect(refitted.changes.filter((c) => c.kind === 'dropped')).toHaveLength(2);
    expect(w.cell(await w.grid(p.id), w.sprint).reviewed).toBe(false);

    // Accepted again, then reset: a reset starts the decisions over.
    const again = await w.versionAction(team.id, w.sprint, 'accept', refitted.version.version);
    expect(again.body.reviewed).toBe(true);
    const reset = await w.versionAction(team.id, w.sprint, 'reset', again.body.version.version);
    expect(reset.status, JSON.stringify(reset.body)).toBe(200);
    expect(reset.body).toMatchObject({ state: 'needs_decision', reviewed: false });
  });
});
