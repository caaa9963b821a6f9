import { randomUUID } from 'node:crypto';
import request from 'supertest';
import { beforeAll, describe, expect, it } from 'vitest';
import { Client, signedIn, useHarness } from '../../test/harness';
import { createOrg, TEST_PASSWORD, type TestOrg } from '../../test/factories';

const h = useHarness({ SIGNIN_MAX_PER_IP: '1000' });

/**
 * Each person's own e-mail choices (everyone hears every change, the way they chose): read and
 * changed only by that person, refused signed out and outside the organization, the change audited
 * in the same transaction.
 */
let org: TestOrg;
let other: TestOrg;
let coach: Client;
let guardian: Client;
beforeAll(async () => {
  [org, other] = await Promise.all([createOrg(h.ds), createOrg(h.ds)]);
  [coach, guardian] = await Promise.all([
    signedIn(h.app, org.coach.email, TEST_PASSWORD),
    signedIn(h.app, org.guardian.email, TEST_PASSWORD),
  ]);
});
const path = (o: TestOrg) => `/api/orgs/${o.id}/notice-preferences`;
const offRows = async (memberId: string): Promise<string[]> =>
  (await h.ds.query(`SELECT kind FROM notice_email_opt_outs WHERE member_id = $1 ORDER BY kind`, [memberId])).map(
    (r: { kind: string }) => r.kind,
  );

describe('notice e-mail preferences', () => {
  it('ASVS 5.0 V8.2.1: signed out → 401 for reading and changing', async () => {
    expect((await request(h.app).get(path(org))).status).toBe(401);
    const anon = await Client.anonymous(h.app);
    expect((await anon.patch(path(org), { email: { status_changed: false } })).status).toBe(401);
  });

  it('ASVS 5.0 V8.4.1: another organization answers 404, and nothing is stored there', async () => {
    expect((await coach.get(path(other))).status).toBe(404);
    expect((await coach.patch(path(other), { email: { status_changed: false } })).status).toBe(404);
    expect(await offRows(org.coach.membershipId)).toEqual([]);
  });

  it('each role sees the kinds it receives: the coach the emergency Out fixed, holds and exceptions switchable', async () => {
    const res = await coach.get(path(org));
    expect(res.status).toBe(200);
    expect(res.body.map((k: { kind: string; fixed: boolean }) => `${k.kind}${k.fixed ? ' (fixed)' : ''}`)).toEqual([
      'status_out (fixed)',
      'sessions_on_hold',
      'exception_granted',
      'exception_refused',
      'status_changed',
      'plan_changed',
    ]);
  });

  it('ASVS 5.0 V8.2.2: a change touches only the caller’s own choices, and is audited with before and after', async () => {
    const rid = `test-${randomUUID()}`;
    const res = await guardian.patch(path(org), { email: { status_changed: false } }).set('x-request-id', rid);
    expect(res.status, JSON.stringify(res.body)).toBe(200);
    expect(await offRows(org.guardian.membershipId)).toEqual(['status_changed']);
    expect(await offRows(org.coach.membershipId)).toEqual([]);
    const entries = await h.ds.query(`SELECT action, subject_type, subject_id, before, after FROM audit_entries WHERE request_id = $1`, [
      rid,
    ]);
    expect(entries).toEqual([
      {
        action: 'notice_preferences.changed',
        subject_type: 'Membership',
        subject_id: org.guardian.membershipId,
        before: { status_changed: true },
        after: { status_changed: false },
      },
    ]);
    // The same choice again changes nothing and writes no entry.
    const again = `test-${randomUUID()}`;
    expect((await guardian.patch(path(org), { email: { status_changed: false } }).set('x-request-id', again)).status).toBe(200);
    expect(await h.ds.query(`SELECT 1 FROM audit_entries WHERE request_id = $1`, [again])).toEqual([]);
  });

  it('ASVS 5.0 V2.2.1: strict bodies — an unknown kind, a non-boolean, an extra top-level key → 400 naming the field', async () => {
    const cases: [object, string][] = [
      [{ email: { status_changed: 'no' } }, 'email.status_changed'],
      [{ email: { status_out: false } }, 'email.status_out'],
      [{ email: {}, memberId: org.coach.membershipId }, ''],
    ];
    for (const [body, field] of cases) {
      const res = await coach.patch(path(org), body);
      expect(res.status, JSON.stringify(body)).toBe(400);
      if (field) expect(Object.keys(res.body.error.fields)).toContain(field);
    }
  });
});
