import { createHash, randomBytes } from 'node:crypto';
import { describe, expect, it } from 'vitest';
import { Client, signedIn, useHarness } from '../../test/harness';
import { createOrg, TEST_PASSWORD, type TestOrg } from '../../test/factories';

const NEW_PASSWORD = 'a brand new passphrase of mine';

const uniqueEmail = (tag: string) => `${tag}-${randomBytes(5).toString('hex')}@test.example`;
const sha256 = (s: string) => createHash('sha256').update(s).digest('hex');
/** A well-formed token that no invitation has. */
const unknownToken = () => randomBytes(32).toString('base64url');

interface Created {
  id: string;
  token: string;
  body: Record<string, unknown>;
}

describe('invitations', () => {
  const h = useHarness();

  async function adminOf(org: TestOrg) {
    return signedIn(h.app, org.admin.email, TEST_PASSWORD);
  }

  async function invite(admin: Client, orgId: string, body: Record<string, unknown>): Promise<Created> {
    const res = await admin.post(`/api/orgs/${orgId}/invitations`, body);
    expect(res.status, JSON.stringify(res.body)).toBe(201);
    return { id: res.body.id, token: new URL(res.body.link).hash.slice(1), body: res.body };
  }

  async function accept(body: Record<string, unknown>) {
    const c = await Client.anonymous(h.app);
    const res = await c.post('/api/invitations/accept', body);
    return { c, res };
  }

  async function preview(token: string) {
    return (await Client.anonymous(h.app)).post('/api/invitations/preview', { token });
  }

  async function invitationRow(id: string) {
    const rows: { token_hash: string; accepted_at: Date | null; revoked_at: Date | null; row: string }[] = await h.ds.query(
      'SELECT token_hash, accepted_at, revoked_at, row_to_json(i)::text AS row FROM invitations i WHERE id = $1',
      [id],
    );
    return rows[0];
  }

  async function countUsers(email: string): Promise<number> {
    const rows: { n: number }[] = await h.ds.query('SELECT count(*)::int AS n FROM users WHERE email = $1', [email]);
    return rows[0].n;
  }

  it('an admin creates an invitation: the token rides in the link fragment and only its SHA-256 is stored', async () => {
    const org = await createOrg(h.ds);
    const admin = await adminOf(org);
    const email = uniqueEmail('Coach').toUpperCase();
    const res = await admin.post(`/api/orgs/${org.id}/invitations`, { email: `  ${email} `, roles: ['coach'], displayName: 'New Coach' });
    expect(res.status).toBe(201);
    expect(res.body).toMatchObject({
      organizationId: org.id,
      email: email.toLowerCase(),
      roles: ['coach'],
      displayName: 'New Coach',
      status: 'pending',
      invitedByName: org.admin.name,
    });
    const hoursLeft = (Date.parse(res.body.expiresAt) - Date.now()) / 3_600_000;
    expect(hoursLeft).toBeGreaterThan(h.config.INVITATION_TTL_HOURS - 0.1);
    expect(hoursLeft).toBeLessThanOrEqual(h.config.INVITATION_TTL_HOURS);

    const link = new URL(res.body.link);
    expect(link.pathname).toBe('/invite');
    expect(link.search).toBe('');
    const token = link.hash.slice(1);
    // ≥ 128 random bits: 32 bytes in base64url is 43 characters.
    expect(token).toMatch(/^[A-Za-z0-9_-]{43,}$/);

    const row = await invitationRow(res.body.id);
    expect(row.token_hash).toBe(sha256(token));
    expect(row.row).not.toContain(token);
    const audit: { row: string }[] = await h.ds.query(
      `SELECT row_to_json(a)::text AS row FROM audit_entries a WHERE action = 'invitation.created' AND subject_id = $1`,
      [res.body.id],
    );
    expect(audit).toHaveLength(1);
    expect(audit[0].row).not.toContain(token);
    expect(audit[0].row).not.toContain(row.token_hash);

    // The list shows it, but never the link, the token or its hash.
    const list = await admin.get(`/api/orgs/${org.id}/invitations`);
    expect(list.status).toBe(200);
    const listed = list.body.find((i: { id: string }) => i.id === res.body.id);
    expect(listed).toMatchObject({ status: 'pending', email: email.toLowerCase() });
    expect(listed).not.toHaveProperty('link');
    expect(JSON.stringify(list.body)).not.toContain(token);
    expect(JSON.stringify(list.body)).not.toContain(row.token_hash);
  });

  it('preview tells the holder of the link what it is for', async () => {
    const org = await createOrg(h.ds);
    const admin = await adminOf(org);
    const email = uniqueEmail('guardian');
    const inv = await invite(admin, org.id, { email, roles: ['guardian'], displayName: 'Pat Parent' });
    const res = await preview(inv.token);
    expect(res.status).toBe(200);
    const orgName: { name: string }[] = await h.ds.query('SELECT name FROM organizations WHERE id = $1', [org.id]);
    expect(res.body).toEqual({
      organizationName: orgName[0].name,
      email,
      roles: ['guardian'],
      displayName: 'Pat Parent',
      hasAccount: false,
      expiresAt: inv.body.expiresAt,
    });
  });

  it('accepting creates the account, the membership with its roles and the athlete profile, and signs the person in', async () => {
    const org = await createOrg(h.ds);
    const admin = await adminOf(org);
    const email = uniqueEmail('athlete');
    const inv = await invite(admin, org.id, { email, roles: ['athlete'], displayName: 'Ada', dateOfBirth: '2011-06-01', sport: 'Rowing' });

    const { c, res } = await accept({ token: inv.token, displayName: 'Ada Athlete', password: NEW_PASSWORD });
    expect(res.status).toBe(200);
    expect(res.body.user).toMatchObject({ email, displayName: 'Ada Athlete', unitPref: 'kg' });
    expect(res.body.memberships).toHaveLength(1);
    expect(res.body.memberships[0]).toMatchObject({ organizationId: org.id, roles: ['athlete'] });

    const who = await c.get('/api/session');
    expect(who.body.user?.email).toBe(email);
    expect(who.body.csrfToken).toBe(res.body.csrfToken);

    const users: { id: string }[] = await h.ds.query('SELECT id FROM users WHERE email = $1', [email]);
    expect(users).toHaveLength(1);
    const memberships: { id: string; roles: string[]; active: boolean }[] = await h.ds.query(
      'SELECT id, roles, active FROM memberships WHERE user_id = $1 AND organization_id = $2',
      [users[0].id, org.id],
    );
    expect(memberships).toEqual([{ id: res.body.memberships[0].id, roles: ['athlete'], active: true }]);
    const profiles: { date_of_birth: string; sport: string }[] = await h.ds.query(
      'SELECT date_of_birth, sport FROM athlete_profiles WHERE membership_id = $1',
      [memberships[0].id],
    );
    expect(profiles).toEqual([{ date_of_birth: '2011-06-01', sport: 'Rowing' }]);

    expect((await invitationRow(inv.id)).accepted_at).not.toBeNull();
    const list = await admin.get(`/api/orgs/${org.id}/invitations`);
    expect(list.body.find((i: { id: string }) => i.id === inv.id).status).toBe('accepted');

    const audit: { action: string }[] = await h.ds.query(
      `SELECT action FROM audit_entries WHERE organization_id = $1 AND actor_user_id = $2 ORDER BY id`,
      [org.id, users[0].id],
    );
    expect(audit.map((a) => a.action)).toEqual(['user.created', 'membership.created', 'invitation.accepted']);
  });

  it('an athlete invitation without a date of birth takes the one given on accepting', async () => {
    const org = await createOrg(h.ds);
    const admin = await adminOf(org);
    const email = uniqueEmail('athlete');
    const inv = await invite(admin, org.id, { email, roles: ['athlete'] });
    const { res } = await accept({ token: inv.token, displayName: 'Bo Athlete', password: NEW_PASSWORD, dateOfBirth: '2012-02-29' });
    expect(res.status).toBe(200);
    const profiles: { date_of_birth: string }[] = await h.ds.query('SELECT date_of_birth FROM athlete_profiles WHERE membership_id = $1', [
      res.body.memberships[0].id,
    ]);
    expect(profiles).toEqual([{ date_of_birth: '2012-02-29' }]);
  });

  it('a link works once: the second use answers 404 invitation_invalid', async () => {
    const org = await createOrg(h.ds);
    const admin = await adminOf(org);
    const email = uniqueEmail('coach');
    const inv = await invite(admin, org.id, { email, roles: ['coach'] });
    expect((await accept({ token: inv.token, displayName: 'First', password: NEW_PASSWORD })).res.status).toBe(200);

    const again = await accept({ token: inv.token, displayName: 'Second', password: 'another passphrase entirely' });
    expect(again.res.status).toBe(404);
    expect(again.res.body.error.code).toBe('invitation_invalid');
    expect((await again.c.get('/api/session')).body.user).toBeNull();
    const p = await preview(inv.token);
    expect(p.status).toBe(404);
    expect(p.body.error.code).toBe('invitation_invalid');

    const users: { display_name: string }[] = await h.ds.query('SELECT display_name FROM users WHERE email = $1', [email]);
    expect(users).toEqual([{ display_name: 'First' }]);
  });

  it('an expired link answers invitation_invalid, with the same message as an unknown one', async () => {
    const org = await createOrg(h.ds);
    const admin = await adminOf(org);
    const email = uniqueEmail('coach');
    const inv = await invite(admin, org.id, { email, roles: ['coach'] });
    await h.ds.query(`UPDATE invitations SET expires_at = now() - interval '1 minute' WHERE id = $1`, [inv.id]);

    const p = await preview(inv.token);
    expect(p.status).toBe(404);
    expect(p.body.error.code).toBe('invitation_invalid');
    const { res } = await accept({ token: inv.token, displayName: 'Late', password: NEW_PASSWORD });
    expect(res.status).toBe(404);
    expect(res.body.error.code).toBe('invitation_invalid');
    expect(await countUsers(email)).toBe(0);

    const unknown = await preview(unknownToken());
    expect(unknown.status).toBe(404);
    expect(unknown.body.error).toEqual(p.body.error);

    const list = await admin.get(`/api/orgs/${org.id}/invitations`);
    expect(list.body.find((i: { id: string }) => i.id === inv.id).status).toBe('expired');
  });

  it('a withdrawn link answers invitation_invalid', async () => {
    const org = await createOrg(h.ds);
    const admin = await adminOf(org);
    const email = uniqueEmail('clinician');
    const inv = await invite(admin, org.id, { email, roles: ['clinician'] });
    const del = await admin.delete(`/api/orgs/${org.id}/invitations/${inv.id}`);
    expect(del.status).toBe(204);
    expect((await invitationRow(inv.id)).revoked_at).not.toBeNull();

    const p = await preview(inv.token);
    expect(p.status).toBe(404);
    expect(p.body.error.code).toBe('invitation_invalid');
    const { res } = await accept({ token: inv.token, displayName: 'Too Late', password: NEW_PASSWORD });
    expect(res.status).toBe(404);
    expect(res.body.error.code).toBe('invitation_invalid');
    expect(await countUsers(email)).toBe(0);

    const list = await admin.get(`/api/orgs/${org.id}/invitations`);
    expect(list.body.find((i: { id: string }) => i.id === inv.id).status).toBe('revoked');
    const audit: { n: number }[] = await h.ds.query(
      `SELECT count(*)::int AS n FROM audit_entries WHERE action = 'invitation.revoked' AND subject_id = $1`,
      [inv.id],
    );
    expect(audit[0].n).toBe(1);
  });

  it('for an existing account, accepting needs that account’s password and adds the roles to the membership', async () => {
    const org = await createOrg(h.ds);
    const admin = await adminOf(org);
    const inv = await invite(admin, org.id, { email: org.coach.email, roles: ['clinician'] });
    const before: { password_hash: string; display_name: string }[] = await h.ds.query(
      'SELECT password_hash, display_name FROM users WHERE id = $1',
      [org.coach.userId],
    );

    const p = await preview(inv.token);
    expect(p.status).toBe(200);
    expect(p.body.hasAccount).toBe(true);

    const wrong = await accept({ token: inv.token, displayName: 'Someone Else', password: 'not the coach passphrase' });
    expect(wrong.res.status).toBe(401);
    expect(wrong.res.body.error.code).toBe('invalid_credentials');
    expect(wrong.res.body.error.fields).toHaveProperty('password');
    expect((await wrong.c.get('/api/session')).body.user).toBeNull();
    expect((await invitationRow(inv.id)).accepted_at).toBeNull();

    const ok = await accept({ token: inv.token, displayName: 'Someone Else', password: TEST_PASSWORD });
    expect(ok.res.status).toBe(200);
    expect(ok.res.body.user.id).toBe(org.coach.userId);
    expect(ok.res.body.memberships).toHaveLength(1);
    expect([...ok.res.body.memberships[0].roles].sort()).toEqual(['clinician', 'coach']);

    const after: { password_hash: string; display_name: string }[] = await h.ds.query(
      'SELECT password_hash, display_name FROM users WHERE id = $1',
      [org.coach.userId],
    );
    // Neither the password nor the name of an existing account is changed by an invitation.
    expect(after).toEqual(before);
    const memberships: { n: number }[] = await h.ds.query('SELECT count(*)::int AS n FROM memberships WHERE user_id = $1', [
      org.coach.userId,
    ]);
    expect(memberships[0].n).toBe(1);
  });

  it('a member of another organization joins this one with their existing account', async () => {
    const org = await createOrg(h.ds);
    const other = await createOrg(h.ds);
    const admin = await adminOf(org);
    const inv = await invite(admin, org.id, { email: other.coach.email, roles: ['coach'] });
    const { res } = await accept({ token: inv.token, displayName: 'Ignored', password: TEST_PASSWORD });
    expect(res.status).toBe(200);
    const orgs = res.body.memberships.map((m: { organizationId: string }) => m.organizationId).sort();
    expect(orgs).toEqual([org.id, other.id].sort());
  });

  it('accepting refuses fields that would widen the invitation (roles, organizationId)', async () => {
    const org = await createOrg(h.ds);
    const admin = await adminOf(org);
    const email = uniqueEmail('guardian');
    const inv = await invite(admin, org.id, { email, roles: ['guardian'] });
    const { res } = await accept({
      token: inv.token,
      displayName: 'Greedy',
      password: NEW_PASSWORD,
      roles: ['admin'],
      organizationId: org.id,
    });
    expect(res.status).toBe(400);
    expect(res.body.error.fields).toHaveProperty('roles');
    expect(res.body.error.fields).toHaveProperty('organizationId');
    expect(await countUsers(email)).toBe(0);
    expect((await invitationRow(inv.id)).accepted_at).toBeNull();
  });

  it('only admins manage invitations: other roles get 403, admins of another organization 404', async () => {
    const org = await createOrg(h.ds);
    const other = await createOrg(h.ds);
    const coach = await signedIn(h.app, org.coach.email, TEST_PASSWORD);
    const email = uniqueEmail('sneaky');

    const byCoach = await coach.post(`/api/orgs/${org.id}/invitations`, { email, roles: ['admin'] });
    expect(byCoach.status).toBe(403);
    expect(byCoach.body.error.code).toBe('forbidden');
    expect((await coach.get(`/api/orgs/${org.id}/invitations`)).status).toBe(403);

    const otherAdmin = await signedIn(h.app, other.admin.email, TEST_PASSWORD);
    const byOutsider = await otherAdmin.post(`/api/orgs/${org.id}/invitations`, { email, roles: ['coach'] });
    expect(byOutsider.status).toBe(404);
    expect(byOutsider.body.error.code).toBe('not_found');
    const listByOutsider = await otherAdmin.get(`/api/orgs/${org.id}/invitations`);
    expect(listByOutsider.status).toBe(404);

    // Nor can an outsider withdraw this organization's invitation, even through their own org's URL.
    const admin = await adminOf(org);
    const inv = await invite(admin, org.id, { email: uniqueEmail('kept'), roles: ['coach'] });
    expect((await otherAdmin.delete(`/api/orgs/${org.id}/invitations/${inv.id}`)).status).toBe(404);
    expect((await otherAdmin.delete(`/api/orgs/${other.id}/invitations/${inv.id}`)).status).toBe(404);
    expect((await invitationRow(inv.id)).revoked_at).toBeNull();

    const rows: { n: number }[] = await h.ds.query('SELECT count(*)::int AS n FROM invitations WHERE email = $1', [email]);
    expect(rows[0].n).toBe(0);
    const refusals: { n: number }[] = await h.ds.query(
      `SELECT count(*)::int AS n FROM audit_entries WHERE organization_id = $1 AND action = 'access.refused' AND actor_user_id = $2`,
      [org.id, org.coach.userId],
    );
    expect(refusals[0].n).toBeGreaterThanOrEqual(1);
  });

  it('validation errors name the fields', async () => {
    const org = await createOrg(h.ds);
    const admin = await adminOf(org);
    const path = `/api/orgs/${org.id}/invitations`;
    const cases: { body: Record<string, unknown>; field: string }[] = [
      { body: { email: 'not-an-email', roles: ['coach'] }, field: 'email' },
      { body: { email: 'a@test.example\r\nBcc: victim@test.example', roles: ['coach'] }, field: 'email' },
      { body: { email: uniqueEmail('x'), roles: [] }, field: 'roles' },
      { body: { email: uniqueEmail('x'), roles: ['superuser'] }, field: 'roles.0' },
      { body: { email: uniqueEmail('x'), roles: ['coach', 'coach'] }, field: 'roles' },
      { body: { email: uniqueEmail('x'), roles: ['coach'], organizationId: org.id }, field: 'organizationId' },
      { body: { email: uniqueEmail('x'), roles: ['coach'], dateOfBirth: '2010-01-01' }, field: 'dateOfBirth' },
      { body: { email: uniqueEmail('x'), roles: ['athlete'], dateOfBirth: '01/02/2010' }, field: 'dateOfBirth' },
      { body: { roles: ['coach'] }, field: 'email' },
    ];
    for (const { body, field } of cases) {
      const res = await admin.post(path, body);
      expect(res.status, JSON.stringify(body)).toBe(400);
      expect(res.body.error.code).toBe('validation_failed');
      expect(Object.keys(res.body.error.fields), JSON.stringify(body)).toContain(field);
      expect(res.body.error.message).toContain(field);
    }
    const rows: { n: number }[] = await h.ds.query('SELECT count(*)::int AS n FROM invitations WHERE organization_id = $1', [org.id]);
    expect(rows[0].n).toBe(0);
  });

  it('inviting a known and an unknown e-mail gives the same response shape', async () => {
    const org = await createOrg(h.ds);
    const other = await createOrg(h.ds);
    const admin = await adminOf(org);
    const known = await admin.post(`/api/orgs/${org.id}/invitations`, { email: other.clinician.email, roles: ['coach'] });
    const unknown = await admin.post(`/api/orgs/${org.id}/invitations`, { email: uniqueEmail('fresh'), roles: ['coach'] });
    expect(known.status).toBe(201);
    expect(unknown.status).toBe(known.status);
    const shape = (b: Record<string, unknown>) =>
      Object.fromEntries(Object.entries(b).map(([k, v]) => [k, v === null ? 'null' : Array.isArray(v) ? 'array' : typeof v]));
    expect(shape(known.body)).toEqual(shape(unknown.body));
    const { id: _a, email: _b, link: _c, expiresAt: _d, createdAt: _e, ...knownRest } = known.body;
    const { id: _f, email: _g, link: _h, expiresAt: _i, createdAt: _j, ...unknownRest } = unknown.body;
    expect(knownRest).toEqual(unknownRest);
  });
});

