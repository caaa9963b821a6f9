import { CareTeamAssignmentCreateSchema, NothingSchema, OrgItemParamsSchema, OrgParamsSchema } from '../../../../policies/schemas';
import { orgRoute, type RouteDef } from '../../http/route';
import { assignCareTeam, unassignCareTeam } from '../../commands/athlete-links';

/** Care-team links; guardian links are the same kind of write (commands/athlete-links.ts). */
export const careTeamRoutes: RouteDef[] = [
  orgRoute({
    method: 'post',
    path: '/orgs/:orgId/care-team',
    summary: "Put a coach or clinician on an athlete's care team",
    access: { kind: 'org', action: 'create', subject: 'CareTeamAssignment' },
    params: OrgParamsSchema,
    query: NothingSchema,
    body: CareTeamAssignmentCreateSchema,
    status: 201,
    command: assignCareTeam,
    async handler({ body, run }) {
      return run(assignCareTeam, body);
    },
  }),
  orgRoute({
    method: 'delete',
    path: '/orgs/:orgId/care-team/:id',
    summary: 'Take a coach or clinician off a care team (their access ends at once)',
    access: { kind: 'org', action: 'delete', subject: 'CareTeamAssignment' },
    params: OrgItemParamsSchema,
    query: NothingSchema,
    body: NothingSchema,
    command: unassignCareTeam,
    async handler({ params, run }) {
      await run(unassignCareTeam, { id: params.id });
      return undefined;
    },
  }),
];
