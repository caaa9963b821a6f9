import { NothingSchema, OrgItemParamsSchema, OrgParamsSchema } from '../../../../policies/schemas';
import {
  PlanTemplateArchiveSchema,
  PlanTemplateCopySchema,
  PlanTemplateCreateSchema,
  PlanTemplateFromPlanSchema,
  PlanTemplateUpdateSchema,
} from '../../../../policies/schemas/plan-templates';
import {
  archivePlanTemplate,
  copyPlanTemplate,
  createPlanTemplate,
  savePlanAsTemplate,
  updatePlanTemplate,
} from '../../commands/plan-templates';
import { orgRoute, type RouteDef } from '../../http/route';
import { listPlanTemplates, planTemplateQuery } from '../../queries/plan-templates';

/**
 * Plan templates, the clinicians' shared protocols (policies/access/plan-template.ts): every clinician
 * reads, writes and copies them; the author or an admin changes and archives one. A plan started
 * from a template is dated on the client (policies/load/plan-template.ts) and saved as any plan is.
 */
const read = { kind: 'org', action: 'read', subject: 'PlanTemplate' } as const;
const create = { kind: 'org', action: 'create', subject: 'PlanTemplate' } as const;
const update = { kind: 'org', action: 'update', subject: 'PlanTemplate' } as const;

export const planTemplateRoutes: RouteDef[] = [
  orgRoute({
    method: 'get',
    path: '/orgs/:orgId/plan-templates',
    summary: "The organization's plan templates in use, by name (without their stages)",
    access: read,
    params: OrgParamsSchema,
    query: NothingSchema,
    body: NothingSchema,
    handler: ({ read: r }) => r(listPlanTemplates, undefined),
  }),
  orgRoute({
    method: 'post',
    path: '/orgs/:orgId/plan-templates',
    summary: 'Write a plan template (stages in days from the plan start)',
    access: create,
    command: createPlanTemplate,
    params: OrgParamsSchema,
    query: NothingSchema,
    body: PlanTemplateCreateSchema,
    status: 201,
    handler: ({ run, body }) => run(createPlanTemplate, body),
  }),
  orgRoute({
    method: 'post',
    path: '/orgs/:orgId/plan-templates/from-plan',
    summary: "Save a case's plan, as it stands, as a plan template (its care team's clinicians)",
    access: create,
    command: savePlanAsTemplate,
    params: OrgParamsSchema,
    query: NothingSchema,
    body: PlanTemplateFromPlanSchema,
    status: 201,
    handler: ({ run, body }) => run(savePlanAsTemplate, body),
  }),
  orgRoute({
    method: 'get',
    path: '/orgs/:orgId/plan-templates/:id',
    summary: 'A plan template with its stages',
    access: read,
    params: OrgItemParamsSchema,
    query: NothingSchema,
    body: NothingSchema,
    handler: ({ read: r, params }) => r(planTemplateQuery, { id: params.id }),
  }),
  orgRoute({
    method: 'put',
    path: '/orgs/:orgId/plan-templates/:id',
    summary: 'Change a plan template (its author or an admin; 409 if someone saved since you opened it)',
    access: update,
    command: updatePlanTemplate,
    params: OrgItemParamsSchema,
    query: NothingSchema,
    body: PlanTemplateUpdateSchema,
    handler: ({ run, params, body }) => run(updatePlanTemplate, { ...body, id: params.id }),
  }),
  orgRoute({
    method: 'post',
    path: '/orgs/:orgId/plan-templates/:id/copy',
    summary: 'Copy a plan template as my own',
    access: create,
    command: copyPlanTemplate,
    params: OrgItemParamsSchema,
    query: NothingSchema,
    body: PlanTemplateCopySchema,
    status: 201,
    handler: ({ run, params, body }) => run(copyPlanTemplate, { ...body, id: params.id }),
  }),
  orgRoute({
    method: 'post',
    path: '/orgs/:orgId/plan-templates/:id/archive',
    summary: 'Archive a plan template (its author or an admin): it leaves the list, kept for the record',
    access: update,
    command: archivePlanTemplate,
    params: OrgItemParamsSchema,
    query: NothingSchema,
    body: PlanTemplateArchiveSchema,
    handler: ({ run, params, body }) => run(archivePlanTemplate, { ...body, id: params.id }),
  }),
];
