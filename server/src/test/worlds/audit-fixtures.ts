import { randomUUID } from 'node:crypto';
import type { Role } from '../../../../policies/roles';
import { appendAudit, type AuditInput } from '../../services/audit';
import type { Harness } from '../harness';
import type { MemberRef, TestOrg } from '../factories';

/** Shared by the audit test files: each builds its own harness and passes it in. */
export interface EntryRow {
  id: string;
  organization_id: string | null;
  actor_user_id: string | null;
  action: string;
  subject_type: string;
  subject_id: string | null;
  before: unknown;
  after: unknown;
  request_id: string | null;
}

export const newRequestId = () => `test-${randomUUID()}`;

export function auditProbes(h: Harness) {
  const entriesFor = (requestId: string): Promise<EntryRow[]> =>
    h.ds.query('SELECT * FROM audit_entries WHERE request_id = $1 ORDER BY id', [requestId]);
  const orgEntryIds = async (orgId: string): Promise<string[]> =>
    (await h.ds.query('SELECT id FROM audit_entries WHERE organization_id = $1 ORDER BY id DESC', [orgId])).map((r: { id: string }) =>
      String(r.id),
    );
  /** Appends one entry in a transaction of its own, as a route would. */
  const append = (orgId: string, input: Partial<AuditInput> = {}) =>
    h.ds.transaction((m) =>
      appendAudit(m, {
        organizationId: orgId,
        actorUserId: null,
        action: 'test.entry',
        subjectType: 'Test',
        requestId: newRequestId(),
        ...input,
      }),
    );
  return { entriesFor, orgEntryIds, append };
}

/** Polls for something written after the response was sent (refusals are audited off the request path). */
export async function eventually<T>(probe: () => Promise<T | undefined>, ms = 10_000): Promise<T> {
  const until = Date.now() + ms;
  for (;;) {
    const value = await probe();
    if (value !== undefined) return value;
    if (Date.now() > until) throw new Error('timed out waiting');
    await new Promise((r) => setTimeout(r, 50));
  }
}

export const playerOf = (org: TestOrg, role: Role): MemberRef =>
  ({ athlete: org.athlete, coach: org.coach, clinician: org.clinician, guardian: org.guardian, admin: org.admin })[role];
