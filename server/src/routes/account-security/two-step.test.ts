import { describe, expect, it } from 'vitest';
import type { Express } from 'express';
import { Client, signedIn, useHarness } from '../../test/harness';
import { createOrg, TEST_PASSWORD } from '../../test/factories';
import { auditCount, enable, nextCode, totp, cookieOf, replay } from '../../test/worlds/account-security-fixtures';

/** Two-step sign-in (TOTP, RFC 6238; ASVS 5.0 V6.3.3) and its recovery codes, through HTTP on the real database. */

describe('two-step sign-in', () => {
  const h = useHarness({ SIGNIN_MAX_PER_IP: '1000' });

  it('setup gives a secret, its otpauth address and a QR image; it is not on until a current code confirms it', async () => {
    const org = await createOrg(h.ds);
    const c = await signedIn(h.app, org.clinician.email, TEST_PASSWORD);
    const setup = await c.post('/api/account/two-step/setup');
    expect(setup.status).toBe(200);
    const { secret, otpauthUri, qrDataUrl } = setup.body;
    expect(secret).toMatch(/^[A-Z2-7]{32}$/);
    expect(otpauthUri).toMatch(/^otpauth:\/\/totp\/Loadline:/);
    expect(otpauthUri).toContain(`secret=${secret}`);
    expect(qrDataUrl).toMatch(/^data:image\/png;base64,/);

    const right = totp(secret).generate();
    const wrong = right === '123456' ? '654321' : '123456';
    const refused = await c.post('/api/account/two-step/enable', { code: wrong });
    expect(refused.status).toBe(400);
    expect(refused.body.error.fields).toHaveProperty('code');
    expect((await c.get('/api/account/two-step')).body).toMatchObject({ enabled: false });
    // Still off: signing in needs only the password.
    expect((await (await Client.anonymous(h.app)).signIn(org.clinician.email, TEST_PASSWORD)).body.user?.id).toBe(org.clinician.userId);

    const on = await c.post('/api/account/two-step/enable', { code: right });
    expect(on.status).toBe(200);
    expect(on.body.recoveryCodes).toHaveLength(10);
    expect(new Set(on.body.recoveryCodes).size).toBe(10);
    expect((await c.get('/api/account/two-step')).body).toMatchObject({ enabled: true, recoveryCodesLeft: 10 });
    expect(await auditCount(h.ds, 'auth.two_step_enabled', org.clinician.userId)).toBe(1);

    // At rest: the secret is encrypted, the recovery codes hashed.
    const [row]: { secret_enc: string }[] = await h.ds.query(`SELECT secret_enc FROM user_totp WHERE user_id = $1`, [org.clinician.userId]);
    expect(row.secret_enc).not.toContain(secret);
    expect(row.secret_enc).toMatch(/^v1\./);
    const codes: { row: string }[] = await h.ds.query(`SELECT row_to_json(r)::text AS row FROM totp_recovery_codes r WHERE user_id = $1`, [
      org.clinician.userId,
    ]);
    expect(codes).toHaveLength(10);
    for (const code of on.body.recoveryCodes as string[]) {
      expect(codes.map((r) => r.row).join()).not.toContain(code.replace('-', ''));
    }
  });

  it('with it on, the password alone gives no session that can open an organization; a current code does, with a new session id', async () => {
    const org = await createOrg(h.ds);
    const { secret } = await enable(await signedIn(h.app, org.admin.email, TEST_PASSWORD));

    const c = await Client.anonymous(h.app);
    const pw = await c.post('/api/session', { email: org.admin.email, password: TEST_PASSWORD });
    expect(pw.status).toBe(200);
    expect(pw.body).toMatchObject({ user: null, memberships: [], secondStep: true });
    c.csrf = pw.body.csrfToken;
    const pendingCookie = cookieOf(pw);
    expect((await c.get(`/api/orgs/${org.id}`)).status).toBe(401);
    expect((await c.get('/api/session')).body).toMatchObject({ user: null, secondStep: true });

    const code = nextCode(secret);
    const done = await c.post('/api/session/second-step', { code });
    expect(done.status, JSON.stringify(done.body)).toBe(200);
    expect(done.body.user.id).toBe(org.admin.userId);
    expect(done.body.secondStep).toBeUndefined();
    c.csrf = done.body.csrfToken;
    expect((await c.get(`/api/orgs/${org.id}`)).status).toBe(200);
    expect(cookieOf(done)).not.toBe(pendingCookie);
    expect((await replay(h.app, pendingCookie, `/api/orgs/${org.id}`)).status).toBe(401);

    // The same code again, in a new sign-in inside its window: refused.
    const again = await Client.anonymous(h.app);
    const pw2 = await again.post('/api/session', { email: org.admin.email, password: TEST_PASSWORD });
    again.csrf = pw2.body.csrfToken;
    const replayed = await again.post('/api/session/second-step', { code });
    expect(replayed.status).toBe(401);
    expect(replayed.body.error.code).toBe('invalid_credentials');
    expect((await again.get(`/api/orgs/${org.id}`)).status).toBe(401);
  });

  it('the second step without a pending password step is refused', async () => {
    const c = await Client.anonymous(h.app);
    const res = await c.post('/api/session/second-step', { code: '123456' });
    expect(res.status).toBe(401);
    expect(res.body.error.code).toBe('unauthenticated');
  });

  it('a recovery code signs in once, and its use is audited', async () => {
    const org = await createOrg(h.ds);
    const { recoveryCodes } = await enable(await signedIn(h.app, org.coach.email, TEST_PASSWORD));
    const attempt = async (code: string) => {
      const c = await Client.anonymous(h.app);
      const pw = await c.post('/api/session', { email: org.coach.email, password: TEST_PASSWORD });
      c.csrf = pw.body.csrfToken;
      return c.post('/api/session/second-step', { code });
    };
    const first = await attempt(recoveryCodes[3].toUpperCase());
    expect(first.status).toBe(200);
    expect(first.body.user.id).toBe(org.coach.userId);
    const second = await attempt(recoveryCodes[3]);
    expect(second.status).toBe(401);
    expect(await auditCount(h.ds, 'auth.recovery_code_used', org.coach.userId)).toBe(1);
    const status = await (await signInWithRecovery(h.app, org.coach.email, recoveryCodes[4])).get('/api/account/two-step');
    expect(status.body.recoveryCodesLeft).toBe(8);
  });

  it('turning it off needs the password and a current code', async () => {
    const org = await createOrg(h.ds);
    const c = await signedIn(h.app, org.guardian.email, TEST_PASSWORD);
    const { secret } = await enable(c);
    const code = nextCode(secret);
    const noPassword = await c.post('/api/account/two-step/disable', { password: 'not my passphrase at all', code });
    expect(noPassword.status).toBe(401);
    expect(noPassword.body.error.fields).toHaveProperty('password');
    const wrongCode = await c.post('/api/account/two-step/disable', {
      password: TEST_PASSWORD,
      code: code === '000000' ? '111111' : '000000',
    });
    expect(wrongCode.status).toBe(401);
    expect(wrongCode.body.error.fields).toHaveProperty('code');
    const missingCode = await c.post('/api/account/two-step/disable', { password: TEST_PASSWORD });
    expect(missingCode.status).toBe(400);
    expect((await c.get('/api/account/two-step')).body.enabled).toBe(true);

    const off = await c.post('/api/account/two-step/disable', { password: TEST_PASSWORD, code });
    expect(off.status, JSON.stringify(off.body)).toBe(204);
    expect((await c.get('/api/account/two-step')).body).toEqual({ enabled: false, enabledAt: null, recoveryCodesLeft: 0 });
    expect(await auditCount(h.ds, 'auth.two_step_disabled', org.guardian.userId)).toBe(1);
    const plain = await (await Client.anonymous(h.app)).signIn(org.guardian.email, TEST_PASSWORD);
    expect(plain.body.user?.id).toBe(org.guardian.userId);
  });

  it('accepting an invitation with an existing account’s password still asks for the code', async () => {
    const home = await createOrg(h.ds);
    const other = await createOrg(h.ds);
    const { secret } = await enable(await signedIn(h.app, home.clinician.email, TEST_PASSWORD));
    const admin = await signedIn(h.app, other.admin.email, TEST_PASSWORD);
    const invite = await admin.post(`/api/orgs/${other.id}/invitations`, { email: home.clinician.email, roles: ['clinician'] });
    expect(invite.status).toBe(201);
    const token = new URL(invite.body.link).hash.slice(1);

    const c = await Client.anonymous(h.app);
    const accepted = await c.post('/api/invitations/accept', { token, displayName: 'Same Person', password: TEST_PASSWORD });
    expect(accepted.status, JSON.stringify(accepted.body)).toBe(200);
    expect(accepted.body).toMatchObject({ user: null, secondStep: true });
    c.csrf = accepted.body.csrfToken;
    expect((await c.get(`/api/orgs/${other.id}`)).status).toBe(401);
    const done = await c.post('/api/session/second-step', { code: nextCode(secret) });
    expect(done.status).toBe(200);
    expect(done.body.memberships.map((m: { organizationId: string }) => m.organizationId).sort()).toEqual([home.id, other.id].sort());
  });

  it('new recovery codes need the password and a current code; the old ones stop working', async () => {
    const org = await createOrg(h.ds);
    const c = await signedIn(h.app, org.otherCoach.email, TEST_PASSWORD);
    const { secret, recoveryCodes: old } = await enable(c);
    const code = nextCode(secret);
    expect((await c.post('/api/account/two-step/recovery-codes', { password: 'not my passphrase at all', code })).status).toBe(401);
    const renewed = await c.post('/api/account/two-step/recovery-codes', { password: TEST_PASSWORD, code });
    expect(renewed.status, JSON.stringify(renewed.body)).toBe(200);
    expect(renewed.body.recoveryCodes).toHaveLength(10);
    expect(renewed.body.recoveryCodes.filter((r: string) => old.includes(r))).toEqual([]);
    expect(await auditCount(h.ds, 'auth.recovery_codes_replaced', org.otherCoach.userId)).toBe(1);

    const attempt = async (recovery: string) => {
      const a = await Client.anonymous(h.app);
      const pw = await a.post('/api/session', { email: org.otherCoach.email, password: TEST_PASSWORD });
      a.csrf = pw.body.csrfToken;
      return (await a.post('/api/session/second-step', { code: recovery })).status;
    };
    expect(await attempt(old[0])).toBe(401);
    expect(await attempt(renewed.body.recoveryCodes[0])).toBe(200);
  });

  it('setup while it is on is refused (the app in use keeps working)', async () => {
    const org = await createOrg(h.ds);
    const c = await signedIn(h.app, org.otherClinician.email, TEST_PASSWORD);
    await enable(c);
    const res = await c.post('/api/account/two-step/setup');
    expect(res.status).toBe(409);
  });

  it('needs a session for every account route', async () => {
    const anon = await Client.anonymous(h.app);
    const routes = [
      ['get', '/api/account/two-step'],
      ['post', '/api/account/two-step/setup'],
      ['post', '/api/account/two-step/enable'],
      ['post', '/api/account/two-step/disable'],
      ['post', '/api/account/two-step/recovery-codes'],
    ] as const;
    for (const [method, path] of routes) {
      const res = method === 'get' ? await anon.get(path) : await anon.post(path, {});
      expect(res.status, path).toBe(401);
    }
  });
});

