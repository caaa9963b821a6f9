import { IsNull } from 'typeorm';
import type { NotificationDto } from '../../../../policies/dto';
import { OrgItemParamsSchema, OrgParamsSchema } from '../../../../policies/schemas';
import { Notification } from '../../entities';
import { authorize } from '../../core/authorize';
import { orgRoute, type RouteDef } from '../../http/route';

const toDto = (n: Notification): NotificationDto => ({
  id: n.id,
  athleteId: n.athleteId,
  kind: n.kind,
  severity: n.severity,
  title: n.title,
  body: n.body,
  createdAt: n.createdAt.toISOString(),
  readAt: n.readAt ? n.readAt.toISOString() : null,
});

export const notificationRoutes: RouteDef[] = [
  orgRoute({
    method: 'get',
    path: '/orgs/:orgId/notifications',
    summary: 'My notices, newest first',
    access: { kind: 'org', action: 'read', subject: 'Notification' },
    params: OrgParamsSchema,
    async handler({ ds, actor }) {
      const rows = await ds
        .getRepository(Notification)
        .find({
          where: { organizationId: actor.organizationId, recipientId: actor.membershipId },
          order: { createdAt: 'DESC' },
          take: 100,
        });
      return rows.map(toDto);
    },
  }),
  orgRoute({
    method: 'post',
    path: '/orgs/:orgId/notifications/:id/read',
    summary: 'Mark one of my notices read',
    access: { kind: 'org', action: 'update', subject: 'Notification' },
    params: OrgItemParamsSchema,
    async handler({ ds, ability, actor, params }) {
      const n = await ds.getRepository(Notification).findOne({ where: { id: params.id, organizationId: actor.organizationId } });
      authorize(ability, 'update', 'Notification', n);
      if (!n.readAt) await ds.getRepository(Notification).update({ id: n.id }, { readAt: new Date() });
      return undefined;
    },
  }),
  orgRoute({
    method: 'post',
    path: '/orgs/:orgId/notifications/read-all',
    summary: 'Mark all my notices read',
    access: { kind: 'org', action: 'update', subject: 'Notification' },
    params: OrgParamsSchema,
    async handler({ ds, actor }) {
      await ds
        .getRepository(Notification)
        .update({ organizationId: actor.organizationId, recipientId: actor.membershipId, readAt: IsNull() }, { readAt: new Date() });
      return undefined;
    },
  }),
];
