import type { PlanDto } from '../../../policies/dto';
import type { PlanCreateInput, PlanUpdateInput } from '../../../policies/schemas';
import { CaseRecord, RestrictionPlan, RestrictionPlanVersion } from '../entities';
import { authorize } from '../core/authorize';
import { orgCommand } from '../core/command';
import { AppError, versionConflict } from '../core/errors';
import { planDto, planVersions } from '../queries/plans';
import { readableTemplate } from '../queries/plan-templates';
import { tellPlanVersion } from '../services/change-notices';
import { isUniqueViolation } from '../services/org-members';

/** The clinician writes the restriction plan of an open case (version 1); the athlete's sessions are checked against it. */
export const createPlan = orgCommand({
  name: 'createPlan',
  changesLimits: true,
  async run(ctx, input: PlanCreateInput & { caseId: string }): Promise<PlanDto> {
    const { m, ability } = ctx;
    const c = await m.findOne(CaseRecord, { where: { id: input.caseId, organizationId: ctx.actor.organizationId } });
    authorize(ability, 'read', 'Case', c);
    authorize(ability, 'create', 'RestrictionPlan', { id: '', organizationId: c.organizationId, athleteId: c.athleteId });
    if (c.closedOn) throw new AppError('conflict', 'This case is closed; open a new case to write a new plan.');
    // A template the writer may read (404 otherwise), named in the audit entry with the version they started from.
    const template = input.fromTemplate ? await readableTemplate(m, ability, ctx.actor.organizationId, input.fromTemplate.id) : null;
    let saved: RestrictionPlan;
    try {
      saved = await m.save(
        m.create(RestrictionPlan, { organizationId: c.organizationId, athleteId: c.athleteId, caseId: c.id, version: 1 }),
      );
    } catch (err) {
      if (isUniqueViolation(err))
        throw new AppError('conflict', 'This case already has a plan: edit it instead (every save keeps the earlier version).');
      throw err;
    }
    await m.save(
      m.create(RestrictionPlanVersion, {
        planId: saved.id,
        version: 1,
        stages: input.stages,
        guidance: input.guidance,
        changeNote: input.changeNote ?? null,
        createdBy: ctx.userId,
      }),
    );
    await ctx.audit({
      action: 'plan.created',
      subjectType: 'RestrictionPlan',
      subjectId: saved.id,
      athleteId: c.athleteId,
      after: {
        version: 1,
        stages: input.stages,
        guidance: input.guidance,
        ...(template && input.fromTemplate
          ? { fromTemplate: { id: template.id, version: input.fromTemplate.version, name: template.name } }
          : {}),
      },
    });
    await ctx.limitsChanged({ athleteIds: [c.athleteId], reason: 'The clinician wrote a restriction plan.' });
    await tellPlanVersion(ctx, c.athleteId, 1, input);
    return planDto(m, ability, saved);
  },
});

/** A new version of a plan, against the version its editor saw (409 otherwise); earlier versions stay. */
export const revisePlan = orgCommand({
  name: 'revisePlan',
  changesLimits: true,
  async run(ctx, input: PlanUpdateInput & { planId: string }): Promise<PlanDto> {
    const { m, ability } = ctx;
    const p = await m.findOne(RestrictionPlan, { where: { id: input.planId, organizationId: ctx.actor.organizationId } });
    authorize(ability, 'update', 'RestrictionPlan', p);
    const c = await m.findOneByOrFail(CaseRecord, { id: p.caseId });
    if (c.closedOn) throw new AppError('conflict', 'This case is closed; its plan can no longer change.');
    const next = input.version + 1;
    const result = await m
      .createQueryBuilder()
      .update(RestrictionPlan)
      .set({ version: next, updatedAt: () => 'now()' } as never)
      .where('id = :id AND version = :v', { id: p.id, v: input.version })
      .execute();
    if (result.affected !== 1) throw versionConflict('plan');
    const [before] = await planVersions(m, p.id, input.version);
    await m.save(
      m.create(RestrictionPlanVersion, {
        planId: p.id,
        version: next,
        stages: input.stages,
        guidance: input.guidance,
        changeNote: input.changeNote ?? null,
        createdBy: ctx.userId,
      }),
    );
    await ctx.audit({
      action: 'plan.revised',
      subjectType: 'RestrictionPlan',
      subjectId: p.id,
      athleteId: p.athleteId,
      before: { version: input.version, stages: before.stages, guidance: before.guidance },
      after: { version: next, stages: input.stages, guidance: input.guidance, changeNote: input.changeNote ?? null },
    });
    await ctx.limitsChanged({ athleteIds: [p.athleteId], reason: 'The clinician changed the restriction plan.' });
    await tellPlanVersion(ctx, p.athleteId, next, input);
    return planDto(m, ability, { ...p, version: next });
  },
});
