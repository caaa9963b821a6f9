import type { DataSource, EntityManager } from 'typeorm';
import { asSubject } from '../../../policies/access';
import type { StageCriteriaDto, StageDecisionDto } from '../../../policies/dto';
import { stageOn } from '../../../policies/load/in-force';
import { plainCriterion, plainCriterionProgress } from '../../../policies/plain-words';
import { RestrictionPlan } from '../entities';
import { authorize } from '../core/authorize';
import { orgQuery } from '../core/command';
import { evaluateStage } from '../services/stage-criteria';
import { planVersions } from './plans';

type Db = DataSource | EntityManager;

export async function stageDecisions(db: Db, planId: string): Promise<StageDecisionDto[]> {
  const rows: (Omit<StageDecisionDto, 'createdAt'> & { createdAt: Date })[] = await db.query(
    `SELECT d.id, d.from_stage_id AS "fromStageId", d.to_stage_id AS "toStageId", to_char(d.effective_date, 'YYYY-MM-DD') AS "effectiveDate",
            to_char(d.planned_date, 'YYYY-MM-DD') AS "plannedDate", d.days_early AS "daysEarly", d.agreed_by AS "agreedBy",
            d.criteria_met AS "criteriaMet", d.criteria_total AS "criteriaTotal", d.plan_version AS "planVersion", d.note,
            u.display_name AS "decidedByName", d.created_at AS "createdAt"
       FROM stage_decisions d LEFT JOIN users u ON u.id = d.decided_by
      WHERE d.plan_id = $1 ORDER BY d.created_at DESC`,
    [planId],
  );
  return rows.map((r) => ({ ...r, createdAt: new Date(r.createdAt).toISOString() }));
}

/**
 * The criteria of the stage in force today, each with its state and evidence, and whether to ask the
 * clinician about moving on. The athlete and guardians read the plain words and how far along each
 * criterion is; the evidence lines (which may quote the clinician's notes) go to the care team only.
 */
export const stageCriteriaQuery = orgQuery({
  name: 'stageCriteria',
  async run(ctx, input: { planId: string }): Promise<StageCriteriaDto> {
    const plan = await ('manager' in ctx.db ? ctx.db.manager : ctx.db).findOne(RestrictionPlan, {
      where: { id: input.planId, organizationId: ctx.actor.organizationId },
    });
    authorize(ctx.ability, 'read', 'RestrictionPlan', plan, 'current');
    const subject = asSubject('RestrictionPlan', { id: plan.id, organizationId: plan.organizationId, athleteId: plan.athleteId });
    const careTeam = ctx.ability.can('read', subject, 'history');
    const canAssess = ctx.ability.can('update', subject);
    const canRate = ctx.ability.can('create', asSubject('CheckIn', { organizationId: plan.organizationId, athleteId: plan.athleteId }));
    const [current] = await planVersions(ctx.db, plan.id, plan.version);
    const ordered = [...current.stages].sort((a, b) => (a.startDate < b.startDate ? -1 : a.startDate > b.startDate ? 1 : 0));
    const stage = stageOn(ordered, ctx.today);
    const k = stage ? ordered.indexOf(stage) : -1;
    const next = k >= 0 && k + 1 < ordered.length ? ordered[k + 1] : null;
    const evaluated = stage
      ? await evaluateStage(ctx.db, { planId: plan.id, athleteId: plan.athleteId, stage, today: ctx.today, timeZone: ctx.actor.timeZone })
      : { results: [], allMet: false, metCount: 0 };
    const criteria = (stage?.criteria ?? []).map((criterion, i) => {
      const result = evaluated.results[i];
      return {
        criterion,
        result: careTeam ? result : { ...result, evidence: '' },
        plain: plainCriterion(criterion),
        plainProgress: plainCriterionProgress(result),
      };
    });
    return {
      planId: plan.id,
      planVersion: plan.version,
      today: ctx.today,
      stage: stage
        ? {
            id: stage.id,
            label: stage.label ?? null,
            startDate: stage.startDate,
            endDate: stage.endDate,
            number: k + 1,
            of: ordered.length,
          }
        : null,
      nextStage: next ? { id: next.id, label: next.label ?? null, startDate: next.startDate, number: k + 2 } : null,
      criteria,
      allMet: evaluated.allMet,
      metCount: evaluated.metCount,
      promptToMove: evaluated.allMet && next !== null && canAssess,
      canAssess,
      canRate,
      decisions: careTeam ? await stageDecisions(ctx.db, plan.id) : [],
    };
  },
});
