import type { AthleteWeekDto } from '../../../policies/dto';
import { dayInWords } from '../../../policies/load/day-words';
import { inForceOn } from '../../../policies/load/in-force';
import type { Unit } from '../../../policies/schemas/common';
import { addDays } from '../../../policies/today';
import { authorize } from '../core/authorize';
import { orgQuery } from '../core/command';
import { activePlans, athleteStatuses } from '../services/cases';
import { athleteDay } from './roster';

/** "My week" looks ahead this many days, the organization's today first. */
export const WEEK_DAYS = 7;

/**
 * The coming seven days for an athlete, from the organization's today (policies/today.ts): each
 * day's published sessions (as the athlete's day shows them: loads worked out, holds marked) and
 * what they may and may not do that day — the plan stages covering it and the participation status
 * on it, in the athlete's words, load caps as a load they can put on the bar in their unit.
 */
export const athleteWeek = orgQuery({
  name: 'athlete_week',
  async run(ctx, input: { athleteId: string; unit: Unit }): Promise<AthleteWeekDto> {
    const subject = { id: '', organizationId: ctx.actor.organizationId, athleteId: input.athleteId };
    authorize(ctx.ability, 'read', 'RestrictionPlan', subject, 'current');
    const days: AthleteWeekDto['days'] = [];
    // Day by day and one query after another: `db` may be a transaction's one connection, and a
    // case that closes or a stage that ends mid-week changes the limits from that day on.
    for (let i = 0; i < WEEK_DAYS; i++) {
      const date = addDays(ctx.today, i);
      const plans = (await activePlans(ctx.db, [input.athleteId], date)).get(input.athleteId) ?? [];
      const status = (await athleteStatuses(ctx.db, [input.athleteId], date)).get(input.athleteId)!.status;
      const inForce = inForceOn(plans, date);
      const day = await athleteDay.run(ctx, { athleteId: input.athleteId, date, unit: input.unit });
      days.push({
        date,
        status,
        stages: inForce.stages.map((s) => ({ label: s.stage.label ?? null, startDate: s.stage.startDate, endDate: s.stage.endDate })),
        painCeiling: inForce.painCeiling,
        limits: dayInWords(inForce, status, input.unit),
        sessions: day.sessions,
      });
    }
    return { athleteId: input.athleteId, from: days[0].date, to: days[WEEK_DAYS - 1].date, unit: input.unit, days };
  },
});
