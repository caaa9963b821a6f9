import { inject } from 'vitest';
import pg from 'pg';
import type { DataSource } from 'typeorm';
import { AuditEntry } from '../entities';
import { entryHash } from '../services/audit';

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

/**
 * The attack the seals exist for: with the owner's credentials, rewrite one entry's `after` and
 * recompute the hash of it and of every entry after it, so the chain checks out again on its own.
 */
export async function rewriteChainAsOwner(ds: DataSource, organizationId: string, entryId: string, after: unknown): Promise<void> {
  const rows = await ds
    .getRepository(AuditEntry)
    .createQueryBuilder('a')
    .where('a.organization_id = :organizationId', { organizationId })
    .orderBy('a.id', 'ASC')
    .getMany();
  await asOwner(async (c) => {
    await c.query('ALTER TABLE audit_entries DISABLE TRIGGER audit_entries_no_update_delete');
    let prev: string | null = null;
    for (const row of rows) {
      if (BigInt(row.id) >= BigInt(entryId)) {
        if (row.id === entryId) row.after = after as AuditEntry['after'];
        row.prevHash = prev ?? row.prevHash;
        row.hash = entryHash(row.prevHash, row);
        await c.query('UPDATE audit_entries SET after = $2, prev_hash = $3, hash = $4 WHERE id = $1', [
          row.id,
          JSON.stringify(row.after),
          row.prevHash,
          row.hash,
        ]);
      }
      prev = row.hash;
    }
    await c.query('ALTER TABLE audit_entries ENABLE TRIGGER audit_entries_no_update_delete');
  });
}
