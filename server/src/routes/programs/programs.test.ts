import { describe, expect, it } from 'vitest';
import { randomUUID } from 'node:crypto';
import bcrypt from 'bcryptjs';
import type { DataSource } from 'typeorm';
import { todayIso } from '../../../../policies/roles';
import { CareTeamAssignment } from '../../entities';
import { Client, signedIn, useHarness } from '../../test/harness';
import { createMember, createOrg as createFullOrg, TEST_PASSWORD, type MemberRef, type TestOrg } from '../../test/factories';

// Sign-in compares against the stored hash at its own cost; the factories' cost-12 hash makes each
// sign-in take a quarter second. The same password at cost 4 keeps these files inside their budget.
let cheap: Promise<string> | null = null;
const cheapen = async (ds: DataSource, userIds: string[]) =>
  ds.query(`UPDATE users SET password_hash = $1 WHERE id = ANY($2)`, [await (cheap ??= bcrypt.hash(TEST_PASSWORD, 4)), userIds]);
async function createOrg(ds: DataSource): Promise<TestOrg> {
  const org = await createFullOrg(ds);
  await cheapen(
    ds,
    Object.values(org)
      .filter((v): v is MemberRef => typeof v === 'object')
      .map((m) => m.userId),
  );
  return org;
}

const addDays = (date: string, days: number) => new Date(Date.parse(`${date}T00:00:00Z`) + days * 86_400_000).toISOString().slice(0, 10);
const TODAY = todayIso();
/** A Monday two weeks ahead, so the sessions below are in the future and inside the plan's stage. */
const MONDAY = (() => {
  const d = addDays(TODAY, 14);
  const dow = (new Date(`${d}T00:00:00Z`).getUTCDay() + 6) % 7;
  return addDays(d, -dow);
})();

interface SetSpec {
  kg: number;
  reps?: number;
  rpe?: number;
}
function content(exerciseId: string, sets: SetSpec[]) {
  return {
    exercises: [
      {
        id: randomUUID(),
        exerciseId,
        sets: sets.map((s) => ({ id: randomUUID(), reps: s.reps ?? 5, load: { kind: 'kg', value: s.kg }, targetRpe: s.rpe ?? 6 })),
      },
    ],
  };
}
type Content = ReturnType<typeof content>;
const setIds = (c: Content) => c.exercises.flatMap((e) => e.sets.map((s) => s.id));
const put = (c: Client, path: string, body: object) => c.agent.put(path).set('x-csrf-token', c.csrf).send(body);

