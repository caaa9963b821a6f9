import { randomUUID } from 'node:crypto';
import { describe, expect, it } from 'vitest';
import { onGroupAthletesChanged } from '../../services/team-membership';
import { createMember } from '../../test/factories';
import { useHarness } from '../../test/harness';
import { addDays, pinClock, put, TODAY } from '../../test/worlds/test-world';
import { teamWorld } from '../../test/worlds/team-world';

/** Team programming: changes flow to the versions; who may read and change a group's team work. */
describe('team programs: changes flow, and who may do what', () => {
  const h = useHarness();
  pinClock();

  async function published() {
    const w = await teamWorld(h);
    const p = await w.createProgram();
    const team = await w.addSession(p.id);
    await w.versionAction(team.id, w.sprint, 'accept', (await w.version(team.id, w.sprint)).version.version);
    const res = await w.publish(p.id, [team.id]);
    expect(res.status, JSON.stringify(res.body)).toBe(200);
    return { w, p, team };
  }

  it("a clinician tightening a limit puts that athlete's version in review with a proposal that passes the engine; accepting it replaces the content and lifts the hold", async () => {
    const { w, p, team } = await published();
    const stage = {
      id: randomUUID(),
      startDate: addDays(TODAY, -30),
      endDate: addDays(TODAY, 120),
      painCeiling: 5,
      patterns: { hinge: { mode: 'capped', caps: { maxPercent1RM: 50 } } },
    };
    const revised = await put(w.clinician, `${w.base}/plans/${w.hingePlan.planId}`, { version: 1, stages: [stage], guidance: '' });
    expect(revised.status, JSON.stringify(revised.body)).toBe(200);

    const g = await w.grid(p.id);
    // The published version (82.5 kg, fitted to the old 60 % cap) now breaches 50 % of 140 kg = 70 kg: held, and in review.
    expect(w.cell(g, w.hinge)).toMatchObject({ needsReview: true, held: true, published: true });
    expect(g.cells.filter((c) => c.needsReview).map((c) => c.athleteId)).toEqual([w.hinge]);
    const v = await w.version(team.id, w.hinge);
    expect(v.breaches.filter((b) => !b.waived).length).toBeGreaterThan(0);
    expect(v.proposal).not.toBeNull();
    const proposedDeadlift = v.proposal!.content.exercises.find((e) => e.exerciseId === w.ex('Deadlift'))!;
    expect(proposedDeadlift.sets.map((s) => s.load)).toEqual([1, 2, 3].map(() => ({ kind: 'kg', value: 70 })));

    const accepted = await w.versionAction(team.id, w.hinge, 'accept', v.version.version);
    expect(accepted.status, JSON.stringify(accepted.body)).toBe(200);
    expect(accepted.body).toMatchObject({ needsReview: false, proposal: null, breaches: [] });
    expect(accepted.body.version.content).toEqual(v.proposal!.content);
    expect(await w.held(w.hinge)).toEqual([]);
    expect(w.cell(await w.grid(p.id), w.hinge)).toMatchObject({ needsReview: false, held: false, published: true });
  });

  it('an athlete back from Out gets a proposal of the full session to review; until then publishing names their empty version', async () => {
    const w = await teamWorld(h);
    const p = await w.createProgram();
    const team = await w.addSession(p.id);
    await w.versionAction(team.id, w.sprint, 'accept', (await w.version(team.id, w.sprint)).version.version);
    const back = await w.clinician.post(`${w.base}/cases/${w.outCase.id}/status`, {
      status: 'full',
      effectiveFrom: TODAY,
      version: w.outCase.version,
    });
    expect(back.status, JSON.stringify(back.body)).toBe(201);
    const v = await w.version(team.id, w.out);
    expect(v).toMatchObject({ state: 'out', needsReview: true });
    expect(v.proposal!.state).toBe('as_written');
    const refused = await w.publish(p.id, [team.id]);
    expect(refused.status).toBe(422);
    expect(refused.body.error.details.problems.map((x: { athleteId: string }) => x.athleteId)).toEqual([w.out]);
    expect((await w.versionAction(team.id, w.out, 'accept', v.version.version)).status).toBe(200);
    const ok = await w.publish(p.id, [team.id]);
    expect(ok.status, JSON.stringify(ok.body)).toBe(200);
    expect(ok.body).toEqual({ published: 8, outSkipped: [] });
  });

  it('ASVS 5.0 V8.2.2: a coach of another group is told a team program was not found; a clinician of a group athlete reads but may not change (403); an athlete gets 404', async () => {
    const { w, p, team } = await published();
    const other = await w.as(w.org.otherCoach);
    const version = `${w.base}/team-sessions/${team.id}/versions/${w.hinge}`;
    for (const path of [`${w.base}/team-programs/${p.id}`, `${w.base}/team-programs/${p.id}/grid`, version])
      expect((await other.get(path)).status, path).toBe(404);
    expect((await other.get(`${w.base}/team-programs`)).body).toEqual([]);
    expect((await other.post(`${w.base}/team-programs`, { groupId: w.group.id, name: 'Mine now' })).status).toBe(404);
    expect((await other.post(`${version}/accept`, { version: 1 })).status).toBe(404);

    const clin = w.clinician;
    expect((await clin.get(`${w.base}/team-programs/${p.id}/grid`)).status).toBe(200);
    expect((await clin.get(version)).status).toBe(200);
    expect((await clin.get(`${w.base}/team-programs`)).body.map((x: { id: string }) => x.id)).toEqual([p.id]);
    const writes = [
      clin.agent.patch(`${w.base}/team-programs/${p.id}`).set('x-csrf-token', clin.csrf).send({ name: 'x', version: p.version }),
      clin.post(`${w.base}/team-programs/${p.id}/sessions`, { date: TODAY, title: 'x', content: { exercises: [] } }),
      clin.post(`${w.base}/team-programs/${p.id}/publish`, { teamSessionIds: [team.id] }),
      clin.post(`${version}/accept`, { version: 1 }),
      clin.agent.delete(`${w.base}/team-sessions/${team.id}`).set('x-csrf-token', clin.csrf),
    ];
    for (const res of await Promise.all(writes)) expect(res.status, JSON.stringify(res.body)).toBe(403);

    const athlete = await w.as(w.org.athlete);
    expect((await athlete.get(`${w.base}/team-programs/${p.id}/grid`)).status).toBe(404);
    expect((await athlete.get(`${w.base}/team-programs`)).body).toEqual([]);
  });

  it("ASVS 5.0 V8.2.2: a team program and its sessions are never reached through the routes of one athlete's program", async () => {
    const { w, p, team } = await published();
    // A team program has no athletes of its own: the athlete-by-athlete check must not let it through.
    const athlete = await w.as(w.org.athlete);
    expect((await athlete.get(`${w.base}/programs/${p.id}`)).status).toBe(404);
    expect((await w.coach.get(`${w.base}/programs/${p.id}`)).status).toBe(404);
    expect((await put(w.coach, `${w.base}/sessions/${team.id}`, { version: 2, title: 'Sneaky' })).status).toBe(404);
    expect((await w.coach.post(`${w.base}/sessions/${team.id}/publish`, { version: 2 })).status).toBe(404);
    expect((await w.coach.get(`${w.base}/programs`)).body.map((x: { id: string }) => x.id)).not.toContain(p.id);
  });

  it('ASVS 5.0 V8.2.2: publishing names only sessions of the program in the path; a version is reached only for an athlete of the group', async () => {
    const { w, p, team } = await published();
    const second = await w.createProgram();
    const res = await w.publish(second.id, [team.id]);
    expect(res.status).toBe(404);
    expect(res.body.error.fields).toEqual({ teamSessionIds: ['must all be sessions of this team program'] });
    const stranger = w.org.guardian.membershipId;
    expect((await w.coach.get(`${w.base}/team-sessions/${team.id}/versions/${stranger}`)).status).toBe(404);
    expect((await w.versionAction(team.id, stranger, 'reset', 1)).status).toBe(404);
    const list = await w.coach.get(`${w.base}/team-programs?groupId=${w.group.id}`);
    expect(list.body.map((x: { id: string }) => x.id).sort()).toEqual([p.id, second.id].sort());
    expect(list.body.find((x: { id: string }) => x.id === p.id)).toMatchObject({ groupName: 'Infield', sessions: 1 });
  });

  it("renaming carries to the athletes' programs; deleting a team session takes its versions with it", async () => {
    const w = await teamWorld(h);
    const p = await w.createProgram();
    const team = await w.addSession(p.id);
    const renamed = await w.coach.agent
      .patch(`${w.base}/team-programs/${p.id}`)
      .set('x-csrf-token', w.coach.csrf)
      .send({ name: 'Infield power', version: p.version });
    expect(renamed.status, JSON.stringify(renamed.body)).toBe(200);
    const names = await h.ds.query(`SELECT DISTINCT name FROM programs WHERE team_program_id = $1`, [p.id]);
    expect(names).toEqual([{ name: 'Infield power' }]);
    const del = await w.coach.agent.delete(`${w.base}/team-sessions/${team.id}`).set('x-csrf-token', w.coach.csrf);
    expect(del.status).toBe(204);
    expect(await h.ds.query(`SELECT id FROM program_sessions WHERE team_session_id = $1`, [team.id])).toEqual([]);
    expect((await w.audit('team_session.deleted', team.id)).length).toBe(1);
  });

  it('an athlete joining the group gets versions of its sessions from today on; one leaving loses the untrained ones', async () => {
    const w = await teamWorld(h);
    const p = await w.createProgram();
    const past = await w.addSession(p.id, w.squadContent(), addDays(TODAY, -3));
    const next = await w.addSession(p.id);
    const joiner = await createMember(h.ds, w.org.id, ['athlete']);
    await h.ds.query(`INSERT INTO group_members (group_id, member_id, role, organization_id) VALUES ($1, $2, 'athlete', $3)`, [
      w.group.id,
      joiner.membershipId,
      w.org.id,
    ]);
    const leaver = w.plainAthlete.membershipId;
    await h.ds.query(`DELETE FROM group_members WHERE group_id = $1 AND member_id = $2`, [w.group.id, leaver]);
    await h.ds.transaction((m) =>
      onGroupAthletesChanged(m, {
        organizationId: w.org.id,
        groupId: w.group.id,
        added: [joiner.membershipId],
        removed: [leaver],
        today: TODAY,
      }),
    );
    const versionsOf = async (athleteId: string) =>
      (
        (await h.ds.query(
          `SELECT s.team_session_id FROM program_sessions s JOIN programs pr ON pr.id = s.program_id
            WHERE pr.team_program_id = $1 AND pr.athlete_ids = ARRAY[$2::uuid] ORDER BY s.date`,
          [p.id, athleteId],
        )) as { team_session_id: string }[]
      ).map((r) => r.team_session_id);
    expect(await versionsOf(joiner.membershipId)).toEqual([next.id]);
    expect(await versionsOf(leaver)).toEqual([past.id]);
    const g = await w.grid(p.id);
    expect(g.athletes.map((a) => a.id)).toContain(joiner.membershipId);
    expect(g.athletes.map((a) => a.id)).not.toContain(leaver);
  });
});
