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

const readBack = (ctx: OrgCommandCtx, planId: string): Promise<StageCriteriaDto> =>
  stageCriteriaQuery.run(
    { db: ctx.m, deps: ctx.deps, userId: ctx.userId, actor: ctx.actor, ability: ctx.ability, now: ctx.now, today: ctx.today },
    { planId },
  );

/**
 * The plan the input names, checked by `mayAct` (which throws a 403/404), on an open case, with its
 * current version. Every stage command starts here, so each refuses the same way in the same order.
 */
async function openPlan(ctx: OrgCommandCtx, planId: string, mayAct: (plan: RestrictionPlan) => void) {
  const plan = await loadPlan(ctx, planId);
  mayAct(plan);
  await openCase(ctx, plan.caseId);
  const [v] = await planVersions(ctx.m, plan.id, plan.version);
  return { plan, v };
}

type PlanVersion = Awaited<ReturnType<typeof openPlan>>['v'];

function stageOf(v: PlanVersion, stageId: string) {
  const stage = v.stages.find((s) => s.id === stageId);
  if (!stage) throw invalid('stageId', 'is not a stage of this plan');
  return stage;
}

/** An audit entry about the plan, in the same transaction as the change it records. */
const auditPlan = (ctx: OrgCommandCtx, plan: RestrictionPlan, action: string, after: Record<string, unknown>) =>
  ctx.audit({ action, subjectType: 'RestrictionPlan', subjectId: plan.id, athleteId: plan.athleteId, after });

type ReadingFields = Pick<StageCriterionReading, 'kind' | 'criterionId' | 'readingDate' | 'value' | 'met' | 'note'>;

/** Saves one reading of a stage with its audit entry (`after` gets the row), and answers with the criteria as they now stand. */
async function saveReading(
  ctx: OrgCommandCtx,
  plan: RestrictionPlan,
  stageId: string,
  fields: ReadingFields,
  action: string,
  after: (row: StageCriterionReading) => Record<string, unknown>,
): Promise<StageCriteriaDto> {
  const row = await ctx.m.save(
    ctx.m.create(StageCriterionReading, {
      organizationId: plan.organizationId,
      planId: plan.id,
      athleteId: plan.athleteId,
      stageId,
      ...fields,
      recordedBy: ctx.userId,
    }),
  );
  await auditPlan(ctx, plan, action, { readingId: row.id, stageId, ...after(row) });
  return readBack(ctx, plan.id);
}

/** The clinician records a measured test or a yes/no judgement for one criterion of a stage. */
export const recordStageAssessment = orgCommand({
  name: 'recordStageAssessment',
  async run(ctx, input: StageAssessmentInput & { planId: string }): Promise<StageCriteriaDto> {
    const { plan, v } = await openPlan(ctx, input.planId, (p) => authorize(ctx.ability, 'update', 'RestrictionPlan', p));
    const stage = stageOf(v, input.stageId);
    const criterion = stage.criteria?.find((c) => c.id === input.criterionId);
    if (!criterion || criterion.kind !== 'clinician') throw invalid('criterionId', "is not one of this stage's clinician criteria");
    if (input.date > ctx.today) throw invalid('date', 'cannot be in the future');
    if (input.date < stage.startDate) throw invalid('date', `must be on or after the stage began (${humanDate(stage.startDate)})`);
    const value = input.value ?? null;
    const met = input.met ?? null;
    if (criterion.measure === 'threshold' && value === null) throw invalid('value', 'is needed for a measured test');
    if (criterion.measure === 'yes_no' && met === null) throw invalid('met', 'is needed for a yes/no judgement');
    const fields: ReadingFields = {
      kind: 'assessment',
      criterionId: criterion.id,
      readingDate: input.date,
      value: criterion.measure === 'threshold' ? value : null,
      met: criterion.measure === 'yes_no' ? met : null,
      note: input.note ?? null,
    };
    return saveReading(ctx, plan, stage.id, fields, 'stage.assessed', (row) => ({
      criterionId: criterion.id,
      date: input.date,
      value: row.value,
      met: row.met,
    }));
  },
});

/** The athlete says how ready they feel to move on (0–10), today, for the stage in force. */
export const rateReadiness = orgCommand({
  name: 'rateReadiness',
  async run(ctx, input: ReadinessRatingInput & { planId: string }): Promise<StageCriteriaDto> {
    const { plan, v } = await openPlan(ctx, input.planId, (p) =>
      authorize(ctx.ability, 'create', 'CheckIn', { organizationId: p.organizationId, athleteId: p.athleteId }),
    );
    const stage = stageOf(v, input.stageId);
    if (!(stage.startDate <= ctx.today && ctx.today <= stage.endDate)) throw invalid('stageId', 'is not the stage in force today');
    const fields: ReadingFields = {
      kind: 'readiness',
      criterionId: null,
      readingDate: ctx.today,
      value: input.value,
      met: null,
      note: null,
    };
    return saveReading(ctx, plan, stage.id, fields, 'stage.readiness_rated', () => ({ value: input.value, date: ctx.today }));
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
    const { plan, v } = await openPlan(ctx, input.planId, (p) => authorize(ctx.ability, 'update', 'RestrictionPlan', p));
    if (plan.version !== input.version) throw versionConflict('plan');
    if (input.effectiveDate < ctx.today) throw invalid('effectiveDate', 'cannot be before today');
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
    // What was decided, said once: the decision's row and its audit entry carry the same facts.
    const decided = {
      fromStageId: from.id,
      toStageId: move.toStageId,
      effectiveDate: input.effectiveDate,
      plannedDate: move.plannedStart,
      daysEarly: move.daysEarly,
      agreedBy: input.agreedBy,
      criteriaMet: evaluated.metCount,
      criteriaTotal: from.criteria?.length ?? 0,
    };
    const decision = await ctx.m.save(
      ctx.m.create(StageDecision, {
        organizationId: plan.organizationId,
        planId: plan.id,
        athleteId: plan.athleteId,
        ...decided,
        planVersion: input.version + 1,
        note: input.note ?? null,
        decidedBy: ctx.userId,
      }),
    );
    await auditPlan(ctx, plan, 'stage.advanced', { decisionId: decision.id, ...decided, version: input.version + 1 });
    return readBack(ctx, plan.id);
  },
});
