import { inject } from 'vitest';
import pg from 'pg';

/**
 * The owner role, for what the app's own (runtime) role may not do: tests that play an attacker with
 * the owner's credentials, or that create and drop databases. Never used by the app under test.
 */
export function ownerUrl(database?: string): string {
  const u = new URL(inject('ownerDatabaseUrl'));
  if (database) u.pathname = `/${database}`;
  return u.toString();
}

/** Runs `fn` in one transaction as the owner; it commits when `fn` resolves. */
export async function asOwner<T>(fn: (c: pg.Client) => Promise<T>, database?: string): Promise<T> {
  const c = new pg.Client({ connectionString: ownerUrl(database) });
  await c.connect();
  try {
    await c.query('BEGIN');
    const out = await fn(c);
    await c.query('COMMIT');
    return out;
  } catch (err) {
    await c.query('ROLLBACK').catch(() => undefined);
    throw err;
  } finally {
    await c.end();
  }
}

/**
 * Rewrites one audit entry's `after` as the table's owner, with the append-only trigger off only
 * inside this one transaction (ALTER TABLE holds its lock to the end, so no other session sees it off).
 */
export async function tamperAuditEntry(id: string, after: unknown): Promise<void> {
  await asOwner(async (c) => {
    await c.query('ALTER TABLE audit_entries DISABLE TRIGGER audit_entries_no_update_delete');
    await c.query('UPDATE audit_entries SET after = $2 WHERE id = $1', [id, JSON.stringify(after)]);
    await c.query('ALTER TABLE audit_entries ENABLE TRIGGER audit_entries_no_update_delete');
  });
}
