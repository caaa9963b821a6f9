import { afterEach, describe, expect, it, vi } from 'vitest';
import request from 'supertest';
import type { Response } from 'supertest';
import type { Express } from 'express';
import type { DataSource } from 'typeorm';
import { Client, signedIn, useHarness } from '../../test/harness';
import { createOrg, TEST_PASSWORD } from '../../test/factories';

const COOKIE = 'loadline.sid';

interface ParsedCookie {
  value: string;
  attrs: Map<string, string | true>;
}

/** The session cookie from a response's Set-Cookie, with its attributes keyed in lower case. */
function sessionCookie(res: Response): ParsedCookie | undefined {
  const raw = res.headers['set-cookie'] as unknown as string[] | undefined;
  const line = raw?.find((c) => c.startsWith(`${COOKIE}=`));
  if (!line) return undefined;
  const [first, ...rest] = line.split(';').map((p) => p.trim());
  const attrs = new Map<string, string | true>();
  for (const part of rest) {
    const eq = part.indexOf('=');
    if (eq === -1) attrs.set(part.toLowerCase(), true);
    else attrs.set(part.slice(0, eq).toLowerCase(), part.slice(eq + 1));
  }
  return { value: first.slice(COOKIE.length + 1), attrs };
}

/** The store's key for a signed cookie value `s:<sid>.<signature>`. */
function sidOf(cookieValue: string): string {
  const v = decodeURIComponent(cookieValue);
  expect(v.startsWith('s:')).toBe(true);
  return v.slice(2, v.lastIndexOf('.'));
}

async function sessionRows(ds: DataSource, sid: string): Promise<number> {
  const rows: { n: number }[] = await ds.query('SELECT count(*)::int AS n FROM "session" WHERE sid = $1', [sid]);
  return rows[0].n;
}

/** Replays a captured cookie with a bare request (no cookie jar), as an attacker holding it would. */
function replay(app: Express, cookieValue: string, path: string) {
  return request(app).get(path).set('Cookie', `${COOKIE}=${cookieValue}`);
}

/** Signs in with a fresh anonymous client and returns the client plus the session cookie it got. */
async function signInCapturing(app: Express, email: string) {
  const c = await Client.anonymous(app);
  const res = await c.signIn(email, TEST_PASSWORD);
  expect(res.status).toBe(200);
  const cookie = sessionCookie(res);
  expect(cookie).toBeDefined();
  return { c, res, cookie: cookie! };
}

async function invitationToken(admin: Client, orgId: string, body: Record<string, unknown>): Promise<string> {
  const res = await admin.post(`/api/orgs/${orgId}/invitations`, body);
  expect(res.status).toBe(201);
  return new URL(res.body.link).hash.slice(1);
}

const uniqueEmail = (tag: string) => `${tag}-${Math.random().toString(36).slice(2, 10)}@test.example`;

