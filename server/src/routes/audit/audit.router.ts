import { stringify } from 'csv-stringify/sync';
import type { AuditEntryDto } from '../../../../policies/dto';
import type { AppAbility } from '../../../../policies/access';
import { AuditQuerySchema, OrgParamsSchema, type AuditQueryInput } from '../../../../policies/schemas';
import type { DataSource } from 'typeorm';
import { orgRoute, type RouteDef } from '../../http/route';
import { accessibleWhere } from '../../core/accessible';
import { verifyChain } from '../../services/audit';

/** One query for both the screen and the CSV export: the reader's rules are part of the WHERE. */
async function findEntries(ds: DataSource, ability: AppAbility, organizationId: string, query: AuditQueryInput, limit: number) {
  const acl = accessibleWhere(ability, 'read', 'AuditEntry', { organizationId: 'a.organization_id', athleteId: 'a.athlete_id' });
  const qb = ds
    .createQueryBuilder()
    .select([
      'a.id AS id',
      'a.occurred_at AS occurred_at',
      'a.actor_user_id AS actor_user_id',
      'u.display_name AS actor_name',
      'a.action AS action',
      'a.subject_type AS subject_type',
      'a.subject_id AS subject_id',
      'a.athlete_id AS athlete_id',
      'au.display_name AS athlete_name',
      'a.before AS before',
      'a.after AS after',
      'a.request_id AS request_id',
    ])
    .from('audit_entries', 'a')
    .leftJoin('users', 'u', 'u.id = a.actor_user_id')
    .leftJoin('memberships', 'am', 'am.id = a.athlete_id')
    .leftJoin('users', 'au', 'au.id = am.user_id')
    .where('a.organization_id = :org', { org: organizationId })
    .andWhere(acl.sql, acl.params)
    .orderBy('a.id', 'DESC')
    .limit(limit);
  if (query.action) qb.andWhere(`a.action LIKE :action ESCAPE '\\'`, { action: `${query.action.replace(/[%_\\]/g, '\\$&')}%` });
  if (query.actorId) qb.andWhere('a.actor_user_id = :actorId', { actorId: query.actorId });
  if (query.subjectId) qb.andWhere('a.subject_id = :subjectId', { subjectId: query.subjectId });
  if (query.athleteId) qb.andWhere('a.athlete_id = :athleteId', { athleteId: query.athleteId });
  if (query.from) qb.andWhere('a.occurred_at >= CAST(:from AS date)', { from: query.from });
  if (query.to) qb.andWhere('a.occurred_at < CAST(:to AS date) + 1', { to: query.to });
  if (query.before) qb.andWhere('a.id < :before', { before: query.before });
  const rows = await qb.getRawMany();
  return rows.map((r): AuditEntryDto => ({
    id: String(r.id),
    occurredAt: new Date(r.occurred_at).toISOString(),
    actorUserId: r.actor_user_id,
    actorName: r.actor_name,
    action: r.action,
    subjectType: r.subject_type,
    subjectId: r.subject_id,
    athleteId: r.athlete_id,
    athleteName: r.athlete_name,
    before: r.before,
    after: r.after,
    requestId: r.request_id,
  }));
}

export const auditRoutes: RouteDef[] = [
  orgRoute({
    method: 'get',
    path: '/orgs/:orgId/audit',
    summary: 'Browse the audit trail, newest first (admins: all; clinicians: their athletes)',
    access: { kind: 'org', action: 'read', subject: 'AuditEntry' },
    params: OrgParamsSchema,
    query: AuditQuerySchema,
    async handler({ ds, ability, actor, query }) {
      const rows = await findEntries(ds, ability, actor.organizationId, query, query.limit + 1);
      const entries = rows.slice(0, query.limit);
      return { entries, nextBefore: rows.length > query.limit ? Number(entries[entries.length - 1].id) : null };
    },
  }),
  orgRoute({
    method: 'get',
    path: '/orgs/:orgId/audit/export',
    summary: 'The filtered audit trail as a CSV file (up to 50,000 entries)',
    access: { kind: 'org', action: 'read', subject: 'AuditEntry' },
    params: OrgParamsSchema,
    query: AuditQuerySchema,
    async handler({ ds, ability, actor, query, res, tx }) {
      const rows = await findEntries(ds, ability, actor.organizationId, query, 50_000);
      await tx((_m, audit) => audit({ action: 'audit.exported', subjectType: 'AuditEntry', after: { filters: query, rows: rows.length } }));
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
      res.setHeader('Content-Disposition', `attachment; filename="loadline-audit-${new Date().toISOString().slice(0, 10)}.csv"`);
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
    async handler({ ds, actor }) {
      return verifyChain(ds.manager, actor.organizationId);
    },
  }),
];
