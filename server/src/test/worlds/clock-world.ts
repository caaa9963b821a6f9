import { randomUUID } from 'node:crypto';
import bcrypt from 'bcryptjs';
import type { Express } from 'express';
import type { DataSource } from 'typeorm';
import { expect, vi } from 'vitest';
import { Organization } from '../../entities';
import { signedIn, type Client } from '../harness';
import { createOrg, TEST_PASSWORD, type MemberRef, type TestOrg } from '../factories';

/**
 * Test support for "one meaning of today": an organization in a given IANA zone, the clock pinned
 * at an awkward instant, and published sessions to hold. Only `Date` is simulated, so pg, supertest
 * and timers keep real time; people sign in after the clock is pinned (the session's idle and
 * absolute timeouts read the same simulated clock).
 */

/** Pins the clock at `iso` (an instant with its offset or Z). */
export function pinClock(iso: string): void {
  vi.useFakeTimers({ toFake: ['Date'] });
  vi.setSystemTime(new Date(iso));
}

export function unpinClock(): void {
  vi.useRealTimers();
}

// The factories hash at cost 12 (a quarter second per sign-in); these tests sign in again at each
// pinned instant, so the same password is stored at cost 4.
let cheapHash: Promise<string> | null = null;

export interface ZonedWorld {
  org: TestOrg;
  base: string;
  as: (who: MemberRef) => Promise<Client>;
  /** Moves the organization to another zone (every request reads the zone with the member's actor). */
  setZone: (timeZone: string) => Promise<void>;
}

export async function zonedWorld(ds: DataSource, app: Express, timeZone: string): Promise<ZonedWorld> {
  const org = await createOrg(ds);
  const people = Object.values(org).filter((v): v is MemberRef => typeof v === 'object');
  await ds.query(`UPDATE users SET password_hash = $1 WHERE id = ANY($2)`, [
    await (cheapHash ??= bcrypt.hash(TEST_PASSWORD, 4)),
    people.map((p) => p.userId),
  ]);
  const setZone = async (zone: string) => {
    await ds.getRepository(Organization).update({ id: org.id }, { timeZone: zone });
  };
  await setZone(timeZone);
  return { org, base: `/api/orgs/${org.id}`, as: (who) => signedIn(app, who.email, TEST_PASSWORD), setZone };
}

/** Publishes, as the coach, a one-set deadlift session for the factory's athlete on `date`; returns its id. */
export async function publishSession(w: ZonedWorld, coach: Client, date: string): Promise<string> {
  const exercises = (await coach.get(`${w.base}/exercises`)).body as { id: string; name: string }[];
  const deadlift = exercises.find((e) => e.name === 'Deadlift')!.id;
  const program = await coach.post(`${w.base}/programs`, { name: `Block ${date}`, athleteIds: [w.org.athlete.membershipId] });
  expect(program.status, JSON.stringify(program.body)).toBe(201);
  const content = {
    exercises: [
      { id: randomUUID(), exerciseId: deadlift, sets: [{ id: randomUUID(), reps: 5, load: { kind: 'kg', value: 60 }, targetRpe: 6 }] },
    ],
  };
  const s = await coach.post(`${w.base}/programs/${program.body.id}/sessions`, { date, title: `Evening lift ${date}`, content });
  expect(s.status, JSON.stringify(s.body)).toBe(201);
  const published = await coach.post(`${w.base}/sessions/${s.body.id}/publish`, { version: s.body.version });
  expect(published.status, JSON.stringify(published.body)).toBe(200);
  return s.body.id;
}

/** Ids of the athlete's sessions on hold. */
export async function heldSessions(ds: DataSource, athleteId: string): Promise<string[]> {
  const rows: { session_id: string }[] = await ds.query(`SELECT session_id FROM session_holds WHERE athlete_id = $1 ORDER BY session_id`, [
    athleteId,
  ]);
  return rows.map((r) => r.session_id);
}

/** The "sessions on hold" notices of the organization: who got them and what they say. */
export async function onHoldNotices(
  ds: DataSource,
  organizationId: string,
): Promise<{ recipient_id: string; title: string; body: string }[]> {
  return ds.query(`SELECT recipient_id, title, body FROM notifications WHERE organization_id = $1 AND kind = 'sessions_on_hold'`, [
    organizationId,
  ]);
}
