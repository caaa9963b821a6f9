import { afterEach, describe, expect, it, vi } from 'vitest';
import request from 'supertest';
import { useHarness } from '../../test/harness';
import { createOrg, TEST_PASSWORD } from '../../test/factories';
import { MIN, replay, sessionCookie, sessionRows, sidOf, signInCapturing, simulateClock } from '../../test/worlds/session-fixtures';

describe('sessions with SECURE_COOKIES=true behind a TLS proxy', () => {
  const h = useHarness({ SECURE_COOKIES: 'true', TRUST_PROXY: 'true', PUBLIC_URL: 'https://loadline.example.org' });

  it('marks the cookies Secure (and sends HSTS); the signed-out CSRF cookie is __Host- prefixed', async () => {
    const org = await createOrg(h.ds);
    const res = await request(h.app).get('/api/session').set('X-Forwarded-Proto', 'https');
    expect(res.status).toBe(200);
    const csrfLine = ((res.headers['set-cookie'] as unknown as string[]) ?? []).find((c) => c.startsWith('__Host-loadline.csrf='));
    expect(csrfLine).toMatch(/; Path=\/;.*Secure/);
    expect(res.headers['strict-transport-security']).toMatch(/max-age=\d+/);
    const signIn = await request(h.app)
      .post('/api/session')
      .set('X-Forwarded-Proto', 'https')
      .set('Cookie', csrfLine!.split(';')[0])
      .set('x-csrf-token', res.body.csrfToken)
      .send({ email: org.coach.email, password: TEST_PASSWORD });
    expect(signIn.status).toBe(200);
    const cookie = sessionCookie(signIn);
    expect(cookie).toBeDefined();
    expect(cookie!.attrs.get('secure')).toBe(true);
    expect(cookie!.attrs.get('httponly')).toBe(true);
    expect(String(cookie!.attrs.get('samesite')).toLowerCase()).toBe('lax');
  });

  it('never hands a Secure cookie out over plain HTTP', async () => {
    const res = await request(h.app).get('/api/session');
    expect(res.status).toBe(200);
    expect(sessionCookie(res)).toBeUndefined();
    expect(res.headers['set-cookie']).toBeUndefined();
  });
});

describe('session lifetime (simulated clock, default settings)', () => {
  const h = useHarness();
  afterEach(() => {
    vi.useRealTimers();
  });

  it('idle timeout: activity keeps a session alive; 31 idle minutes end it on the server', async () => {
    const org = await createOrg(h.ds);
    const t0 = simulateClock();
    const { cookie } = await signInCapturing(h.app, org.coach.email);
    const orgPath = `/api/orgs/${org.id}`;

    vi.setSystemTime(t0 + 29 * MIN);
    expect((await replay(h.app, cookie.value, orgPath)).status).toBe(200);
    vi.setSystemTime(t0 + 58 * MIN);
    expect((await replay(h.app, cookie.value, orgPath)).status).toBe(200);

    // The cookie is replayed by hand, so it is the server, not the browser, that refuses it.
    vi.setSystemTime(t0 + (58 + 31) * MIN);
    const res = await replay(h.app, cookie.value, orgPath);
    expect(res.status).toBe(401);
    expect(res.body.error.code).toBe('unauthenticated');
  });

  it('absolute timeout: a session in constant use still ends after 12 hours', async () => {
    const org = await createOrg(h.ds);
    const t0 = simulateClock();
    const { cookie } = await signInCapturing(h.app, org.admin.email);
    const orgPath = `/api/orgs/${org.id}`;

    const statuses = new Set<number>();
    for (let m = 25; m < 12 * 60; m += 25) {
      vi.setSystemTime(t0 + m * MIN);
      statuses.add((await replay(h.app, cookie.value, orgPath)).status);
    }
    expect([...statuses]).toEqual([200]);

    vi.setSystemTime(t0 + (12 * 60 + 1) * MIN);
    const res = await replay(h.app, cookie.value, orgPath);
    expect(res.status).toBe(401);
    expect(res.body.error.code).toBe('session_expired');
    expect(await sessionRows(h.ds, sidOf(cookie.value))).toBe(0);
    expect((await replay(h.app, cookie.value, '/api/session')).body.user).toBeNull();
  });
});

describe('absolute session timeout is configurable (SESSION_ABSOLUTE_HOURS=0.001 ≈ 3.6 s)', () => {
  const h = useHarness({ SESSION_ABSOLUTE_HOURS: '0.001' });
  afterEach(() => {
    vi.useRealTimers();
  });

  it('ends the session once 3.6 s have passed since sign-in', async () => {
    const org = await createOrg(h.ds);
    const t0 = simulateClock();
    const { c } = await signInCapturing(h.app, org.admin.email);
    vi.setSystemTime(t0 + 3_000);
    expect((await c.get(`/api/orgs/${org.id}`)).status).toBe(200);
    vi.setSystemTime(t0 + 4_000);
    const res = await c.get(`/api/orgs/${org.id}`);
    expect(res.status).toBe(401);
    expect(res.body.error.code).toBe('session_expired');
  });
});