async function signInWithRecovery(app: Express, email: string, code: string): Promise<Client> {
  const c = await Client.anonymous(app);
  const pw = await c.post('/api/session', { email, password: TEST_PASSWORD });
  c.csrf = pw.body.csrfToken;
  const res = await c.post('/api/session/second-step', { code });
  expect(res.status).toBe(200);
  c.csrf = res.body.csrfToken;
  return c;
}

describe('wrong second-step codes count toward the account’s sign-in limit (3 failures per window)', () => {
  const h = useHarness({ SIGNIN_WINDOW_SECONDS: '60', SIGNIN_MAX_FAILURES_PER_ACCOUNT: '3' });

  it('three wrong codes, then even the right code is refused with 429; other accounts are unaffected', async () => {
    const org = await createOrg(h.ds);
    const { secret } = await enable(await signedIn(h.app, org.clinician.email, TEST_PASSWORD));
    const c = await Client.anonymous(h.app);
    const pw = await c.post('/api/session', { email: org.clinician.email, password: TEST_PASSWORD });
    c.csrf = pw.body.csrfToken;
    const right = nextCode(secret);
    const wrong = right === '000000' ? '111111' : '000000';
    const statuses: number[] = [];
    for (let i = 0; i < 3; i++) statuses.push((await c.post('/api/session/second-step', { code: wrong })).status);
    statuses.push((await c.post('/api/session/second-step', { code: right })).status);
    expect(statuses).toEqual([401, 401, 401, 429]);
    // The password step of the same account is limited too.
    expect(
      (await (await Client.anonymous(h.app)).post('/api/session', { email: org.clinician.email, password: TEST_PASSWORD })).status,
    ).toBe(429);
    expect((await (await Client.anonymous(h.app)).signIn(org.coach.email, TEST_PASSWORD)).status).toBe(200);
  });
});
