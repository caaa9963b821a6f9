import { randomUUID } from 'node:crypto';
import bcrypt from 'bcryptjs';
import type { DataSource } from 'typeorm';
import { afterAll, beforeAll, expect, vi } from 'vitest';
import { addDays } from '../../../../policies/today';
import { Client, signedIn, type Harness } from '../harness';
import { createOrg as createFullOrg, TEST_PASSWORD, type MemberRef, type TestOrg } from '../factories';

/** Shared by the programming tests: a pinned clock, cheap sign-ins, and the usual world of an athlete with a plan. */

/** A Thursday at noon UTC: every test of these files runs on this day, whatever the real date. */
export const PINNED = new Date('2026-12-03T12:00:00Z');
export const TODAY = '2026-12-03';
export { addDays };

/** Pins `Date` (only: timers and the database keep running) for the file's tests. */
export function pinClock(at: Date = PINNED) {
  beforeAll(() => {
    vi.useFakeTimers({ toFake: ['Date'] });
    vi.setSystemTime(at);
  });
  afterAll(() => {
    vi.useRealTimers();
  });
}

// Sign-in compares against the stored hash at its own cost; the factories' cost-12 hash makes each
// sign-in take a quarter second. The same password at cost 4 keeps these files inside their budget.
let cheap: Promise<string> | null = null;
export const cheapen = async (ds: DataSource, userIds: string[]) =>
  ds.query(`UPDATE users SET password_hash = $1 WHERE id = ANY($2)`, [await (cheap ??= bcrypt.hash(TEST_PASSWORD, 4)), userIds]);

export async function createOrg(ds: DataSource): Promise<TestOrg> {
  const org = await createFullOrg(ds);
  await cheapen(
    ds,
    Object.values(org)
      .filter((v): v is MemberRef => typeof v === 'object')
      .map((m) => m.userId),
  );
  return org;
}

export const put = (c: Client, path: string, body: object) => c.agent.put(path).set('x-csrf-token', c.csrf).send(body);

export interface SetSpec {
  kg: number;
  reps?: number;
  rpe?: number;
}

/** Session content: one exercise with the given sets (5 reps at RPE 6 unless said). */
export function content(exerciseId: string, sets: SetSpec[]) {
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
export type Content = ReturnType<typeof content>;
export const setIds = (c: Content) => c.exercises.flatMap((e) => e.sets.map((s) => s.id));

/**
 * An organization with the coach and the clinician signed in, and helpers for what the programming
 * tests set up through the API: baselines, a case with a plan, programs, sessions and publishing.
 */
export async function programWorld(h: Harness) {
  const as = (m: { email: string }) => signedIn(h.app, m.email, TEST_PASSWORD);
  const org = await createOrg(h.ds);
  const [coach, clinician] = await Promise.all([as(org.coach), as(org.clinician)]);
  const base = `/api/orgs/${org.id}`;
  const lib = (await coach.get(`${base}/exercises`)).body as { id: string; name: string; version: number; patterns: string[] }[];
  const ex = (name: string) => lib.find((e) => e.name === name)!.id;
  const athlete = org.athlete.membershipId;
  const baseline = async (athleteId: string, kg: number, exercise = 'Deadlift') =>
    expect(
      (
        await coach.post(`${base}/athletes/${athleteId}/baselines`, {
          exerciseId: ex(exercise),
          kind: 'tested',
          loadKg: kg,
          reps: 1,
          testedOn: TODAY,
        })
      ).status,
    ).toBe(201);
  /** A case opened a month ago, Limited, with one stage from a month ago to four months ahead. */
  const plan = async (athleteId: string, patterns: object) => {
    const c = await clinician.post(`${base}/cases`, {
      athleteId,
      bodyRegions: ['lower_back'],
      onsetDate: addDays(TODAY, -30),
      status: 'limited',
      statusEffectiveFrom: addDays(TODAY, -30),
    });
    expect(c.status, JSON.stringify(c.body)).toBe(201);
    const stages = [{ id: randomUUID(), startDate: addDays(TODAY, -30), endDate: addDays(TODAY, 120), painCeiling: 5, patterns }];
    const p = await clinician.post(`${base}/cases/${c.body.id}/plan`, { stages, guidance: '' });
    expect(p.status, JSON.stringify(p.body)).toBe(201);
    return { caseId: c.body.id as string, planId: p.body.id as string };
  };
  const program = async (athleteIds = [athlete], client: Client = coach) => {
    const res = await client.post(`${base}/programs`, { name: 'Return block', athleteIds });
    expect(res.status, JSON.stringify(res.body)).toBe(201);
    return res.body as { id: string };
  };
  const session = async (programId: string, date: string, c: object, title = 'Day') => {
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
  const held = async (athleteId = athlete) =>
    (
      (await h.ds.query(`SELECT session_id FROM session_holds WHERE athlete_id = $1 ORDER BY session_id`, [athleteId])) as {
        session_id: string;
      }[]
    ).map((r) => r.session_id);
  const notices = async (kind = 'sessions_on_hold') =>
    (await h.ds.query(
      `SELECT recipient_id, athlete_id, severity, title, body FROM notifications WHERE organization_id = $1 AND kind = $2 ORDER BY created_at`,
      [org.id, kind],
    )) as { recipient_id: string; athlete_id: string; severity: string; title: string; body: string }[];
  return { org, as, coach, clinician, base, lib, ex, athlete, baseline, plan, program, session, publish, audit, held, notices };
}
