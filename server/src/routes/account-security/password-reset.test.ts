import { createHash } from 'node:crypto';
import { describe, expect, it } from 'vitest';
import { Client, signedIn, useHarness } from '../../test/harness';
import { createOrg, TEST_PASSWORD } from '../../test/factories';
import { RESET_REQUESTED } from '../../commands/password-reset';
import {
  auditCount,
  enable,
  nextCode,
  cookieOf,
  NEW_PASSWORD,
  replay,
  requestResetToken,
  resetMails,
  uniqueEmail,
  waitFor,
} from '../../test/worlds/account-security-fixtures';

/**
 * Password reset through HTTP on the real database (ASVS 5.0 V6.3.8 no account enumeration; V6.4.1
 * one-time, short-lived links; V7.4.3 other sessions end); reset e-mails go through the real queue to
 * the fake SMTP server.
 */
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

  it('a forged Host header never reaches the e-mail: refused before the handler (OWASP WSTG-INPV-17)', async () => {
    const org = await createOrg(h.ds);
    const c = await Client.anonymous(h.app);
    const res = await c.agent
      .post('/api/password-reset')
      .set('x-csrf-token', c.csrf)
      .set('Host', 'attacker.example')
      .send({ email: org.admin.email });
    expect(res.status).toBe(400);
    expect(res.body.error.fields).toHaveProperty('host');
    // A request on the server's own (loopback) address goes through; its link is on the configured
    // address, and the refused one left no token and no e-mail behind.
    const ok = await c.agent
      .post('/api/password-reset')
      .set('x-csrf-token', c.csrf)
      .set('Host', 'localhost')
      .send({ email: org.admin.email });
    expect(ok.status).toBe(202);
    const [mail, ...more] = await waitFor('the reset e-mail', async () => {
      const m = await resetMails(h.ds, org.admin.email);
      return m.length ? m : null;
    });
    expect(more).toEqual([]);
    expect(mail.text_body).toContain(`http://${h.config.HOST}:${h.config.PORT}/reset#`);
    expect(mail.text_body).not.toContain('attacker.example');
    const tokens: { n: number }[] = await h.ds.query(`SELECT count(*)::int AS n FROM password_reset_tokens WHERE user_id = $1`, [
      org.admin.userId,
    ]);
    expect(tokens[0].n).toBe(1);
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
