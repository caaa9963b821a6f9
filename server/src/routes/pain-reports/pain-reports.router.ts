import { z } from 'zod';
import { NothingSchema, OrgItemParamsSchema, OrgParamsSchema, PainReportCreateSchema, UuidSchema } from '../../../../policies/schemas';
import { orgRoute, type RouteDef } from '../../http/route';
import { reportPain } from '../../commands/pain-reports';
import { viewPainReport, viewPainReports } from '../../commands/pain-report-reads';

export const painReportRoutes: RouteDef[] = [
  orgRoute({
    method: 'post',
    path: '/orgs/:orgId/pain-reports',
    summary: 'Report pain with the red-flag screen; emergencies set Out and alert the care team at once',
    access: { kind: 'org', action: 'create', subject: 'PainReport' },
    query: NothingSchema,
    command: reportPain,
    params: OrgParamsSchema,
    body: PainReportCreateSchema,
    status: 201,
    handler: ({ run, body }) => run(reportPain, body),
  }),
  orgRoute({
    method: 'get',
    path: '/orgs/:orgId/pain-reports',
    summary: 'Pain reports I may see, newest first (coaches without the narrative or answers)',
    access: { kind: 'org', action: 'read', subject: 'PainReport' },
    command: viewPainReports,
    params: OrgParamsSchema,
    body: NothingSchema,
    query: z.strictObject({ athleteId: UuidSchema.optional() }),
    handler: ({ run, query }) => run(viewPainReports, { athleteId: query.athleteId }),
  }),
  orgRoute({
    method: 'get',
    path: '/orgs/:orgId/pain-reports/:id',
    summary: 'One pain report and who was told (coaches without the narrative or answers); 404 outside the care team',
    access: { kind: 'org', action: 'read', subject: 'PainReport' },
    command: viewPainReport,
    params: OrgItemParamsSchema,
    query: NothingSchema,
    body: NothingSchema,
    handler: ({ run, params }) => run(viewPainReport, { id: params.id }),
  }),
];
