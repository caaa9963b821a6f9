import type { PlanTemplateDto } from '../../../policies/dto';
import type { PlanStage } from '../../../policies/load/in-force';
import { templateStagesFromPlan } from '../../../policies/load/plan-template';
import type {
  PlanTemplateCopyInput,
  PlanTemplateCreateInput,
  PlanTemplateFromPlanInput,
  PlanTemplateUpdateInput,
} from '../../../policies/schemas';
import { authorize } from '../core/authorize';
import { orgCommand, type OrgCommandCtx } from '../core/command';
import { AppError } from '../core/errors';
import { PlanTemplate, RestrictionPlan } from '../entities';
import { planTemplateDtos, readableTemplate, templateSubject } from '../queries/plan-templates';
import { planVersions } from '../queries/plans';
import { updateVersioned } from '../services/versioned';

/**
 * Plan templates: a clinician's restriction plan kept as days from its start, for the organization's
 * clinicians to start plans from (policies/load/plan-template.ts). A template changes no athlete's
 * limits — a plan started from one is saved through the ordinary plan commands — so none of these
 * goes through the limits-changed path. Audit entries name no athlete: a template is about nobody.
 */

async function dto(ctx: OrgCommandCtx, id: string): Promise<PlanTemplateDto> {
  return (await planTemplateDtos(ctx.m, ctx.ability, [await ctx.m.findOneByOrFail(PlanTemplate, { id })]))[0];
}

async function insertTemplate(
  ctx: OrgCommandCtx,
  fields: Pick<PlanTemplate, 'name' | 'description' | 'stages' | 'guidance'>,
): Promise<PlanTemplate> {
  const organizationId = ctx.actor.organizationId;
  authorize(ctx.ability, 'create', 'PlanTemplate', { id: '', organizationId, authorId: ctx.actor.membershipId });
  return ctx.m.save(ctx.m.create(PlanTemplate, { ...fields, organizationId, authorId: ctx.actor.membershipId }));
}

/** Loads a template the actor may change; an archived one is kept for the record and changes no more. */
async function changeableTemplate(ctx: OrgCommandCtx, id: string): Promise<PlanTemplate> {
  const t = await readableTemplate(ctx.m, ctx.ability, ctx.actor.organizationId, id);
  authorize(ctx.ability, 'update', 'PlanTemplate', templateSubject(t));
  if (t.archived) throw new AppError('conflict', 'That plan template is archived and can no longer be changed.');
  return t;
}

export const createPlanTemplate = orgCommand({
  name: 'planTemplates.create',
  async run(ctx, input: PlanTemplateCreateInput): Promise<PlanTemplateDto> {
    const t = await insertTemplate(ctx, input);
    await ctx.audit({
      action: 'plan_template.created',
      subjectType: 'PlanTemplate',
      subjectId: t.id,
      after: { name: t.name, stages: t.stages, guidance: t.guidance, version: t.version },
    });
    return dto(ctx, t.id);
  },
});

/**
 * Saves a case's plan, as it stands now, as a template. The stages are read on the server and copied
 * whole (limits, exit criteria and all), so nothing the editor does not show is lost on the way.
 */
export const savePlanAsTemplate = orgCommand({
  name: 'planTemplates.from_plan',
  async run(ctx, input: PlanTemplateFromPlanInput): Promise<PlanTemplateDto> {
    const p = await ctx.m.findOne(RestrictionPlan, { where: { id: input.planId, organizationId: ctx.actor.organizationId } });
    // Only someone who may write this plan may carry it away as a template: its care team's clinicians.
    authorize(ctx.ability, 'update', 'RestrictionPlan', p);
    const [current] = await planVersions(ctx.m, p.id, p.version);
    const t = await insertTemplate(ctx, {
      name: input.name,
      description: input.description,
      stages: templateStagesFromPlan(current.stages as PlanStage[]),
      guidance: current.guidance,
    });
    await ctx.audit({
      action: 'plan_template.created',
      subjectType: 'PlanTemplate',
      subjectId: t.id,
      after: { name: t.name, fromPlanId: p.id, fromPlanVersion: p.version, stages: t.stages, guidance: t.guidance, version: t.version },
    });
    return dto(ctx, t.id);
  },
});

export const updatePlanTemplate = orgCommand({
  name: 'planTemplates.update',
  async run(ctx, input: PlanTemplateUpdateInput & { id: string }): Promise<PlanTemplateDto> {
    const t = await changeableTemplate(ctx, input.id);
    await updateVersioned(
      ctx.m,
      PlanTemplate,
      t.id,
      input.version,
      {
        name: input.name,
        description: input.description,
        stages: input.stages,
        guidance: input.guidance,
        updatedAt: () => 'now()',
      },
      'plan template',
    );
    await ctx.audit({
      action: 'plan_template.updated',
      subjectType: 'PlanTemplate',
      subjectId: t.id,
      before: { name: t.name, description: t.description, stages: t.stages, guidance: t.guidance, version: t.version },
      after: {
        name: input.name,
        description: input.description,
        stages: input.stages,
        guidance: input.guidance,
        version: input.version + 1,
      },
    });
    return dto(ctx, t.id);
  },
});

/** Anyone who may read a template copies it as their own, to change as they like. */
export const copyPlanTemplate = orgCommand({
  name: 'planTemplates.copy',
  async run(ctx, input: PlanTemplateCopyInput & { id: string }): Promise<PlanTemplateDto> {
    const from = await readableTemplate(ctx.m, ctx.ability, ctx.actor.organizationId, input.id);
    const name = input.name ?? `${from.name} (copy)`.slice(0, 120);
    const t = await insertTemplate(ctx, { name, description: from.description, stages: from.stages, guidance: from.guidance });
    await ctx.audit({
      action: 'plan_template.copied',
      subjectType: 'PlanTemplate',
      subjectId: t.id,
      after: { name, fromTemplateId: from.id, fromVersion: from.version, version: t.version },
    });
    return dto(ctx, t.id);
  },
});

export const archivePlanTemplate = orgCommand({
  name: 'planTemplates.archive',
  async run(ctx, input: { id: string; version: number }): Promise<PlanTemplateDto> {
    const t = await changeableTemplate(ctx, input.id);
    await updateVersioned(ctx.m, PlanTemplate, t.id, input.version, { archived: true, updatedAt: () => 'now()' }, 'plan template');
    await ctx.audit({
      action: 'plan_template.archived',
      subjectType: 'PlanTemplate',
      subjectId: t.id,
      before: { name: t.name },
      after: { archived: true, version: input.version + 1 },
    });
    return dto(ctx, t.id);
  },
});
