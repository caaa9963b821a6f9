import { describe, expect, it } from 'vitest';
import { CareTeamAssignment } from '../../entities';
import { createMember } from '../../test/factories';
import { useHarness } from '../../test/harness';
import { addDays, content, type Content, pinClock, programWorld, put, setIds, TODAY } from '../../test/worlds/test-world';

/** Publishing checks every set of a session against each athlete's limits; an edit of a published session is checked again. */

const hingeCap = (pct: number) => ({ hinge: { mode: 'capped', caps: { maxPercent1RM: pct } } });
/** A Monday two weeks ahead, so the sessions below are in the future and inside the plan's stage. */
const MONDAY = (() => {
  const d = addDays(TODAY, 14);
  const dow = (new Date(`${d}T00:00:00Z`).getUTCDay() + 6) % 7;
  return addDays(d, -dow);
})();

describe('publishing sessions', () => {
  const h = useHarness();
  pinClock();

  /** The athlete has a tested deadlift of 140 kg and a plan capping the hinge at 60% of 1RM (84 kg) from a month ago to four months ahead. */
  async function world() {
    const w = await programWorld(h);
    await w.baseline(w.athlete, 140);
    await w.plan(w.athlete, hingeCap(60));
    return w;
  }

  it('publish is refused 422 with the exact breach list (60% of 140 kg = 84 kg: 87.5 kg breaches; 82.5 kg, the largest 2.5 kg step under the cap, fits)', async () => {
    const w = await world();
    const p = await w.program();
    const c = content(w.ex('Deadlift'), [{ kg: 87.5 }, { kg: 80 }]);
    const s = await w.session(p.id, MONDAY, c);
    const res = await w.publish(s.id, s.version);
    expect(res.status).toBe(422);
    expect(res.body.error.code).toBe('unprocessable');
    expect(res.body.error.message).toBe(
      'This session cannot be published: 1 planned set goes past a cap. Each line below says which limit, by how much, and what would fit.',
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
            fits: '82.5 kg fits on 2.5 kg increments',
            fittingKg: 82.5,
            waived: false,
            message: 'Hinge: max 60% of 140 kg = 84 kg: planned 87.5 kg; 82.5 kg fits on 2.5 kg increments.',
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
    await w.plan(second.membershipId, hingeCap(60));
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
});
