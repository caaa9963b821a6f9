import { createHash } from 'node:crypto';
import type { EntityManager } from 'typeorm';
import { AuditEntry } from '../entities';
import { canonicalJson, toPlainJson } from './canonical';

export const GENESIS_HASH = '0'.repeat(64);

export interface AuditInput {
  organizationId: string | null;
  actorUserId: string | null;
  action: string;
  subjectType: string;
  subjectId?: string | null;
  /** The athlete the change concerns, if any (clinicians browse their athletes' trail by it). */
  athleteId?: string | null;
  before?: unknown;
  after?: unknown;
  requestId?: string | null;
}

type Hashable = Pick<
  AuditEntry,
  'organizationId' | 'occurredAt' | 'actorUserId' | 'action' | 'subjectType' | 'subjectId' | 'before' | 'after' | 'requestId'
> &
  Partial<Pick<AuditEntry, 'athleteId'>>;

export function entryHash(prevHash: string, e: Hashable): string {
  const canonical = canonicalJson({
    organizationId: e.organizationId,
    occurredAt: e.occurredAt.toISOString(),
    actorUserId: e.actorUserId,
    action: e.action,
    subjectType: e.subjectType,
    subjectId: e.subjectId,
    before: e.before,
    after: e.after,
    requestId: e.requestId,
    // Added with the cases migration; left out when empty so entries written before it still verify.
    ...(e.athleteId ? { athleteId: e.athleteId } : {}),
  });
  return createHash('sha256').update(prevHash).update(canonical).digest('hex');
}

/**
 * Appends one entry to the organization's hash chain, inside the caller's transaction so the change
 * and its entry commit or roll back together. A transaction-scoped advisory lock per chain serialises
 * writers, so two concurrent changes can never both link to the same previous entry.
 */
export async function appendAudit(manager: EntityManager, input: AuditInput): Promise<void> {
  if (!manager.queryRunner?.isTransactionActive) {
    throw new Error('appendAudit must run inside a transaction');
  }
  const chainKey = input.organizationId ?? 'global';
  await manager.query('SELECT pg_advisory_xact_lock(hashtextextended($1, 0))', [`audit:${chainKey}`]);
  const last: { hash: string }[] = await manager.query(
    `SELECT hash FROM audit_entries WHERE organization_id IS NOT DISTINCT FROM $1 ORDER BY id DESC LIMIT 1`,
    [input.organizationId],
  );
  const entry = manager.create(AuditEntry, {
    organizationId: input.organizationId,
    occurredAt: new Date(),
    actorUserId: input.actorUserId,
    action: input.action,
    subjectType: input.subjectType,
    subjectId: input.subjectId ?? null,
    athleteId: input.athleteId ?? null,
    before: toPlainJson(input.before ?? null),
    after: toPlainJson(input.after ?? null),
    requestId: input.requestId ?? null,
  });
  entry.prevHash = last[0]?.hash ?? GENESIS_HASH;
  entry.hash = entryHash(entry.prevHash, entry);
  await manager.insert(AuditEntry, entry as never);
}

export interface ChainReport {
  organizationId: string | null;
  entries: number;
  intact: boolean;
  firstBrokenId: string | null;
  reason: string | null;
}

/** Walks one chain from its start and names the first entry whose links or contents do not match. */
export async function verifyChain(manager: EntityManager, organizationId: string | null): Promise<ChainReport> {
  const batch = 1000;
  let prev = GENESIS_HASH;
  let lastId = '0';
  let count = 0;
  for (;;) {
    const rows = await manager
      .createQueryBuilder(AuditEntry, 'a')
      .where('a.organization_id IS NOT DISTINCT FROM :org', { org: organizationId })
      .andWhere('a.id > :lastId', { lastId })
      .orderBy('a.id', 'ASC')
      .limit(batch)
      .getMany();
    for (const row of rows) {
      count += 1;
      if (row.prevHash !== prev) {
        return {
          organizationId,
          entries: count,
          intact: false,
          firstBrokenId: row.id,
          reason: 'link to the previous entry does not match',
        };
      }
      if (entryHash(row.prevHash, row) !== row.hash) {
        return { organizationId, entries: count, intact: false, firstBrokenId: row.id, reason: 'contents do not match the stored hash' };
      }
      prev = row.hash;
      lastId = row.id;
    }
    if (rows.length < batch) break;
  }
  return { organizationId, entries: count, intact: true, firstBrokenId: null, reason: null };
}

/**
 * Clinical free text never enters the trail: the entry records that it changed and its length, so
 * the trail proves what happened without becoming a second copy of the notes.
 */
export function redact<T extends Record<string, unknown>>(value: T | null, fields: readonly string[]): Record<string, unknown> | null {
  if (!value) return null;
  const out: Record<string, unknown> = { ...value };
  for (const f of fields) {
    if (typeof out[f] === 'string') out[f] = `[redacted: ${(out[f] as string).length} characters]`;
  }
  return out;
}
