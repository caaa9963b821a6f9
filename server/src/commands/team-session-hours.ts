import type { TeamSessionHoursDto } from '../../../policies/dto/injury-report';
import type { TeamSessionHoursCreateInput } from '../../../policies/schemas/injury-report';
import { orgCommand } from '../core/command';
import { authorize } from '../core/authorize';
import { AppError } from '../core/errors';
import { groupSubject, readableGroup } from '../queries/groups';
import { toTeamSessionHoursDto, type TeamSessionHoursRow } from '../queries/injury-report';

/**
 * A coach records a group's practice or competition in one step: date, minutes, kind and who was
 * there (the whole group unless some were unticked). Each athlete present is exposed for the minutes
 * in the injury report (policies/load/injury-report.ts). Allowed to whoever may change the group (its
 * coaches and admins); an archived group takes no more records. Nothing here changes any limit.
 */
export const recordTeamSessionHours = orgCommand({
  name: 'team_session_hours.record',
  async run(ctx, input: TeamSessionHoursCreateInput & { groupId: string }): Promise<TeamSessionHoursDto> {
    const { group, members } = await readableGroup(ctx.m, ctx.actor, ctx.ability, input.groupId);
    authorize(ctx.ability, 'update', 'Group', groupSubject(group, members));
    if (group.archived) throw new AppError('conflict', 'That group is archived and takes no more session hours.');
    if (input.date > ctx.today)
      throw new AppError('validation_failed', 'Please check the form: date must not be after today.', {
        date: ['must not be after today'],
      });
    const athleteIds = input.athleteIds ?? members.athleteIds;
    if (athleteIds.some((id) => !members.athleteIds.includes(id)))
      throw new AppError('validation_failed', 'Please check the form: athleteIds must all be athletes of this group.', {
        athleteIds: ['must all be athletes of this group'],
      });
    if (athleteIds.length === 0)
      throw new AppError('validation_failed', 'Please check the form: athleteIds must name at least one athlete who was there.', {
        athleteIds: ['must name at least one athlete who was there'],
      });
    const [row]: TeamSessionHoursRow[] = await ctx.m.query(
      `INSERT INTO team_session_hours (organization_id, group_id, date, minutes, kind, athlete_ids, recorded_by)
       VALUES ($1, $2, $3, $4, $5, $6::uuid[], $7)
       RETURNING id, group_id, to_char(date, 'YYYY-MM-DD') AS date, minutes, kind, athlete_ids`,
      [ctx.actor.organizationId, group.id, input.date, input.minutes, input.kind, athleteIds, ctx.userId],
    );
    await ctx.audit({
      action: 'team_session_hours.recorded',
      subjectType: 'Group',
      subjectId: group.id,
      after: { group: group.name, date: input.date, minutes: input.minutes, kind: input.kind, present: athleteIds.length },
    });
    return toTeamSessionHoursDto(row);
  },
});
