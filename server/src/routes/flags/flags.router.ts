import type { FlagDto } from '../../../../policies/dto';
import { FlagListQuerySchema, OrgItemParamsSchema, OrgParamsSchema } from '../../../../policies/schemas';
import { Flag } from '../../entities';
import { accessibleWhere } from '../../core/accessible';
import { authorize } from '../../core/authorize';
import { orgRoute, type RouteDef } from '../../http/route';

export const flagRoutes: RouteDef[] = [
  orgRoute({
    method: 'get',
    path: '/orgs/:orgId/flags',
    summary: 'Red-flag reports, pain reports and pain-rule flags of my athletes, newest first',
    access: { kind: 'org', action: 'read', subject: 'Flag' },
    params: OrgParamsSchema,
    query: FlagListQuerySchema,
    async handler({ ds, ability, actor, query }) {
      const acl = accessibleWhere(ability, 'read', 'Flag', { organizationId: 'f.organization_id', athleteId: 'f.athlete_id', id: 'f.id' });
      const qb = ds
        .createQueryBuilder()
        .select([
          'f.id AS id',
          'f.athlete_id AS "athleteId"',
          'au.display_name AS "athleteName"',
          'f.kind AS kind',
          'f.severity AS severity',
          'f.message AS message',
          'f.suggested_action AS "suggestedAction"',
          'f.created_at AS "createdAt"',
          'f.acknowledged_at AS "acknowledgedAt"',
          'ku.display_name AS "acknowledgedByName"',
        ])
        .from('flags', 'f')
        .innerJoin('memberships', 'am', 'am.id = f.athlete_id')
        .innerJoin('users', 'au', 'au.id = am.user_id')
        .leftJoin('users', 'ku', 'ku.id = f.acknowledged_by')
        .where('f.organization_id = :org', { org: actor.organizationId })
        .andWhere(acl.sql, acl.params)
        .orderBy('f.created_at', 'DESC')
        .limit(300);
      if (query.athleteId) qb.andWhere('f.athlete_id = :a', { a: query.athleteId });
      if (query.state === 'open') qb.andWhere('f.acknowledged_at IS NULL');
      if (query.state === 'acknowledged') qb.andWhere('f.acknowledged_at IS NOT NULL');
      const rows = await qb.getRawMany();
      return rows.map((r): FlagDto => ({
        ...r,
        createdAt: new Date(r.createdAt).toISOString(),
        acknowledgedAt: r.acknowledgedAt ? new Date(r.acknowledgedAt).toISOString() : null,
      }));
    },
  }),
  orgRoute({
    method: 'post',
    path: '/orgs/:orgId/flags/:id/acknowledge',
    summary: 'Acknowledge a flag: I have seen it and am acting on it',
    access: { kind: 'org', action: 'update', subject: 'Flag' },
    params: OrgItemParamsSchema,
    async handler({ ability, actor, user, params, tx }) {
      await tx(async (m, audit) => {
        const flag = await m.findOne(Flag, { where: { id: params.id, organizationId: actor.organizationId } });
        authorize(ability, 'update', 'Flag', flag);
        if (flag.acknowledgedAt) return;
        await m.update(Flag, { id: flag.id }, { acknowledgedAt: new Date(), acknowledgedBy: user.id });
        await audit({
          action: 'flag.acknowledged',
          subjectType: 'Flag',
          subjectId: flag.id,
          athleteId: flag.athleteId,
          after: { kind: flag.kind },
        });
      });
      return undefined;
    },
  }),
];