describe('sessions (default settings)', () => {
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

  it('gives a new session id and CSRF token at sign-in: the pre-sign-in cookie no longer works', async () => {
    const org = await createOrg(h.ds);
    const anon = await request(h.app).get('/api/session');
    const before = sessionCookie(anon);
    expect(before).toBeDefined();
    const oldCsrf = anon.body.csrfToken as string;

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

  describe('CSRF', () => {
    it('refuses a cross-site write however it is dressed, and accepts the right token from the same origin', async () => {
      const org = await createOrg(h.ds);
      const c = await signedIn(h.app, org.coach.email, TEST_PASSWORD);
      const nameNow = async () => {
        const rows: { display_name: string }[] = await h.ds.query('SELECT display_name FROM users WHERE id = $1', [org.coach.userId]);
        return rows[0].display_name;
      };
      const otherSession = await Client.anonymous(h.app);
      const sameLengthWrong = c.csrf.slice(0, -1) + (c.csrf.endsWith('A') ? 'B' : 'A');
      const refused: { label: string; headers: Record<string, string> }[] = [
        { label: 'no token', headers: {} },
        { label: 'wrong token of the same length', headers: { 'x-csrf-token': sameLengthWrong } },
        { label: 'another session’s token', headers: { 'x-csrf-token': otherSession.csrf } },
        { label: 'right token, foreign Origin', headers: { 'x-csrf-token': c.csrf, Origin: 'https://evil.example' } },
        { label: 'right token, Sec-Fetch-Site: cross-site', headers: { 'x-csrf-token': c.csrf, 'Sec-Fetch-Site': 'cross-site' } },
        { label: 'right token, Sec-Fetch-Site: same-site', headers: { 'x-csrf-token': c.csrf, 'Sec-Fetch-Site': 'same-site' } },
      ];
      const outcomes: string[] = [];
      for (const { label, headers } of refused) {
        const res = await c.agent.patch('/api/me').set(headers).send({ displayName: 'Changed by CSRF' });
        outcomes.push(`${label}: ${res.status} ${res.body.error?.code}`);
      }
      expect(outcomes).toEqual(refused.map(({ label }) => `${label}: 403 csrf_failed`));
      expect(await nameNow()).toBe(org.coach.name);

      const res = await c.agent
        .patch('/api/me')
        .set('x-csrf-token', c.csrf)
        .set('Host', 'loadline.test')
        .set('Origin', 'http://loadline.test')
        .set('Sec-Fetch-Site', 'same-origin')
        .send({ displayName: 'Same Origin Name' });
      expect(res.status).toBe(200);
      expect(await nameNow()).toBe('Same Origin Name');
    });

    it('refuses an anonymous write (sign-in) without the token', async () => {
      const org = await createOrg(h.ds);
      const res = await request(h.app).post('/api/session').send({ email: org.coach.email, password: TEST_PASSWORD });
      expect(res.status).toBe(403);
      expect(res.body.error.code).toBe('csrf_failed');
      expect(sessionCookie(res)).toBeUndefined();
    });
  });

  it('PATCH /api/me changes name and unit and writes an audit entry', async () => {
    const org = await createOrg(h.ds);
    const c = await signedIn(h.app, org.athlete.email, TEST_PASSWORD);
    const res = await c.patch('/api/me', { displayName: '  Renamed Athlete ', unitPref: 'lb' });
    expect(res.status).toBe(200);
    expect(res.body).toEqual({ id: org.athlete.userId, email: org.athlete.email, displayName: 'Renamed Athlete', unitPref: 'lb' });
    const who = await c.get('/api/session');
    expect(who.body.user).toMatchObject({ displayName: 'Renamed Athlete', unitPref: 'lb' });

    const audit: { before: unknown; after: unknown; request_id: string; actor_user_id: string }[] = await h.ds.query(
      `SELECT before, after, request_id, actor_user_id FROM audit_entries WHERE action = 'user.updated' AND subject_id = $1`,
      [org.athlete.userId],
    );
    expect(audit).toHaveLength(1);
    expect(audit[0].actor_user_id).toBe(org.athlete.userId);
    expect(audit[0].before).toEqual({ displayName: org.athlete.name, unitPref: 'kg' });
    expect(audit[0].after).toEqual({ displayName: 'Renamed Athlete', unitPref: 'lb' });
    expect(audit[0].request_id).toBe(res.headers['x-request-id']);
  });

  it('PATCH /api/me refuses fields a person may not set on themselves and bad values, changing nothing', async () => {
    const org = await createOrg(h.ds);
    const c = await signedIn(h.app, org.coach.email, TEST_PASSWORD);
    const withEmail = await c.patch('/api/me', { displayName: 'X', email: 'taken@test.example' });
    expect(withEmail.status).toBe(400);
    expect(withEmail.body.error.fields).toHaveProperty('email');
    const badUnit = await c.patch('/api/me', { unitPref: 'stone' });
    expect(badUnit.status).toBe(400);
    expect(badUnit.body.error.fields).toHaveProperty('unitPref');
    const rows: { email: string; display_name: string; unit_pref: string }[] = await h.ds.query(
      'SELECT email, display_name, unit_pref FROM users WHERE id = $1',
      [org.coach.userId],
    );
    expect(rows[0]).toEqual({ email: org.coach.email, display_name: org.coach.name, unit_pref: 'kg' });
  });

  it('PATCH /api/me needs a session', async () => {
    const anon = await Client.anonymous(h.app);
    const res = await anon.patch('/api/me', { displayName: 'Nobody' });
    expect(res.status).toBe(401);
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

  describe('passwords (through the invitation-accept flow)', () => {
    it('stores a bcrypt hash at cost 12 or more', async () => {
      const org = await createOrg(h.ds);
      const admin = await signedIn(h.app, org.admin.email, TEST_PASSWORD);
      const email = uniqueEmail('cost');
      const token = await invitationToken(admin, org.id, { email, roles: ['coach'] });
      const newcomer = await Client.anonymous(h.app);
      const password = 'a fine long passphrase for cost';
      const res = await newcomer.post('/api/invitations/accept', { token, displayName: 'Cost Check', password });
      expect(res.status).toBe(200);
      const rows: { password_hash: string }[] = await h.ds.query('SELECT password_hash FROM users WHERE email = $1', [email]);
      expect(rows).toHaveLength(1);
      const match = /^\$2[ab]\$(\d\d)\$/.exec(rows[0].password_hash);
      expect(match).not.toBeNull();
      expect(Number(match![1])).toBeGreaterThanOrEqual(12);
      expect(rows[0].password_hash).not.toContain(password);
    });

    it('refuses a 73-byte password with a message naming password (bcrypt would cut it silently)', async () => {
      const org = await createOrg(h.ds);
      const admin = await signedIn(h.app, org.admin.email, TEST_PASSWORD);
      const email = uniqueEmail('long');
      const token = await invitationToken(admin, org.id, { email, roles: ['coach'] });
      const newcomer = await Client.anonymous(h.app);
      const res = await newcomer.post('/api/invitations/accept', { token, displayName: 'Too Long', password: 'x'.repeat(73) });
      expect(res.status).toBe(400);
      expect(res.body.error.code).toBe('validation_failed');
      expect(res.body.error.fields.password[0]).toMatch(/72 bytes/);
      expect(res.body.error.message).toMatch(/password/);
      const rows: { n: number }[] = await h.ds.query('SELECT count(*)::int AS n FROM users WHERE email = $1', [email]);
      expect(rows[0].n).toBe(0);
    });

    it('applies the password policy: length in characters and bytes, no common passwords', async () => {
      const org = await createOrg(h.ds);
      const admin = await signedIn(h.app, org.admin.email, TEST_PASSWORD);
      const cases: { label: string; password: string; ok: boolean }[] = [
        { label: '7 characters', password: 'Zq7#mK2', ok: false },
        { label: '8 characters', password: 'Zq7#mK2p', ok: true },
        { label: 'common: password1', password: 'password1', ok: false },
        { label: 'common: qwertyuiop', password: 'qwertyuiop', ok: false },
        { label: 'common, other case: PASSWORD1', password: 'PASSWORD1', ok: false },
        { label: '72 bytes', password: 'k'.repeat(60) + 'Zq7#mK2p0123', ok: true },
        { label: "'é' × 37 = 74 bytes in 37 characters", password: 'é'.repeat(37), ok: false },
      ];
      expect(new TextEncoder().encode(cases[5].password).length).toBe(72);

      const outcomes: { label: string; status: number; fields: string[] }[] = [];
      for (const { label, password } of cases) {
        const email = uniqueEmail('policy');
        const token = await invitationToken(admin, org.id, { email, roles: ['guardian'] });
        const res = await (await Client.anonymous(h.app)).post('/api/invitations/accept', { token, displayName: label, password });
        outcomes.push({ label, status: res.status, fields: Object.keys(res.body.error?.fields ?? {}) });
      }
      expect(outcomes).toEqual(cases.map(({ label, ok }) => ({ label, status: ok ? 200 : 400, fields: ok ? [] : ['password'] })));
    });
  });
});

describe('sessions with SECURE_COOKIES=true behind a TLS proxy', () => {
  const h = useHarness({ SECURE_COOKIES: 'true', TRUST_PROXY: 'true' });

  it('marks the cookie Secure (and sends HSTS)', async () => {
    const res = await request(h.app).get('/api/session').set('X-Forwarded-Proto', 'https');
    expect(res.status).toBe(200);
    const cookie = sessionCookie(res);
    expect(cookie).toBeDefined();
    expect(cookie!.attrs.get('secure')).toBe(true);
    expect(cookie!.attrs.get('httponly')).toBe(true);
    expect(String(cookie!.attrs.get('samesite')).toLowerCase()).toBe('lax');
    expect(res.headers['strict-transport-security']).toMatch(/max-age=\d+/);
  });

  it('never hands a Secure cookie out over plain HTTP', async () => {
    const res = await request(h.app).get('/api/session');
    expect(res.status).toBe(200);
    expect(sessionCookie(res)).toBeUndefined();
  });
});

// Timeouts and rate-limit windows read the time from Date, and only Date is simulated below: a test
// steps past a window instead of waiting for it, whatever bcrypt's speed on a busy machine.
const MIN = 60_000;
const simulateClock = () => {
  vi.useFakeTimers({ toFake: ['Date'] });
  return Date.now();
};

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

describe('sign-in rate limit per account (SIGNIN_WINDOW_SECONDS=2, 3 failures per window)', () => {
  const h = useHarness({ SIGNIN_WINDOW_SECONDS: '2', SIGNIN_MAX_FAILURES_PER_ACCOUNT: '3' });
  afterEach(() => {
    vi.useRealTimers();
  });

  it('20 bad tries on one account → 429 (the last one too); after the window the real user signs in', async () => {
    const org = await createOrg(h.ds);
    const c = await Client.anonymous(h.app);
    const t0 = simulateClock();
    const statuses: number[] = [];
    let last!: Awaited<ReturnType<Client['post']>>;
    for (let i = 0; i < 20; i++) {
      last = await c.post('/api/session', { email: org.coach.email, password: `guess number ${i}` });
      statuses.push(last.status);
    }
    expect(statuses.filter((s) => s === 429).length).toBeGreaterThanOrEqual(1);
    expect(statuses).toEqual([401, 401, 401, ...Array(17).fill(429)]);
    expect(last.status).toBe(429);
    expect(last.body.error.code).toBe('rate_limited');

    // Inside the window even the right password is refused (so a lucky guess is not confirmed)...
    const blocked = await c.post('/api/session', { email: org.coach.email, password: TEST_PASSWORD });
    expect(blocked.status).toBe(429);
    // ...while another account from the same address is not locked by this one's failures.
    const other = await (await Client.anonymous(h.app)).signIn(org.clinician.email, TEST_PASSWORD);
    expect(other.status).toBe(200);

    // Once the window has passed the real user gets in: no permanent lockout.
    vi.setSystemTime(t0 + h.config.SIGNIN_WINDOW_SECONDS * 1000 + 1000);
    const ok = await c.signIn(org.coach.email, TEST_PASSWORD);
    expect(ok.status).toBe(200);
    expect(ok.body.user.id).toBe(org.coach.userId);
  });
});

describe('sign-in rate limit per IP address (SIGNIN_WINDOW_SECONDS=2, 3 tries per window)', () => {
  const h = useHarness({ SIGNIN_WINDOW_SECONDS: '2', SIGNIN_MAX_PER_IP: '3' });
  afterEach(() => {
    vi.useRealTimers();
  });

  it('limits tries from one address across many accounts, then lets the address in again', async () => {
    const org = await createOrg(h.ds);
    const c = await Client.anonymous(h.app);
    const t0 = simulateClock();
    const statuses: number[] = [];
    for (let i = 0; i < 4; i++) {
      const res = await c.post('/api/session', { email: uniqueEmail('spray'), password: 'guessing the passphrase' });
      statuses.push(res.status);
    }
    expect(statuses).toEqual([401, 401, 401, 429]);
    expect((await c.post('/api/session', { email: org.coach.email, password: TEST_PASSWORD })).status).toBe(429);

    vi.setSystemTime(t0 + h.config.SIGNIN_WINDOW_SECONDS * 1000 + 1000);
    const ok = await c.signIn(org.coach.email, TEST_PASSWORD);
    expect(ok.status).toBe(200);
  });
});
