import type { DataSource, EntityManager } from 'typeorm';
import { asSubject, type AppAbility } from '../../../policies/access';
import type { InForceDto, PlanDto, PlanVersionDto } from '../../../policies/dto';
import { inForceOn } from '../../../policies/load/in-force';
import { RestrictionPlan } from '../entities';
import { authorize } from '../core/authorize';
import { orgQuery } from '../core/command';
import { AppError } from '../core/errors';
import { activePlans, athleteStatuses } from '../services/cases';

type Db = DataSource | EntityManager;

/** Versions of a plan, newest first, with who saved each; one version when `version` is given. */
export async function planVersions(db: Db, planId: string, version?: number): Promise<PlanVersionDto[]> {
  const rows: (Omit<PlanVersionDto, 'createdAt'> & { createdAt: Date })[] = await db.query(
    `SELECT v.plan_id AS "planId", v.version, v.stages, v.guidance, v.change_note AS "changeNote", v.created_at AS "createdAt",
            u.display_name AS "createdByName"
       FROM restriction_plan_versions v LEFT JOIN users u ON u.id = v.created_by
      WHERE v.plan_id = $1 ${version ? 'AND v.version = $2' : ''} ORDER BY v.version DESC`,
    version ? [planId, version] : [planId],
  );
  return rows.map((r) => ({ ...r, createdAt: new Date(r.createdAt).toISOString() }));
}

/** The plan as it stands, and whether its reader may open earlier versions. */
export async function planDto(
  db: Db,
  ability: AppAbility,
  plan: Pick<RestrictionPlan, 'id' | 'organizationId' | 'caseId' | 'athleteId' | 'version'>,
): Promise<PlanDto> {
  const [current] = await planVersions(db, plan.id, plan.version);
  return {
    id: plan.id,
    organizationId: plan.organizationId,
    caseId: plan.caseId,
    athleteId: plan.athleteId,
    version: plan.version,
    current,
    canSeeHistory: ability.can(
      'read',
      asSubject('RestrictionPlan', { id: plan.id, organizationId: plan.organizationId, athleteId: plan.athleteId }),
      'history',
    ),
  };
}

const loadPlan = (db: Db, id: string, organizationId: string) =>
  ('manager' in db ? db.manager : db).findOne(RestrictionPlan, { where: { id, organizationId } });

export const planQuery = orgQuery({
  name: 'plan',
  async run(ctx, input: { planId: string }): Promise<PlanDto> {
    const plan = await loadPlan(ctx.db, input.planId, ctx.actor.organizationId);
    authorize(ctx.ability, 'read', 'RestrictionPlan', plan);
    return planDto(ctx.db, ctx.ability, plan);
  },
});

/** Every version of a plan: the care team only (an athlete or guardian reads the current one). */
export const planHistoryQuery = orgQuery({
  name: 'planHistory',
  async run(ctx, input: { planId: string; version?: number }): Promise<PlanVersionDto[]> {
    const plan = await loadPlan(ctx.db, input.planId, ctx.actor.organizationId);
    authorize(ctx.ability, 'read', 'RestrictionPlan', plan, 'history');
    const versions = await planVersions(ctx.db, plan.id, input.version);
    if (input.version && versions.length === 0) throw new AppError('not_found', `This plan has no version ${input.version}.`);
    return versions;
  },
});

/** What is in force for an athlete on a date, by default the organization's today. */
export const inForceQuery = orgQuery({
  name: 'inForce',
  async run(ctx, input: { athleteId: string; date?: string }): Promise<InForceDto> {
    authorize(
      ctx.ability,
      'read',
      'RestrictionPlan',
      { id: '', organizationId: ctx.actor.organizationId, athleteId: input.athleteId },
      'current',
    );
    const date = input.date ?? ctx.today;
    // In sequence: `db` may be a transaction's one connection.
    const mine = (await activePlans(ctx.db, [input.athleteId], date)).get(input.athleteId) ?? [];
    const status = (await athleteStatuses(ctx.db, [input.athleteId], date)).get(input.athleteId)!;
    const inForce = inForceOn(mine, date);
    return {
      ...inForce,
      athleteId: input.athleteId,
      status: status.status,
      statusEffectiveFrom: status.since,
      guidance: mine.filter((p) => inForce.stages.some((s) => s.planId === p.planId) && p.guidance).map((p) => p.guidance),
    };
  },
});
