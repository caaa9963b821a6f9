import type { AuditEntryDto } from '../../../../policies/dto';
import { AuditQuerySchema, OrgParamsSchema } from '../../../../policies/schemas';
import { orgRoute, type RouteDef } from '../../http/route';
import { accessibleWhere } from '../../http/accessible';
import { verifyChain } from '../../services/audit';

export const auditRoutes: RouteDef[] = [
  orgRoute({
    method: 'get',
    path: '/orgs/:orgId/audit',
    summary: 'Browse the audit trail, newest first',
    access: { kind: 'org', action: 'read', subject: 'AuditEntry' },
    params: OrgParamsSchema,
    query: AuditQuerySchema,
    async handler({ ds, ability, actor, query }) {
      const acl = accessibleWhere(ability, 'read', 'AuditEntry', { organizationId: 'a.organization_id' });
      const qb = ds
        .createQueryBuilder()
        .select(['a.id AS id', 'a.occurred_at AS occurred_at', 'a.actor_user_id AS actor_user_id', 'u.display_name AS actor_name',
          'a.action AS action', 'a.subject_type AS subject_type', 'a.subject_id AS subject_id', 'a.before AS before',
          'a.after AS after', 'a.request_id AS request_id'])
        .from('audit_entries', 'a')
        .leftJoin('users', 'u', 'u.id = a.actor_user_id')
        .where('a.organization_id = :org', { org: actor.organizationId })
        .andWhere(acl.sql, acl.params)
        .orderBy('a.id', 'DESC')
        .limit(query.limit + 1);
      if (query.action) qb.andWhere('a.action LIKE :action', { action: `${query.action.replace(/[%_\\]/g, '\\$&')}%` });
      if (query.actorId) qb.andWhere('a.actor_user_id = :actorId', { actorId: query.actorId });
      if (query.subjectId) qb.andWhere('a.subject_id = :subjectId', { subjectId: query.subjectId });
      if (query.from) qb.andWhere('a.occurred_at >= CAST(:from AS date)', { from: query.from });
      if (query.to) qb.andWhere('a.occurred_at < CAST(:to AS date) + 1', { to: query.to });
      if (query.before) qb.andWhere('a.id < :before', { before: query.before });
      const rows = await qb.getRawMany();
      const more = rows.length > query.limit;
      const entries: AuditEntryDto[] = rows.slice(0, query.limit).map((r) => ({
        id: String(r.id),
        occurredAt: new Date(r.occurred_at).toISOString(),
        actorUserId: r.actor_user_id,
        actorName: r.actor_name,
        action: r.action,
        subjectType: r.subject_type,
        subjectId: r.subject_id,
        before: r.before,
        after: r.after,
        requestId: r.request_id,
      }));
      return { entries, nextBefore: more ? Number(entries[entries.length - 1].id) : null };
    },
  }),
  orgRoute({
    method: 'get',
    path: '/orgs/:orgId/audit/verify',
    summary: "Check the organization's audit chain end to end",
    access: { kind: 'org', action: 'read', subject: 'AuditEntry' },
    params: OrgParamsSchema,
    async handler({ ds, actor }) {
      return verifyChain(ds.manager, actor.organizationId);
    },
  }),
];
