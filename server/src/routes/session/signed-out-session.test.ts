import { describe, expect, it } from 'vitest';
import request from 'supertest';
import { Client, useHarness } from '../../test/harness';
import { createOrg, TEST_PASSWORD } from '../../test/factories';
import { COOKIE, sessionCookie } from '../../test/worlds/session-fixtures';

/** Rows of callers who are nobody: no signed-in user and no pending second step. */
async function anonymousSessionRows(h: ReturnType<typeof useHarness>): Promise<number> {
  const rows: { n: number }[] = await h.ds.query(
    `SELECT count(*)::int AS n FROM "session" WHERE sess -> 'passport' ->> 'user' IS NULL AND sess -> 'pendingSignIn' IS NULL`,
  );
  return rows[0].n;
}

const csrfCookie = (res: request.Response) =>
  ((res.headers['set-cookie'] as unknown as string[] | undefined) ?? []).find((c) => c.startsWith('loadline.csrf='));

describe('a signed-out GET /api/session writes no session row (ASVS 5.0 V3.5.1 with a signed double-submit token)', () => {
  const h = useHarness();

  it('5 signed-out GETs, with and without cookies, create no session row and set no session cookie', async () => {
    const before = await anonymousSessionRows(h);
    const agent = request.agent(h.app);
    const tokens: string[] = [];
    for (let i = 0; i < 5; i++) {
      const res = i % 2 ? await request(h.app).get('/api/session') : await agent.get('/api/session');
      expect(res.status).toBe(200);
      expect(res.body.user).toBeNull();
      expect(res.body.csrfToken).toMatch(/^[\w-]{43}$/);
      expect(sessionCookie(res)).toBeUndefined();
      if (i % 2 === 0) tokens.push(res.body.csrfToken);
    }
    expect(await anonymousSessionRows(h)).toBe(before);
    // The same browser keeps its token: its nonce cookie is reused, not replaced on each visit.
    expect(new Set(tokens).size).toBe(1);
  });

  it('the signed-out token is an HttpOnly cookie-bound token: it signs in with its cookie, and is refused without it or with another', async () => {
    const org = await createOrg(h.ds);
    const first = await request(h.app).get('/api/session');
    const cookie = csrfCookie(first)!;
    expect(cookie).toMatch(/HttpOnly/i);
    expect(cookie).toMatch(/SameSite=Lax/i);
    const pair = cookie.split(';')[0];
    const token = first.body.csrfToken as string;
    const other = await request(h.app).get('/api/session');
    const otherPair = csrfCookie(other)!.split(';')[0];
    const body = { email: org.coach.email, password: TEST_PASSWORD };

    const noCookie = await request(h.app).post('/api/session').set('x-csrf-token', token).send(body);
    expect(noCookie.status).toBe(403);
    expect(noCookie.body.error.code).toBe('csrf_failed');
    const wrongCookie = await request(h.app).post('/api/session').set('Cookie', otherPair).set('x-csrf-token', token).send(body);
    expect(wrongCookie.status).toBe(403);
    const forged = await request(h.app)
      .post('/api/session')
      .set('Cookie', 'loadline.csrf=' + 'A'.repeat(43))
      .set('x-csrf-token', token)
      .send(body);
    expect(forged.status).toBe(403);

    const ok = await request(h.app).post('/api/session').set('Cookie', pair).set('x-csrf-token', token).send(body);
    expect(ok.status).toBe(200);
    // Signed in, the session's own token takes over; the signed-out one no longer works for this session.
    const sid = sessionCookie(ok)!;
    expect(ok.body.csrfToken).not.toBe(token);
    const stale = await request(h.app)
      .patch('/api/me')
      .set('Cookie', `${pair}; ${COOKIE}=${sid.value}`)
      .set('x-csrf-token', token)
      .send({ displayName: 'Via the old token' });
    expect(stale.status).toBe(403);
    const fresh = await request(h.app)
      .patch('/api/me')
      .set('Cookie', `${pair}; ${COOKIE}=${sid.value}`)
      .set('x-csrf-token', ok.body.csrfToken)
      .send({ displayName: 'Via the session token' });
    expect(fresh.status).toBe(200);
  });

  it('after signing out, the browser gets a signed-out token again and can sign in once more', async () => {
    const org = await createOrg(h.ds);
    const c = await Client.anonymous(h.app);
    expect((await c.signIn(org.clinician.email, TEST_PASSWORD)).status).toBe(200);
    expect((await c.delete('/api/session')).status).toBe(204);
    await c.refresh();
    expect((await c.signIn(org.clinician.email, TEST_PASSWORD)).status).toBe(200);
  });
});
