import { z } from 'zod';
import {
  CaseCloseSchema,
  CaseCreateSchema,
  CaseItemParamsSchema,
  CaseUpdateSchema,
  NothingSchema,
  OrgParamsSchema,
  StatusChangeSchema,
  UuidSchema,
} from '../../../../policies/schemas';
import { orgRoute, type RouteDef } from '../../http/route';
import { changeStatus, closeCase, openCase, updateCase, viewCase } from '../../commands/cases';
import { caseloadQuery, casesQuery } from '../../queries/cases';

const CaseListQuerySchema = z.strictObject({
  athleteId: UuidSchema.optional(),
  state: z.enum(['open', 'closed', 'all'], { message: 'must be open, closed or all' }).default('all'),
});

export const caseRoutes: RouteDef[] = [
  orgRoute({
    method: 'get',
    path: '/orgs/:orgId/caseload',
    summary: 'Athletes I may see with status, open cases and next review date',
    access: { kind: 'org', action: 'read', subject: 'Athlete' },
    params: OrgParamsSchema,
    query: NothingSchema,
    body: NothingSchema,
    handler: ({ read }) => read(caseloadQuery, undefined),
  }),
  orgRoute({
    method: 'get',
    path: '/orgs/:orgId/cases',
    summary: 'Cases I may see, with the fields my role may read',
    access: { kind: 'org', action: 'read', subject: 'Case' },
    params: OrgParamsSchema,
    body: NothingSchema,
    query: CaseListQuerySchema,
    handler: ({ read, query }) => read(casesQuery, query),
  }),
  orgRoute({
    method: 'post',
    path: '/orgs/:orgId/cases',
    summary: 'Open a case for an athlete on my care team, with its first participation status',
    access: { kind: 'org', action: 'create', subject: 'Case' },
    query: NothingSchema,
    command: openCase,
    params: OrgParamsSchema,
    body: CaseCreateSchema,
    status: 201,
    handler: ({ run, body }) => run(openCase, body),
  }),
  orgRoute({
    method: 'get',
    path: '/orgs/:orgId/cases/:id',
    summary: 'One case with its status history; clinical notes for clinicians (the read is audited)',
    access: { kind: 'org', action: 'read', subject: 'Case' },
    query: NothingSchema,
    body: NothingSchema,
    command: viewCase,
    params: CaseItemParamsSchema,
    handler: ({ run, params }) => run(viewCase, { caseId: params.id }),
  }),
  orgRoute({
    method: 'patch',
    path: '/orgs/:orgId/cases/:id',
    summary: "Edit a case's regions, onset, diagnosis, notes or review date",
    access: { kind: 'org', action: 'update', subject: 'Case' },
    query: NothingSchema,
    command: updateCase,
    params: CaseItemParamsSchema,
    body: CaseUpdateSchema,
    handler: ({ run, params, body }) => run(updateCase, { ...body, caseId: params.id }),
  }),
  orgRoute({
    method: 'post',
    path: '/orgs/:orgId/cases/:id/status',
    summary: 'Set the participation status (Out, Limited, Full) from a date',
    access: { kind: 'org', action: 'create', subject: 'ParticipationStatus' },
    query: NothingSchema,
    command: changeStatus,
    params: CaseItemParamsSchema,
    body: StatusChangeSchema,
    status: 201,
    handler: ({ run, params, body }) => run(changeStatus, { ...body, caseId: params.id }),
  }),
  orgRoute({
    method: 'post',
    path: '/orgs/:orgId/cases/:id/close',
    summary: 'Close a resolved case; its plan stops being in force',
    access: { kind: 'org', action: 'update', subject: 'Case' },
    query: NothingSchema,
    command: closeCase,
    params: CaseItemParamsSchema,
    body: CaseCloseSchema,
    handler: ({ run, params, body }) => run(closeCase, { ...body, caseId: params.id }),
  }),
];
