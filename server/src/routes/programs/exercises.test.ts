import { describe, expect, it } from 'vitest';
import { randomUUID } from 'node:crypto';
import { expectedOutcome } from '../../../../policies/access/matrix';
import { DEFAULT_LIBRARY } from '../../services/exercise-library';
import { Client, signedIn, useHarness } from '../../test/harness';
import { TEST_PASSWORD, type TestOrg } from '../../test/factories';
import { createOrg, pinClock } from '../../test/worlds/test-world';

const STATUS = { allowed: [200, 201], forbidden: [403], not_found: [404] } as const;

describe('the exercise library', () => {
  const h = useHarness();
  pinClock();
  const as = (m: { email: string }) => signedIn(h.app, m.email, TEST_PASSWORD);
  const lib = async (c: Client, org: TestOrg) =>
    (await c.get(`/api/orgs/${org.id}/exercises`)).body as {
      id: string;
      name: string;
      referenceId: string | null;
      version: number;
      patterns: string[];
    }[];
  const newExercise = (name = `Pin squat ${randomUUID().slice(0, 6)}`) => ({
    name,
    patterns: ['squat'],
    equipment: 'barbell',
    ballistic: false,
    steps: { kind: 'increment', step: 2.5, unit: 'kg' },
  });

  it('is seeded for each organization: at least 30 exercises, names unique, reference lifts resolved', async () => {
    const org = await createOrg(h.ds);
    const coach = await as(org.coach);
    const list = await lib(coach, org);
    expect(list.length).toBeGreaterThanOrEqual(30);
    expect(list.length).toBe(DEFAULT_LIBRARY.length);
    expect(new Set(list.map((e) => e.name)).size).toBe(list.length);
    const byName = new Map(list.map((e) => [e.name, e]));
    expect(byName.get('Romanian deadlift')!.referenceId).toBe(byName.get('Deadlift')!.id);
    expect(byName.get('Box squat')!.referenceId).toBe(byName.get('Back squat')!.id);
    expect(byName.get('Trap-bar deadlift')!.patterns).toEqual(['hinge', 'squat']);
    // Each organization has its own copy: ids never shared.
    const other = await createOrg(h.ds);
    const otherIds = new Set((await lib(await as(other.coach), other)).map((e) => e.id));
    expect(list.filter((e) => otherIds.has(e.id))).toEqual([]);
  });

  it("every member may read it; another organization's member may not (404)", async () => {
    const org = await createOrg(h.ds);
    const other = await createOrg(h.ds);
    for (const m of [org.athlete, org.guardian, org.clinician, org.admin]) {
      expect((await (await as(m)).get(`/api/orgs/${org.id}/exercises`)).status, m.email).toBe(200);
    }
    expect((await (await as(other.coach)).get(`/api/orgs/${org.id}/exercises`)).status).toBe(404);
  });

  it('a coach adds an exercise (version 1) and edits it with its version; a stale version is 409 and changes nothing', async () => {
    const org = await createOrg(h.ds);
    const coach = await as(org.coach);
    const created = await coach.post(`/api/orgs/${org.id}/exercises`, newExercise('Pin squat'));
    expect(created.status, JSON.stringify(created.body)).toBe(201);
    expect(created.body).toMatchObject({ name: 'Pin squat', version: 1, archived: false, referenceId: null });
    const renamed = await coach.patch(`/api/orgs/${org.id}/exercises/${created.body.id}`, { name: 'Pin squat (low)', version: 1 });
    expect(renamed.status, JSON.stringify(renamed.body)).toBe(200);
    expect(renamed.body).toMatchObject({ name: 'Pin squat (low)', version: 2 });
    const stale = await coach.patch(`/api/orgs/${org.id}/exercises/${created.body.id}`, { name: 'Lost edit', version: 1 });
    expect(stale.status).toBe(409);
    expect(stale.body.error.code).toBe('version_conflict');
    const after = (await lib(coach, org)).find((e) => e.id === created.body.id)!;
    expect(after).toMatchObject({ name: 'Pin squat (low)', version: 2 });
    const audit = await h.ds.query(`SELECT action FROM audit_entries WHERE organization_id = $1 AND subject_id = $2 ORDER BY id`, [
      org.id,
      created.body.id,
    ]);
    expect(audit.map((a: { action: string }) => a.action)).toEqual(['exercise.created', 'exercise.updated']);
  });

  it('a name already in the library is refused 409 naming the field, on create and on rename', async () => {
    const org = await createOrg(h.ds);
    const coach = await as(org.coach);
    const dup = await coach.post(`/api/orgs/${org.id}/exercises`, newExercise('Back squat'));
    expect(dup.status).toBe(409);
    expect(dup.body.error).toMatchObject({ code: 'conflict', fields: { name: ['is already in the library'] } });
    const mine = await coach.post(`/api/orgs/${org.id}/exercises`, newExercise('Pause squat'));
    const rename = await coach.patch(`/api/orgs/${org.id}/exercises/${mine.body.id}`, { name: 'Back squat', version: 1 });
    expect(rename.status, JSON.stringify(rename.body)).toBe(409);
    expect(rename.body.error.fields).toEqual({ name: ['is already in the library'] });
    expect((await lib(coach, org)).filter((e) => e.name === 'Back squat')).toHaveLength(1);
  });

  it('who may add to the library, as the access matrix says; nothing is added by those refused', async () => {
    const org = await createOrg(h.ds);
    const cases = [
      ['athlete', org.athlete],
      ['guardian', org.guardian],
      ['clinician', org.clinician],
      ['admin', org.admin],
      ['coach', org.coach],
    ] as const;
    for (const [role, member] of cases) {
      const name = `By ${role}`;
      const res = await (await as(member)).post(`/api/orgs/${org.id}/exercises`, newExercise(name));
      const outcome = expectedOutcome(role, 'Exercise', 'create', 'same-org');
      expect(STATUS[outcome], `${role} → ${res.status}`).toContain(res.status);
      const exists = (await lib(await as(org.coach), org)).some((e) => e.name === name);
      expect(exists, role).toBe(outcome === 'allowed');
    }
    // The matrix rows this relies on: only coaches and admins keep the library.
    expect(expectedOutcome('athlete', 'Exercise', 'create', 'same-org')).toBe('forbidden');
    expect(expectedOutcome('guardian', 'Exercise', 'create', 'same-org')).toBe('forbidden');
  });

  it("another organization's exercise cannot be edited or used as a reference (404 / 400)", async () => {
    const org = await createOrg(h.ds);
    const other = await createOrg(h.ds);
    const theirs = (await lib(await as(other.coach), other))[0];
    const coach = await as(org.coach);
    expect((await coach.patch(`/api/orgs/${org.id}/exercises/${theirs.id}`, { name: 'Hijacked', version: theirs.version })).status).toBe(
      404,
    );
    const ref = await coach.post(`/api/orgs/${org.id}/exercises`, { ...newExercise(), referenceId: theirs.id });
    expect(ref.status).toBe(400);
    expect(Object.keys(ref.body.error.fields)).toEqual(['referenceId']);
    expect((await lib(await as(other.coach), other)).find((e) => e.id === theirs.id)!.name).toBe(theirs.name);
  });
});

