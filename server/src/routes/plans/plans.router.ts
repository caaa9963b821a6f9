import {
  CaseItemParamsSchema,
  InForceQuerySchema,
  NothingSchema,
  OrgItemParamsSchema,
  PlanCreateSchema,
  PlanUpdateSchema,
  PlanVersionParamsSchema,
} from '../../../../policies/schemas';
import { orgRoute, type RouteDef } from '../../http/route';
import { createPlan, revisePlan } from '../../commands/plans';
import { inForceQuery, planHistoryQuery, planQuery } from '../../queries/plans';

export const planRoutes: RouteDef[] = [
  orgRoute({
    method: 'post',
    path: '/orgs/:orgId/cases/:id/plan',
    summary: 'Write the restriction plan of a case (version 1)',
    access: { kind: 'org', action: 'create', subject: 'RestrictionPlan' },
    query: NothingSchema,
    command: createPlan,
    params: CaseItemParamsSchema,
    body: PlanCreateSchema,
    status: 201,
    handler: ({ run, params, body }) => run(createPlan, { ...body, caseId: params.id }),
  }),
  orgRoute({
    method: 'get',
    path: '/orgs/:orgId/plans/:id',
    summary: 'A restriction plan as it stands now',
    access: { kind: 'org', action: 'read', subject: 'RestrictionPlan' },
    params: OrgItemParamsSchema,
    query: NothingSchema,
    body: NothingSchema,
    handler: ({ read, params }) => read(planQuery, { planId: params.id }),
  }),
  orgRoute({
    method: 'put',
    path: '/orgs/:orgId/plans/:id',
    summary: 'Save a new version of a plan (409 if someone saved since you opened it)',
    access: { kind: 'org', action: 'update', subject: 'RestrictionPlan' },
    query: NothingSchema,
    command: revisePlan,
    params: OrgItemParamsSchema,
    body: PlanUpdateSchema,
    handler: ({ run, params, body }) => run(revisePlan, { ...body, planId: params.id }),
  }),
  orgRoute({
    method: 'get',
    path: '/orgs/:orgId/plans/:id/versions',
    summary: 'Every saved version of a plan, newest first, with who saved it (care team only)',
    access: { kind: 'org', action: 'read', subject: 'RestrictionPlan' },
    params: OrgItemParamsSchema,
    query: NothingSchema,
    body: NothingSchema,
    handler: ({ read, params }) => read(planHistoryQuery, { planId: params.id }),
  }),
  orgRoute({
    method: 'get',
    path: '/orgs/:orgId/plans/:id/versions/:version',
    summary: 'One earlier version of a plan',
    access: { kind: 'org', action: 'read', subject: 'RestrictionPlan' },
    params: PlanVersionParamsSchema,
    query: NothingSchema,
    body: NothingSchema,
    async handler({ read, params }) {
      const [v] = await read(planHistoryQuery, { planId: params.id, version: params.version });
      return v;
    },
  }),
  orgRoute({
    method: 'get',
    path: '/orgs/:orgId/athletes/:id/in-force',
    summary: 'What is in force for an athlete on a date (default today): status, stage and caps per pattern',
    access: { kind: 'org', action: 'read', subject: 'RestrictionPlan' },
    params: OrgItemParamsSchema,
    body: NothingSchema,
    query: InForceQuerySchema,
    handler: ({ read, params, query }) => read(inForceQuery, { athleteId: params.id, date: query.date }),
  }),
];
