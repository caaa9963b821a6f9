import { describe, expect, it } from 'vitest';
import pg from 'pg';
import { useHarness } from '../test/harness';
import { createOrg } from '../test/factories';
import { ownerUrl } from '../test/owner';
import { appendAudit, verifyChain } from './audit';

const h = useHarness();

/** One statement as the app's own role (the harness's DATABASE_URL), always rolled back; its error code, if any. */
async function asApp(sql: string, params: unknown[] = []): Promise<{ code: string | undefined; message: string } | null> {
  const c = new pg.Client({ connectionString: h.config.DATABASE_URL });
  await c.connect();
  await c.query('BEGIN');
  try {
    await c.query(sql, params);
    return null;
  } catch (err) {
    return { code: (err as { code?: string }).code, message: (err as Error).message };
  } finally {
    await c.query('ROLLBACK');
    await c.end();
  }
}

describe('ASVS 5.0 V16.4.2: the app’s own database role cannot modify the audit trail', () => {
  it('the app connects as a role other than the owner, and owns nothing (an owner could ALTER or DISABLE TRIGGER)', async () => {
    const app = decodeURIComponent(new URL(h.config.DATABASE_URL).username);
    expect(app).not.toBe(decodeURIComponent(new URL(ownerUrl()).username));
    const [{ current_user }] = await h.ds.query('SELECT current_user');
    expect(current_user).toBe(app);
    const owned = await h.ds.query(
      `SELECT n.nspname, c.relname FROM pg_class c JOIN pg_namespace n ON n.oid = c.relnamespace WHERE pg_has_role(current_user, c.relowner, 'USAGE')`,
    );
    expect(owned).toEqual([]);
    const [{ n }] = await h.ds.query(`SELECT count(*)::int AS n FROM pg_proc WHERE pg_has_role(current_user, proowner, 'USAGE')`);
    expect(n).toBe(0);
  });

  it.each([
    ['UPDATE', `UPDATE audit_entries SET action = 'forged' WHERE organization_id = $1`, true],
    ['DELETE', `DELETE FROM audit_entries WHERE organization_id = $1`, true],
    ['TRUNCATE', 'TRUNCATE audit_entries', false],
    ['ALTER TABLE', 'ALTER TABLE audit_entries ADD COLUMN forged text', false],
    ['ALTER TABLE … DISABLE TRIGGER', 'ALTER TABLE audit_entries DISABLE TRIGGER audit_entries_no_update_delete', false],
    ['DROP TRIGGER', 'DROP TRIGGER audit_entries_no_update_delete ON audit_entries', false],
    ['DROP TABLE', 'DROP TABLE audit_entries', false],
    [
      'replacing the trigger function',
      `CREATE OR REPLACE FUNCTION audit_entries_refuse_change() RETURNS trigger LANGUAGE plpgsql AS $$ BEGIN RETURN NEW; END $$`,
      false,
    ],
  ])('%s is refused with a permission error', async (_op, sql, withOrg) => {
    const org = await createOrg(h.ds);
    await h.ds.transaction((m) => appendAudit(m, { organizationId: org.id, actorUserId: null, action: 'test.entry', subjectType: 'Test' }));
    const err = await asApp(sql, withOrg ? [org.id] : []);
    expect(err?.code, err?.message).toBe('42501'); // insufficient_privilege
    expect(err!.message).toMatch(/permission denied|must be owner/);
    expect(await verifyChain(h.ds.manager, org.id)).toMatchObject({ intact: true });
  });

  it('the app may still append and read entries, and may not touch the migrations ledger', async () => {
    const org = await createOrg(h.ds);
    await h.ds.transaction((m) => appendAudit(m, { organizationId: org.id, actorUserId: null, action: 'test.entry', subjectType: 'Test' }));
    const [{ n }] = await h.ds.query('SELECT count(*)::int AS n FROM audit_entries WHERE organization_id = $1', [org.id]);
    expect(n).toBe(1);
    expect((await asApp(`DELETE FROM migrations`))?.code).toBe('42501');
    expect(await asApp('SELECT count(*) FROM migrations')).toBeNull();
  });
});