describe('baselines', () => {
  const h = useHarness();
  pinClock();
  const as = (m: { email: string }) => signedIn(h.app, m.email, TEST_PASSWORD);
  const exerciseId = async (c: Client, org: TestOrg, name: string) =>
    ((await c.get(`/api/orgs/${org.id}/exercises`)).body as { id: string; name: string }[]).find((e) => e.name === name)!.id;

  it('a tested max must be one rep: 400 naming reps, and nothing is recorded', async () => {
    const org = await createOrg(h.ds);
    const coach = await as(org.coach);
    const dl = await exerciseId(coach, org, 'Deadlift');
    const res = await coach.post(`/api/orgs/${org.id}/athletes/${org.athlete.membershipId}/baselines`, {
      exerciseId: dl,
      kind: 'tested',
      loadKg: 140,
      reps: 5,
      testedOn: '2026-11-01',
    });
    expect(res.status).toBe(400);
    expect(res.body.error.fields).toEqual({ reps: ['a tested max is one rep'] });
    expect((await coach.get(`/api/orgs/${org.id}/athletes/${org.athlete.membershipId}/baselines`)).body).toEqual([]);
    const ok = await coach.post(`/api/orgs/${org.id}/athletes/${org.athlete.membershipId}/baselines`, {
      exerciseId: dl,
      kind: 'tested',
      loadKg: 140,
      reps: 1,
      testedOn: '2026-11-01',
    });
    expect(ok.status).toBe(201);
    // A tested single is the 1RM by definition (r = 1 → 1RM = w); Epley (1985, from memory) read literally would give 143.33.
    expect(ok.body).toMatchObject({ kind: 'tested', e1rmKg: 140, formula: 'tested', lowReliability: false });
  });

  it('estimates: 100 kg × 5 → 116.67 (Epley 1985, from memory); at RPE 8 → 7 reps possible → 123.33 (common practice RIR, Zourdos 2016)', async () => {
    const org = await createOrg(h.ds);
    const coach = await as(org.coach);
    const sq = await exerciseId(coach, org, 'Back squat');
    const url = `/api/orgs/${org.id}/athletes/${org.athlete.membershipId}/baselines`;
    const plain = await coach.post(url, { exerciseId: sq, kind: 'estimated', loadKg: 100, reps: 5, testedOn: '2026-11-01' });
    expect(plain.status, JSON.stringify(plain.body)).toBe(201);
    expect(plain.body).toMatchObject({
      kind: 'estimated',
      loadKg: 100,
      reps: 5,
      rpe: null,
      e1rmKg: 116.67,
      formula: 'epley',
      lowReliability: false,
      exerciseName: 'Back squat',
    });
    const rir = await coach.post(url, { exerciseId: sq, kind: 'estimated', loadKg: 100, reps: 5, rpe: 8, testedOn: '2026-11-02' });
    expect(rir.body).toMatchObject({ rpe: 8, e1rmKg: 123.33, lowReliability: false });
    // 10 reps is still reliable (Reynolds et al. 2006, JSCR 20:584–592: up to 10); 100 kg × 10 → 133.33 (Epley, from memory).
    const ten = await coach.post(url, { exerciseId: sq, kind: 'estimated', loadKg: 100, reps: 10, testedOn: '2026-11-03' });
    expect(ten.body).toMatchObject({ e1rmKg: 133.33, lowReliability: false });
    const list = (await coach.get(url)).body as { e1rmKg: number; testedOn: string }[];
    expect(list.map((b) => [b.testedOn, b.e1rmKg])).toEqual([
      ['2026-11-03', 133.33],
      ['2026-11-02', 123.33],
      ['2026-11-01', 116.67],
    ]);
  });

  it('more than 10 reps is flagged low reliability (Reynolds et al. 2006, JSCR 20:584–592): 60 kg × 12 → 84 kg', async () => {
    const org = await createOrg(h.ds);
    const clinician = await as(org.clinician);
    const sq = await exerciseId(clinician, org, 'Back squat');
    const url = `/api/orgs/${org.id}/athletes/${org.athlete.membershipId}/baselines`;
    const res = await clinician.post(url, { exerciseId: sq, kind: 'estimated', loadKg: 60, reps: 12, testedOn: '2026-11-01' });
    expect(res.status, JSON.stringify(res.body)).toBe(201);
    expect(res.body).toMatchObject({ e1rmKg: 84, lowReliability: true });
    // 9 reps at RPE 8 is 11 possible: low reliability too.
    expect(
      (await clinician.post(url, { exerciseId: sq, kind: 'estimated', loadKg: 60, reps: 9, rpe: 8, testedOn: '2026-11-02' })).body
        .lowReliability,
    ).toBe(true);
  });

  it('reps past where the estimates break down are refused (Brzycki 1993, JOPERD 64:88–90: 36w/(37 − r) has no value from r = 37), counting reps in reserve', async () => {
    const org = await createOrg(h.ds);
    const coach = await as(org.coach);
    const sq = await exerciseId(coach, org, 'Back squat');
    const url = `/api/orgs/${org.id}/athletes/${org.athlete.membershipId}/baselines`;
    const tooMany = await coach.post(url, { exerciseId: sq, kind: 'estimated', loadKg: 40, reps: 37, testedOn: '2026-11-01' });
    expect(tooMany.status).toBe(400);
    expect(Object.keys(tooMany.body.error.fields)).toEqual(['reps']);
    const withReserve = await coach.post(url, { exerciseId: sq, kind: 'estimated', loadKg: 40, reps: 36, rpe: 9, testedOn: '2026-11-01' });
    expect(withReserve.status).toBe(400);
    expect(Object.keys(withReserve.body.error.fields)).toEqual(['reps']);
    expect((await coach.get(url)).body).toEqual([]);
  });

  it("another care team's athlete or another organization's athlete answers 404, and nothing is recorded", async () => {
    const org = await createOrg(h.ds);
    const other = await createOrg(h.ds);
    const coach = await as(org.coach);
    const dl = await exerciseId(coach, org, 'Deadlift');
    const body = { exerciseId: dl, kind: 'tested', loadKg: 140, reps: 1, testedOn: '2026-11-01' };
    for (const athleteId of [org.otherAthlete.membershipId, other.athlete.membershipId]) {
      expect((await coach.post(`/api/orgs/${org.id}/athletes/${athleteId}/baselines`, body)).status).toBe(404);
      expect((await coach.get(`/api/orgs/${org.id}/athletes/${athleteId}/baselines`)).status).toBe(404);
    }
    const rows = await h.ds.query(`SELECT count(*)::int AS n FROM baselines WHERE athlete_id = ANY($1)`, [
      [org.otherAthlete.membershipId, other.athlete.membershipId],
    ]);
    expect(rows[0].n).toBe(0);
  });

  it('the athlete reads their own but may not record one; guardians and admins read none (as the matrix says)', async () => {
    const org = await createOrg(h.ds);
    const coach = await as(org.coach);
    const dl = await exerciseId(coach, org, 'Deadlift');
    const url = `/api/orgs/${org.id}/athletes/${org.athlete.membershipId}/baselines`;
    await coach.post(url, { exerciseId: dl, kind: 'tested', loadKg: 140, reps: 1, testedOn: '2026-11-01' });
    const athlete = await as(org.athlete);
    expect((await athlete.get(url)).body).toHaveLength(1);
    expect(expectedOutcome('athlete', 'Baseline', 'create', 'self')).toBe('forbidden');
    expect((await athlete.post(url, { exerciseId: dl, kind: 'tested', loadKg: 200, reps: 1, testedOn: '2026-11-02' })).status).toBe(403);
    for (const [role, m] of [
      ['guardian', org.guardian],
      ['admin', org.admin],
    ] as const) {
      const res = await (await as(m)).get(url);
      expect(STATUS[expectedOutcome(role, 'Baseline', 'read', role === 'admin' ? 'other-athlete' : 'own-care-team')]).toContain(res.status);
      expect(res.status, role).toBe(403);
    }
    expect((await coach.get(url)).body).toHaveLength(1);
  });
});
