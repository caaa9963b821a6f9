import { describe, expect, it } from 'vitest';
import { signedIn, useHarness } from '../../test/harness';
import { createOrg, TEST_PASSWORD } from '../../test/factories';
import { invitationHelpers, sha256, uniqueEmail } from '../../test/worlds/invitations-fixtures';

describe('invitations: an admin invites, the holder of the link previews', () => {
  const h = useHarness();
  const { adminOf, invite, preview, invitationRow } = invitationHelpers(h);

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
