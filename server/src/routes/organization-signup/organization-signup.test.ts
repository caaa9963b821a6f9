import { createHash } from 'node:crypto';
import { describe, expect, it } from 'vitest';
import type { DataSource } from 'typeorm';
import type { Express } from 'express';
import { Client, signedIn, useHarness } from '../../test/harness';
import { createOrg, TEST_PASSWORD } from '../../test/factories';
import { GENESIS_HASH, verifyChain } from '../../services/audit';
import { SIGNUP_REQUESTED } from '../../commands/organization-signup';
import { uniqueEmail, waitFor } from '../../test/worlds/account-security-fixtures';
import { SIGNUP_CLOSED_MESSAGE } from './organization-signup.router';

/**
 * Starting an organization from the public page, through HTTP on the real database, with the
 * confirmation e-mail going through the real queue to the fake SMTP server. ASVS 5.0 V6.3.8 (no
 * account enumeration), V6.4.1 (one-time, short-lived links whose token is stored only as a hash).
 */

const CHOSEN = 'a new club and a long passphrase';
const SUBJECT = (name: string) => `Confirm your e-mail to start ${name} on Loadline`;

function form(over: Record<string, unknown> = {}) {
  return {
    organizationName: `Fjord Rowing ${Math.random().toString(36).slice(2, 7)}`,
    country: 'NO',
    timeZone: 'Europe/Oslo',
    adminName: 'Ingrid Solberg',
    email: uniqueEmail('founder'),
    password: CHOSEN,
    ...over,
  };
}

const signupMails = (ds: DataSource, to: string, name: string): Promise<{ text_body: string }[]> =>
  ds.query(`SELECT text_body FROM fake_mailbox WHERE envelope_to && $1 AND subject = $2 ORDER BY id`, [[to], SUBJECT(name)]);

