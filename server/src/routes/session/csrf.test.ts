import { describe, expect, it } from 'vitest';
import request from 'supertest';
import { Client, signedIn, useHarness } from '../../test/harness';
import { createOrg, TEST_PASSWORD } from '../../test/factories';
import { sessionCookie } from '../../test/worlds/session-fixtures';

describe('CSRF and the signed-in person’s own profile (default settings)', () => {
  const h = useHarness();

  describe('CSRF (ASVS 5.0 V3.5.1–V3.5.3)', () => {
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
        .set('Host', 'localhost:3000')
        .set('Origin', 'http://localhost:3000')
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
});
