import {
  NothingSchema,
  OrgItemParamsSchema,
  ReadinessRatingSchema,
  StageAdvanceSchema,
  StageAssessmentSchema,
} from '../../../../policies/schemas';
import { orgRoute, type RouteDef } from '../../http/route';
import { advanceStage, rateReadiness, recordStageAssessment } from '../../commands/stage-criteria';
import { stageCriteriaQuery } from '../../queries/stage-criteria';

export const stageCriteriaRoutes: RouteDef[] = [
  orgRoute({
    method: 'get',
    path: '/orgs/:orgId/plans/:id/stage-criteria',
    summary: 'The criteria of the stage in force today, each with its state; the care team also gets the evidence and the decisions',
    access: { kind: 'org', action: 'read', subject: 'RestrictionPlan' },
    params: OrgItemParamsSchema,
    query: NothingSchema,
    body: NothingSchema,
    handler: ({ read, params }) => read(stageCriteriaQuery, { planId: params.id }),
  }),
  orgRoute({
    method: 'post',
    path: '/orgs/:orgId/plans/:id/stage-assessments',
    summary: "Record a clinician's test or judgement for one criterion of a stage",
    access: { kind: 'org', action: 'update', subject: 'RestrictionPlan' },
    query: NothingSchema,
    command: recordStageAssessment,
    params: OrgItemParamsSchema,
    body: StageAssessmentSchema,
    status: 201,
    handler: ({ run, params, body }) => run(recordStageAssessment, { ...body, planId: params.id }),
  }),
  orgRoute({
    method: 'post',
    path: '/orgs/:orgId/plans/:id/readiness',
    summary: 'The athlete says how ready they feel to move on (0–10), today',
    access: { kind: 'org', action: 'create', subject: 'CheckIn' },
    query: NothingSchema,
    command: rateReadiness,
    params: OrgItemParamsSchema,
    body: ReadinessRatingSchema,
    status: 201,
    handler: ({ run, params, body }) => run(rateReadiness, { ...body, planId: params.id }),
  }),
  orgRoute({
    method: 'post',
    path: '/orgs/:orgId/plans/:id/advance',
    summary: 'Move to the next stage on a date, earlier or later than planned: a shared decision with who agreed (409 on a stale version)',
    access: { kind: 'org', action: 'update', subject: 'RestrictionPlan' },
    query: NothingSchema,
    command: advanceStage,
    params: OrgItemParamsSchema,
    body: StageAdvanceSchema,
    handler: ({ run, params, body }) => run(advanceStage, { ...body, planId: params.id }),
  }),
];