/** Sends the form and returns the token from the confirmation e-mail (and the mail's text). */
async function requestToken(app: Express, ds: DataSource, body: ReturnType<typeof form>): Promise<{ token: string; text: string }> {
  const res = await (await Client.anonymous(app)).post('/api/org-signup', body);
  expect(res.status, JSON.stringify(res.body)).toBe(202);
  const [mail] = await waitFor(`the sign-up e-mail to ${body.email}`, async () => {
    const m = await signupMails(ds, body.email, body.organizationName);
    return m.length ? m : null;
  });
  const token = mail.text_body.match(/\/start\/confirm#([A-Za-z0-9_-]+)/)?.[1];
  expect(token).toBeTruthy();
  return { token: token!, text: mail.text_body };
}

describe('starting an organization from the public page', () => {
  const h = useHarness(
    { SIGNIN_MAX_PER_IP: '1000', ORG_SIGNUP_MAX_PER_IP: '1000', ORG_SIGNUP_MAX_PER_ACCOUNT: '3', BCRYPT_COST: '12' },
    { mail: true },
  );

  it('says sign-up is open', async () => {
    const res = await (await Client.anonymous(h.app)).get('/api/org-signup');
    expect(res.status).toBe(200);
    expect(res.body).toEqual({ open: true });
  });

  it('answers the same for a new and an existing address; each gets its own e-mail; nothing is created before the link is used', async () => {
    const org = await createOrg(h.ds);
    const c = await Client.anonymous(h.app);
    const fresh = form();
    const taken = form({ email: org.coach.email });
    const a = await c.post('/api/org-signup', fresh);
    const b = await c.post('/api/org-signup', taken);
    expect(a.status).toBe(202);
    expect(b.status).toBe(202);
    expect(a.body).toEqual(SIGNUP_REQUESTED);
    expect(b.body).toEqual(a.body);
    const headers = (r: typeof a) =>
      Object.keys(r.headers)
        .filter((k) => !['x-request-id', 'date', 'etag'].includes(k) && !k.startsWith('ratelimit'))
        .sort();
    expect(headers(b)).toEqual(headers(a));

    const [newMail] = await waitFor('the new address’s e-mail', async () => {
      const m = await signupMails(h.ds, fresh.email, fresh.organizationName);
      return m.length ? m : null;
    });
    const [takenMail] = await waitFor('the existing address’s e-mail', async () => {
      const m = await signupMails(h.ds, taken.email, taken.organizationName);
      return m.length ? m : null;
    });
    expect(newMail.text_body).toContain('Hello Ingrid Solberg,');
    expect(newMail.text_body).toContain('creates the organization and your account');
    expect(takenMail.text_body).toContain('already has a Loadline account');
    const made = await h.ds.query(`SELECT id FROM organizations WHERE name = ANY($1)`, [[fresh.organizationName, taken.organizationName]]);
    expect(made).toEqual([]);
    expect(await h.ds.query(`SELECT id FROM users WHERE email = $1`, [fresh.email])).toEqual([]);
  });

  it('the link creates the organization, the account and the admin; the admin signs in with the chosen password', async () => {
    const body = form();
    const { token } = await requestToken(h.app, h.ds, body);
    const stored: { token_hash: string; password_hash: string | null; row: string }[] = await h.ds.query(
      `SELECT token_hash, password_hash, row_to_json(s)::text AS row FROM organization_signups s WHERE email = $1`,
      [body.email],
    );
    expect(stored).toHaveLength(1);
    expect(stored[0].token_hash).toBe(createHash('sha256').update(token).digest('hex'));
    expect(stored[0].row).not.toContain(token);
    expect(stored[0].row).not.toContain(CHOSEN);
    expect(stored[0].password_hash).toMatch(/^\$2[aby]\$12\$/);

    const c = await Client.anonymous(h.app);
    const res = await c.post('/api/org-signup/confirm', { token });
    expect(res.status, JSON.stringify(res.body)).toBe(200);
    expect(res.body).toEqual({
      organizationId: expect.any(String),
      organizationName: body.organizationName,
      email: body.email,
      existingAccount: false,
    });
    const orgId = res.body.organizationId as string;
    const [org] = await h.ds.query(`SELECT name, country, time_zone, emergency_number FROM organizations WHERE id = $1`, [orgId]);
    expect(org).toEqual({ name: body.organizationName, country: 'NO', time_zone: 'Europe/Oslo', emergency_number: '112' });
    // The password hash is not kept once used.
    expect((await h.ds.query(`SELECT password_hash FROM organization_signups WHERE email = $1`, [body.email]))[0].password_hash).toBeNull();

    const admin = await signedIn(h.app, body.email, CHOSEN);
    const session = await admin.get('/api/session');
    expect(session.body.user.displayName).toBe('Ingrid Solberg');
    expect(session.body.memberships).toEqual([
      expect.objectContaining({
        organizationId: orgId,
        organizationName: body.organizationName,
        roles: ['admin'],
        timeZone: 'Europe/Oslo',
      }),
    ]);
    // Usable at once: its own exercise library, its settings, its people.
    expect((await admin.get(`/api/orgs/${orgId}/settings`)).body).toMatchObject({ timeZone: 'Europe/Oslo', emergencyNumber: '112' });
    expect((await admin.get(`/api/orgs/${orgId}/exercises`)).body.length).toBeGreaterThan(10);
  });

  it('starts the new organization’s own audit chain; the request itself is in the trail of no organization, without the password', async () => {
    const body = form();
    const { token } = await requestToken(h.app, h.ds, body);
    const res = await (await Client.anonymous(h.app)).post('/api/org-signup/confirm', { token });
    expect(res.status).toBe(200);
    const orgId = res.body.organizationId as string;
    const chain: { action: string; prev_hash: string; actor_user_id: string | null; after: Record<string, unknown> }[] = await h.ds.query(
      `SELECT action, prev_hash, actor_user_id, after FROM audit_entries WHERE organization_id = $1 ORDER BY id`,
      [orgId],
    );
    expect(chain.map((e) => e.action)).toEqual(['organization.created', 'user.created', 'membership.created']);
    expect(chain[0].prev_hash).toBe(GENESIS_HASH);
    expect(chain[0].after).toMatchObject({ name: body.organizationName, country: 'NO', timeZone: 'Europe/Oslo', via: 'signup' });
    const [{ id: userId }] = await h.ds.query(`SELECT id FROM users WHERE email = $1`, [body.email]);
    expect(chain.every((e) => e.actor_user_id === userId)).toBe(true);
    expect(chain[2].after).toMatchObject({ roles: ['admin'], via: 'signup' });
    const report = await h.ds.transaction((m) => verifyChain(m, orgId));
    expect(report).toMatchObject({ intact: true, entries: 3 });

    const requested: { organization_id: string | null; actor_user_id: string | null; after: unknown }[] = await h.ds.query(
      `SELECT a.organization_id, a.actor_user_id, a.after FROM audit_entries a JOIN organization_signups s ON s.id = a.subject_id::uuid
        WHERE a.action = 'organization.signup_requested' AND s.email = $1`,
      [body.email],
    );
    expect(requested).toHaveLength(1);
    expect(requested[0].organization_id).toBeNull();
    expect(requested[0].actor_user_id).toBeNull();
    expect(JSON.stringify(requested[0].after)).not.toContain(CHOSEN);
    expect(requested[0].after).toMatchObject({ organizationName: body.organizationName, email: body.email });
  });

  it('a link works once, and not after it expires; either refusal says the same', async () => {
    const once = form();
    const { token } = await requestToken(h.app, h.ds, once);
    const c = await Client.anonymous(h.app);
    expect((await c.post('/api/org-signup/confirm', { token })).status).toBe(200);
    const again = await c.post('/api/org-signup/confirm', { token });
    expect(again.status).toBe(404);
    expect(again.body.error.code).toBe('signup_invalid');
    expect(await h.ds.query(`SELECT id FROM organizations WHERE name = $1`, [once.organizationName])).toHaveLength(1);

    const late = form();
    const { token: lateToken } = await requestToken(h.app, h.ds, late);
    await h.ds.query(`UPDATE organization_signups SET expires_at = now() - interval '1 second' WHERE email = $1`, [late.email]);
    const expired = await c.post('/api/org-signup/confirm', { token: lateToken });
    expect(expired.status).toBe(404);
    expect(expired.body.error).toEqual(again.body.error);
    expect(await h.ds.query(`SELECT id FROM organizations WHERE name = $1`, [late.organizationName])).toEqual([]);

    const made = await c.post('/api/org-signup/confirm', { token: 'x'.repeat(43) });
    expect(made.status).toBe(404);
    // The next request anyone makes clears the expired request's password hash.
    await requestToken(h.app, h.ds, form());
    const [lateRow] = await h.ds.query(`SELECT password_hash FROM organization_signups WHERE email = $1`, [late.email]);
    expect(lateRow.password_hash).toBeNull();
  });

  it('an address that already has an account keeps its password and gains the new organization beside its old one', async () => {
    const old = await createOrg(h.ds);
    const body = form({ email: old.clinician.email, password: 'not the password of that account' });
    const { token } = await requestToken(h.app, h.ds, body);
    const res = await (await Client.anonymous(h.app)).post('/api/org-signup/confirm', { token });
    expect(res.status, JSON.stringify(res.body)).toBe(200);
    expect(res.body.existingAccount).toBe(true);
    expect((await (await Client.anonymous(h.app)).signIn(old.clinician.email, 'not the password of that account')).status).toBe(401);
    const person = await signedIn(h.app, old.clinician.email, TEST_PASSWORD);
    const memberships = (await person.get('/api/session')).body.memberships as { organizationId: string; roles: string[] }[];
    expect(memberships.map((m) => [m.organizationId, m.roles]).sort()).toEqual(
      [
        [old.id, ['clinician']],
        [res.body.organizationId, ['admin']],
      ].sort(),
    );
    // No user.created: the account was there already (the sign-ins above follow in the chain).
    const actions = await h.ds.query(`SELECT action FROM audit_entries WHERE organization_id = $1 ORDER BY id LIMIT 2`, [
      res.body.organizationId,
    ]);
    expect(actions.map((a: { action: string }) => a.action)).toEqual(['organization.created', 'membership.created']);
  });

  it('refuses a bad form with a 400 naming each field, and sends nothing', async () => {
    const c = await Client.anonymous(h.app);
    const bad = await c.post(
      '/api/org-signup',
      form({ country: 'XX', timeZone: 'Mars/Olympus_Mons', email: 'not-an-address', organizationName: '' }),
    );
    expect(bad.status).toBe(400);
    expect(bad.body.error.code).toBe('validation_failed');
    expect(Object.keys(bad.body.error.fields).sort()).toEqual(['country', 'email', 'organizationName', 'timeZone']);
    expect(bad.body.error.fields.country).toEqual(['must be a two-letter country code (ISO 3166-1) such as NO or US']);
    expect(bad.body.error.fields.timeZone).toEqual(['must be an IANA time zone such as America/Chicago']);
    const short = await c.post('/api/org-signup', form({ password: 'short' }));
    expect(short.status).toBe(400);
    expect(short.body.error.fields).toHaveProperty('password');
    const common = form({ password: 'password1' });
    const commonRes = await c.post('/api/org-signup', common);
    expect(commonRes.status).toBe(400);
    expect(commonRes.body.error.fields.password[0]).toContain('too common');
    const extra = await c.post('/api/org-signup', { ...form(), role: 'admin' });
    expect(extra.status).toBe(400);
    await new Promise((r) => setTimeout(r, 500));
    expect(await h.ds.query(`SELECT id FROM organization_signups WHERE email = $1`, [common.email])).toEqual([]);
  });

  it('limits requests per address typed, whether or not it has an account', async () => {
    const c = await Client.anonymous(h.app);
    const email = uniqueEmail('busy');
    for (let i = 0; i < 3; i += 1) expect((await c.post('/api/org-signup', form({ email }))).status).toBe(202);
    const limited = await c.post('/api/org-signup', form({ email }));
    expect(limited.status).toBe(429);
    expect(limited.body.error.code).toBe('rate_limited');
  });
});

describe('a private installation (ORG_SIGNUP=closed)', () => {
  const h = useHarness({ ORG_SIGNUP: 'closed' });

  it('says sign-up is closed, and the sign-up routes answer 404 with a sentence', async () => {
    const c = await Client.anonymous(h.app);
    expect((await c.get('/api/org-signup')).body).toEqual({ open: false });
    const res = await c.post('/api/org-signup', form());
    expect(res.status).toBe(404);
    expect(res.body.error.message).toBe(SIGNUP_CLOSED_MESSAGE);
    const confirm = await c.post('/api/org-signup/confirm', { token: 'x'.repeat(43) });
    expect(confirm.status).toBe(404);
    expect(confirm.body.error.message).toBe(SIGNUP_CLOSED_MESSAGE);
  });
});
