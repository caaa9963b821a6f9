import { describe, expect, it } from 'vitest';
import { randomUUID } from 'node:crypto';
import type { Role } from '../../../../policies/roles';
import { expectedOutcome, type Relation } from '../../../../policies/access/matrix';
import type { SubjectName, Action } from '../../../../policies/access';
import { CareTeamAssignment } from '../../entities';
import { TEST_PASSWORD } from '../../test/factories';
import { Client, signedIn, useHarness } from '../../test/harness';
import { addDays, content, createOrg, pinClock, programWorld, put, setIds, TODAY } from '../../test/worlds/test-world';

/** Who may see and change a program: staff on every athlete's care team; the athlete, their published sessions. */

const hingeCap = (pct: number) => ({ hinge: { mode: 'capped', caps: { maxPercent1RM: pct } } });
/** A Monday two weeks ahead, so the sessions below are in the future and inside the plan's stage. */
const MONDAY = (() => {
  const d = addDays(TODAY, 14);
  const dow = (new Date(`${d}T00:00:00Z`).getUTCDay() + 6) % 7;
  return addDays(d, -dow);
})();

describe('who may see and change programs', () => {
  const h = useHarness();
  pinClock();
  const as = (m: { email: string }) => signedIn(h.app, m.email, TEST_PASSWORD);

  /** The athlete has a tested deadlift of 140 kg and a plan capping the hinge at 60% of 1RM (84 kg) from a month ago to four months ahead. */
  async function world() {
    const w = await programWorld(h);
    await w.baseline(w.athlete, 140);
    await w.plan(w.athlete, hingeCap(60));
    return w;
  }

  it('a coach of another care team, or of another organization, gets 404 on the program and its sessions; nothing changes', async () => {
    const w = await world();
    const p = await w.program();
    const c = content(w.ex('Deadlift'), [{ kg: 80 }]);
    const s = await w.session(p.id, MONDAY, c);
    const other = await createOrg(h.ds);
    for (const [who, client, base] of [
      ['other coach', await as(w.org.otherCoach), w.base],
      ['other org', await as(other.coach), `/api/orgs/${other.id}`],
    ] as const) {
      const answers = [
        (await client.get(`${base}/programs/${p.id}`)).status,
        (await client.patch(`${base}/programs/${p.id}`, { name: 'Mine now', version: 1 })).status,
        (await client.post(`${base}/programs/${p.id}/sessions`, { date: MONDAY, title: 'Extra', content: c })).status,
        (await put(client, `${base}/sessions/${s.id}`, { version: s.version, title: 'Renamed' })).status,
        (await client.post(`${base}/sessions/${s.id}/check`)).status,
        (await client.post(`${base}/sessions/${s.id}/publish`, { version: s.version })).status,
        (await client.delete(`${base}/sessions/${s.id}`)).status,
        (await client.post(`${base}/programs/${p.id}/copy-week`, { fromWeekStart: MONDAY, toWeekStart: addDays(MONDAY, 7) })).status,
      ];
      expect(answers, who).toEqual([404, 404, 404, 404, 404, 404, 404, 404]);
      const list = await client.get(`${base}/programs`);
      expect(list.body, who).toEqual([]);
    }
    const now = (await w.coach.get(`${w.base}/programs/${p.id}`)).body;
    expect(now).toMatchObject({ name: 'Return block', version: 1 });
    expect(now.sessions.map((x: { title: string; status: string; version: number }) => [x.title, x.status, x.version])).toEqual([
      ['Day', 'draft', s.version],
    ]);
  });

  it('a coach cannot build a program including an athlete not on their care team, nor add one later; nothing is created', async () => {
    const w = await world();
    const other = await createOrg(h.ds);
    const count = async () =>
      (await h.ds.query(`SELECT count(*)::int AS n FROM programs WHERE organization_id = $1`, [w.org.id]))[0].n as number;
    const mixed = await w.coach.post(`${w.base}/programs`, { name: 'Group', athleteIds: [w.athlete, w.org.otherAthlete.membershipId] });
    expect([403, 404]).toContain(mixed.status);
    const foreign = await w.coach.post(`${w.base}/programs`, { name: 'Group', athleteIds: [w.athlete, other.athlete.membershipId] });
    expect([400, 403, 404]).toContain(foreign.status);
    expect(await count()).toBe(0);
    const p = await w.program();
    const widen = await w.coach.patch(`${w.base}/programs/${p.id}`, {
      athleteIds: [w.athlete, w.org.otherAthlete.membershipId],
      version: 1,
    });
    expect([403, 404]).toContain(widen.status);
    expect((await w.coach.get(`${w.base}/programs/${p.id}`)).body).toMatchObject({ athleteIds: [w.athlete], version: 1 });
    // Clinicians read programs but do not build them (the matrix: Program create, clinician n).
    expect((await w.clinician.post(`${w.base}/programs`, { name: 'Clinic', athleteIds: [w.athlete] })).status).toBe(403);
    expect(await count()).toBe(1);
  });

  it('the athlete sees only the published sessions of their own programs; a draft answers 404', async () => {
    const w = await world();
    const p = await w.program();
    const dl = w.ex('Deadlift');
    const pubContent = content(dl, [{ kg: 80 }]);
    const pctSet = { id: randomUUID(), reps: 5, load: { kind: 'percent', value: 55 }, targetRpe: 6 };
    (pubContent.exercises[0].sets as object[]).push(pctSet);
    const published = await w.session(p.id, MONDAY, pubContent, 'Published day');
    expect((await w.publish(published.id, published.version)).status).toBe(200);
    const draft = await w.session(p.id, addDays(MONDAY, 2), content(dl, [{ kg: 70 }]), 'Draft day');
    const me = await as(w.org.athlete);
    const list = await me.get(`${w.base}/programs`);
    expect(list.status).toBe(200);
    const mine = list.body.find((x: { id: string }) => x.id === p.id);
    expect(mine.sessions.map((x: { title: string }) => x.title)).toEqual(['Published day']);
    const one = await me.get(`${w.base}/programs/${p.id}`);
    expect(one.body.sessions.map((x: { id: string }) => x.id)).toEqual([published.id]);
    expect((await me.get(`${w.base}/athletes/${w.athlete}/today?date=${addDays(MONDAY, 2)}`)).body.sessions).toEqual([]);
    // Their day works the loads out: 55% of the 140 kg deadlift = 77 kg.
    const day = (await me.get(`${w.base}/athletes/${w.athlete}/today?date=${MONDAY}`)).body;
    expect(day.sessions.map((x: { id: string; onHold: boolean }) => [x.id, x.onHold])).toEqual([[published.id, false]]);
    expect(day.sessions[0].loadsKg).toEqual({ [setIds(pubContent)[0]]: 80, [pctSet.id]: 77 });
    expect(day.sessions[0].exerciseNames).toEqual({ [dl]: 'Deadlift' });
    // The draft's id reveals nothing: the session route open to them answers 404, as for an unknown id.
    expect((await me.post(`${w.base}/sessions/${draft.id}/check`)).status).toBe(404);
    expect((await me.post(`${w.base}/sessions/${randomUUID()}/check`)).status).toBe(404);
    // Editing is refused to the role outright (403 for any id, known or not), so that reveals nothing either.
    for (const id of [draft.id, published.id, randomUUID()])
      expect((await put(me, `${w.base}/sessions/${id}`, { version: 1, title: 'x' })).status).toBe(403);
    // Another athlete's program: 404, and the guardian or admin are refused programs outright.
    await h.ds.getRepository(CareTeamAssignment).save({
      organizationId: w.org.id,
      athleteId: w.org.otherAthlete.membershipId,
      memberId: w.org.otherCoach.membershipId,
      role: 'coach',
    });
    const otherProgram = await (
      await as(w.org.otherCoach)
    ).post(`${w.base}/programs`, { name: 'Other', athleteIds: [w.org.otherAthlete.membershipId] });
    expect(otherProgram.status).toBe(201);
    expect((await me.get(`${w.base}/programs/${otherProgram.body.id}`)).status).toBe(404);
    expect((await me.get(`${w.base}/programs`)).body.map((x: { id: string }) => x.id)).toEqual([p.id]);
    expect((await (await as(w.org.guardian)).get(`${w.base}/programs`)).status).toBe(403);
    expect((await (await as(w.org.admin)).get(`${w.base}/programs`)).status).toBe(403);
  });

  /** The other coach is on both athletes' care teams and builds a group program for the two. */
  async function withGroup(w: Awaited<ReturnType<typeof world>>) {
    await h.ds.getRepository(CareTeamAssignment).save(
      [w.athlete, w.org.otherAthlete.membershipId].map((athleteId) => ({
        organizationId: w.org.id,
        athleteId,
        memberId: w.org.otherCoach.membershipId,
        role: 'coach' as const,
      })),
    );
    const otherCoach = await as(w.org.otherCoach);
    const group = await w.program([w.athlete, w.org.otherAthlete.membershipId], otherCoach);
    return { otherCoach, group };
  }

  it('the list is filtered by the rules of one program: a group program is listed only to staff of every athlete in it, and to its athletes', async () => {
    const w = await world();
    const own = await w.program();
    const { otherCoach, group } = await withGroup(w);
    const ids = async (c: Client, query = '') => ((await c.get(`${w.base}/programs${query}`)).body as { id: string }[]).map((p) => p.id);
    // Newest first.
    expect(await ids(otherCoach)).toEqual([group.id, own.id]);
    expect(await ids(w.coach)).toEqual([own.id]);
    expect(await ids(w.coach, `?athleteId=${w.athlete}`)).toEqual([own.id]);
    expect(await ids(w.coach, `?athleteId=${w.org.otherAthlete.membershipId}`)).toEqual([]);
    expect((await w.coach.get(`${w.base}/programs/${group.id}`)).status).toBe(404);
    expect(await ids(w.clinician)).toEqual([own.id]);
    const me = await as(w.org.athlete);
    expect(await ids(me)).toEqual([group.id, own.id]);
    // An athlete narrows to themselves only: a teammate's id lists nothing.
    expect(await ids(me, `?athleteId=${w.athlete}`)).toEqual([group.id, own.id]);
    expect(await ids(me, `?athleteId=${w.org.otherAthlete.membershipId}`)).toEqual([]);
    expect(await ids(await as(w.org.otherAthlete))).toEqual([group.id]);
  });

  it('each role gets the access matrix answer: 404 for a program it may not read, 403 when its role may never take the action or may only read', async () => {
    const w = await world();
    const mine = await w.program();
    const mineSession = await w.session(mine.id, MONDAY, content(w.ex('Deadlift'), [{ kg: 60 }]));
    const set = (await w.coach.get(`${w.base}/programs/${mine.id}`)).body.sessions[0].content.exercises[0].sets[0].id as string;
    const { otherCoach } = await withGroup(w);
    const theirs = await w.program([w.org.otherAthlete.membershipId], otherCoach);
    const theirSession = await otherCoach.post(`${w.base}/programs/${theirs.id}/sessions`, {
      date: MONDAY,
      title: 'Theirs',
      content: content(w.ex('Deadlift'), [{ kg: 60 }]),
    });
    const STATUS = { allowed: [200, 201], forbidden: [403], not_found: [404] } as const;
    const targets = [
      { athleteId: w.athlete, program: mine.id, session: mineSession.id, setId: set },
      { athleteId: w.org.otherAthlete.membershipId, program: theirs.id, session: theirSession.body.id as string, setId: set },
    ];
    const probes: [SubjectName, Action, (c: Client, t: (typeof targets)[number]) => Promise<{ status: number }>][] = [
      ['Program', 'read', (c, t) => c.get(`${w.base}/programs/${t.program}`)],
      ['Program', 'read', (c, t) => c.get(`${w.base}/athletes/${t.athleteId}/today?date=${MONDAY}`)],
      ['Program', 'update', (c, t) => c.post(`${w.base}/programs/${t.program}/shift`, { fromDate: addDays(MONDAY, 60), days: 1 })],
      ['Baseline', 'read', (c, t) => c.get(`${w.base}/athletes/${t.athleteId}/baselines`)],
      [
        'ProgramException',
        'create',
        (c, t) =>
          c.post(`${w.base}/sessions/${t.session}/exceptions`, { athleteId: t.athleteId, setIds: [t.setId], reason: 'Matrix probe' }),
      ],
    ];
    const members: [Role, { email: string }][] = [
      ['athlete', w.org.athlete],
      ['coach', w.org.coach],
      ['clinician', w.org.clinician],
      ['guardian', w.org.guardian],
      ['admin', w.org.admin],
    ];
    const got: string[] = [];
    const want: string[] = [];
    for (const [role, member] of members) {
      const client = await as(member);
      for (const [i, t] of targets.entries()) {
        // The athlete's own program is 'self'; admins have no care team, so every athlete is another's to them.
        const relation: Relation = i === 1 || role === 'admin' ? 'other-athlete' : role === 'athlete' ? 'self' : 'own-care-team';
        for (const [subject, action, probe] of probes) {
          const outcome = expectedOutcome(role, subject, action, relation);
          const status = (await probe(client, t)).status;
          const label = `${role} ${action} ${subject} (${relation})`;
          got.push(`${label} → ${(STATUS[outcome] as readonly number[]).includes(status) ? outcome : status}`);
          want.push(`${label} → ${outcome}`);
        }
      }
    }
    expect(got).toEqual(want);
  });
});
