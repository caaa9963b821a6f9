import { describe, expect, it } from 'vitest';
import { randomUUID } from 'node:crypto';
import { Client, signedIn, useHarness } from '../../test/harness';
import { TEST_PASSWORD } from '../../test/factories';
import { addDays, createOrg, pinClock, put, TODAY } from '../../test/worlds/test-world';

const DATE = addDays(TODAY, 10);

describe("exceptions: going past a cap on named sets, decided by the athlete's clinician", () => {
  const h = useHarness();
  pinClock();
  const as = (m: { email: string }) => signedIn(h.app, m.email, TEST_PASSWORD);

  /**
   * Deadlift 140 kg; the hinge capped at 60% (of 140 kg: 84 kg). A draft session with sets
   * A 87.5 kg and B 90 kg (both over) and C 80 kg (fits).
   */
  async function world() {
    const org = await createOrg(h.ds);
    const [coach, clinician] = await Promise.all([as(org.coach), as(org.clinician)]);
    const base = `/api/orgs/${org.id}`;
    const athlete = org.athlete.membershipId;
    const dl = ((await coach.get(`${base}/exercises`)).body as { id: string; name: string }[]).find((e) => e.name === 'Deadlift')!.id;
    await coach.post(`${base}/athletes/${athlete}/baselines`, { exerciseId: dl, kind: 'tested', loadKg: 140, reps: 1, testedOn: TODAY });
    const c = await clinician.post(`${base}/cases`, {
      athleteId: athlete,
      bodyRegions: ['lower_back'],
      onsetDate: addDays(TODAY, -30),
      status: 'limited',
      statusEffectiveFrom: addDays(TODAY, -30),
    });
    const stages = (pct: number) => [
      {
        id: randomUUID(),
        startDate: addDays(TODAY, -30),
        endDate: addDays(TODAY, 120),
        painCeiling: 5,
        patterns: { hinge: { mode: 'capped', caps: { maxPercent1RM: pct } } },
      },
    ];
    const plan = await clinician.post(`${base}/cases/${c.body.id}/plan`, { stages: stages(60), guidance: '' });
    expect(plan.status).toBe(201);
    const prog = await coach.post(`${base}/programs`, { name: 'Block', athleteIds: [athlete] });
    const [A, B, C] = [randomUUID(), randomUUID(), randomUUID()];
    const content = (kgs: [number, number, number]) => ({
      exercises: [
        {
          id: randomUUID(),
          exerciseId: dl,
          sets: [A, B, C].map((id, i) => ({ id, reps: 5, load: { kind: 'kg', value: kgs[i] }, targetRpe: 6 })),
        },
      ],
    });
    const s = await coach.post(`${base}/programs/${prog.body.id}/sessions`, {
      date: DATE,
      title: 'Heavy day',
      content: content([87.5, 90, 80]),
    });
    expect(s.status).toBe(201);
    const request = (setIds: string[], who: Client = coach) =>
      who.post(`${base}/sessions/${s.body.id}/exceptions`, { athleteId: athlete, setIds, reason: 'Test day agreed with the physio' });
    const decide = (id: string, body: object, who: Client = clinician) => who.post(`${base}/exceptions/${id}/decide`, body);
    const version = async () => (await coach.get(`${base}/programs/${prog.body.id}`)).body.sessions[0].version as number;
    const publish = async () => coach.post(`${base}/sessions/${s.body.id}/publish`, { version: await version() });
    const blocking = (res: { body: { error: { details: { breaches: { breaches: { setId: string }[] }[] } } } }) =>
      res.body.error.details.breaches.flatMap((r) => r.breaches.map((b) => b.setId));
    const audit = async (action: string) =>
      (await h.ds.query(
        `SELECT subject_id, athlete_id, before, after FROM audit_entries WHERE organization_id = $1 AND action = $2 ORDER BY id`,
        [org.id, action],
      )) as { subject_id: string; athlete_id: string; before: Record<string, unknown> | null; after: Record<string, unknown> }[];
    const notices = async (kind: string) =>
      (
        (await h.ds.query(`SELECT recipient_id FROM notifications WHERE organization_id = $1 AND kind = $2`, [org.id, kind])) as {
          recipient_id: string;
        }[]
      ).map((r) => r.recipient_id);
    return {
      org,
      coach,
      clinician,
      base,
      athlete,
      dl,
      session: s.body.id as string,
      planId: plan.body.id as string,
      stages,
      A,
      B,
      C,
      content,
      request,
      decide,
      version,
      publish,
      blocking,
      audit,
      notices,
    };
  }

  it("the coach asks for named sets; the request is pending, audited, and the athlete's clinicians are told", async () => {
    const w = await world();
    const res = await w.request([w.A, w.B]);
    expect(res.status, JSON.stringify(res.body)).toBe(201);
    expect(res.body).toMatchObject({
      sessionId: w.session,
      sessionDate: DATE,
      sessionTitle: 'Heavy day',
      athleteId: w.athlete,
      athleteName: w.org.athlete.name,
      setIds: [w.A, w.B],
      reason: 'Test day agreed with the physio',
      requestedByName: w.org.coach.name,
      status: 'pending',
      grantedSetIds: [],
      decidedByName: null,
    });
    expect(await w.audit('exception.requested')).toEqual([
      {
        subject_id: res.body.id,
        athlete_id: w.athlete,
        before: null,
        after: { sessionId: w.session, setIds: [w.A, w.B], reason: 'Test day agreed with the physio' },
      },
    ]);
    expect(await w.notices('exception_requested')).toEqual([w.org.clinician.membershipId]);
    // Listed for the care team, pending; not for a clinician of another team.
    const pending = (await w.clinician.get(`${w.base}/exceptions?state=pending`)).body;
    expect(pending.map((x: { id: string }) => x.id)).toEqual([res.body.id]);
    expect((await (await as(w.org.otherClinician)).get(`${w.base}/exceptions`)).body).toEqual([]);
  });

  it("a request must name sets of that session, for an athlete of that program, from the athlete's own coach", async () => {
    const w = await world();
    const unknown = await w.request([w.A, randomUUID()]);
    expect(unknown.status).toBe(400);
    expect(Object.keys(unknown.body.error.fields)).toEqual(['setIds']);
    const notInProgram = await w.coach.post(`${w.base}/sessions/${w.session}/exceptions`, {
      athleteId: w.org.otherAthlete.membershipId,
      setIds: [w.A],
      reason: 'Not their program',
    });
    expect(notInProgram.status).toBe(400);
    expect(Object.keys(notInProgram.body.error.fields)).toEqual(['athleteId']);
    expect((await w.request([w.A], await as(w.org.otherCoach))).status).toBe(404);
    // Clinicians decide; they do not ask.
    expect((await w.request([w.A], w.clinician)).status).toBe(403);
    expect((await h.ds.query(`SELECT count(*)::int AS n FROM program_exceptions WHERE organization_id = $1`, [w.org.id]))[0].n).toBe(0);
  });

  it("only a clinician on the athlete's care team decides: coach 403, athlete 403, guardian 403, other clinician 404, other organization 404", async () => {
    const w = await world();
    const x = (await w.request([w.A])).body.id as string;
    const body = { decision: 'grant', note: 'Fine by me' };
    const other = await createOrg(h.ds);
    const answers = {
      coach: (await w.decide(x, body, w.coach)).status,
      athlete: (await w.decide(x, body, await as(w.org.athlete))).status,
      guardian: (await w.decide(x, body, await as(w.org.guardian))).status,
      otherClinician: (await w.decide(x, body, await as(w.org.otherClinician))).status,
      otherOrg: (await (await as(other.clinician)).post(`/api/orgs/${other.id}/exceptions/${x}/decide`, body)).status,
    };
    expect(answers).toEqual({ coach: 403, athlete: 403, guardian: 403, otherClinician: 404, otherOrg: 404 });
    const [row] = await h.ds.query(`SELECT status, granted_set_ids FROM program_exceptions WHERE id = $1`, [x]);
    expect(row).toEqual({ status: 'pending', granted_set_ids: [] });
    expect(await w.audit('exception.granted')).toEqual([]);
  });

  it('a narrowed grant covers exactly the sets granted: publishing waives A; B still blocks until it is fixed', async () => {
    const w = await world();
    const x = (await w.request([w.A, w.B])).body.id as string;
    const outside = await w.decide(x, { decision: 'grant', setIds: [w.A, w.C], note: 'Adding C' });
    expect(outside.status).toBe(400);
    expect(Object.keys(outside.body.error.fields)).toEqual(['setIds']);
    const granted = await w.decide(x, { decision: 'grant', setIds: [w.A], note: 'One heavier set only' });
    expect(granted.status, JSON.stringify(granted.body)).toBe(200);
    expect(granted.body).toMatchObject({
      status: 'granted',
      setIds: [w.A, w.B],
      grantedSetIds: [w.A],
      decidedByName: w.org.clinician.name,
      decisionNote: 'One heavier set only',
    });
    expect(await w.audit('exception.granted')).toEqual([
      {
        subject_id: x,
        athlete_id: w.athlete,
        before: { status: 'pending', setIds: [w.A, w.B] },
        after: { status: 'granted', grantedSetIds: [w.A], note: 'One heavier set only' },
      },
    ]);
    expect(await w.notices('exception_granted')).toEqual([w.org.coach.membershipId]);
    // The dry-run check shows A as waived, B as blocking.
    const check = (await w.coach.post(`${w.base}/sessions/${w.session}/check`)).body.results[0].breaches;
    expect(check.map((b: { setId: string; waived: boolean }) => [b.setId, b.waived])).toEqual([
      [w.A, true],
      [w.B, false],
    ]);
    const refused = await w.publish();
    expect(refused.status).toBe(422);
    expect(w.blocking(refused)).toEqual([w.B]);
    const fixed = await put(w.coach, `${w.base}/sessions/${w.session}`, {
      version: await w.version(),
      content: w.content([87.5, 82.5, 80]),
    });
    expect(fixed.status).toBe(200);
    const pub = await w.publish();
    expect(pub.status, JSON.stringify(pub.body)).toBe(200);
    const [entry] = await w.audit('session.published');
    expect(entry.after.waivedByException).toEqual([{ athleteId: w.athlete, setId: w.A, rule: 'percent_1rm' }]);
  });

  it('editing a granted set voids the waiver: a heavier load, or the same set on another day, blocks again', async () => {
    const w = await world();
    const x = (await w.request([w.A, w.B])).body.id as string;
    expect((await w.decide(x, { decision: 'grant', note: 'Both fine' })).body.grantedSetIds).toEqual([w.A, w.B]);
    expect((await w.publish()).status).toBe(200);
    // Unchanged sets keep their waiver through an edit of something else.
    const retitled = await put(w.coach, `${w.base}/sessions/${w.session}`, { version: await w.version(), title: 'Heavy day (moved gym)' });
    expect(retitled.status, JSON.stringify(retitled.body)).toBe(200);
    const heavier = await put(w.coach, `${w.base}/sessions/${w.session}`, { version: await w.version(), content: w.content([90, 90, 80]) });
    expect(heavier.status).toBe(422);
    expect(w.blocking(heavier)).toEqual([w.A]);
    const moved = await put(w.coach, `${w.base}/sessions/${w.session}`, { version: await w.version(), date: addDays(DATE, 1) });
    expect(moved.status).toBe(422);
    expect(w.blocking(moved).sort()).toEqual([w.A, w.B].sort());
    const now = (
      await w.coach.get(
        `${w.base}/programs/${(await h.ds.query(`SELECT program_id FROM program_sessions WHERE id = $1`, [w.session]))[0].program_id}`,
      )
    ).body.sessions[0];
    expect(now).toMatchObject({ date: DATE, title: 'Heavy day (moved gym)', status: 'published' });
    expect(now.content.exercises[0].sets.map((s: { load: { value: number } }) => s.load.value)).toEqual([87.5, 90, 80]);
  });

  it('a refusal keeps the sets blocked, tells the requester, and is audited; a second decision is 409', async () => {
    const w = await world();
    const x = (await w.request([w.A, w.B])).body.id as string;
    const refused = await w.decide(x, { decision: 'refuse', note: 'Not this week' });
    expect(refused.status).toBe(200);
    expect(refused.body).toMatchObject({ status: 'refused', grantedSetIds: [], decisionNote: 'Not this week' });
    expect(await w.notices('exception_refused')).toEqual([w.org.coach.membershipId]);
    expect(await w.audit('exception.refused')).toEqual([
      {
        subject_id: x,
        athlete_id: w.athlete,
        before: { status: 'pending', setIds: [w.A, w.B] },
        after: { status: 'refused', grantedSetIds: [], note: 'Not this week' },
      },
    ]);
    const pub = await w.publish();
    expect(pub.status).toBe(422);
    expect(w.blocking(pub)).toEqual([w.A, w.B]);
    const again = await w.decide(x, { decision: 'grant', note: 'Changed my mind' });
    expect(again.status).toBe(409);
    expect(again.body.error.message).toBe('This request was already refused.');
    const [row] = await h.ds.query(`SELECT status, granted_set_ids FROM program_exceptions WHERE id = $1`, [x]);
    expect(row).toEqual({ status: 'refused', granted_set_ids: [] });
    expect(await w.audit('exception.granted')).toEqual([]);
    // Deciding a granted one twice is refused the same way.
    const y = (await w.request([w.A])).body.id as string;
    expect((await w.decide(y, { decision: 'grant', note: 'Ok' })).status).toBe(200);
    expect((await w.decide(y, { decision: 'refuse', note: 'No' })).status).toBe(409);
    expect((await w.clinician.get(`${w.base}/exceptions?state=pending`)).body).toEqual([]);
  });

  it('a refusal leaves a session put on hold by a tighter plan on hold; grants release it', async () => {
    const w = await world();
    const fixed = await put(w.coach, `${w.base}/sessions/${w.session}`, { version: await w.version(), content: w.content([82.5, 80, 80]) });
    expect(fixed.status).toBe(200);
    expect((await w.publish()).status).toBe(200);
    // 55% of 140 kg = 77 kg: all three sets now go past the cap.
    expect((await put(w.clinician, `${w.base}/plans/${w.planId}`, { version: 1, stages: w.stages(55), guidance: '' })).status).toBe(200);
    const onHold = async () =>
      (await w.coach.get(`${w.base}/roster`)).body.find((r: { athleteId: string }) => r.athleteId === w.athlete).sessionsOnHold as number;
    expect(await onHold()).toBe(1);
    const told = (await w.notices('sessions_on_hold')).length;
    const refused = (await w.request([w.A, w.B, w.C])).body.id as string;
    expect((await w.decide(refused, { decision: 'refuse', note: 'Not with this plan' })).status).toBe(200);
    expect(await onHold()).toBe(1);
    expect(await w.notices('sessions_on_hold')).toHaveLength(told);
    const partial = (await w.request([w.A, w.B])).body.id as string;
    await w.decide(partial, { decision: 'grant', note: 'Two of three' });
    expect(await onHold()).toBe(1); // C still breaches
    const rest = (await w.request([w.C])).body.id as string;
    await w.decide(rest, { decision: 'grant', note: 'And the last' });
    expect(await onHold()).toBe(0);
  });
});
