import { randomUUID } from 'node:crypto';
import { afterAll, beforeAll, describe, expect, it } from 'vitest';
import { Notification } from '../../entities';
import { useHarness, type Client } from '../../test/harness';
import type { MemberRef } from '../../test/factories';
import { pinClock, unpinClock, zonedWorld, type ZonedWorld } from '../../test/worlds/clock-world';
import { asOwner } from '../../test/owner';

const h = useHarness({ SIGNIN_MAX_PER_IP: '1000' });

/**
 * Clearing a notice is part of "no warning sign goes unread": who cleared which notice, and when, is
 * in the audit trail (45 CFR 164.312(b)), written in the same transaction as the change so neither
 * stands without the other (OWASP Top 10 A09:2025). One entry per request; a request that changes
 * nothing writes none.
 */
describe('marking notices read is an audited change', () => {
  let w: ZonedWorld;
  let coach: Client;

  beforeAll(async () => {
    pinClock('2026-06-10T09:00:00-07:00');
    w = await zonedWorld(h.ds, h.app, 'America/Los_Angeles');
    coach = await w.as(w.org.coach);
  });
  afterAll(unpinClock);

  const notices = async (to: MemberRef, n: number): Promise<string[]> => {
    const rows = await h.ds.getRepository(Notification).save(
      Array.from({ length: n }, (_, i) => ({
        organizationId: w.org.id,
        recipientId: to.membershipId,
        athleteId: w.org.athlete.membershipId,
        kind: 'pain_report',
        severity: 'routine' as const,
        title: `Notice ${i}`,
        body: 'A routine notice for the test.',
      })),
    );
    return rows.map((r) => r.id);
  };
  const readAt = async (id: string): Promise<Date | null> =>
    (await h.ds.query('SELECT read_at FROM notifications WHERE id = $1', [id]))[0].read_at;
  const entries = async (requestId: string) =>
    h.ds.query('SELECT action, subject_type, subject_id, athlete_id, actor_user_id, after FROM audit_entries WHERE request_id = $1', [
      requestId,
    ]);
  const post = (path: string, rid: string) => coach.post(`${w.base}/notifications${path}`).set('x-request-id', rid);

  it('one notice: read, with one entry naming it and who read it; marking it again writes nothing', async () => {
    const [id] = await notices(w.org.coach, 1);
    const rid = `test-${randomUUID()}`;
    expect((await post(`/${id}/read`, rid)).status).toBe(204);
    expect(await readAt(id)).toEqual(new Date('2026-06-10T16:00:00Z'));
    expect(await entries(rid)).toEqual([
      {
        action: 'notification.read',
        subject_type: 'Notification',
        subject_id: id,
        athlete_id: null,
        actor_user_id: w.org.coach.userId,
        after: { ids: [id] },
      },
    ]);
    const again = `test-${randomUUID()}`;
    expect((await post(`/${id}/read`, again)).status).toBe(204);
    expect(await entries(again)).toEqual([]);
  });

  it('read-all: every unread notice of mine in one entry ("all", with the count), none of anyone else’s', async () => {
    const mine = await notices(w.org.coach, 3);
    const theirs = await notices(w.org.otherCoach, 1);
    const rid = `test-${randomUUID()}`;
    expect((await post('/read-all', rid)).status).toBe(204);
    for (const id of mine) expect(await readAt(id)).toBeInstanceOf(Date);
    expect(await readAt(theirs[0])).toBeNull();
    expect(await entries(rid)).toEqual([
      {
        action: 'notification.read',
        subject_type: 'Notification',
        subject_id: null,
        athlete_id: null,
        actor_user_id: w.org.coach.userId,
        after: { ids: 'all', count: 3 },
      },
    ]);
    const again = `test-${randomUUID()}`;
    expect((await post('/read-all', again)).status).toBe(204);
    expect(await entries(again)).toEqual([]);
  });

  it('when the audit entry cannot be written, the notice stays unread (one transaction)', async () => {
    const [id] = await notices(w.org.coach, 1);
    // A trigger that refuses audit entries about this one notice only, so other tests are untouched.
    const fn = `test_refuse_audit_${id.replace(/-/g, '')}`;
    // As the owner: the app's own role may create no function and no trigger on audit_entries.
    await asOwner((c) =>
      c.query(`CREATE FUNCTION ${fn}() RETURNS trigger LANGUAGE plpgsql AS $$
      BEGIN IF NEW.subject_id = '${id}' THEN RAISE EXCEPTION 'audit insert refused for the test'; END IF; RETURN NEW; END $$`),
    );
    await asOwner((c) => c.query(`CREATE TRIGGER ${fn} BEFORE INSERT ON audit_entries FOR EACH ROW EXECUTE FUNCTION ${fn}()`));
    try {
      const res = await post(`/${id}/read`, `test-${randomUUID()}`);
      expect(res.status).toBe(500);
      expect(JSON.stringify(res.body)).not.toContain('audit insert refused');
    } finally {
      await asOwner(async (c) => {
        await c.query(`DROP TRIGGER ${fn} ON audit_entries`);
        await c.query(`DROP FUNCTION ${fn}()`);
      });
    }
    expect(await readAt(id)).toBeNull();
    // With the audit insert allowed again the same request goes through: the refusal was the cause.
    expect((await post(`/${id}/read`, `test-${randomUUID()}`)).status).toBe(204);
    expect(await readAt(id)).toBeInstanceOf(Date);
  });

  it("another person's notice → 404, stays unread, and nothing is written to the trail (ASVS 5.0 V8.2.2)", async () => {
    const [id] = await notices(w.org.clinician, 1);
    const rid = `test-${randomUUID()}`;
    expect((await post(`/${id}/read`, rid)).status).toBe(404);
    expect(await readAt(id)).toBeNull();
    expect((await entries(rid)).filter((e: { action: string }) => e.action === 'notification.read')).toEqual([]);
  });
});
