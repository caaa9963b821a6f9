import type { StageCriteriaDto } from '../../../policies/dto';
import type { ReadinessRatingInput, StageAdvanceInput, StageAssessmentInput } from '../../../policies/schemas';
import { moveToNextStage } from '../../../policies/load/stage-criteria';
import { humanDate } from '../../../policies/words/dates';
import { CaseRecord, RestrictionPlan, StageCriterionReading, StageDecision } from '../entities';
import { authorize } from '../core/authorize';
import { orgCommand, type OrgCommandCtx } from '../core/command';
import { AppError, versionConflict } from '../core/errors';
import { planVersions } from '../queries/plans';
import { stageCriteriaQuery } from '../queries/stage-criteria';
import { evaluateStage } from '../services/stage-criteria';
import { revisePlan } from './plans';
import { callWithin } from './run';

const invalid = (field: string, problem: string) =>
  new AppError('validation_failed', `Please check the form: ${field} ${problem}.`, { [field]: [problem] });

async function loadPlan(ctx: OrgCommandCtx, planId: string) {
  const p = await ctx.m.findOne(RestrictionPlan, { where: { id: planId, organizationId: ctx.actor.organizationId } });
  authorize(ctx.ability, 'read', 'RestrictionPlan', p, 'current');
  return p;
}

async function openCase(ctx: OrgCommandCtx, caseId: string) {
  const c = await ctx.m.findOneByOrFail(CaseRecord, { id: caseId });
  if (c.closedOn) throw new AppError('conflict', 'This case is closed; its plan can no longer change.');
  return c;
}

async function currentStages(ctx: OrgCommandCtx, plan: RestrictionPlan) {
  const [v] = await planVersions(ctx.m, plan.id, plan.version);
  return v;
}

const readBack = (ctx: OrgCommandCtx, planId: string): Promise<StageCriteriaDto> =>
  stageCriteriaQuery.run(
    { db: ctx.m, deps: ctx.deps, userId: ctx.userId, actor: ctx.actor, ability: ctx.ability, now: ctx.now, today: ctx.today },
    { planId },
  );

/** The clinician records a measured test or a yes/no judgement for one criterion of a stage. */
export const recordStageAssessment = orgCommand({
  name: 'recordStageAssessment',
  async run(ctx, input: StageAssessmentInput & { planId: string }): Promise<StageCriteriaDto> {
    const plan = await loadPlan(ctx, input.planId);
    authorize(ctx.ability, 'update', 'RestrictionPlan', plan);
    await openCase(ctx, plan.caseId);
    const v = await currentStages(ctx, plan);
    const stage = v.stages.find((s) => s.id === input.stageId);
    if (!stage) throw invalid('stageId', 'is not a stage of this plan');
    const criterion = stage.criteria?.find((c) => c.id === input.criterionId);
    if (!criterion || criterion.kind !== 'clinician') throw invalid('criterionId', "is not one of this stage's clinician criteria");
    if (input.date > ctx.today) throw invalid('date', 'cannot be in the future');
    if (input.date < stage.startDate) throw invalid('date', `must be on or after the stage began (${humanDate(stage.startDate)})`);
    const value = input.value ?? null;
    const met = input.met ?? null;
    if (criterion.measure === 'threshold' && value === null) throw invalid('value', 'is needed for a measured test');
    if (criterion.measure === 'yes_no' && met === null) throw invalid('met', 'is needed for a yes/no judgement');
    const row = await ctx.m.save(
      ctx.m.create(StageCriterionReading, {
        organizationId: plan.organizationId,
        planId: plan.id,
        athleteId: plan.athleteId,
        stageId: stage.id,
        kind: 'assessment',
        criterionId: criterion.id,
        readingDate: input.date,
        value: criterion.measure === 'threshold' ? value : null,
        met: criterion.measure === 'yes_no' ? met : null,
        note: input.note ?? null,
        recordedBy: ctx.userId,
      }),
    );
    await ctx.audit({
      action: 'stage.assessed',
      subjectType: 'RestrictionPlan',
      subjectId: plan.id,
      athleteId: plan.athleteId,
      after: { readingId: row.id, stageId: stage.id, criterionId: criterion.id, date: input.date, value: row.value, met: row.met },
    });
    return readBack(ctx, plan.id);
  },
});

