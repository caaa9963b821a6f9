import { createHash } from 'node:crypto';
import { describe, expect, it } from 'vitest';
import request from 'supertest';
import type { Response } from 'supertest';
import type { Express } from 'express';
import type { DataSource } from 'typeorm';
import { Secret, TOTP } from 'otpauth';
import { Client, signedIn, useHarness } from '../../test/harness';
import { createOrg, TEST_PASSWORD } from '../../test/factories';
import { RESET_REQUESTED } from '../../commands/password-reset';

/**
 * Password reset (SECURITY 4, 5) and two-step sign-in (SECURITY 6, 8), through HTTP on the real
 * database; reset e-mails go through the real queue to the fake SMTP server.
 */
const COOKIE = 'loadline.sid';
const NEW_PASSWORD = 'a fresh and rather long passphrase';
const uniqueEmail = (tag: string) => `${tag}-${Math.random().toString(36).slice(2, 10)}@test.example`;

async function waitFor<T>(what: string, fn: () => Promise<T | null | undefined | false>, ms = 20_000): Promise<T> {
  const end = Date.now() + ms;
  for (;;) {
    const v = await fn();
    if (v) return v;
    if (Date.now() > end) throw new Error(`timed out waiting for ${what}`);
    await new Promise((r) => setTimeout(r, 100));
  }
}

const RESET_SUBJECT = 'Choose a new Loadline password';
const resetMails = (ds: DataSource, to: string): Promise<{ text_body: string; subject: string }[]> =>
  ds.query(`SELECT text_body, subject FROM fake_mailbox WHERE envelope_to && $1 AND subject = $2 ORDER BY id`, [[to], RESET_SUBJECT]);

