import { stringify } from 'csv-stringify/sync';
import { AuditQuerySchema, NothingSchema, OrgParamsSchema } from '../../../../policies/schemas';
import { orgToday } from '../../../../policies/today';
import { orgRoute, type RouteDef } from '../../http/route';
import { exportAudit } from '../../commands/audit';
import { listAuditEntries, verifyAuditChain } from '../../queries/audit';

export const auditRoutes: RouteDef[] = [
  orgRoute({
    method: 'get',
    path: '/orgs/:orgId/audit',
    summary: 'Browse the audit trail, newest first (admins: all; clinicians: their athletes)',
    access: { kind: 'org', action: 'read', subject: 'AuditEntry' },
    params: OrgParamsSchema,
    body: NothingSchema,
    query: AuditQuerySchema,
    async handler({ read, query }) {
      return read(listAuditEntries, query);
    },
  }),
  orgRoute({
    method: 'get',
    path: '/orgs/:orgId/audit/export',
    summary: 'The filtered audit trail as a CSV file (up to 50,000 entries)',
    access: { kind: 'org', action: 'read', subject: 'AuditEntry' },
    params: OrgParamsSchema,
    body: NothingSchema,
    query: AuditQuerySchema,
    command: exportAudit,
    async handler({ run, query, res, actor }) {
      const rows = await run(exportAudit, query);
      const csv = stringify(
        rows.map((e) => [
          e.id,
          e.occurredAt,
          e.actorName ?? '',
          e.actorUserId ?? '',
          e.action,
          e.subjectType,
          e.subjectId ?? '',
          e.athleteName ?? '',
          JSON.stringify(e.before ?? null),
          JSON.stringify(e.after ?? null),
          e.requestId ?? '',
        ]),
        {
          header: true,
          escape_formulas: true,
          columns: [
            'id',
            'occurred_at_utc',
            'actor',
            'actor_id',
            'action',
            'subject_type',
            'subject_id',
            'athlete',
            'before',
            'after',
            'request_id',
          ],
        },
      );
      res.setHeader('Content-Type', 'text/csv; charset=utf-8');
      res.setHeader('Content-Disposition', `attachment; filename="loadline-audit-${orgToday(actor.timeZone)}.csv"`);
      res.status(200).send(csv);
      return csv;
    },
  }),
  orgRoute({
    method: 'get',
    path: '/orgs/:orgId/audit/verify',
    summary: "Check the organization's audit chain end to end (admins)",
    access: { kind: 'org', action: 'read', subject: 'AuditChain' },
    params: OrgParamsSchema,
    query: NothingSchema,
    body: NothingSchema,
    async handler({ read }) {
      return read(verifyAuditChain, undefined);
    },
  }),
];
