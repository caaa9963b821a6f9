import { z } from 'zod';
import {
  AthleteRangeQuerySchema,
  CheckInSchema,
  NextMorningSchema,
  NothingSchema,
  OrgItemParamsSchema,
  OrgParamsSchema,
  TrainingLogCreateSchema,
  UuidSchema,
  IsoDateSchema,
  wholeNumberText,
} from '../../../../policies/schemas';
import { orgRoute, type RouteDef } from '../../http/route';
import { logTraining, recordCheckIn, recordNextMorningPain } from '../../commands/training';
import { checkInsQuery, trainingLogsQuery, workloadQuery } from '../../queries/training';

const RangeQuery = AthleteRangeQuerySchema.extend({ athleteId: UuidSchema.optional() });

export const trainingRoutes: RouteDef[] = [
  orgRoute({
    method: 'post',
    path: '/orgs/:orgId/training-logs',
    summary: 'Log a session (sets, duration, session RPE, pain); the pain rule runs on it',
    access: { kind: 'org', action: 'create', subject: 'TrainingLog' },
    query: NothingSchema,
    command: logTraining,
    params: OrgParamsSchema,
    body: TrainingLogCreateSchema,
    status: 201,
    handler: ({ run, body }) => run(logTraining, body),
  }),
  orgRoute({
    method: 'get',
    path: '/orgs/:orgId/training-logs',
    summary: 'Training logs I may see (default: the last 28 days)',
    access: { kind: 'org', action: 'read', subject: 'TrainingLog' },
    params: OrgParamsSchema,
    body: NothingSchema,
    query: RangeQuery,
    handler: ({ read, query }) => read(trainingLogsQuery, query),
  }),
  orgRoute({
    method: 'post',
    path: '/orgs/:orgId/training-logs/:id/next-morning',
    summary: 'Record next-morning pain for a logged session; the pain rule runs again',
    access: { kind: 'org', action: 'update', subject: 'TrainingLog' },
    query: NothingSchema,
    command: recordNextMorningPain,
    params: OrgItemParamsSchema,
    body: NextMorningSchema,
    handler: ({ run, params, body }) => run(recordNextMorningPain, { ...body, logId: params.id }),
  }),
  orgRoute({
    method: 'post',
    path: '/orgs/:orgId/check-ins',
    summary: "Today's quick check-in (sleep, soreness, readiness, pain); a second one the same day replaces it",
    access: { kind: 'org', action: 'create', subject: 'CheckIn' },
    query: NothingSchema,
    command: recordCheckIn,
    params: OrgParamsSchema,
    body: CheckInSchema,
    handler: ({ run, body }) => run(recordCheckIn, body),
  }),
  orgRoute({
    method: 'get',
    path: '/orgs/:orgId/check-ins',
    summary: 'Check-ins I may see (default: the last 28 days)',
    access: { kind: 'org', action: 'read', subject: 'CheckIn' },
    params: OrgParamsSchema,
    body: NothingSchema,
    query: RangeQuery,
    handler: ({ read, query }) => read(checkInsQuery, query),
  }),
  orgRoute({
    method: 'get',
    path: '/orgs/:orgId/athletes/:id/workload',
    summary: 'Daily and weekly load, monotony, strain, acute:chronic (described), pain against load, e1RM',
    access: { kind: 'org', action: 'read', subject: 'TrainingLog' },
    params: OrgItemParamsSchema,
    body: NothingSchema,
    query: z.strictObject({
      to: IsoDateSchema.optional(),
      days: wholeNumberText(7, 365).default(56),
    }),
    handler: ({ read, params, query }) => read(workloadQuery, { athleteId: params.id, to: query.to, days: query.days }),
  }),
];
