import { describe, expect, it } from 'vitest';
import pg from 'pg';
import { Membership } from '../../entities';
import { appendAudit, verifyChain } from '../../services/audit';
import { signedIn, useHarness } from '../../test/harness';
import { ownerUrl, tamperAuditEntry } from '../../test/owner';
import { createOrg, TEST_PASSWORD } from '../../test/factories';
import { auditProbes, newRequestId, type EntryRow } from '../../test/worlds/audit-fixtures';

const h = useHarness({ SIGNIN_MAX_PER_IP: '1000' });
const { entriesFor, orgEntryIds, append } = auditProbes(h);

describe('the audit table is append-only', () => {
  /**
   * Runs one statement in a transaction that is always rolled back, and returns its error, if any; as
   * the app's own role (h.ds), or as the table's owner.
   */
  async function attempt(sql: string, params: unknown[] = [], as: 'app' | 'owner' = 'app'): Promise<(Error & { code?: string }) | null> {
    const c = new pg.Client({ connectionString: as === 'owner' ? ownerUrl() : h.config.DATABASE_URL });
    await c.connect();
    await c.query('BEGIN');
    try {
      await c.query(sql, params);
      return null;
    } catch (err) {
      return err as Error;
    } finally {
      await c.query('ROLLBACK');
      await c.end();
    }
  }

  it('UPDATE, DELETE and TRUNCATE are refused by the database itself, even to the owner (its trigger)', async () => {
    const org = await createOrg(h.ds);
    await append(org.id);
    for (const [sql, op] of [
      [`UPDATE audit_entries SET action = 'forged' WHERE organization_id = $1`, 'UPDATE'],
      [`DELETE FROM audit_entries WHERE organization_id = $1`, 'DELETE'],
      ['TRUNCATE audit_entries', 'TRUNCATE'],
    ] as const) {
      // The app's own role has no such right at all (audit-roles.test.ts); the trigger stops the owner too.
      expect((await attempt(sql, sql.includes('$1') ? [org.id] : []))?.code, op).toBe('42501');
      const err = await attempt(sql, sql.includes('$1') ? [org.id] : [], 'owner');
      expect(err, op).not.toBeNull();
      expect(err!.message).toBe(`audit_entries is append-only: ${op} refused`);
    }
    const rows: EntryRow[] = await h.ds.query('SELECT * FROM audit_entries WHERE organization_id = $1', [org.id]);
    expect(rows.map((r) => r.action)).toEqual(['test.entry']);
  });

  it('a tampered entry is found: /audit/verify reports intact:false and names that entry', async () => {
    // An organization of its own: chains are per organization, so no other test's chain breaks.
    const org = await createOrg(h.ds);
    const admin = await signedIn(h.app, org.admin.email, TEST_PASSWORD);
    for (const n of [1, 2, 3]) await append(org.id, { action: `test.entry_${n}`, after: { roles: ['coach'], n } });
    const healthy = await admin.get(`/api/orgs/${org.id}/audit/verify`);
    expect(healthy.body).toMatchObject({ intact: true, firstBrokenId: null });
    const [target]: { id: string }[] = await h.ds.query(
      `SELECT id FROM audit_entries WHERE organization_id = $1 AND action = 'test.entry_2'`,
      [org.id],
    );

    // As the table's owner, with the trigger off only inside one transaction (ALTER TABLE holds its lock to the end).
    await tamperAuditEntry(target.id, { roles: ['admin'], n: 2 });

    const res = await admin.get(`/api/orgs/${org.id}/audit/verify`);
    expect(res.status).toBe(200);
    expect(res.body).toMatchObject({
      organizationId: org.id,
      intact: false,
      firstBrokenId: String(target.id),
      reason: 'contents do not match the stored hash',
    });
    // The trigger is back on.
    expect((await attempt(`UPDATE audit_entries SET action = 'x' WHERE id = $1`, [target.id], 'owner'))?.message).toBe(
      'audit_entries is append-only: UPDATE refused',
    );
  });
});

describe('the change and its audit entry commit or roll back together', () => {
  it('a transaction that writes a change and its entry, then fails, leaves neither', async () => {
    const org = await createOrg(h.ds);
    const rid = newRequestId();
    const id = org.otherCoach.membershipId;
    await expect(
      h.ds.transaction(async (m) => {
        await m.update(Membership, { id }, { roles: ['coach', 'admin'] });
        await appendAudit(m, {
          organizationId: org.id,
          actorUserId: org.admin.userId,
          action: 'membership.roles_changed',
          subjectType: 'Membership',
          subjectId: id,
          before: { roles: ['coach'] },
          after: { roles: ['coach', 'admin'] },
          requestId: rid,
        });
        expect(await entriesFor(rid)).toEqual([]); // not visible outside the transaction yet
        throw new Error('crash after the audit entry');
      }),
    ).rejects.toThrow('crash after the audit entry');
    expect((await h.ds.getRepository(Membership).findOneByOrFail({ id })).roles).toEqual(['coach']);
    expect(await entriesFor(rid)).toEqual([]);
  });

  it('when the audit entry cannot be written, the change is rolled back', async () => {
    const org = await createOrg(h.ds);
    const rid = newRequestId();
    const id = org.otherCoach.membershipId;
    await expect(
      h.ds.transaction(async (m) => {
        await m.update(Membership, { id }, { roles: ['coach', 'admin'] });
        // action is varchar(80): the insert fails inside the same transaction.
        await appendAudit(m, {
          organizationId: org.id,
          actorUserId: org.admin.userId,
          action: 'x'.repeat(81),
          subjectType: 'Membership',
          subjectId: id,
          requestId: rid,
        });
      }),
    ).rejects.toThrow(/too long/);
    expect((await h.ds.getRepository(Membership).findOneByOrFail({ id })).roles).toEqual(['coach']);
    expect(await entriesFor(rid)).toEqual([]);
    expect((await verifyChain(h.ds.manager, org.id)).intact).toBe(true);
  });

  it('appendAudit refuses to run outside a transaction', async () => {
    const org = await createOrg(h.ds);
    await expect(
      appendAudit(h.ds.manager, { organizationId: org.id, actorUserId: null, action: 'test.entry', subjectType: 'Test' }),
    ).rejects.toThrow(/inside a transaction/);
    expect(await orgEntryIds(org.id)).toEqual([]);
  });
});

describe('the hash chain under concurrency', () => {
  it('10 parallel writers in one organization extend the chain by 10, without a fork', async () => {
    const org = await createOrg(h.ds);
    await append(org.id, { action: 'test.genesis' });
    const before = await verifyChain(h.ds.manager, org.id);
    expect(before).toMatchObject({ intact: true, entries: 1 });
    await Promise.all(Array.from({ length: 10 }, (_, n) => append(org.id, { action: `test.parallel_${n}` })));
    const after = await verifyChain(h.ds.manager, org.id);
    expect(after).toMatchObject({ intact: true, entries: 11, firstBrokenId: null });
    const [{ links }] = await h.ds.query('SELECT count(DISTINCT prev_hash)::int AS links FROM audit_entries WHERE organization_id = $1', [
      org.id,
    ]);
    expect(links).toBe(11);
  });
});
