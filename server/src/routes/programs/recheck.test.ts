import { describe, expect, it } from 'vitest';
import { CareTeamAssignment } from '../../entities';
import { signedIn, useHarness } from '../../test/harness';
import { createMember, TEST_PASSWORD } from '../../test/factories';
import { oneSet, recheckWorld } from '../../test/worlds/recheck-world';
import { addDays, cheapen, pinClock, TODAY } from '../../test/worlds/test-world';
import { humanDate } from '../../../../policies/words/dates';

describe('published sessions are checked again when what they depend on changes', () => {
  const h = useHarness();
  pinClock();
  const as = (m: { email: string }) => signedIn(h.app, m.email, TEST_PASSWORD);
  const world = (pct: number | null) => recheckWorld(h, pct);

  it('a tighter plan holds exactly the published sessions from today on that now breach; past and draft sessions are untouched', async () => {
    const w = await world(70); // 70% of 140 kg = 98 kg
    const past = await w.session(addDays(TODAY, -3), 90);
    const today = await w.session(TODAY, 90);
    const breaching = await w.session(addDays(TODAY, 7), 90);
    const fitting = await w.session(addDays(TODAY, 9), 80);
    const draft = await w.session(addDays(TODAY, 8), 90, true);
    expect(await w.held()).toEqual([]);
    await w.revisePlan(60); // 84 kg
    expect(await w.held()).toEqual([today, breaching].sort());
    const program = (await w.coach.get(`${w.base}/programs/${w.program}`)).body;
    const holdsOf = (id: string) => program.sessions.find((s: { id: string }) => s.id === id).holds;
    expect(holdsOf(breaching)).toEqual([
      {
        athleteId: w.athlete,
        breaches: [expect.objectContaining({ rule: 'percent_1rm', limit: 'max 60% of 140 kg = 84 kg', planned: '90 kg', fittingKg: 82.5 })],
      },
    ]);
    for (const id of [past, fitting, draft]) expect(holdsOf(id), id).toEqual([]);
    // Nothing was unpublished or edited by the re-check: holding is not changing the session.
    expect(program.sessions.map((s: { id: string; status: string }) => [s.id, s.status]).sort()).toEqual(
      [
        [past, 'published'],
        [today, 'published'],
        [breaching, 'published'],
        [fitting, 'published'],
        [draft, 'draft'],
      ].sort(),
    );
    const roster = (await w.coach.get(`${w.base}/roster`)).body.find((r: { athleteId: string }) => r.athleteId === w.athlete);
    expect(roster.sessionsOnHold).toBe(2);
  });

  it('the coaches on the care team are told (one urgent notice each); the clinician, athlete, guardian and other staff are not', async () => {
    const w = await world(70);
    // A second coach on the athlete's care team.
    const second = await createMember(h.ds, w.org.id, ['coach']);
    await h.ds
      .getRepository(CareTeamAssignment)
      .save({ organizationId: w.org.id, athleteId: w.athlete, memberId: second.membershipId, role: 'coach' });
    const d1 = addDays(TODAY, 7);
    const d2 = addDays(TODAY, 10);
    await w.session(d1, 90);
    await w.session(d2, 92.5);
    await w.revisePlan(60);
    const notices = await w.notices();
    expect(notices.map((n) => n.recipient_id).sort()).toEqual([w.org.coach.membershipId, second.membershipId].sort());
    for (const n of notices) {
      expect(n).toMatchObject({ athlete_id: w.athlete, severity: 'urgent', title: `${w.org.athlete.name}: 2 sessions on hold` });
      expect(n.body).toBe(
        `The clinician changed the restriction plan. These published sessions now go past a limit and are on hold until you update them: ${w.org.athlete.name}: ${humanDate(d1)}, ${humanDate(d2)}.`,
      );
    }
    // What the coach reads through the API.
    const mine = (await w.coach.get(`${w.base}/notifications`)).body.filter((n: { kind: string }) => n.kind === 'sessions_on_hold');
    expect(mine).toHaveLength(1);
    for (const m of [w.org.clinician, w.org.athlete, w.org.guardian, w.org.otherCoach]) {
      const theirs = (await (await as(m)).get(`${w.base}/notifications`)).body.filter(
        (n: { kind: string }) => n.kind === 'sessions_on_hold',
      );
      expect(theirs, m.email).toEqual([]);
    }
    // A further change that holds nothing new tells nobody again.
    await w.revisePlan(59);
    expect(await w.notices()).toHaveLength(2);
  });

  it("loosening the plan releases the holds; the session is back in the athlete's day", async () => {
    const w = await world(70);
    const date = addDays(TODAY, 7);
    const s = await w.session(date, 90);
    await w.revisePlan(60);
    expect(await w.held()).toEqual([s]);
    const athlete = await as(w.org.athlete);
    const held = (await athlete.get(`${w.base}/athletes/${w.athlete}/today?date=${date}`)).body;
    expect(held.sessions.map((x: { id: string; onHold: boolean }) => [x.id, x.onHold])).toEqual([[s, true]]);
    expect(held.sessions[0].holds.map((x: { athleteId: string }) => x.athleteId)).toEqual([w.athlete]);
    await w.revisePlan(70);
    expect(await w.held()).toEqual([]);
    const free = (await athlete.get(`${w.base}/athletes/${w.athlete}/today?date=${date}`)).body;
    expect(free.sessions.map((x: { id: string; onHold: boolean; holds: unknown[] }) => [x.id, x.onHold, x.holds])).toEqual([
      [s, false, []],
    ]);
    expect((await w.coach.get(`${w.base}/roster`)).body.find((r: { athleteId: string }) => r.athleteId === w.athlete).sessionsOnHold).toBe(
      0,
    );
    // Only the tightening told the coach.
    expect(await w.notices()).toHaveLength(1);
  });

  it('status Out with no plan stage holds the published sessions from its effective date on, not before', async () => {
    const w = await world(null);
    const before = await w.session(addDays(TODAY, 4), 120);
    const onTheDay = await w.session(addDays(TODAY, 5), 60);
    const after = await w.session(addDays(TODAY, 12), 60);
    expect(await w.held()).toEqual([]);
    const out = await w.clinician.post(`${w.base}/cases/${w.caseId}/status`, {
      status: 'out',
      effectiveFrom: addDays(TODAY, 5),
      version: w.caseVersion,
    });
    expect(out.status, JSON.stringify(out.body)).toBe(201);
    expect(await w.held()).toEqual([onTheDay, after].sort());
    expect(await w.held()).not.toContain(before);
    const [hold] = await h.ds.query(`SELECT breaches FROM session_holds WHERE session_id = $1`, [after]);
    expect(hold.breaches.map((b: { rule: string }) => b.rule)).toEqual(['status_out']);
    const [n] = await w.notices();
    expect(n.body).toMatch(new RegExp(`^The clinician set the status to out from ${humanDate(addDays(TODAY, 5))}\\. `));
  });

  it('a new baseline re-checks % caps both ways: a lower max holds, a higher one releases', async () => {
    const w = await world(60); // 60% of 140 kg = 84 kg
    const s = await w.session(addDays(TODAY, 7), 82.5);
    await w.baseline(130); // 78 kg
    expect(await w.held()).toEqual([s]);
    const [n] = await w.notices();
    expect(n.body).toMatch(/^A new baseline for Deadlift was recorded\. /);
    const [hold] = await h.ds.query(`SELECT breaches FROM session_holds WHERE session_id = $1`, [s]);
    expect(hold.breaches[0]).toMatchObject({ rule: 'percent_1rm', limit: 'max 60% of 130 kg = 78 kg', fittingKg: 77.5 });
    await w.baseline(150); // 90 kg
    expect(await w.held()).toEqual([]);
  });

  it('in a group session the athlete sees only their own hold', async () => {
    const w = await world(60);
    const teammate = await createMember(h.ds, w.org.id, ['athlete']);
    await cheapen(h.ds, [teammate.userId]);
    await h.ds
      .getRepository(CareTeamAssignment)
      .save({ organizationId: w.org.id, athleteId: teammate.membershipId, memberId: w.org.coach.membershipId, role: 'coach' });
    const group = await w.coach.post(`${w.base}/programs`, { name: 'Group', athleteIds: [w.athlete, teammate.membershipId] });
    const date = addDays(TODAY, 7);
    const s = await w.coach.post(`${w.base}/programs/${group.body.id}/sessions`, { date, title: 'Team lift', content: oneSet(w.dl, 80) });
    expect((await w.coach.post(`${w.base}/sessions/${s.body.id}/publish`, { version: s.body.version })).status).toBe(200);
    await w.baseline(120); // 72 kg: 80 kg now breaches for the first athlete only
    const mine = (await (await as(w.org.athlete)).get(`${w.base}/athletes/${w.athlete}/today?date=${date}`)).body.sessions[0];
    expect(mine.onHold).toBe(true);
    const teammateClient = await as(teammate);
    const theirs = (await teammateClient.get(`${w.base}/athletes/${teammate.membershipId}/today?date=${date}`)).body.sessions[0];
    expect(theirs).toMatchObject({ id: s.body.id, onHold: false, holds: [] });
    // The program itself, as the teammate reads it, does not carry the first athlete's breaches either
    // (they name that athlete's caps and 1RM).
    for (const program of [
      (await teammateClient.get(`${w.base}/programs/${group.body.id}`)).body,
      ...(await teammateClient.get(`${w.base}/programs`)).body,
    ]) {
      expect(program.sessions.map((x: { holds: unknown[] }) => x.holds)).toEqual([[]]);
    }
    // The coach still sees the hold, and whose it is.
    const coachView = (await w.coach.get(`${w.base}/programs/${group.body.id}`)).body.sessions[0];
    expect(coachView.holds.map((x: { athleteId: string }) => x.athleteId)).toEqual([w.athlete]);
    // Another team's coach cannot open the athlete's day.
    expect((await (await as(w.org.otherCoach)).get(`${w.base}/athletes/${w.athlete}/today?date=${date}`)).status).toBe(404);
  });

  it('an athlete taken off a program keeps no hold on its sessions', async () => {
    const w = await world(70);
    const teammate = await createMember(h.ds, w.org.id, ['athlete']);
    await h.ds
      .getRepository(CareTeamAssignment)
      .save({ organizationId: w.org.id, athleteId: teammate.membershipId, memberId: w.org.coach.membershipId, role: 'coach' });
    const group = await w.coach.post(`${w.base}/programs`, { name: 'Group', athleteIds: [w.athlete, teammate.membershipId] });
    const s = await w.coach.post(`${w.base}/programs/${group.body.id}/sessions`, {
      date: addDays(TODAY, 7),
      title: 'Team lift',
      content: oneSet(w.dl, 90),
    });
    // The teammate has no plan; 90 kg fits the athlete's 70% (98 kg) until the plan tightens to 60%.
    expect((await w.coach.post(`${w.base}/sessions/${s.body.id}/publish`, { version: s.body.version })).status).toBe(200);
    await w.revisePlan(60);
    expect(await w.held()).toEqual([s.body.id]);
    const removed = await w.coach.patch(`${w.base}/programs/${group.body.id}`, { athleteIds: [teammate.membershipId], version: 1 });
    expect(removed.status, JSON.stringify(removed.body)).toBe(200);
    expect(await w.held()).toEqual([]);
    const row = (await w.coach.get(`${w.base}/roster`)).body.find((r: { athleteId: string }) => r.athleteId === w.athlete);
    expect(row.sessionsOnHold).toBe(0);
  });
});
