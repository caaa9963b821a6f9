import { GuardianLinkCreateSchema, NothingSchema, OrgItemParamsSchema, OrgParamsSchema } from '../../../../policies/schemas';
import { orgRoute, type RouteDef } from '../../http/route';
import { linkGuardian, unlinkGuardian } from '../../commands/athlete-links';

/** Guardian links; care-team links are the same kind of write (commands/athlete-links.ts). */
export const guardianLinkRoutes: RouteDef[] = [
  orgRoute({
    method: 'post',
    path: '/orgs/:orgId/guardian-links',
    summary: 'Link a guardian to an athlete',
    access: { kind: 'org', action: 'create', subject: 'GuardianLink' },
    params: OrgParamsSchema,
    query: NothingSchema,
    body: GuardianLinkCreateSchema,
    status: 201,
    command: linkGuardian,
    async handler({ body, run }) {
      return run(linkGuardian, body);
    },
  }),
  orgRoute({
    method: 'delete',
    path: '/orgs/:orgId/guardian-links/:id',
    summary: 'Unlink a guardian from an athlete',
    access: { kind: 'org', action: 'delete', subject: 'GuardianLink' },
    params: OrgItemParamsSchema,
    query: NothingSchema,
    body: NothingSchema,
    command: unlinkGuardian,
    async handler({ params, run }) {
      await run(unlinkGuardian, { id: params.id });
      return undefined;
    },
  }),
];
