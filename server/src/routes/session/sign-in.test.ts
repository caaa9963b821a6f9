import { describe, expect, it } from 'vitest';
import request from 'supertest';
import { Client, useHarness } from '../../test/harness';
import { createOrg, TEST_PASSWORD } from '../../test/factories';
import { COOKIE, replay, sessionCookie, sessionRows, sidOf, signInCapturing, uniqueEmail } from '../../test/worlds/session-fixtures';

describe('signing in and out (default settings)', () => {
  const h = useHarness();

  it('signs in: the user and memberships come back, and the cookie is HttpOnly, SameSite=Lax, Path=/, not Secure over plain HTTP', async () => {
    const org = await createOrg(h.ds);
    const { res, cookie } = await signInCapturing(h.app, org.coach.email);
    expect(res.body.user).toMatchObject({ id: org.coach.userId, email: org.coach.email });
    expect(res.body.memberships).toHaveLength(1);
    expect(res.body.memberships[0]).toMatchObject({ organizationId: org.id, roles: ['coach'] });
    expect(cookie.attrs.get('httponly')).toBe(true);
    expect(String(cookie.attrs.get('samesite')).toLowerCase()).toBe('lax');
    expect(cookie.attrs.get('path')).toBe('/');
    expect(cookie.attrs.has('secure')).toBe(false);
  });

  it('signs in case-insensitively on the e-mail and with surrounding spaces', async () => {
    const org = await createOrg(h.ds);
    const c = await Client.anonymous(h.app);
    const res = await c.signIn(`  ${org.clinician.email.toUpperCase()} `, TEST_PASSWORD);
    expect(res.status).toBe(200);
    expect(res.body.user.id).toBe(org.clinician.userId);
  });

  it('gives a new session id and CSRF token at sign-in: the pre-sign-in cookie no longer works (ASVS 5.0 V7.2.4)', async () => {
    const org = await createOrg(h.ds);
    // A signed-out visit makes no session to fixate (http/csrf.ts); the cookie an attacker could plant
    // is one of their own sessions, so sign in once and use that cookie for the next sign-in.
    const anon = await request(h.app).get('/api/session');
    expect(sessionCookie(anon)).toBeUndefined();
    const planted = await signInCapturing(h.app, org.coach.email);
    const before = planted.cookie;
    const oldCsrf = planted.res.body.csrfToken as string;

    const signIn = await request(h.app)
      .post('/api/session')
      .set('Cookie', `${COOKIE}=${before!.value}`)
      .set('x-csrf-token', oldCsrf)
      .send({ email: org.admin.email, password: TEST_PASSWORD });
    expect(signIn.status).toBe(200);
    const after = sessionCookie(signIn);
    expect(after).toBeDefined();
    expect(sidOf(after!.value)).not.toBe(sidOf(before!.value));
    expect(signIn.body.csrfToken).not.toBe(oldCsrf);

    // The old id is gone from the store and grants nothing.
    expect(await sessionRows(h.ds, sidOf(before!.value))).toBe(0);
    const old = await replay(h.app, before!.value, '/api/session');
    expect(old.status).toBe(200);
    expect(old.body.user).toBeNull();
    const oldOnOrg = await replay(h.app, before!.value, `/api/orgs/${org.id}`);
    expect(oldOnOrg.status).toBe(401);

    // The new one does.
    const current = await replay(h.app, after!.value, '/api/session');
    expect(current.body.user?.id).toBe(org.admin.userId);
  });

  it('sign-out deletes the session row; replaying the old cookie answers 401', async () => {
    const org = await createOrg(h.ds);
    const { c, cookie } = await signInCapturing(h.app, org.admin.email);
    const sid = sidOf(cookie.value);
    expect(await sessionRows(h.ds, sid)).toBe(1);
    expect((await replay(h.app, cookie.value, `/api/orgs/${org.id}`)).status).toBe(200);

    const out = await c.delete('/api/session');
    expect(out.status).toBe(204);
    expect(await sessionRows(h.ds, sid)).toBe(0);

    const replayed = await replay(h.app, cookie.value, `/api/orgs/${org.id}`);
    expect(replayed.status).toBe(401);
    expect(replayed.body.error.code).toBe('unauthenticated');
    const who = await c.get('/api/session');
    expect(who.body.user).toBeNull();

    const audit: { n: number }[] = await h.ds.query(
      `SELECT count(*)::int AS n FROM audit_entries WHERE action = 'auth.signed_out' AND actor_user_id = $1`,
      [org.admin.userId],
    );
    expect(audit[0].n).toBe(1);
  });

  it('sign-out needs a session (401 when signed out)', async () => {
    const anon = await Client.anonymous(h.app);
    const res = await anon.delete('/api/session');
    expect(res.status).toBe(401);
    expect(res.body.error.code).toBe('unauthenticated');
  });

  it('idle timeout is at most 30 minutes, on the server row as well as the cookie', async () => {
    const org = await createOrg(h.ds);
    const { cookie } = await signInCapturing(h.app, org.coach.email);
    const rows: { remaining: number }[] = await h.ds.query(
      `SELECT extract(epoch FROM expire::timestamptz - now())::float8 AS remaining FROM "session" WHERE sid = $1`,
      [sidOf(cookie.value)],
    );
    expect(rows).toHaveLength(1);
    expect(rows[0].remaining).toBeLessThanOrEqual(30 * 60 + 1);
    expect(rows[0].remaining).toBeGreaterThan(30 * 60 - 60);

    const maxAge = cookie.attrs.get('max-age');
    const lifetime = typeof maxAge === 'string' ? Number(maxAge) : (Date.parse(String(cookie.attrs.get('expires'))) - Date.now()) / 1000;
    expect(Number.isFinite(lifetime)).toBe(true);
    expect(lifetime).toBeLessThanOrEqual(30 * 60 + 1);
    expect(lifetime).toBeGreaterThan(30 * 60 - 60);
  });

  it('unknown e-mail and wrong password get the same status and the same body', async () => {
    const org = await createOrg(h.ds);
    const c = await Client.anonymous(h.app);
    const unknown = await c.post('/api/session', { email: uniqueEmail('nobody'), password: TEST_PASSWORD });
    const wrong = await c.post('/api/session', { email: org.coach.email, password: 'not the right passphrase' });
    expect(unknown.status).toBe(401);
    expect(wrong.status).toBe(unknown.status);
    expect(wrong.body.error).toEqual(unknown.body.error);
    expect(unknown.body.error.code).toBe('invalid_credentials');
    expect(Object.keys(wrong.body).sort()).toEqual(Object.keys(unknown.body).sort());
    expect(wrong.body.requestId).not.toBe(unknown.body.requestId);
    expect(sessionCookie(wrong)?.value ?? null).toBe(sessionCookie(unknown)?.value ?? null);
  });

  it('audits a sign-in in the person’s organization and a failure with the e-mail tried, never the password', async () => {
    const org = await createOrg(h.ds);
    const c = await Client.anonymous(h.app);
    const ok = await c.signIn(org.guardian.email, TEST_PASSWORD);
    expect(ok.status).toBe(200);
    const signedInRows: { organization_id: string; actor_user_id: string; request_id: string }[] = await h.ds.query(
      `SELECT organization_id, actor_user_id, request_id FROM audit_entries WHERE action = 'auth.signed_in' AND subject_id = $1`,
      [org.guardian.userId],
    );
    expect(signedInRows).toHaveLength(1);
    expect(signedInRows[0]).toEqual({
      organization_id: org.id,
      actor_user_id: org.guardian.userId,
      request_id: ok.headers['x-request-id'],
    });

    const badPassword = 'wrong-guess-for-audit-test';
    const anon = await Client.anonymous(h.app);
    const failed = await anon.post('/api/session', { email: org.guardian.email, password: badPassword });
    expect(failed.status).toBe(401);
    const failedRows: { after: { email: string }; actor_user_id: string | null; request_id: string; row: string }[] = await h.ds.query(
      `SELECT after, actor_user_id, request_id, row_to_json(a)::text AS row FROM audit_entries a
       WHERE action = 'auth.sign_in_failed' AND request_id = $1`,
      [failed.headers['x-request-id']],
    );
    expect(failedRows).toHaveLength(1);
    expect(failedRows[0].after.email).toBe(org.guardian.email);
    expect(failedRows[0].actor_user_id).toBeNull();
    expect(failedRows[0].row).not.toContain(badPassword);
  });
});
