import type { DataSource } from 'typeorm';
import type { CheckInDto, TrainingLogDto, TrainingLogOutcomeDto } from '../../../../policies/dto';
import type { AppAbility } from '../../../../policies/access';
import { sessionLoad } from '../../../../policies/load/workload';
import {
  AthleteRangeQuerySchema,
  CheckInSchema,
  NextMorningSchema,
  OrgItemParamsSchema,
  OrgParamsSchema,
  TrainingLogCreateSchema,
  UuidSchema,
} from '../../../../policies/schemas';
import { todayIso } from '../../../../policies/roles';
import { z } from 'zod';
import { CheckIn, TrainingLog } from '../../entities';
import { accessibleWhere } from '../../core/accessible';
import { authorize } from '../../core/authorize';
import { AppError, versionConflict } from '../../core/errors';
import { orgRoute, type RouteDef } from '../../http/route';
import { requireMemberWithRole } from '../../services/org-members';
import { createTrainingLog, recordNextMorning, shiftDate } from '../../services/training-logs';
import { workload } from '../../services/workload';

const RangeQuery = AthleteRangeQuerySchema.extend({ athleteId: UuidSchema.optional() });

export function toLogDto(l: TrainingLog): TrainingLogDto {
  return {
    id: l.id,
    athleteId: l.athleteId,
    date: l.date,
    durationMinutes: l.durationMinutes,
    sessionRpe: l.sessionRpe,
    sessionLoad: sessionLoad(l.sessionRpe, l.durationMinutes),
    painBefore: l.painBefore,
    painDuring: l.painDuring,
    painNextMorning: l.painNextMorning,
    painCeiling: l.painCeiling,
    sets: l.sets,
    notes: l.notes,
    version: l.version,
  };
}

async function listLogs(ds: DataSource, ability: AppAbility, organizationId: string, q: z.infer<typeof RangeQuery>) {
  const acl = accessibleWhere(ability, 'read', 'TrainingLog', {
    organizationId: 'l.organization_id',
    athleteId: 'l.athlete_id',
    id: 'l.id',
  });
  const qb = ds
    .getRepository(TrainingLog)
    .createQueryBuilder('l')
    .where('l.organization_id = :org', { org: organizationId })
    .andWhere(acl.sql, acl.params);
  if (q.athleteId) qb.andWhere('l.athlete_id = :a', { a: q.athleteId });
  qb.andWhere('l.date >= :from', { from: q.from ?? shiftDate(todayIso(), -27) });
  if (q.to) qb.andWhere('l.date <= :to', { to: q.to });
  return (await qb.orderBy('l.date', 'DESC').addOrderBy('l.created_at', 'DESC').limit(500).getMany()).map(toLogDto);
}

async function athleteName(ds: DataSource, athleteId: string): Promise<string> {
  const rows: { name: string }[] = await ds.query(
    `SELECT u.display_name AS name FROM memberships m JOIN users u ON u.id = m.user_id WHERE m.id = $1`,
    [athleteId],
  );
  return rows[0]?.name ?? 'The athlete';
}

