import type { DataSource, EntityManager } from 'typeorm';
import { appendAudit, type AuditInput } from '../services/audit';

/** Writes an audit entry in the surrounding transaction; actor, organization and request id are filled in. */
export type AuditFn = (entry: Omit<AuditInput, 'requestId' | 'actorUserId' | 'organizationId'> & Partial<AuditInput>) => Promise<void>;
export type TxFn = <T>(work: (m: EntityManager, audit: AuditFn) => Promise<T>) => Promise<T>;

/** The audit function of one transaction: entries commit or roll back with the change (OWASP A09:2025). */
export function auditFor(m: EntityManager, requestId: string, actorUserId: string | null, organizationId: string | null): AuditFn {
  return (entry) => appendAudit(m, { organizationId, actorUserId, requestId, ...entry });
}

/** Runs `work` in one transaction with an audit function bound to it. */
export function makeTx(ds: DataSource, requestId: string, actorUserId: string | null, organizationId: string | null): TxFn {
  return (work) => ds.transaction((m) => work(m, auditFor(m, requestId, actorUserId, organizationId)));
}
