import { afterAll, beforeAll, describe, expect, it, vi } from 'vitest';
import request from 'supertest';
import pg from 'pg';
import pino from 'pino';
import type { Express } from 'express';
import { buildApp } from '../app';
import { useHarness, signedIn } from '../test/harness';
import { createOrg, TEST_PASSWORD, type TestOrg } from '../test/factories';
import { ActorCache } from './actor-cache';

// Two app servers on one database, each with its own actor cache (http/actor-cache.ts). What one
// server (or any SQL) changes must be honoured by the other on its very next request, although the
// other had the person's session, user and memberships cached.
const h = useHarness({ SIGNIN_MAX_PER_IP: '1000', ACTOR_CACHE_SECONDS: '30' });

/** The SQL this process sends while `work` runs (both servers share the process), except the expiry touch. */
async function queriesDuring(work: () => Promise<unknown>): Promise<string[]> {
  const sent: string[] = [];
  const original = pg.Client.prototype.query;
  pg.Client.prototype.query = function (this: pg.Client, ...args: unknown[]) {
    const q = args[0] as string | { text?: string };
    const text = typeof q === 'string' ? q : (q?.text ?? '');
    if (!/^UPDATE "session" SET expire/.test(text)) sent.push(text);
    return (original as (...a: unknown[]) => unknown).apply(this, args);
  } as typeof original;
  try {
    await work();
  } finally {
    pg.Client.prototype.query = original;
  }
  return sent;
}

/** Signs in on `app` by hand and answers the session cookie and CSRF token, to be sent to either server. */
async function signInOn(app: Express, email: string): Promise<{ cookie: string; csrf: string }> {
  const first = await request(app).get('/api/session');
  const nonce = (first.headers['set-cookie'] as unknown as string[]).map((c) => c.split(';')[0]).join('; ');
  const res = await request(app)
    .post('/api/session')
    .set('cookie', nonce)
    .set('x-csrf-token', first.body.csrfToken)
    .send({ email, password: TEST_PASSWORD })
    .expect(200);
  const sid = (res.headers['set-cookie'] as unknown as string[]).map((c) => c.split(';')[0]).find((c) => c.startsWith('loadline.sid='))!;
  return { cookie: sid, csrf: res.body.csrfToken };
}

