import { FlagListQuerySchema, NothingSchema, OrgItemParamsSchema, OrgParamsSchema } from '../../../../policies/schemas';
import { orgRoute, type RouteDef } from '../../http/route';
import { acknowledgeFlag } from '../../commands/flags';
import { flagsQuery } from '../../queries/flags';

export const flagRoutes: RouteDef[] = [
  orgRoute({
    method: 'get',
    path: '/orgs/:orgId/flags',
    summary: 'Red-flag reports, pain reports and pain-rule flags of my athletes, newest first',
    access: { kind: 'org', action: 'read', subject: 'Flag' },
    params: OrgParamsSchema,
    body: NothingSchema,
    query: FlagListQuerySchema,
    handler: ({ read, query }) => read(flagsQuery, query),
  }),
  orgRoute({
    method: 'post',
    path: '/orgs/:orgId/flags/:id/acknowledge',
    summary: 'Acknowledge a flag: I have seen it and am acting on it',
    access: { kind: 'org', action: 'update', subject: 'Flag' },
    query: NothingSchema,
    body: NothingSchema,
    command: acknowledgeFlag,
    params: OrgItemParamsSchema,
    handler: ({ run, params }) => run(acknowledgeFlag, { flagId: params.id }),
  }),
];