describe('invitation rate limits are per link, not one bucket for everyone', () => {
  const h = useHarness();

  it('a stranger’s failed tries with made-up links do not block a real invitation', async () => {
    const org = await createOrg(h.ds);
    const admin = await signedIn(h.app, org.admin.email, TEST_PASSWORD);
    const res = await admin.post(`/api/orgs/${org.id}/invitations`, { email: uniqueEmail('real'), roles: ['coach'] });
    expect(res.status).toBe(201);
    const token = new URL(res.body.link).hash.slice(1);

    const stranger = await Client.anonymous(h.app);
    const tries = h.config.SIGNIN_MAX_FAILURES_PER_ACCOUNT + 2;
    for (let i = 0; i < tries; i++) {
      expect((await stranger.post('/api/invitations/preview', { token: unknownToken() })).status).toBe(404);
      expect(
        (await stranger.post('/api/invitations/accept', { token: unknownToken(), displayName: 'X', password: NEW_PASSWORD })).status,
      ).toBe(404);
    }

    const newcomer = await Client.anonymous(h.app);
    expect((await newcomer.post('/api/invitations/preview', { token })).status).toBe(200);
    const accepted = await newcomer.post('/api/invitations/accept', { token, displayName: 'Real Person', password: NEW_PASSWORD });
    expect(accepted.status).toBe(200);
  });

  it('repeated failures on one link are still limited', async () => {
    const org = await createOrg(h.ds);
    const admin = await signedIn(h.app, org.admin.email, TEST_PASSWORD);
    const res = await admin.post(`/api/orgs/${org.id}/invitations`, { email: uniqueEmail('typo'), roles: ['coach'] });
    const token = new URL(res.body.link).hash.slice(1);
    const guesser = await Client.anonymous(h.app);
    const statuses: number[] = [];
    for (let i = 0; i <= h.config.SIGNIN_MAX_FAILURES_PER_ACCOUNT; i++) {
      const r = await guesser.post('/api/invitations/accept', { token, displayName: 'X', password: `short${i}` });
      statuses.push(r.status);
    }
    expect(statuses).toEqual([...Array(h.config.SIGNIN_MAX_FAILURES_PER_ACCOUNT).fill(400), 429]);
  });
});