describe('programs and sessions', () => {
  const h = useHarness();
  const as = (m: { email: string }) => signedIn(h.app, m.email, TEST_PASSWORD);

  /**
   * An organization where the athlete has a tested deadlift of 140 kg and a plan capping the hinge
   * at 60% of 1RM (84 kg; REFERENCES 9) from a month ago to four months ahead.
   */
  async function world() {
    const org = await createOrg(h.ds);
    const [coach, clinician] = await Promise.all([as(org.coach), as(org.clinician)]);
    const base = `/api/orgs/${org.id}`;
    const lib = (await coach.get(`${base}/exercises`)).body as { id: string; name: string }[];
    const ex = (name: string) => lib.find((e) => e.name === name)!.id;
    const athlete = org.athlete.membershipId;
    const baseline = async (athleteId: string, kg: number) =>
      expect(
        (
          await coach.post(`${base}/athletes/${athleteId}/baselines`, {
            exerciseId: ex('Deadlift'),
            kind: 'tested',
            loadKg: kg,
            reps: 1,
            testedOn: TODAY,
          })
        ).status,
      ).toBe(201);
    await baseline(athlete, 140);
    const plan = async (athleteId: string, pct: number) => {
      const c = await clinician.post(`${base}/cases`, {
        athleteId,
        bodyRegions: ['lower_back'],
        onsetDate: addDays(TODAY, -30),
        status: 'limited',
        statusEffectiveFrom: addDays(TODAY, -30),
      });
      expect(c.status, JSON.stringify(c.body)).toBe(201);
      const stages = [
        {
          id: randomUUID(),
          startDate: addDays(TODAY, -30),
          endDate: addDays(TODAY, 120),
          painCeiling: 5,
          patterns: { hinge: { mode: 'capped', caps: { maxPercent1RM: pct } } },
        },
      ];
      const p = await clinician.post(`${base}/cases/${c.body.id}/plan`, { stages, guidance: '' });
      expect(p.status, JSON.stringify(p.body)).toBe(201);
    };
    await plan(athlete, 60);
    const program = async (athleteIds = [athlete]) => {
      const res = await coach.post(`${base}/programs`, { name: 'Return block', athleteIds });
      expect(res.status, JSON.stringify(res.body)).toBe(201);
      return res.body as { id: string };
    };
    const session = async (programId: string, date: string, c: Content, title = 'Day') => {
      const res = await coach.post(`${base}/programs/${programId}/sessions`, { date, title, content: c });
      expect(res.status, JSON.stringify(res.body)).toBe(201);
      return res.body as { id: string; version: number; status: string };
    };
    const publish = (id: string, version: number) => coach.post(`${base}/sessions/${id}/publish`, { version });
    const audit = async (action: string, subjectId: string) =>
      (await h.ds.query(
        `SELECT before, after, athlete_id FROM audit_entries WHERE organization_id = $1 AND action = $2 AND subject_id = $3 ORDER BY id`,
        [org.id, action, subjectId],
      )) as { before: Record<string, unknown> | null; after: Record<string, unknown> | null; athlete_id: string | null }[];
    return { org, coach, clinician, base, ex, athlete, baseline, plan, program, session, publish, audit };
  }

  it('publish is refused 422 with the exact breach list (REFERENCES 9: 60% of 140 kg = 84 kg; 87.5 kg breaches; 82.5 kg fits)', async () => {
    const w = await world();
    const p = await w.program();
    const c = content(w.ex('Deadlift'), [{ kg: 87.5 }, { kg: 80 }]);
    const s = await w.session(p.id, MONDAY, c);
    const res = await w.publish(s.id, s.version);
    expect(res.status).toBe(422);
    expect(res.body.error.code).toBe('unprocessable');
    expect(res.body.error.message).toBe(
      'This session cannot be published: 1 planned set goes past a cap. Each breach below says which cap, by how much, and what would fit.',
    );
    expect(res.body.error.details.breaches).toEqual([
      {
        athleteId: w.athlete,
        breaches: [
          {
            setId: setIds(c)[0],
            sessionId: s.id,
            date: MONDAY,
            exerciseId: w.ex('Deadlift'),
            rule: 'percent_1rm',
            pattern: 'hinge',
            limit: 'max 60% of 140 kg = 84 kg',
            planned: '87.5 kg',
            fits: '82.5 kg fits on 2.5 kg steps',
            fittingKg: 82.5,
            waived: false,
            message: 'Hinge: max 60% of 140 kg = 84 kg: planned 87.5 kg; 82.5 kg fits on 2.5 kg steps.',
          },
        ],
      },
    ]);
    // The dry-run check says the same, and neither publishes.
    const check = await w.coach.post(`${w.base}/sessions/${s.id}/check`);
    expect(check.status).toBe(200);
    expect(check.body.results).toEqual([{ athleteId: w.athlete, breaches: res.body.error.details.breaches[0].breaches }]);
    const after = (await w.coach.get(`${w.base}/programs/${p.id}`)).body;
    expect(after.sessions.map((x: { status: string; version: number }) => [x.status, x.version])).toEqual([['draft', s.version]]);
    expect(await w.audit('session.published', s.id)).toEqual([]);
  });

  it('fixing the set to the fitting load then publishing works, and is audited with no waivers', async () => {
    const w = await world();
    const p = await w.program();
    const dl = w.ex('Deadlift');
    const c = content(dl, [{ kg: 87.5 }]);
    const s = await w.session(p.id, MONDAY, c);
    expect((await w.publish(s.id, s.version)).status).toBe(422);
    const fixed = structuredClone(c);
    fixed.exercises[0].sets[0].load.value = 82.5;
    const edited = await put(w.coach, `${w.base}/sessions/${s.id}`, { version: s.version, content: fixed });
    expect(edited.status, JSON.stringify(edited.body)).toBe(200);
    const pub = await w.publish(s.id, edited.body.version);
    expect(pub.status, JSON.stringify(pub.body)).toBe(200);
    expect(pub.body).toMatchObject({ status: 'published', version: edited.body.version + 1, holds: [] });
    expect(pub.body.publishedAt).toEqual(expect.any(String));
    const [entry] = await w.audit('session.published', s.id);
    expect(entry.athlete_id).toBe(w.athlete);
    expect(entry.after).toEqual({ date: MONDAY, athletes: [w.athlete], waivedByException: [] });
    // The session.updated entry keeps what the content was and what it became.
    const [upd] = await w.audit('session.updated', s.id);
    expect((upd.before!.content as Content).exercises[0].sets[0].load).toEqual({ kind: 'kg', value: 87.5 });
    expect((upd.after!.content as Content).exercises[0].sets[0].load).toEqual({ kind: 'kg', value: 82.5 });
    // Publishing again with the now-stale version is a conflict, not a second publish.
    expect((await w.publish(s.id, edited.body.version)).status).toBe(409);
  });

  it('editing a published session into a breach is refused 422 and the session is unchanged; a fitting edit is kept', async () => {
    const w = await world();
    const p = await w.program();
    const c = content(w.ex('Deadlift'), [{ kg: 80 }]);
    const s = await w.session(p.id, MONDAY, c);
    const pub = await w.publish(s.id, s.version);
    expect(pub.status).toBe(200);
    const heavier = structuredClone(c);
    heavier.exercises[0].sets[0].load.value = 90;
    const refused = await put(w.coach, `${w.base}/sessions/${s.id}`, { version: pub.body.version, content: heavier });
    expect(refused.status).toBe(422);
    expect(refused.body.error.message).toMatch(/^This session cannot be changed while published: 1 planned set goes past a cap\./);
    expect(refused.body.error.details.breaches[0].breaches.map((b: { rule: string; planned: string }) => [b.rule, b.planned])).toEqual([
      ['percent_1rm', '90 kg'],
    ]);
    const now = (await w.coach.get(`${w.base}/programs/${p.id}`)).body.sessions[0];
    expect(now).toMatchObject({ status: 'published', version: pub.body.version, content: c });
    expect(await w.audit('session.updated', s.id)).toEqual([]);
    // Moving it is checked too: the same content on a day with no cap in force is fine.
    const moved = await put(w.coach, `${w.base}/sessions/${s.id}`, {
      version: pub.body.version,
      date: addDays(TODAY, 200),
      content: heavier,
    });
    expect(moved.status, JSON.stringify(moved.body)).toBe(200);
    expect(moved.body).toMatchObject({ status: 'published', date: addDays(TODAY, 200) });
  });

  it('a group program is checked athlete by athlete: the breach names the athlete it is for', async () => {
    const w = await world();
    // A second athlete on the same coach's care team, with a stronger deadlift and a looser plan.
    const second = await createMember(h.ds, w.org.id, ['athlete']);
    await h.ds.getRepository(CareTeamAssignment).save([
      { organizationId: w.org.id, athleteId: second.membershipId, memberId: w.org.coach.membershipId, role: 'coach' },
      { organizationId: w.org.id, athleteId: second.membershipId, memberId: w.org.clinician.membershipId, role: 'clinician' },
    ]);
    await w.baseline(second.membershipId, 200);
    await w.plan(second.membershipId, 60);
    const p = await w.program([w.athlete, second.membershipId]);
    const c = content(w.ex('Deadlift'), [{ kg: 100 }]);
    const s = await w.session(p.id, MONDAY, c);
    const res = await w.publish(s.id, s.version);
    expect(res.status).toBe(422);
    // 100 kg is 71% of 140 kg (over 84 kg) but 50% of 200 kg (under 120 kg).
    expect(
      res.body.error.details.breaches.map((r: { athleteId: string; breaches: { limit: string }[] }) => [
        r.athleteId,
        r.breaches.map((b) => b.limit),
      ]),
    ).toEqual([[w.athlete, ['max 60% of 140 kg = 84 kg']]]);
    // The other way round: 80 kg fits the first athlete, and a new 120 kg max makes it 67% for the second.
    const light = structuredClone(c);
    light.exercises[0].sets[0].load.value = 80;
    const edited = await put(w.coach, `${w.base}/sessions/${s.id}`, { version: s.version, content: light });
    await w.baseline(second.membershipId, 120);
    const res2 = await w.publish(s.id, edited.body.version);
    expect(res2.status).toBe(422);
    expect(res2.body.error.details.breaches.map((r: { athleteId: string }) => r.athleteId)).toEqual([second.membershipId]);
  });

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

  it('a stale version on a session edit is 409 and the edit is not applied', async () => {
    const w = await world();
    const p = await w.program();
    const s = await w.session(p.id, MONDAY, content(w.ex('Deadlift'), [{ kg: 80 }]), 'First');
    const first = await put(w.coach, `${w.base}/sessions/${s.id}`, { version: s.version, title: 'Second' });
    expect(first.status).toBe(200);
    const stale = await put(w.coach, `${w.base}/sessions/${s.id}`, { version: s.version, title: 'Lost' });
    expect(stale.status).toBe(409);
    expect(stale.body.error.code).toBe('version_conflict');
    expect((await w.coach.get(`${w.base}/programs/${p.id}`)).body.sessions[0]).toMatchObject({
      title: 'Second',
      version: first.body.version,
    });
    // An empty session has nothing to check and cannot be published.
    const empty = await w.session(p.id, MONDAY, { exercises: [] }, 'Empty');
    const refused = await w.publish(empty.id, empty.version);
    expect(refused.status).toBe(422);
    expect(refused.body.error.message).toBe('An empty session cannot be published: add at least one exercise.');
  });

  it("copy-week copies one week's sessions as drafts a week on, with new exercise and set ids", async () => {
    const w = await world();
    const p = await w.program();
    const dl = w.ex('Deadlift');
    const mon = content(dl, [{ kg: 80 }, { kg: 82.5 }]);
    const s1 = await w.session(p.id, MONDAY, mon, 'Mon');
    expect((await w.publish(s1.id, s1.version)).status).toBe(200);
    await w.session(p.id, addDays(MONDAY, 6), content(dl, [{ kg: 70 }]), 'Sun');
    await w.session(p.id, addDays(MONDAY, 7), content(dl, [{ kg: 60 }]), 'Next Mon'); // outside the week copied
    const res = await w.coach.post(`${w.base}/programs/${p.id}/copy-week`, { fromWeekStart: MONDAY, toWeekStart: addDays(MONDAY, 14) });
    expect(res.status, JSON.stringify(res.body)).toBe(200);
    expect(res.body.map((x: { title: string; date: string; status: string }) => [x.title, x.date, x.status])).toEqual([
      ['Mon', addDays(MONDAY, 14), 'draft'],
      ['Sun', addDays(MONDAY, 20), 'draft'],
    ]);
    const copy = res.body[0].content as Content;
    expect(copy.exercises[0].exerciseId).toBe(dl);
    expect(copy.exercises[0].sets.map((x) => x.load)).toEqual(mon.exercises[0].sets.map((x) => x.load));
    const oldIds = new Set([mon.exercises[0].id, ...setIds(mon)]);
    const newIds = [copy.exercises[0].id, ...setIds(copy)];
    expect(newIds.filter((id) => oldIds.has(id))).toEqual([]);
    expect(new Set(newIds).size).toBe(newIds.length);
    const all = (await w.coach.get(`${w.base}/programs/${p.id}`)).body.sessions;
    expect(all).toHaveLength(5);
    expect(await w.audit('program.week_copied', p.id)).toEqual([
      { before: null, after: { fromWeekStart: MONDAY, toWeekStart: addDays(MONDAY, 14), sessions: 2 }, athlete_id: null },
    ]);
  });

  it('shift moves the drafts from a date on, never a published session or an earlier draft', async () => {
    const w = await world();
    const p = await w.program();
    const dl = w.ex('Deadlift');
    const early = await w.session(p.id, addDays(MONDAY, -1), content(dl, [{ kg: 60 }]), 'Early draft');
    const pub = await w.session(p.id, MONDAY, content(dl, [{ kg: 60 }]), 'Published');
    expect((await w.publish(pub.id, pub.version)).status).toBe(200);
    const later = await w.session(p.id, addDays(MONDAY, 2), content(dl, [{ kg: 60 }]), 'Later draft');
    const res = await w.coach.post(`${w.base}/programs/${p.id}/shift`, { fromDate: MONDAY, days: 3 });
    expect(res.status, JSON.stringify(res.body)).toBe(200);
    expect(res.body.moved).toBe(1);
    const byTitle = Object.fromEntries(
      (await w.coach.get(`${w.base}/programs/${p.id}`)).body.sessions.map((x: { title: string; date: string; version: number }) => [
        x.title,
        [x.date, x.version],
      ]),
    );
    expect(byTitle).toEqual({
      'Early draft': [addDays(MONDAY, -1), early.version],
      Published: [MONDAY, pub.version + 1],
      'Later draft': [addDays(MONDAY, 5), later.version + 1],
    });
  });
});
