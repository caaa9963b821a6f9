import { randomUUID } from 'node:crypto';
import { afterEach, describe, expect, it, vi } from 'vitest';
import request from 'supertest';
import pino from 'pino';
import { Client, signedIn, useHarness } from '../test/harness';
import { createOrg, TEST_PASSWORD } from '../test/factories';
import { auditRefusal, flushRefusals } from '../services/refusals';
import { verifyChain } from '../services/audit';

interface Row {
  organization_id: string | null;
  actor_user_id: string | null;
  action: string;
  subject_type: string;
  subject_id: string | null;
  request_id: string | null;
  after: Record<string, unknown>;
}

/**
 * Polls for entries written after the response (refusals are audited off the request path); counts
 * tries, not time, so a pinned clock cannot stall it. Up to 30 s: on a busy 2-core machine with the
 * other test worker at full load, 100 refusals once took more than 10 s to be counted.
 */
async function until<T>(probe: () => Promise<T | undefined>): Promise<T> {
  for (let i = 0; i < 600; i++) {
    const value = await probe();
    if (value !== undefined) return value;
    await new Promise((r) => setTimeout(r, 50));
  }
  throw new Error(`timed out waiting; last probe: ${JSON.stringify(await probe())}`);
}

describe('refusals are audited, summarised per actor, route and minute (ASVS 5.0 V16.3.1, V16.3.2)', () => {
  const h = useHarness({ SIGNIN_MAX_FAILURES_PER_ACCOUNT: '2' });
  afterEach(() => {
    vi.useRealTimers();
  });
  const entries = (where: string, params: unknown[]): Promise<Row[]> =>
    h.ds.query(
      `SELECT organization_id, actor_user_id, action, subject_type, subject_id, request_id, after FROM audit_entries WHERE ${where} ORDER BY id`,
      params,
    );

  const quietDeps = () => ({ ds: h.ds, logger: pino({ level: 'silent' }) });
  /** The organization's coach refused on a GET of `route`, as the error handler reports it. */
  const coachRefusedOn = (org: { id: string; coach: { userId: string } }, route: string) => ({
    organizationIds: [org.id],
    actorUserId: org.coach.userId,
    address: null,
    action: 'access.refused',
    method: 'GET',
    route,
    path: route,
    requestId: null,
  });

  it('a flood of refusals is written one at a time and coalesced: it never takes the pool the requests need', async () => {
    const org = await createOrg(h.ds);
    const original = h.ds.transaction.bind(h.ds);
    let active = 0;
    let most = 0;
    const spy = vi.spyOn(h.ds, 'transaction').mockImplementation((async (...args: unknown[]) => {
      most = Math.max(most, ++active);
      try {
        return await (original as (...a: unknown[]) => Promise<unknown>)(...args);
      } finally {
        active -= 1;
      }
    }) as typeof h.ds.transaction);
    try {
      const route = `/api/flood/${randomUUID()}`;
      for (let i = 0; i < 500; i++) auditRefusal(quietDeps(), coachRefusedOn(org, route));
      const counted = await until(async () => {
        const [c]: { hits: number }[] = await h.ds.query(`SELECT sum(hits)::int AS hits FROM refusal_counters WHERE route = $1`, [
          `GET ${route}`,
        ]);
        return c?.hits === 500 ? c : undefined;
      });
      expect(counted.hits).toBe(500);
      // Before: one transaction per refusal, all at once, each waiting on the same counter row.
      expect(most).toBe(1);
      expect(await entries(`organization_id = $1 AND after->>'route' = $2`, [org.id, route])).toHaveLength(1);
    } finally {
      spy.mockRestore();
    }
  });

  it('a refusal queued while the writer is finishing its summary pass is still written, without waiting for another refusal', async () => {
    const org = await createOrg(h.ds);
    const deps = quietDeps();
    const refusal = (route: string) => coachRefusedOn(org, route);
    const [first, late] = [`/api/first/${randomUUID()}`, `/api/late/${randomUUID()}`];
    const original = h.ds.transaction.bind(h.ds);
    let calls = 0;
    // The writer's second transaction is its summary pass (the first wrote the first refusal): the
    // late refusal arrives just then, while the writer is still running.
    const spy = vi.spyOn(h.ds, 'transaction').mockImplementation((async (...args: unknown[]) => {
      if (++calls === 2) auditRefusal(deps, refusal(late));
      return (original as (...a: unknown[]) => Promise<unknown>)(...args);
    }) as typeof h.ds.transaction);
    try {
      auditRefusal(deps, refusal(first));
      const written = await until(async () => {
        const rows: { route: string }[] = await h.ds.query(`SELECT route FROM refusal_counters WHERE route = $1`, [`GET ${late}`]);
        return rows.length ? rows : undefined;
      });
      expect(written).toHaveLength(1);
    } finally {
      spy.mockRestore();
    }
  });

  it('100 refusals in one minute by one member on one route give 2 entries: the first, then a summary with the count', async () => {
    const org = await createOrg(h.ds);
    vi.useFakeTimers({ toFake: ['Date'] });
    const minute = Math.ceil(Date.now() / 60_000) * 60_000;
    vi.setSystemTime(minute + 1_000);
    const coach = await signedIn(h.app, org.coach.email, TEST_PASSWORD);
    for (let i = 0; i < 100; i++) {
      // Each refused with a different target: the count groups by route, not by path.
      const target = i % 2 ? org.athlete.membershipId : org.guardian.membershipId;
      const res = await coach.patch(`/api/orgs/${org.id}/people/${target}`, { roles: ['admin'], version: 1 });
      expect(res.status).toBe(403);
    }
    const refusedBy = () =>
      entries(`organization_id = $1 AND action = 'access.refused' AND actor_user_id = $2`, [org.id, org.coach.userId]);
    await until(async () => {
      const [c]: { hits: number }[] = await h.ds.query(
        `SELECT hits FROM refusal_counters WHERE organization_id = $1 AND actor_user_id = $2`,
        [org.id, org.coach.userId],
      );
      return c?.hits === 100 ? c : undefined;
    });
    expect(await refusedBy()).toHaveLength(1);

    // The minute is over: the next flush (the next refusal anywhere, or the timer) writes the summary.
    vi.setSystemTime(minute + 61_000);
    await flushRefusals(h.ds);
    const rows = await refusedBy();
    expect(rows).toHaveLength(2);
    expect(rows[0].after).toMatchObject({ method: 'PATCH', route: '/api/orgs/:orgId/people/:id', message: expect.any(String) });
    expect(rows[0].request_id).toBeTruthy();
    expect(rows[1].after).toMatchObject({ summary: true, method: 'PATCH', route: '/api/orgs/:orgId/people/:id', count: 100 });
    expect((await verifyChain(h.ds.manager, org.id)).intact).toBe(true);
    const left: { n: number }[] = await h.ds.query(`SELECT count(*)::int AS n FROM refusal_counters WHERE organization_id = $1`, [org.id]);
    expect(left[0].n).toBe(0);
  });

  it('a member asking for a record they cannot see (404) is audited; an unknown route and a non-member are not', async () => {
    const org = await createOrg(h.ds);
    const outsiderOrg = await createOrg(h.ds);
    const clinician = await signedIn(h.app, org.otherClinician.email, TEST_PASSWORD);
    const caseId = randomUUID();
    const res = await clinician.get(`/api/orgs/${org.id}/cases/${caseId}`);
    expect(res.status).toBe(404);
    const rows = await until(async () => {
      const r = await entries(`organization_id = $1 AND action = 'access.not_found'`, [org.id]);
      return r.length ? r : undefined;
    });
    expect(rows).toHaveLength(1);
    expect(rows[0]).toMatchObject({
      actor_user_id: org.otherClinician.userId,
      subject_type: 'Route',
      request_id: res.headers['x-request-id'],
      after: { method: 'GET', route: '/api/orgs/:orgId/cases/:id', path: `/api/orgs/${org.id}/cases/${caseId}` },
    });

    expect((await clinician.get(`/api/orgs/${org.id}/no-such-thing`)).status).toBe(404);
    const outsider = await signedIn(h.app, outsiderOrg.admin.email, TEST_PASSWORD);
    expect((await outsider.get(`/api/orgs/${org.id}/cases/${caseId}`)).status).toBe(404);
    await new Promise((r) => setTimeout(r, 300));
    expect(await entries(`organization_id = $1 AND action = 'access.not_found'`, [org.id])).toHaveLength(1);
    expect(await entries(`actor_user_id = $1 AND action LIKE 'access.%'`, [outsiderOrg.admin.userId])).toEqual([]);
  });

  it('CSRF refusals: a member’s in their organization’s trail, a signed-out caller’s in the global trail with the address', async () => {
    const org = await createOrg(h.ds);
    const coach = await signedIn(h.app, org.coach.email, TEST_PASSWORD);
    const res = await coach.agent.patch('/api/me').send({ displayName: 'Forged' });
    expect(res.status).toBe(403);
    const rows = await until(async () => {
      const r = await entries(`organization_id = $1 AND action = 'access.csrf_refused'`, [org.id]);
      return r.length ? r : undefined;
    });
    expect(rows[0]).toMatchObject({
      actor_user_id: org.coach.userId,
      request_id: res.headers['x-request-id'],
      after: { method: 'PATCH', path: '/api/me' },
    });

    const anon = await request(h.app).post('/api/session').send({ email: org.coach.email, password: 'x' });
    expect(anon.status).toBe(403);
    const global = await until(async () => {
      const r = await entries(`organization_id IS NULL AND action = 'access.csrf_refused' AND request_id = $1`, [
        anon.headers['x-request-id'],
      ]);
      return r.length ? r : undefined;
    });
    expect(global[0].actor_user_id).toBeNull();
    expect(global[0].after).toMatchObject({ method: 'POST', path: '/api/session', address: expect.any(String) });
  });

  it('failed sign-ins against a member’s e-mail and the limit’s refusal show in that organization’s trail', async () => {
    const org = await createOrg(h.ds);
    const c = await Client.anonymous(h.app);
    const statuses: number[] = [];
    for (let i = 0; i < 3; i++) statuses.push((await c.post('/api/session', { email: org.guardian.email, password: `guess ${i}` })).status);
    expect(statuses).toEqual([401, 401, 429]);
    const failed = await entries(`organization_id = $1 AND action = 'auth.sign_in_failed'`, [org.id]);
    expect(failed).toHaveLength(2);
    expect(failed[0]).toMatchObject({ actor_user_id: null, subject_id: org.guardian.userId, after: { email: org.guardian.email } });
    const limited = await until(async () => {
      const r = await entries(`organization_id = $1 AND action = 'auth.sign_in_limited'`, [org.id]);
      return r.length ? r : undefined;
    });
    expect(limited[0]).toMatchObject({
      actor_user_id: null,
      after: { method: 'POST', route: '/api/session', limit: 'account', email: org.guardian.email, address: expect.any(String) },
    });
    expect(JSON.stringify([...failed, ...limited])).not.toContain('guess');
  });
});
