import { describe, expect, it } from 'vitest';
import { useHarness } from '../../test/harness';
import { pinClock, put } from '../../test/worlds/test-world';
import { MONDAY, teamWorld } from '../../test/worlds/team-world';

/** Team programming: one team session, each athlete's fitted version, the review grid and publishing the whole group. */
describe('team programs: fitting, the grid and publishing', () => {
  const h = useHarness();
  pinClock();

  it('fits every athlete of the group at once: as written, fitted (hinge capped), needs a decision (sprint blocked), Out', async () => {
    const w = await teamWorld(h);
    const p = await w.createProgram();
    expect(p.athletes.map((a) => a.id).sort()).toEqual([...w.athletes].sort());
    const team = await w.addSession(p.id);
    const g = await w.grid(p.id);
    expect(g.sessions).toEqual([{ id: team.id, date: MONDAY, title: 'Squad lift', status: 'draft', version: team.version, setCount: 10 }]);
    expect(g.cells).toHaveLength(8);
    expect(w.cell(g, w.plainAthlete.membershipId)).toMatchObject({ state: 'as_written', changes: 0, published: false });
    // 75 % of a 140 kg deadlift is 105 kg; the hinge cap of 60 % allows 84 kg, so 82.5 kg on 2.5 kg steps (never rounded up).
    expect(w.cell(g, w.hinge)).toMatchObject({ state: 'fitted', changes: 3, overridden: false });
    expect(w.cell(g, w.sprint).state).toBe('needs_decision');
    expect(w.cell(g, w.out)).toMatchObject({ state: 'out', changes: 0 });
    expect(g.athletes.find((a) => a.id === w.out)!.statusToday).toBe('out');

    const v = await w.version(team.id, w.hinge);
    const deadlift = v.version.content.exercises.find((e) => e.exerciseId === w.ex('Deadlift'))!;
    expect(deadlift.sets.map((s) => s.load)).toEqual([1, 2, 3].map(() => ({ kind: 'kg', value: 82.5 })));
    // 75 % of a 100 kg back squat resolves to 75 kg: a real load, not a change.
    const squat = v.version.content.exercises.find((e) => e.exerciseId === w.ex('Back squat'))!;
    expect(squat.sets.map((s) => s.load)).toEqual([1, 2, 3].map(() => ({ kind: 'kg', value: 75 })));
    expect(v.changes.every((c) => c.kind === 'load_lowered' && c.exerciseId === w.ex('Deadlift'))).toBe(true);
    expect(v.breaches).toEqual([]);
    // The version's ids are the athlete's own, stable across re-fits; the changes name the team's rows.
    const teamSetIds: string[] = team.content.exercises.flatMap((e) => e.sets.map((s) => s.id));
    expect(v.version.content.exercises.flatMap((e) => e.sets.map((s) => s.id)).some((id) => teamSetIds.includes(id))).toBe(false);
    expect(teamSetIds).toContain(v.changes[0].teamSetId);
    const sprintVersion = await w.version(team.id, w.sprint);
    expect(sprintVersion.changes.filter((c) => c.kind === 'dropped')).toHaveLength(4);
    expect(sprintVersion.version.content.exercises.some((e) => e.exerciseId === w.ex('Sprint 20 m'))).toBe(false);
  });

  it('publishing the group is refused (422) naming who and what, then succeeds in one go once resolved; Out athletes are skipped', async () => {
    const w = await teamWorld(h);
    const p = await w.createProgram();
    const team = await w.addSession(p.id);
    const refused = await w.publish(p.id, [team.id]);
    expect(refused.status).toBe(422);
    expect(refused.body.error.code).toBe('unprocessable');
    const problems = refused.body.error.details.problems as {
      athleteId: string;
      teamSessionId: string;
      date: string;
      problems: string[];
    }[];
    expect(problems.map((x) => x.athleteId)).toEqual([w.sprint]);
    expect(problems[0]).toMatchObject({ teamSessionId: team.id, date: MONDAY, title: 'Squad lift' });
    expect(problems[0].problems[0]).toMatch(/^Something could not be made to fit and was dropped: .*Sprint/);
    // Nothing was published.
    expect((await w.grid(p.id)).cells.some((c) => c.published)).toBe(false);

    // The coach accepts the drop for the sprint athlete (marks the version reviewed).
    const sv = await w.version(team.id, w.sprint);
    const accepted = await w.versionAction(team.id, w.sprint, 'accept', sv.version.version);
    expect(accepted.status, JSON.stringify(accepted.body)).toBe(200);
    expect(accepted.body.needsReview).toBe(false);

    const ok = await w.publish(p.id, [team.id]);
    expect(ok.status, JSON.stringify(ok.body)).toBe(200);
    expect(ok.body).toEqual({ published: 7, outSkipped: [{ athleteId: w.out, teamSessionId: team.id }] });
    const g = await w.grid(p.id);
    expect(g.sessions[0].status).toBe('published');
    expect(
      g.cells
        .filter((c) => c.published)
        .map((c) => c.athleteId)
        .sort(),
    ).toEqual(w.athletes.filter((a) => a !== w.out).sort());
    const audit = await w.audit('team_session.published', team.id);
    expect(audit[0].after).toMatchObject({ outSkipped: [w.out] });
  });

  it('a version with a set past a cap (edited by hand) is a problem; the as-written version waits for an exception', async () => {
    const w = await teamWorld(h);
    const p = await w.createProgram();
    const team = await w.addSession(p.id);
    const v = await w.version(team.id, w.hinge);
    const asWritten = await w.versionAction(team.id, w.hinge, 'as-written', v.version.version);
    expect(asWritten.status, JSON.stringify(asWritten.body)).toBe(200);
    expect(asWritten.body.overridden).toBe(true);
    expect(asWritten.body.breaches.filter((b: { rule: string }) => b.rule === 'percent_1rm')).toHaveLength(3);
    await w.versionAction(team.id, w.sprint, 'accept', (await w.version(team.id, w.sprint)).version.version);
    const refused = await w.publish(p.id, [team.id]);
    expect(refused.status).toBe(422);
    const problems = refused.body.error.details.problems as { athleteId: string; problems: string[] }[];
    expect(problems.map((x) => x.athleteId)).toEqual([w.hinge]);
    expect(problems[0].problems).toHaveLength(3);
    expect(problems[0].problems[0]).toMatch(/^Hinge: max 60% of 140 kg = 84 kg/);

    // Reset drops the hand edit and fits again.
    const now = await w.version(team.id, w.hinge);
    const reset = await w.versionAction(team.id, w.hinge, 'reset', now.version.version);
    expect(reset.status, JSON.stringify(reset.body)).toBe(200);
    expect(reset.body).toMatchObject({ overridden: false, state: 'fitted', breaches: [] });
    expect((await w.publish(p.id, [team.id])).status).toBe(200);
  });

  it("the team's sets as written are published once the clinician grants an exception on the athlete's version (the existing exception routes)", async () => {
    const w = await teamWorld(h);
    const p = await w.createProgram();
    const team = await w.addSession(p.id);
    await w.versionAction(team.id, w.sprint, 'accept', (await w.version(team.id, w.sprint)).version.version);
    const v = await w.version(team.id, w.hinge);
    const asWritten = await w.versionAction(team.id, w.hinge, 'as-written', v.version.version);
    const setIds = (asWritten.body.breaches as { setId: string }[]).map((b) => b.setId);
    expect(setIds).toHaveLength(3);
    const req = await w.coach.post(`${w.base}/sessions/${asWritten.body.version.id}/exceptions`, {
      athleteId: w.hinge,
      setIds,
      reason: 'Team test day agreed with the physio',
    });
    expect(req.status, JSON.stringify(req.body)).toBe(201);
    const granted = await w.clinician.post(`${w.base}/exceptions/${req.body.id}/decide`, {
      decision: 'grant',
      note: 'Agreed for the test day',
    });
    expect(granted.status, JSON.stringify(granted.body)).toBe(200);
    const after = await w.version(team.id, w.hinge);
    expect(after.breaches.every((b) => b.waived)).toBe(true);
    const ok = await w.publish(p.id, [team.id]);
    expect(ok.status, JSON.stringify(ok.body)).toBe(200);
    const deadlift = (await w.version(team.id, w.hinge)).version.content.exercises.find((e) => e.exerciseId === w.ex('Deadlift'))!;
    expect(deadlift.sets.map((s) => s.load)).toEqual([1, 2, 3].map(() => ({ kind: 'percent', value: 75 })));
  });

  it('editing the team session re-fits every version not edited by hand; a hand edit is kept and marked for review', async () => {
    const w = await teamWorld(h);
    const p = await w.createProgram();
    const team = await w.addSession(p.id);
    const plain = w.plainAthlete.membershipId;
    const other = w.extra[2].membershipId;
    const mine = await w.version(team.id, other);
    const handContent = { exercises: mine.version.content.exercises.slice(0, 1) };
    const edited = await put(w.coach, `${w.base}/sessions/${mine.version.id}`, { version: mine.version.version, content: handContent });
    expect(edited.status, JSON.stringify(edited.body)).toBe(200);
    expect((await w.version(team.id, other)).overridden).toBe(true);

    const lighter = { exercises: team.content.exercises.map((e) => ({ ...e, sets: e.sets.slice(0, 2) })) };
    const res = await w.coach.agent
      .patch(`${w.base}/team-sessions/${team.id}`)
      .set('x-csrf-token', w.coach.csrf)
      .send({ version: team.version, content: lighter });
    expect(res.status, JSON.stringify(res.body)).toBe(200);
    const follow = await w.version(team.id, plain);
    expect(follow.version.content.exercises.map((e) => e.sets.length)).toEqual([2, 2, 2]);
    expect(follow.needsReview).toBe(false);
    const kept = await w.version(team.id, other);
    expect(kept).toMatchObject({ overridden: true, needsReview: true });
    expect(kept.version.content.exercises.map((e) => e.sets.length)).toEqual([3]);
    const g = await w.grid(p.id);
    expect(w.cell(g, other)).toMatchObject({ overridden: true, needsReview: true });
    // A stale edit of the team session is refused (version-checked).
    const stale = await w.coach.agent
      .patch(`${w.base}/team-sessions/${team.id}`)
      .set('x-csrf-token', w.coach.csrf)
      .send({ version: team.version, title: 'x' });
    expect(stale.status).toBe(409);
  });

  it('athletes see only their own version through the ordinary views, never the team session as written', async () => {
    const w = await teamWorld(h);
    const p = await w.createProgram();
    const team = await w.addSession(p.id);
    await w.versionAction(team.id, w.sprint, 'accept', (await w.version(team.id, w.sprint)).version.version);
    expect((await w.publish(p.id, [team.id])).status).toBe(200);
    const athlete = await w.as(w.org.athlete);
    const list = await athlete.get(`${w.base}/programs`);
    expect(list.status).toBe(200);
    expect(list.body.map((x: { id: string }) => x.id)).not.toContain(p.id);
    const mine = (await w.version(team.id, w.hinge)).version;
    const sessions = list.body.flatMap((x: { sessions: { id: string }[] }) => x.sessions.map((s) => s.id));
    expect(sessions).toEqual([mine.id]);
    expect((await athlete.get(`${w.base}/programs/${p.id}`)).status).toBe(404);
    expect((await athlete.get(`${w.base}/programs/${mine.programId}`)).status).toBe(200);
    const teammate = (await w.version(team.id, w.plainAthlete.membershipId)).version;
    expect((await athlete.get(`${w.base}/programs/${teammate.programId}`)).status).toBe(404);
    const day = await athlete.get(`${w.base}/athletes/${w.hinge}/today?date=${MONDAY}`);
    expect(day.status, JSON.stringify(day.body)).toBe(200);
    expect(JSON.stringify(day.body)).toContain(mine.id);
    expect(JSON.stringify(day.body)).not.toContain(team.id);
    // Team routes are not the athlete's: not found, as for anything they may not see.
    expect((await athlete.get(`${w.base}/team-programs/${p.id}`)).status).toBe(404);
    expect((await athlete.get(`${w.base}/team-sessions/${team.id}/versions/${w.hinge}`)).status).toBe(404);
  });

  it('an archived group keeps its team program for the record: readable, changed no more (409)', async () => {
    const w = await teamWorld(h);
    const p = await w.createProgram();
    const team = await w.addSession(p.id);
    const coach = w.coach;
    const group = (await coach.get(`${w.base}/groups/${w.group.id}`)).body as { version: number };
    expect((await coach.post(`${w.base}/groups/${w.group.id}/archive`, { version: group.version })).status).toBe(200);
    const kept = await coach.get(`${w.base}/team-programs/${p.id}`);
    expect(kept.status).toBe(200);
    expect(kept.body.archived).toBe(true);
    expect(p.archived).toBe(false);
    expect((await w.grid(p.id)).sessions.map((s) => s.id)).toEqual([team.id]);
    const add = await coach.post(`${w.base}/team-programs/${p.id}/sessions`, {
      date: MONDAY,
      title: 'Late lift',
      content: w.squadContent(),
    });
    expect(add.status, JSON.stringify(add.body)).toBe(409);
    expect(add.body.error.message).toContain('archived');
    expect((await w.publish(p.id, [team.id])).status).toBe(409);
  });
});