/** The athlete says how ready they feel to move on (0–10), today, for the stage in force. */
export const rateReadiness = orgCommand({
  name: 'rateReadiness',
  async run(ctx, input: ReadinessRatingInput & { planId: string }): Promise<StageCriteriaDto> {
    const plan = await loadPlan(ctx, input.planId);
    authorize(ctx.ability, 'create', 'CheckIn', { organizationId: plan.organizationId, athleteId: plan.athleteId });
    await openCase(ctx, plan.caseId);
    const v = await currentStages(ctx, plan);
    const stage = v.stages.find((s) => s.id === input.stageId);
    if (!stage) throw invalid('stageId', 'is not a stage of this plan');
    if (!(stage.startDate <= ctx.today && ctx.today <= stage.endDate)) throw invalid('stageId', 'is not the stage in force today');
    const row = await ctx.m.save(
      ctx.m.create(StageCriterionReading, {
        organizationId: plan.organizationId,
        planId: plan.id,
        athleteId: plan.athleteId,
        stageId: stage.id,
        kind: 'readiness',
        criterionId: null,
        readingDate: ctx.today,
        value: input.value,
        met: null,
        note: null,
        recordedBy: ctx.userId,
      }),
    );
    await ctx.audit({
      action: 'stage.readiness_rated',
      subjectType: 'RestrictionPlan',
      subjectId: plan.id,
      athleteId: plan.athleteId,
      after: { readingId: row.id, stageId: stage.id, value: input.value, date: ctx.today },
    });
    return readBack(ctx, plan.id);
  },
});

/**
 * The clinician moves the athlete to the next stage: a shared decision (Bern consensus, Ardern et al.
 * 2016, BJSM 50:853–864), recorded with who agreed. Never automatic; earlier or later than the dates
 * both work. The plan gets a new version (the ordinary revision: limits path, notices), the decision
 * its own row and audit entry with how many criteria were met at the time.
 */
export const advanceStage = orgCommand({
  name: 'advanceStage',
  changesLimits: true,
  async run(ctx, input: StageAdvanceInput & { planId: string }): Promise<StageCriteriaDto> {
    const plan = await loadPlan(ctx, input.planId);
    authorize(ctx.ability, 'update', 'RestrictionPlan', plan);
    await openCase(ctx, plan.caseId);
    if (plan.version !== input.version) throw versionConflict('plan');
    if (input.effectiveDate < ctx.today) throw invalid('effectiveDate', 'cannot be before today');
    const v = await currentStages(ctx, plan);
    const move = moveToNextStage(v.stages, input.fromStageId, input.effectiveDate);
    if (!move.ok) throw invalid(move.field, move.message);
    const from = v.stages.find((s) => s.id === input.fromStageId)!;
    const evaluated = await evaluateStage(ctx.m, {
      planId: plan.id,
      athleteId: plan.athleteId,
      stage: from,
      today: ctx.today,
      timeZone: ctx.actor.timeZone,
    });
    const total = from.criteria?.length ?? 0;
    const when =
      move.daysEarly > 0
        ? `${move.daysEarly} days earlier than planned`
        : move.daysEarly < 0
          ? `${-move.daysEarly} days later than planned`
          : 'as planned';
    await callWithin(ctx, revisePlan, {
      planId: plan.id,
      version: input.version,
      stages: move.stages,
      guidance: v.guidance,
      changeNote: `Moved to the next stage from ${humanDate(input.effectiveDate)} (${when}); agreed with ${input.agreedBy.join(', ')}.`,
    });
    const decision = await ctx.m.save(
      ctx.m.create(StageDecision, {
        organizationId: plan.organizationId,
        planId: plan.id,
        athleteId: plan.athleteId,
        fromStageId: from.id,
        toStageId: move.toStageId,
        effectiveDate: input.effectiveDate,
        plannedDate: move.plannedStart,
        daysEarly: move.daysEarly,
        agreedBy: input.agreedBy,
        criteriaMet: evaluated.metCount,
        criteriaTotal: total,
        planVersion: input.version + 1,
        note: input.note ?? null,
        decidedBy: ctx.userId,
      }),
    );
    await ctx.audit({
      action: 'stage.advanced',
      subjectType: 'RestrictionPlan',
      subjectId: plan.id,
      athleteId: plan.athleteId,
      after: {
        decisionId: decision.id,
        fromStageId: from.id,
        toStageId: move.toStageId,
        effectiveDate: input.effectiveDate,
        plannedDate: move.plannedStart,
        daysEarly: move.daysEarly,
        agreedBy: input.agreedBy,
        criteriaMet: evaluated.metCount,
        criteriaTotal: total,
        version: input.version + 1,
      },
    });
    return readBack(ctx, plan.id);
  },
});
