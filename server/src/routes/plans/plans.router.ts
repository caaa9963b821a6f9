import type { EntityManager } from 'typeorm';
import type { InForceDto, PlanDto } from '../../../../policies/dto';
import { inForceOn } from '../../../../policies/load/in-force';
import {
  CaseItemParamsSchema,
  InForceQuerySchema,
  OrgItemParamsSchema,
  PlanCreateSchema,
  PlanUpdateSchema,
  PlanVersionParamsSchema,
} from '../../../../policies/schemas';
import { todayIso } from '../../../../policies/roles';
import { asSubject, type AppAbility } from '../../../../policies/access';
import { CaseRecord, RestrictionPlan, RestrictionPlanVersion } from '../../entities';
import { authorize } from '../../core/authorize';
import { AppError, versionConflict } from '../../core/errors';
import { orgRoute, type RouteDef } from '../../http/route';
import { activePlans, athleteStatuses, planVersions } from '../../services/cases';
import { isUniqueViolation } from '../../services/org-members';
import { recheckAthlete } from '../../commands/limits';
import { orgToday } from '../../../../policies/today';

async function planDto(db: EntityManager, ability: AppAbility, plan: RestrictionPlan): Promise<PlanDto> {
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

export const planRoutes: RouteDef[] = [
  orgRoute({
    method: 'post',
    path: '/orgs/:orgId/cases/:id/plan',
    summary: 'Write the restriction plan of a case (version 1)',
    access: { kind: 'org', action: 'create', subject: 'RestrictionPlan' },
    params: CaseItemParamsSchema,
    body: PlanCreateSchema,
    status: 201,
    async handler({ ds, ability, actor, user, params, body, tx }) {
      const plan = await tx(async (m, audit) => {
        const c = await m.findOne(CaseRecord, { where: { id: params.id, organizationId: actor.organizationId } });
        authorize(ability, 'read', 'Case', c);
        authorize(ability, 'create', 'RestrictionPlan', { id: '', organizationId: c.organizationId, athleteId: c.athleteId });
        if (c.closedOn) throw new AppError('conflict', 'This case is closed; open a new case to write a new plan.');
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
            stages: body.stages,
            guidance: body.guidance,
            changeNote: body.changeNote ?? null,
            createdBy: user.id,
          }),
        );
        await audit({
          action: 'plan.created',
          subjectType: 'RestrictionPlan',
          subjectId: saved.id,
          athleteId: c.athleteId,
          after: { version: 1, stages: body.stages, guidance: body.guidance },
        });
        await recheckAthlete(m, c.organizationId, c.athleteId, 'The clinician wrote a restriction plan.', orgToday(actor.timeZone));
        return saved;
      });
      return planDto(ds.manager, ability, plan);
    },
  }),
  orgRoute({
    method: 'get',
    path: '/orgs/:orgId/plans/:id',
    summary: 'A restriction plan as it stands now',
    access: { kind: 'org', action: 'read', subject: 'RestrictionPlan' },
    params: OrgItemParamsSchema,
    async handler({ ds, ability, actor, params }) {
      const plan = await ds.getRepository(RestrictionPlan).findOne({ where: { id: params.id, organizationId: actor.organizationId } });
      authorize(ability, 'read', 'RestrictionPlan', plan);
      return planDto(ds.manager, ability, plan);
    },
  }),
  orgRoute({
    method: 'put',
    path: '/orgs/:orgId/plans/:id',
    summary: 'Save a new version of a plan (409 if someone saved since you opened it)',
    access: { kind: 'org', action: 'update', subject: 'RestrictionPlan' },
    params: OrgItemParamsSchema,
    body: PlanUpdateSchema,
    async handler({ ds, ability, actor, user, params, body, tx }) {
      const plan = await tx(async (m, audit) => {
        const p = await m.findOne(RestrictionPlan, { where: { id: params.id, organizationId: actor.organizationId } });
        authorize(ability, 'update', 'RestrictionPlan', p);
        const c = await m.findOneByOrFail(CaseRecord, { id: p.caseId });
        if (c.closedOn) throw new AppError('conflict', 'This case is closed; its plan can no longer change.');
        const next = body.version + 1;
        const result = await m
          .createQueryBuilder()
          .update(RestrictionPlan)
          .set({ version: next, updatedAt: () => 'now()' } as never)
          .where('id = :id AND version = :v', { id: p.id, v: body.version })
          .execute();
        if (result.affected !== 1) throw versionConflict('plan');
        const [before] = await planVersions(m, p.id, body.version);
        await m.save(
          m.create(RestrictionPlanVersion, {
            planId: p.id,
            version: next,
            stages: body.stages,
            guidance: body.guidance,
            changeNote: body.changeNote ?? null,
            createdBy: user.id,
          }),
        );
        await audit({
          action: 'plan.revised',
          subjectType: 'RestrictionPlan',
          subjectId: p.id,
          athleteId: p.athleteId,
          before: { version: body.version, stages: before.stages, guidance: before.guidance },
          after: { version: next, stages: body.stages, guidance: body.guidance, changeNote: body.changeNote ?? null },
        });
        await recheckAthlete(m, p.organizationId, p.athleteId, 'The clinician changed the restriction plan.', orgToday(actor.timeZone));
        return { ...p, version: next };
      });
      return planDto(ds.manager, ability, plan);
    },
  }),
  orgRoute({
    method: 'get',
    path: '/orgs/:orgId/plans/:id/versions',
    summary: 'Every saved version of a plan, newest first, with who saved it (care team only)',
    access: { kind: 'org', action: 'read', subject: 'RestrictionPlan' },
    params: OrgItemParamsSchema,
    async handler({ ds, ability, actor, params }) {
      const plan = await ds.getRepository(RestrictionPlan).findOne({ where: { id: params.id, organizationId: actor.organizationId } });
      authorize(ability, 'read', 'RestrictionPlan', plan, 'history');
      return planVersions(ds, plan.id);
    },
  }),
  orgRoute({
    method: 'get',
    path: '/orgs/:orgId/plans/:id/versions/:version',
    summary: 'One earlier version of a plan',
    access: { kind: 'org', action: 'read', subject: 'RestrictionPlan' },
    params: PlanVersionParamsSchema,
    async handler({ ds, ability, actor, params }) {
      const plan = await ds.getRepository(RestrictionPlan).findOne({ where: { id: params.id, organizationId: actor.organizationId } });
      authorize(ability, 'read', 'RestrictionPlan', plan, 'history');
      const [v] = await planVersions(ds, plan.id, params.version);
      if (!v) throw new AppError('not_found', `This plan has no version ${params.version}.`);
      return v;
    },
  }),
  orgRoute({
    method: 'get',
    path: '/orgs/:orgId/athletes/:id/in-force',
    summary: 'What is in force for an athlete on a date (default today): status, stage and caps per pattern',
    access: { kind: 'org', action: 'read', subject: 'RestrictionPlan' },
    params: OrgItemParamsSchema,
    query: InForceQuerySchema,
    async handler({ ds, ability, actor, params, query }) {
      authorize(ability, 'read', 'RestrictionPlan', { id: '', organizationId: actor.organizationId, athleteId: params.id }, 'current');
      const date = query.date ?? todayIso();
      const [plans, statuses] = await Promise.all([activePlans(ds, [params.id], date), athleteStatuses(ds, [params.id], date)]);
      const mine = plans.get(params.id) ?? [];
      const status = statuses.get(params.id)!;
      const inForce = inForceOn(mine, date);
      const dto: InForceDto = {
        ...inForce,
        athleteId: params.id,
        status: status.status,
        statusEffectiveFrom: status.since,
        guidance: mine.filter((p) => inForce.stages.some((s) => s.planId === p.planId) && p.guidance).map((p) => p.guidance),
      };
      return dto;
    },
  }),
];
