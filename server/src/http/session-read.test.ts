import { afterEach, beforeAll, describe, expect, it } from 'vitest';
import pg from 'pg';
import { todayIso } from '../../../policies/roles';
import { signedIn, useHarness, type Client } from '../test/harness';
import { createOrg, TEST_PASSWORD, type TestOrg } from '../test/factories';

// The session row, its user and the user's memberships are read in one query (http/security.ts),
// and the roster and today view in one query each. These tests show that nothing is read less
// often than before: every change applies on the very next request.
const h = useHarness({ SIGNIN_MAX_PER_IP: '1000' });

/** The SQL sent while `work` runs, except the session expiry touch (at most once a minute). */
async function queriesDuring(work: () => Promise<unknown>): Promise<string[]> {
  const sent: string[] = [];
  const original = pg.Client.prototype.query;
  pg.Client.prototype.query = function (this: pg.Client, ...args: unknown[]) {
    const q = args[0] as string | { text?: string };
    const text = typeof q === 'string' ? q : (q?.text ?? '');
    if (!/^UPDATE "session" SET expire/.test(text)) sent.push(text);
    return (original as (...a: unknown[]) => unknown).apply(this, args);
  } as typeof original;
  try {
    await work();
  } finally {
    pg.Client.prototype.query = original;
  }
  return sent;
}

describe('the session read', () => {
  let org: TestOrg;
  let coach: Client;
  let athlete: Client;

  beforeAll(async () => {
    org = await createOrg(h.ds);
    coach = await signedIn(h.app, org.coach.email, TEST_PASSWORD);
    athlete = await signedIn(h.app, org.athlete.email, TEST_PASSWORD);
  });

  afterEach(async () => {
    await h.ds.query(`UPDATE memberships SET active = true WHERE organization_id = $1`, [org.id]);
  });

  it('costs one query before the handler; the roster and the today view one query each', async () => {
    await coach.get(`/api/orgs/${org.id}/roster`);
    const roster = await queriesDuring(() => coach.get(`/api/orgs/${org.id}/roster`).expect(200));
    expect(roster).toHaveLength(2);
    expect(roster[0]).toMatch(/FROM "session" s\s+LEFT JOIN users u/);
    const today = await queriesDuring(() => athlete.get(`/api/orgs/${org.id}/athletes/${org.athlete.membershipId}/today`).expect(200));
    expect(today).toHaveLength(2);
  });

  it('a deactivated membership answers 404 on the next request, and 200 again once reactivated', async () => {
    await coach.get(`/api/orgs/${org.id}/roster`).expect(200);
    await h.ds.query(`UPDATE memberships SET active = false WHERE id = $1`, [org.coach.membershipId]);
    expect((await coach.get(`/api/orgs/${org.id}/roster`)).status).toBe(404);
    await h.ds.query(`UPDATE memberships SET active = true WHERE id = $1`, [org.coach.membershipId]);
    expect((await coach.get(`/api/orgs/${org.id}/roster`)).status).toBe(200);
  });

  it('a care-team change shows on the next request', async () => {
    const ids = async () => ((await coach.get(`/api/orgs/${org.id}/roster`)).body as { athleteId: string }[]).map((r) => r.athleteId);
    expect(await ids()).toEqual([org.athlete.membershipId]);
    await h.ds.query(`UPDATE care_team_assignments SET member_id = $1 WHERE member_id = $2 AND role = 'coach'`, [
      org.otherCoach.membershipId,
      org.coach.membershipId,
    ]);
    expect(await ids()).toEqual([]);
    await h.ds.query(`UPDATE care_team_assignments SET member_id = $2 WHERE member_id = $1 AND role = 'coach'`, [
      org.otherCoach.membershipId,
      org.coach.membershipId,
    ]);
    expect(await ids()).toEqual([org.athlete.membershipId]);
  });

  it('a role taken away refuses on the next request (a guardian may never read programs: 403)', async () => {
    await h.ds.query(`UPDATE memberships SET roles = '{guardian}' WHERE id = $1`, [org.coach.membershipId]);
    try {
      expect((await coach.get(`/api/orgs/${org.id}/athletes/${org.athlete.membershipId}/today`)).status).toBe(403);
    } finally {
      await h.ds.query(`UPDATE memberships SET roles = '{coach}' WHERE id = $1`, [org.coach.membershipId]);
    }
    expect((await coach.get(`/api/orgs/${org.id}/athletes/${org.athlete.membershipId}/today`)).status).toBe(200);
  });

  it('a changed name is seen on the next request (the user row is read every time)', async () => {
    await h.ds.query(`UPDATE users SET display_name = 'Renamed Athlete' WHERE id = $1`, [org.athlete.userId]);
    expect((await athlete.get('/api/session')).body.user.displayName).toBe('Renamed Athlete');
  });

  it('a deleted session row (sign-out elsewhere, password reset) answers 401 on the next request', async () => {
    const other = await signedIn(h.app, org.clinician.email, TEST_PASSWORD);
    await other.get(`/api/orgs/${org.id}/roster`).expect(200);
    await h.ds.query(`DELETE FROM "session" WHERE (sess -> 'passport' ->> 'user') = $1`, [org.clinician.userId]);
    expect((await other.get(`/api/orgs/${org.id}/roster`)).status).toBe(401);
  });

  it('a session written while signed in never stores what the read loaded with it', async () => {
    // Without a CSRF token in the row, the next read makes one: express-session then saves the session.
    await h.ds.query(`UPDATE "session" SET sess = (sess::jsonb - 'csrfToken')::json WHERE (sess -> 'passport' ->> 'user') = $1`, [
      org.coach.userId,
    ]);
    await coach.refresh();
    expect(coach.csrf).toBeTruthy();
    const rows: { sess: Record<string, unknown> }[] = await h.ds.query(
      `SELECT sess FROM "session" WHERE (sess -> 'passport' ->> 'user') = $1`,
      [org.coach.userId],
    );
    expect(rows.length).toBeGreaterThan(0);
    for (const r of rows) {
      expect(r.sess.csrfToken).toBe(coach.csrf);
      expect(r.sess.passport).toEqual({ user: org.coach.userId });
    }
  });

  it("the today view still shows only the athlete's own data for a date", async () => {
    const res = await athlete.get(`/api/orgs/${org.id}/athletes/${org.athlete.membershipId}/today`);
    expect(res.body).toEqual({ athleteId: org.athlete.membershipId, date: todayIso(), unit: 'kg', sessions: [] });
  });
});
