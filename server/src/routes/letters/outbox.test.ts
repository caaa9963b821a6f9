import { randomUUID } from 'node:crypto';
import { describe, expect, it } from 'vitest';
import { Client, signedIn, useHarness } from '../../test/harness';
import { createOrg, TEST_PASSWORD, type TestOrg } from '../../test/factories';
import { waitFor } from '../../mail/mail-fixtures';

/**
 * The admin's outbox: the local fake mail server's messages, only while that fake is in use.
 * Two organizations for the file (the second to show isolation), shared by both apps below (same database).
 */
let orgsOnce: Promise<[TestOrg, TestOrg]> | null = null;

describe('the outbox, with the local fake mail server (FAKE_MAIL=true)', () => {
  const h = useHarness({ SIGNIN_MAX_PER_IP: '1000' }, { mail: true });
  const orgs = () => (orgsOnce ??= Promise.all([createOrg(h.ds), createOrg(h.ds)]));
  let adminBOnce: Promise<Client> | null = null;
  const adminOfB = async () => (adminBOnce ??= signedIn(h.app, (await orgs())[1].admin.email, TEST_PASSWORD));

  it("an admin lists the messages sent to their organization's people, newest first, without raw source or HTML; never another organization's", async () => {
    const [org, orgB] = await orgs();
    const admin = await signedIn(h.app, org.admin.email, TEST_PASSWORD);
    const adminB = await adminOfB();
    const first = `outbox-1-${randomUUID()}@test.example`;
    const second = `outbox-2-${randomUUID()}@test.example`;
    const theirs = `outbox-b-${randomUUID()}@test.example`;
    for (const email of [first, second])
      expect((await admin.post(`/api/orgs/${org.id}/invitations`, { email, roles: ['coach'] })).status).toBe(201);
    expect((await adminB.post(`/api/orgs/${orgB.id}/invitations`, { email: theirs, roles: ['coach'] })).status).toBe(201);
    await waitFor('the three invitations delivered', async () => {
      const rows: { n: string }[] = await h.ds.query(`SELECT count(*) AS n FROM fake_mailbox WHERE envelope_to && $1`, [
        [first, second, theirs],
      ]);
      return Number(rows[0].n) === 3;
    });

    const res = await admin.get(`/api/orgs/${org.id}/outbox`);
    expect(res.status).toBe(200);
    expect(res.headers['cache-control']).toMatch(/no-store/);
    const ids = res.body.map((m: { id: string }) => Number(m.id));
    expect(ids).toEqual([...ids].sort((a, b) => b - a));
    const mine = res.body.filter((m: { to: string[] }) => m.to.includes(first) || m.to.includes(second));
    expect(mine.map((m: { to: string[] }) => m.to[0]).sort()).toEqual([first, second].sort());
    const msg = mine.find((m: { to: string[] }) => m.to[0] === first);
    expect(Object.keys(msg).sort()).toEqual(['attachments', 'id', 'receivedAt', 'subject', 'text', 'to']);
    expect(msg.subject).toMatch(/^You're invited to .+ on Loadline$/);
    expect(msg.text).toContain('/invite#');
    expect(msg.attachments).toEqual([]);
    expect(new Date(msg.receivedAt).toISOString()).toBe(msg.receivedAt);
    // Organizations are isolated (ASVS 5.0 V8.4.1): another organization's mail is not in this list…
    expect(JSON.stringify(res.body)).not.toContain(theirs);
    // …and is in theirs, without ours.
    const b = await adminB.get(`/api/orgs/${orgB.id}/outbox`);
    expect(b.status).toBe(200);
    expect(b.body.map((m: { to: string[] }) => m.to[0])).toContain(theirs);
    expect(JSON.stringify(b.body)).not.toContain(first);
  });

  it('anyone but an admin is refused (403); signed out → 401; an admin of another organization → 404', async () => {
    const [org] = await orgs();
    for (const who of [org.clinician, org.coach, org.guardian, org.athlete]) {
      const c = await signedIn(h.app, who.email, TEST_PASSWORD);
      const res = await c.get(`/api/orgs/${org.id}/outbox`);
      expect(res.status, who.email).toBe(403);
      expect(res.body.error.code).toBe('forbidden');
    }
    expect((await (await Client.anonymous(h.app)).get(`/api/orgs/${org.id}/outbox`)).status).toBe(401);
    const adminB = await adminOfB();
    expect((await adminB.get(`/api/orgs/${org.id}/outbox`)).status).toBe(404);
  });
});

describe('the outbox, with a real mail provider (FAKE_MAIL=false)', () => {
  const h = useHarness({ SIGNIN_MAX_PER_IP: '1000', FAKE_MAIL: 'false' });

  it('does not exist: 404 even for an admin', async () => {
    const [org] = await (orgsOnce ??= Promise.all([createOrg(h.ds), createOrg(h.ds)]));
    const admin = await signedIn(h.app, org.admin.email, TEST_PASSWORD);
    const res = await admin.get(`/api/orgs/${org.id}/outbox`);
    expect(res.status).toBe(404);
    expect(res.body.error.code).toBe('not_found');
    expect(JSON.stringify(res.body)).not.toMatch(/@test\.example/);
  });
});
