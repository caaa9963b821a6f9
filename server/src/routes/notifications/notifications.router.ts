import { NothingSchema, OrgItemParamsSchema, OrgParamsSchema } from '../../../../policies/schemas';
import { orgRoute, type RouteDef } from '../../http/route';
import { markAllNoticesRead, markNoticeRead } from '../../commands/notifications';
import { myNoticesQuery } from '../../queries/notifications';

export const notificationRoutes: RouteDef[] = [
  orgRoute({
    method: 'get',
    path: '/orgs/:orgId/notifications',
    summary: 'My notices, newest first',
    access: { kind: 'org', action: 'read', subject: 'Notification' },
    params: OrgParamsSchema,
    query: NothingSchema,
    body: NothingSchema,
    handler: ({ read }) => read(myNoticesQuery, undefined),
  }),
  orgRoute({
    method: 'post',
    path: '/orgs/:orgId/notifications/:id/read',
    summary: 'Mark one of my notices read',
    access: { kind: 'org', action: 'update', subject: 'Notification' },
    query: NothingSchema,
    body: NothingSchema,
    command: markNoticeRead,
    params: OrgItemParamsSchema,
    handler: ({ run, params }) => run(markNoticeRead, { noticeId: params.id }),
  }),
  orgRoute({
    method: 'post',
    path: '/orgs/:orgId/notifications/read-all',
    summary: 'Mark all my notices read',
    access: { kind: 'org', action: 'update', subject: 'Notification' },
    query: NothingSchema,
    body: NothingSchema,
    command: markAllNoticesRead,
    params: OrgParamsSchema,
    handler: ({ run }) => run(markAllNoticesRead, undefined),
  }),
];
