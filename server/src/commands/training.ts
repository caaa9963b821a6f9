import type { CheckInDto, TrainingLogOutcomeDto } from '../../../policies/dto';
import type { CheckInInput, TrainingLogCreateInput } from '../../../policies/schemas';
import { CheckIn, TrainingLog } from '../entities';
import { authorize } from '../core/authorize';
import { orgCommand, type OrgCommandCtx } from '../core/command';
import { AppError, versionConflict } from '../core/errors';
import { memberName } from '../queries/members';
import { toCheckInDto, toLogDto } from '../queries/training';
import { requireMemberWithRole } from '../services/org-members';
import { flagLoggedSetsOverLimits, requirePlannedSession } from '../services/logged-limits';
import { createTrainingLog, recordNextMorning, recordPainAfter, shiftDate } from '../services/training-logs';
import { humanDate } from '../../../policies/words/dates';

/** A log or check-in records what happened: a day after the organization's today is refused (common practice). */
function notInTheFuture(ctx: OrgCommandCtx, date: string) {
  if (date > ctx.today) {
    throw new AppError('validation_failed', 'Please check the form: date cannot be in the future.', { date: ['cannot be in the future'] });
  }
}

/**
 * An athlete logs a session; the pain rule runs on it (Silbernagel et al. 2007, AJSM 35:897–906).
 * Its sets become 'logged' baselines, which are strength history only: the engine's 1RM is the
 * latest tested or estimated baseline (services/programs.ts), so a log changes no limit. Its sets are
 * checked against the limits in force that day: over a limit is recorded and told, never refused.
 */
export const logTraining = orgCommand({
  name: 'logTraining',
  async run(ctx, input: TrainingLogCreateInput): Promise<TrainingLogOutcomeDto> {
    const org = ctx.actor.organizationId;
    authorize(ctx.ability, 'create', 'TrainingLog', { id: '', organizationId: org, athleteId: input.athleteId });
    notInTheFuture(ctx, input.date);
    await requireMemberWithRole(ctx.m, org, input.athleteId, 'athlete', 'athleteId');
    if (input.sessionId) await requirePlannedSession(ctx.m, org, input.athleteId, input.sessionId);
    const athleteName = await memberName(ctx.m, input.athleteId, 'The athlete');
    const { log, painRule } = await createTrainingLog(ctx.m, input, { organizationId: org, athleteName }, ctx.audit);
    const overLimits = await flagLoggedSetsOverLimits(ctx.m, log, athleteName, ctx.audit);
    return { log: toLogDto(log), painRule, overLimits };
  },
});

/**
 * Pain after the session (that evening), added later on the session's own day in the organization's
 * zone; after that day it is the next morning's question, not the evening's.
 */
export const recordAfterSessionPain = orgCommand({
  name: 'recordAfterSessionPain',
  async run(ctx, input: { logId: string; painAfter: number; version: number }): Promise<TrainingLogOutcomeDto> {
    const log = await ctx.m.findOne(TrainingLog, { where: { id: input.logId, organizationId: ctx.actor.organizationId } });
    authorize(ctx.ability, 'update', 'TrainingLog', log);
    if (log.version !== input.version) throw versionConflict('training log');
    if (log.painAfter !== null) throw new AppError('conflict', 'Pain after the session is already recorded for this session.');
    if (ctx.today !== log.date) {
      throw new AppError(
        'unprocessable',
        `Pain after the session can be recorded only on the session's day (${humanDate(log.date)}); today is ${humanDate(ctx.today)}.`,
        { painAfter: [`can be recorded only on ${humanDate(log.date)}, the day of the session`] },
      );
    }
    const athleteName = await memberName(ctx.m, log.athleteId, 'The athlete');
    const painRule = await recordPainAfter(ctx.m, log, input.painAfter, athleteName, ctx.audit);
    const saved = await ctx.m.save(log);
    return { log: toLogDto(saved), painRule, overLimits: [] };
  },
});

/**
 * Next-morning pain for a logged session; the pain rule runs again (settled by next morning). The
 * question belongs to the next calendar day in the organization's zone: asked the same evening, the
 * answer would be the evening's pain, so it is refused until then.
 */
export const recordNextMorningPain = orgCommand({
  name: 'recordNextMorningPain',
  async run(ctx, input: { logId: string; painNextMorning: number; version: number }): Promise<TrainingLogOutcomeDto> {
    const log = await ctx.m.findOne(TrainingLog, { where: { id: input.logId, organizationId: ctx.actor.organizationId } });
    authorize(ctx.ability, 'update', 'TrainingLog', log);
    if (log.version !== input.version) throw versionConflict('training log');
    if (log.painNextMorning !== null) throw new AppError('conflict', 'Next-morning pain is already recorded for this session.');
    if (ctx.today <= log.date) {
      throw new AppError(
        'unprocessable',
        `Next-morning pain can be recorded from the morning after the session (${humanDate(shiftDate(log.date, 1))}).`,
        {
          painNextMorning: [`can be recorded from ${humanDate(shiftDate(log.date, 1))}, the morning after the session`],
        },
      );
    }
    const athleteName = await memberName(ctx.m, log.athleteId, 'The athlete');
    const painRule = await recordNextMorning(ctx.m, log, input.painNextMorning, athleteName, ctx.audit);
    const saved = await ctx.m.save(log);
    return { log: toLogDto(saved), painRule, overLimits: [] };
  },
});

/** Today's quick check-in; a second one the same day replaces it. */
export const recordCheckIn = orgCommand({
  name: 'recordCheckIn',
  async run(ctx, input: CheckInInput): Promise<CheckInDto> {
    authorize(ctx.ability, 'create', 'CheckIn', { organizationId: ctx.actor.organizationId, athleteId: input.athleteId });
    notInTheFuture(ctx, input.date);
    await ctx.m
      .createQueryBuilder()
      .insert()
      .into(CheckIn)
      .values({ organizationId: ctx.actor.organizationId, ...input })
      .orUpdate(['sleep_hours', 'soreness', 'readiness', 'pain_now'], ['athlete_id', 'date'])
      .execute();
    const saved = await ctx.m.findOneByOrFail(CheckIn, { athleteId: input.athleteId, date: input.date });
    await ctx.audit({ action: 'check_in.recorded', subjectType: 'CheckIn', subjectId: saved.id, athleteId: input.athleteId, after: input });
    return toCheckInDto(saved);
  },
});