/** Asks for a reset and returns the token from the `count`-th reset e-mail that address received. */
async function requestResetToken(app: Express, ds: DataSource, email: string, count = 1): Promise<string> {
  const c = await Client.anonymous(app);
  const res = await c.post('/api/password-reset', { email });
  expect(res.status).toBe(202);
  const mails = await waitFor(`reset e-mail #${count} to ${email}`, async () => {
    const m = await resetMails(ds, email);
    return m.length >= count ? m : null;
  });
  const token = mails[count - 1].text_body.match(/\/reset#([A-Za-z0-9_-]+)/)?.[1];
  expect(token).toBeTruthy();
  return token!;
}

function cookieOf(res: Response): string {
  const raw = res.headers['set-cookie'] as unknown as string[] | undefined;
  const line = raw?.find((c) => c.startsWith(`${COOKIE}=`));
  expect(line, 'a session cookie').toBeDefined();
  return line!.split(';')[0].slice(COOKIE.length + 1);
}
const replay = (app: Express, cookie: string, path: string) => request(app).get(path).set('Cookie', `${COOKIE}=${cookie}`);

const auditCount = async (ds: DataSource, action: string, userId: string): Promise<number> =>
  (await ds.query(`SELECT count(*)::int AS n FROM audit_entries WHERE action = $1 AND subject_id = $2`, [action, userId]))[0].n;

describe('password reset', () => {
  const h = useHarness({ SIGNIN_MAX_PER_IP: '1000', RESET_MAX_PER_IP: '1000', RESET_MAX_PER_ACCOUNT: '50' }, { mail: true });

  it('answers the same status and body for a known and an unknown address; only the known one gets an e-mail', async () => {
    const org = await createOrg(h.ds);
    const c = await Client.anonymous(h.app);
    const unknownEmail = uniqueEmail('nobody');
    const known = await c.post('/api/password-reset', { email: org.coach.email });
    const unknown = await c.post('/api/password-reset', { email: unknownEmail });
    expect(known.status).toBe(202);
    expect(unknown.status).toBe(known.status);
    expect(unknown.body).toEqual(known.body);
    expect(known.body).toEqual(RESET_REQUESTED);
    expect(
      Object.keys(unknown.headers)
        .filter((k) => k !== 'x-request-id' && k !== 'date' && k !== 'etag')
        .sort(),
    ).toEqual(
      Object.keys(known.headers)
        .filter((k) => k !== 'x-request-id' && k !== 'date' && k !== 'etag')
        .sort(),
    );
    await waitFor('the known address’s e-mail', async () => (await resetMails(h.ds, org.coach.email)).length === 1);
    expect(await resetMails(h.ds, unknownEmail)).toEqual([]);
  });

  it('e-mails a one-time link through the queue and the fake SMTP server; only the token’s SHA-256 is stored', async () => {
    const org = await createOrg(h.ds);
    const token = await requestResetToken(h.app, h.ds, org.athlete.email);
    expect(Buffer.from(token, 'base64url').length).toBeGreaterThanOrEqual(16);
    const [mail] = await resetMails(h.ds, org.athlete.email);
    expect(mail.text_body).toContain(`Hello ${org.athlete.name},`);
    expect(mail.text_body).toContain('works once, for the next 30 minutes');
    const rows: { token_hash: string; expires_in: number; row: string }[] = await h.ds.query(
      `SELECT token_hash, extract(epoch FROM expires_at - now())::float8 AS expires_in, row_to_json(t)::text AS row FROM password_reset_tokens t WHERE user_id = $1`,
      [org.athlete.userId],
    );
    expect(rows).toHaveLength(1);
    expect(rows[0].token_hash).toBe(createHash('sha256').update(token).digest('hex'));
    expect(rows[0].row).not.toContain(token);
    expect(rows[0].expires_in).toBeGreaterThan(29 * 60);
    expect(rows[0].expires_in).toBeLessThanOrEqual(30 * 60);
    // The delivery row keeps no body (and so no link) once sent.
    const deliveries: { status: string; body_text: string | null }[] = await h.ds.query(
      `SELECT status, body_text FROM email_deliveries WHERE to_address = $1 AND kind = 'password_reset'`,
      [org.athlete.email],
    );
    expect(deliveries).toEqual([{ status: 'sent', body_text: null }]);
  });

  it('a link sets a new password once: the new one signs in, the old one no longer does, the link is refused the second time', async () => {
    const org = await createOrg(h.ds);
    const token = await requestResetToken(h.app, h.ds, org.guardian.email);
    const c = await Client.anonymous(h.app);
    const first = await c.post('/api/password-reset/confirm', { token, password: NEW_PASSWORD });
    expect(first.status, JSON.stringify(first.body)).toBe(204);
    const again = await c.post('/api/password-reset/confirm', { token, password: 'yet another long passphrase' });
    expect(again.status).toBe(404);
    expect(again.body.error.code).toBe('reset_invalid');
    expect((await (await Client.anonymous(h.app)).signIn(org.guardian.email, TEST_PASSWORD)).status).toBe(401);
    expect((await (await Client.anonymous(h.app)).signIn(org.guardian.email, NEW_PASSWORD)).status).toBe(200);
    expect(await auditCount(h.ds, 'auth.password_reset', org.guardian.userId)).toBe(1);
  });

  it('refuses an expired link and changes nothing', async () => {
    const org = await createOrg(h.ds);
    const token = await requestResetToken(h.app, h.ds, org.clinician.email);
    await h.ds.query(`UPDATE password_reset_tokens SET expires_at = now() - interval '1 second' WHERE user_id = $1`, [
      org.clinician.userId,
    ]);
    const res = await (await Client.anonymous(h.app)).post('/api/password-reset/confirm', { token, password: NEW_PASSWORD });
    expect(res.status).toBe(404);
    expect(res.body.error.code).toBe('reset_invalid');
    expect((await (await Client.anonymous(h.app)).signIn(org.clinician.email, TEST_PASSWORD)).status).toBe(200);
  });

  it('a newer request makes the older link stop working', async () => {
    const org = await createOrg(h.ds);
    const older = await requestResetToken(h.app, h.ds, org.otherCoach.email, 1);
    const newer = await requestResetToken(h.app, h.ds, org.otherCoach.email, 2);
    const c = await Client.anonymous(h.app);
    expect((await c.post('/api/password-reset/confirm', { token: older, password: NEW_PASSWORD })).status).toBe(404);
    expect((await c.post('/api/password-reset/confirm', { token: newer, password: NEW_PASSWORD })).status).toBe(204);
  });

  it('applies the password policy to the new password and keeps the link usable after a refusal', async () => {
    const org = await createOrg(h.ds);
    const token = await requestResetToken(h.app, h.ds, org.otherClinician.email);
    const c = await Client.anonymous(h.app);
    const common = await c.post('/api/password-reset/confirm', { token, password: 'password1' });
    expect(common.status).toBe(400);
    expect(common.body.error.fields).toHaveProperty('password');
    const short = await c.post('/api/password-reset/confirm', { token, password: 'short' });
    expect(short.status).toBe(400);
    expect((await c.post('/api/password-reset/confirm', { token, password: NEW_PASSWORD })).status).toBe(204);
  });

  it('ends the person’s other sessions: an old cookie answers 401 afterwards', async () => {
    const org = await createOrg(h.ds);
    const laptop = await Client.anonymous(h.app);
    const signIn = await laptop.signIn(org.admin.email, TEST_PASSWORD);
    const cookie = cookieOf(signIn);
    const orgPath = `/api/orgs/${org.id}`;
    expect((await replay(h.app, cookie, orgPath)).status).toBe(200);
    // Someone else's session is left alone.
    const bystander = await signedIn(h.app, org.coach.email, TEST_PASSWORD);

    const token = await requestResetToken(h.app, h.ds, org.admin.email);
    expect((await (await Client.anonymous(h.app)).post('/api/password-reset/confirm', { token, password: NEW_PASSWORD })).status).toBe(204);

    const old = await replay(h.app, cookie, orgPath);
    expect(old.status).toBe(401);
    expect(old.body.error.code).toBe('unauthenticated');
    const rows: { n: number }[] = await h.ds.query(`SELECT count(*)::int AS n FROM "session" WHERE sess -> 'passport' ->> 'user' = $1`, [
      org.admin.userId,
    ]);
    expect(rows[0].n).toBe(0);
    expect((await bystander.get(orgPath)).status).toBe(200);
  });

  it('also ends a session that was waiting for the second-step code', async () => {
    const org = await createOrg(h.ds);
    const { secret } = await enable(await signedIn(h.app, org.otherAthlete.email, TEST_PASSWORD));
    const waiting = await Client.anonymous(h.app);
    const pw = await waiting.post('/api/session', { email: org.otherAthlete.email, password: TEST_PASSWORD });
    expect(pw.body.secondStep).toBe(true);
    waiting.csrf = pw.body.csrfToken;

    const token = await requestResetToken(h.app, h.ds, org.otherAthlete.email);
    expect((await (await Client.anonymous(h.app)).post('/api/password-reset/confirm', { token, password: NEW_PASSWORD })).status).toBe(204);

    // The waiting session is gone: its CSRF token no longer matches, and with a fresh one there is
    // nothing waiting for a code.
    const stale = await waiting.post('/api/session/second-step', { code: nextCode(secret) });
    expect(stale.status).toBe(403);
    await waiting.refresh();
    const res = await waiting.post('/api/session/second-step', { code: nextCode(secret) });
    expect(res.status).toBe(401);
    expect(res.body.error.code).toBe('unauthenticated');
  });

  it('sends nothing to a person with no active membership', async () => {
    const org = await createOrg(h.ds);
    await h.ds.query(`UPDATE memberships SET active = false WHERE user_id = $1`, [org.otherGuardian.userId]);
    const res = await (await Client.anonymous(h.app)).post('/api/password-reset', { email: org.otherGuardian.email });
    expect(res.status).toBe(202);
    expect(res.body).toEqual(RESET_REQUESTED);
    // A request for an active person made after it is delivered; by then the first would have been too.
    await requestResetToken(h.app, h.ds, org.otherAthlete.email);
    expect(await resetMails(h.ds, org.otherGuardian.email)).toEqual([]);
    const tokens: { n: number }[] = await h.ds.query(`SELECT count(*)::int AS n FROM password_reset_tokens WHERE user_id = $1`, [
      org.otherGuardian.userId,
    ]);
    expect(tokens[0].n).toBe(0);
  });
});

describe('password reset requests are rate-limited (2 per address, 6 per IP)', () => {
  const h = useHarness({ RESET_MAX_PER_ACCOUNT: '2', RESET_MAX_PER_IP: '6' });

  it('per address, known or not alike; then per IP across addresses', async () => {
    const org = await createOrg(h.ds);
    const c = await Client.anonymous(h.app);
    const unknown = uniqueEmail('nobody');
    const statuses: Record<string, number[]> = { known: [], unknown: [] };
    for (let i = 0; i < 3; i++) statuses.known.push((await c.post('/api/password-reset', { email: org.coach.email })).status);
    for (let i = 0; i < 3; i++) statuses.unknown.push((await c.post('/api/password-reset', { email: unknown })).status);
    expect(statuses).toEqual({ known: [202, 202, 429], unknown: [202, 202, 429] });
    const byIp = await c.post('/api/password-reset', { email: uniqueEmail('fresh') });
    expect(byIp.status).toBe(429);
    expect(byIp.body.error.code).toBe('rate_limited');
  });
});

// ---------------------------------------------------------------------------------------------------

const totp = (secret: string) => new TOTP({ algorithm: 'SHA1', digits: 6, period: 30, secret: Secret.fromBase32(secret) });
/** The code for the next 30-second step: valid now (±1 step), and newer than the one used to enable. */
const nextCode = (secret: string) => totp(secret).generate({ timestamp: Date.now() + 30_000 });

/** Turns two-step sign-in on for a signed-in client; returns the secret and the recovery codes. */
async function enable(c: Client): Promise<{ secret: string; recoveryCodes: string[] }> {
  const setup = await c.post('/api/account/two-step/setup');
  expect(setup.status, JSON.stringify(setup.body)).toBe(200);
  const secret = setup.body.secret as string;
  const on = await c.post('/api/account/two-step/enable', { code: totp(secret).generate() });
  expect(on.status, JSON.stringify(on.body)).toBe(200);
  return { secret, recoveryCodes: on.body.recoveryCodes };
}

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