// A change made through the app (a command, a sign-out) is waited for by the server that made it, and
// reaches the other server with the same commit: those tests send the next request at once.
describe('the actor cache across two servers', () => {
  let org: TestOrg;
  let other: { app: Express; actorCache: ActorCache; close: () => Promise<void> };

  beforeAll(async () => {
    org = await createOrg(h.ds);
    const built = buildApp({ ds: h.ds, config: h.config, logger: pino({ level: 'silent' }), jobs: null });
    await built.ready;
    other = built;
  });
  afterAll(async () => {
    await other?.close();
  });

  /**
   * Plain SQL (not a command) is seen once PostgreSQL has delivered its notice, which takes well under a
   * millisecond here but is not ordered with this test's next request: wait for B to have heard it.
   */
  const heard = () => other.actorCache.settle();

  /**
   * Reads the roster on server B until its cache holds the session: then a request sends the handler's
   * query alone. (The sign-in's own session writes notify too, and a read that overlaps one is not kept.)
   */
  async function cachedOnB(cookie: string) {
    await vi.waitFor(
      async () => {
        const sent = await queriesDuring(() => request(other.app).get(`/api/orgs/${org.id}/roster`).set('cookie', cookie).expect(200));
        expect(sent).toHaveLength(1);
        expect(sent[0]).not.toMatch(/FROM "session"/);
      },
      { timeout: 5000, interval: 50 },
    );
  }

  it('a sign-out on one server is honoured by the other on its next request', async () => {
    const coach = await signInOn(h.app, org.coach.email);
    await cachedOnB(coach.cookie);
    await request(h.app).delete('/api/session').set('cookie', coach.cookie).set('x-csrf-token', coach.csrf).expect(204);
    expect((await request(other.app).get(`/api/orgs/${org.id}/roster`).set('cookie', coach.cookie)).status).toBe(401);
  });

  it('a role change on one server is honoured by the other on its next request (its sessions end)', async () => {
    const admin = await signedIn(h.app, org.admin.email, TEST_PASSWORD);
    const coach = await signInOn(h.app, org.coach.email);
    await cachedOnB(coach.cookie);
    const person = await admin.get(`/api/orgs/${org.id}/people/${org.coach.membershipId}`).expect(200);
    await admin
      .patch(`/api/orgs/${org.id}/people/${org.coach.membershipId}`, { roles: ['coach', 'clinician'], version: person.body.version })
      .expect(200);
    expect((await request(other.app).get(`/api/orgs/${org.id}/roster`).set('cookie', coach.cookie)).status).toBe(401);
  });

  it('a role or care team changed by plain SQL is honoured by the other server once it has the notice', async () => {
    const coach = await signInOn(h.app, org.coach.email);
    await cachedOnB(coach.cookie);
    const today = `/api/orgs/${org.id}/athletes/${org.athlete.membershipId}/today`;
    await request(other.app).get(today).set('cookie', coach.cookie).expect(200);
    await h.ds.query(`UPDATE memberships SET roles = '{guardian}' WHERE id = $1`, [org.coach.membershipId]);
    await heard();
    try {
      expect((await request(other.app).get(today).set('cookie', coach.cookie)).status).toBe(403);
    } finally {
      await h.ds.query(`UPDATE memberships SET roles = $2 WHERE id = $1`, [org.coach.membershipId, ['coach', 'clinician']]);
    }
    await cachedOnB(coach.cookie);
    await h.ds.query(`DELETE FROM care_team_assignments WHERE member_id = $1 AND role = 'coach'`, [org.coach.membershipId]);
    await heard();
    const roster = await request(other.app).get(`/api/orgs/${org.id}/roster`).set('cookie', coach.cookie).expect(200);
    expect(roster.body).toEqual([]);
  });

  it('sessions deleted by plain SQL answer 401 on the other server once it has the notice', async () => {
    const athlete = await signInOn(h.app, org.athlete.email);
    const path = `/api/orgs/${org.id}/athletes/${org.athlete.membershipId}/today`;
    await request(other.app).get(path).set('cookie', athlete.cookie).expect(200);
    await request(other.app).get(path).set('cookie', athlete.cookie).expect(200);
    await h.ds.query(`DELETE FROM "session" WHERE (sess -> 'passport' ->> 'user') = $1`, [org.athlete.userId]);
    await heard();
    expect((await request(other.app).get(path).set('cookie', athlete.cookie)).status).toBe(401);
  });
});

describe('the actor cache without its listening connection', () => {
  it('is off (and empty) until LISTEN is in place, and after the connection drops', async () => {
    const cache = new ActorCache('postgres://nobody@127.0.0.1:1/none', pino({ level: 'silent' }), 30_000);
    await cache.start();
    expect(cache.active).toBe(false);
    cache.put('sid', cache.begin(), { row: {}, expiresAt: Date.now() + 60_000 }, null);
    expect(cache.get('sid')).toBeUndefined();
    await cache.close();
  });

  it('stores nothing read before an invalidation that arrived meanwhile', async () => {
    const url = h.config.DATABASE_URL;
    const cache = new ActorCache(url, pino({ level: 'silent' }), 30_000);
    await cache.start();
    expect(cache.active).toBe(true);
    const token = cache.begin();
    cache.invalidate('*');
    cache.put('sid', token, { row: {}, expiresAt: Date.now() + 60_000 }, null);
    expect(cache.get('sid')).toBeUndefined();
    cache.put('sid', cache.begin(), { row: {}, expiresAt: Date.now() + 60_000 }, 'u1');
    expect(cache.get('sid')).toBeDefined();
    cache.invalidate('u:u1');
    expect(cache.get('sid')).toBeUndefined();
    // An expired session row is never served from the cache.
    cache.put('sid', cache.begin(), { row: {}, expiresAt: Date.now() - 1 }, null);
    expect(cache.get('sid')).toBeUndefined();
    // The connection ends: the cache turns itself off and empties.
    cache.put('sid2', cache.begin(), { row: {}, expiresAt: Date.now() + 60_000 }, null);
    await (cache as unknown as { listener: pg.Client }).listener.end();
    expect(cache.active).toBe(false);
    expect(cache.get('sid2')).toBeUndefined();
    await cache.close();
  });
});