export const trainingRoutes: RouteDef[] = [
  orgRoute({
    method: 'post',
    path: '/orgs/:orgId/training-logs',
    summary: 'Log a session (sets, duration, session RPE, pain); the pain rule runs on it',
    access: { kind: 'org', action: 'create', subject: 'TrainingLog' },
    params: OrgParamsSchema,
    body: TrainingLogCreateSchema,
    status: 201,
    async handler({ ds, ability, actor, body, tx }) {
      authorize(ability, 'create', 'TrainingLog', { id: '', organizationId: actor.organizationId, athleteId: body.athleteId });
      if (body.date > todayIso()) {
        throw new AppError('validation_failed', 'Please check the form: date cannot be in the future.', {
          date: ['cannot be in the future'],
        });
      }
      const name = await athleteName(ds, body.athleteId);
      const { log, painRule } = await tx(async (m, audit) => {
        await requireMemberWithRole(m, actor.organizationId, body.athleteId, 'athlete', 'athleteId');
        return createTrainingLog(m, body, { organizationId: actor.organizationId, athleteName: name }, audit);
      });
      const dto: TrainingLogOutcomeDto = { log: toLogDto(log), painRule };
      return dto;
    },
  }),
  orgRoute({
    method: 'get',
    path: '/orgs/:orgId/training-logs',
    summary: 'Training logs I may see (default: the last 28 days)',
    access: { kind: 'org', action: 'read', subject: 'TrainingLog' },
    params: OrgParamsSchema,
    query: RangeQuery,
    async handler({ ds, ability, actor, query }) {
      return listLogs(ds, ability, actor.organizationId, query);
    },
  }),
  orgRoute({
    method: 'post',
    path: '/orgs/:orgId/training-logs/:id/next-morning',
    summary: 'Record next-morning pain for a logged session; the pain rule runs again',
    access: { kind: 'org', action: 'update', subject: 'TrainingLog' },
    params: OrgItemParamsSchema,
    body: NextMorningSchema,
    async handler({ ds, ability, actor, params, body, tx }) {
      const result = await tx(async (m, audit) => {
        const log = await m.findOne(TrainingLog, { where: { id: params.id, organizationId: actor.organizationId } });
        authorize(ability, 'update', 'TrainingLog', log);
        if (log.version !== body.version) throw versionConflict('training log');
        if (log.painNextMorning !== null) throw new AppError('conflict', 'Next-morning pain is already recorded for this session.');
        const painRule = await recordNextMorning(m, log, body.painNextMorning, await athleteName(ds, log.athleteId), audit);
        const saved = await m.save(log);
        return { log: saved, painRule };
      });
      const dto: TrainingLogOutcomeDto = { log: toLogDto(result.log), painRule: result.painRule };
      return dto;
    },
  }),
  orgRoute({
    method: 'post',
    path: '/orgs/:orgId/check-ins',
    summary: "Today's quick check-in (sleep, soreness, readiness, pain); a second one the same day replaces it",
    access: { kind: 'org', action: 'create', subject: 'CheckIn' },
    params: OrgParamsSchema,
    body: CheckInSchema,
    async handler({ ability, actor, body, tx }) {
      authorize(ability, 'create', 'CheckIn', { organizationId: actor.organizationId, athleteId: body.athleteId });
      if (body.date > todayIso()) {
        throw new AppError('validation_failed', 'Please check the form: date cannot be in the future.', {
          date: ['cannot be in the future'],
        });
      }
      return tx(async (m, audit) => {
        await m
          .createQueryBuilder()
          .insert()
          .into(CheckIn)
          .values({ organizationId: actor.organizationId, ...body })
          .orUpdate(['sleep_hours', 'soreness', 'readiness', 'pain_now'], ['athlete_id', 'date'])
          .execute();
        const saved = await m.findOneByOrFail(CheckIn, { athleteId: body.athleteId, date: body.date });
        await audit({ action: 'check_in.recorded', subjectType: 'CheckIn', subjectId: saved.id, athleteId: body.athleteId, after: body });
        const dto: CheckInDto = {
          id: saved.id,
          athleteId: saved.athleteId,
          date: saved.date,
          sleepHours: saved.sleepHours,
          soreness: saved.soreness,
          readiness: saved.readiness,
          painNow: saved.painNow,
        };
        return dto;
      });
    },
  }),
  orgRoute({
    method: 'get',
    path: '/orgs/:orgId/check-ins',
    summary: 'Check-ins I may see (default: the last 28 days)',
    access: { kind: 'org', action: 'read', subject: 'CheckIn' },
    params: OrgParamsSchema,
    query: RangeQuery,
    async handler({ ds, ability, actor, query }) {
      const acl = accessibleWhere(ability, 'read', 'CheckIn', { organizationId: 'c.organization_id', athleteId: 'c.athlete_id' });
      const qb = ds
        .getRepository(CheckIn)
        .createQueryBuilder('c')
        .where('c.organization_id = :org', { org: actor.organizationId })
        .andWhere(acl.sql, acl.params);
      if (query.athleteId) qb.andWhere('c.athlete_id = :a', { a: query.athleteId });
      qb.andWhere('c.date >= :from', { from: query.from ?? shiftDate(todayIso(), -27) });
      if (query.to) qb.andWhere('c.date <= :to', { to: query.to });
      const rows = await qb.orderBy('c.date', 'DESC').limit(500).getMany();
      return rows.map((c): CheckInDto => ({
        id: c.id,
        athleteId: c.athleteId,
        date: c.date,
        sleepHours: c.sleepHours,
        soreness: c.soreness,
        readiness: c.readiness,
        painNow: c.painNow,
      }));
    },
  }),
  orgRoute({
    method: 'get',
    path: '/orgs/:orgId/athletes/:id/workload',
    summary: 'Daily and weekly load, monotony, strain, acute:chronic (described), pain against load, e1RM',
    access: { kind: 'org', action: 'read', subject: 'TrainingLog' },
    params: OrgItemParamsSchema,
    query: z.strictObject({
      to: z.iso.date({ message: 'must be a date (YYYY-MM-DD)' }).optional(),
      days: z.coerce.number().int().min(7).max(365).default(56),
    }),
    async handler({ ds, ability, actor, params, query }) {
      authorize(ability, 'read', 'TrainingLog', { id: '', organizationId: actor.organizationId, athleteId: params.id });
      return workload(ds, params.id, query.to ?? todayIso(), query.days);
    },
  }),
];
