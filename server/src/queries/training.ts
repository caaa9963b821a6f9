import type { z } from 'zod';
import type { CheckInDto, TrainingLogDto, WorkloadDto } from '../../../policies/dto';
import { sessionLoad } from '../../../policies/load/workload';
import type { AthleteRangeQuerySchema } from '../../../policies/schemas';
import { CheckIn, TrainingLog } from '../entities';
import { accessibleWhere } from '../core/accessible';
import { authorize } from '../core/authorize';
import { orgQuery, type QueryCtx } from '../core/command';
import { shiftDate } from '../services/training-logs';
import { workload } from '../services/workload';

type Range = z.infer<typeof AthleteRangeQuerySchema> & { athleteId?: string };

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
    painAfter: l.painAfter,
    painNextMorning: l.painNextMorning,
    painCeiling: l.painCeiling,
    sets: l.sets,
    notes: l.notes,
    sessionId: l.sessionId,
    version: l.version,
  };
}

export function toCheckInDto(c: CheckIn): CheckInDto {
  return {
    id: c.id,
    athleteId: c.athleteId,
    date: c.date,
    sleepHours: c.sleepHours,
    soreness: c.soreness,
    readiness: c.readiness,
    painNow: c.painNow,
  };
}

const manager = (db: QueryCtx['db']) => ('manager' in db ? db.manager : db);

/** Training logs the reader may see; by default the 28 days up to the organization's today. */
export const trainingLogsQuery = orgQuery({
  name: 'trainingLogs',
  async run(ctx, input: Range): Promise<TrainingLogDto[]> {
    const acl = accessibleWhere(ctx.ability, 'read', 'TrainingLog', {
      organizationId: 'l.organization_id',
      athleteId: 'l.athlete_id',
      id: 'l.id',
    });
    const qb = manager(ctx.db)
      .createQueryBuilder(TrainingLog, 'l')
      .where('l.organization_id = :org', { org: ctx.actor.organizationId })
      .andWhere(acl.sql, acl.params);
    if (input.athleteId) qb.andWhere('l.athlete_id = :a', { a: input.athleteId });
    qb.andWhere('l.date >= :from', { from: input.from ?? shiftDate(ctx.today, -27) });
    if (input.to) qb.andWhere('l.date <= :to', { to: input.to });
    return (await qb.orderBy('l.date', 'DESC').addOrderBy('l.created_at', 'DESC').limit(500).getMany()).map(toLogDto);
  },
});

/** Check-ins the reader may see; by default the 28 days up to the organization's today. */
export const checkInsQuery = orgQuery({
  name: 'checkIns',
  async run(ctx, input: Range): Promise<CheckInDto[]> {
    const acl = accessibleWhere(ctx.ability, 'read', 'CheckIn', { organizationId: 'c.organization_id', athleteId: 'c.athlete_id' });
    const qb = manager(ctx.db)
      .createQueryBuilder(CheckIn, 'c')
      .where('c.organization_id = :org', { org: ctx.actor.organizationId })
      .andWhere(acl.sql, acl.params);
    if (input.athleteId) qb.andWhere('c.athlete_id = :a', { a: input.athleteId });
    qb.andWhere('c.date >= :from', { from: input.from ?? shiftDate(ctx.today, -27) });
    if (input.to) qb.andWhere('c.date <= :to', { to: input.to });
    return (await qb.orderBy('c.date', 'DESC').limit(500).getMany()).map(toCheckInDto);
  },
});

/** An athlete's workload over `days` days up to `to` (default: the organization's today). */
export const workloadQuery = orgQuery({
  name: 'workload',
  async run(ctx, input: { athleteId: string; to?: string; days: number }): Promise<WorkloadDto> {
    authorize(ctx.ability, 'read', 'TrainingLog', { id: '', organizationId: ctx.actor.organizationId, athleteId: input.athleteId });
    return workload(ctx.db, input.athleteId, input.to ?? ctx.today, input.days);
  },
});
