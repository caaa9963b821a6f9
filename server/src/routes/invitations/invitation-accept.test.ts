import { describe, expect, it } from 'vitest';
import { useHarness } from '../../test/harness';
import { createOrg, TEST_PASSWORD } from '../../test/factories';
import { invitationHelpers, NEW_PASSWORD, uniqueEmail, unknownToken } from '../../test/worlds/invitations-fixtures';

describe('accepting an invitation', () => {
  const h = useHarness();
  const { adminOf, invite, accept, preview, invitationRow, countUsers } = invitationHelpers(h);

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
});
