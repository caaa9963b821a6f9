import { MembershipUpdateSchema, NothingSchema, OrgItemParamsSchema, OrgParamsSchema } from '../../../../policies/schemas';
import { orgRoute, type RouteDef } from '../../http/route';
import { changeRoles, removeMember } from '../../commands/people';
import { getPerson, listPeople } from '../../queries/people';

export const peopleRoutes: RouteDef[] = [
  orgRoute({
    method: 'get',
    path: '/orgs/:orgId/people',
    summary: 'People of the organization and their roles',
    access: { kind: 'org', action: 'read', subject: 'Membership' },
    params: OrgParamsSchema,
    query: NothingSchema,
    body: NothingSchema,
    async handler({ read }) {
      return read(listPeople, undefined);
    },
  }),
  orgRoute({
    method: 'get',
    path: '/orgs/:orgId/people/:id',
    summary: 'One person',
    access: { kind: 'org', action: 'read', subject: 'Membership' },
    params: OrgItemParamsSchema,
    query: NothingSchema,
    body: NothingSchema,
    async handler({ read, params }) {
      return read(getPerson, { id: params.id });
    },
  }),
  orgRoute({
    method: 'patch',
    path: '/orgs/:orgId/people/:id',
    summary: "Change a person's roles",
    access: { kind: 'org', action: 'update', subject: 'Membership' },
    params: OrgItemParamsSchema,
    query: NothingSchema,
    body: MembershipUpdateSchema,
    command: changeRoles,
    async handler({ req, params, body, run }) {
      // The person's other sessions end; the caller's own session (changing their own roles) stays.
      return run(changeRoles, { ...body, id: params.id, keepSessionId: req.sessionID ?? null });
    },
  }),
  orgRoute({
    method: 'delete',
    path: '/orgs/:orgId/people/:id',
    summary: 'Remove a person from the organization (their records stay)',
    access: { kind: 'org', action: 'delete', subject: 'Membership' },
    params: OrgItemParamsSchema,
    query: NothingSchema,
    body: NothingSchema,
    command: removeMember,
    async handler({ params, run }) {
      await run(removeMember, { id: params.id });
      return undefined;
    },
  }),
];
