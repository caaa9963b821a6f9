import { Flag } from '../entities';
import { authorize } from '../core/authorize';
import { orgCommand } from '../core/command';

/** A care-team member acknowledges a flag: they have seen it and are acting on it. A second acknowledgement changes nothing. */
export const acknowledgeFlag = orgCommand({
  name: 'acknowledgeFlag',
  async run(ctx, input: { flagId: string }): Promise<void> {
    const flag = await ctx.m.findOne(Flag, { where: { id: input.flagId, organizationId: ctx.actor.organizationId } });
    authorize(ctx.ability, 'update', 'Flag', flag);
    if (flag.acknowledgedAt) return;
    await ctx.m.update(Flag, { id: flag.id }, { acknowledgedAt: ctx.now, acknowledgedBy: ctx.userId });
    await ctx.audit({
      action: 'flag.acknowledged',
      subjectType: 'Flag',
      subjectId: flag.id,
      athleteId: flag.athleteId,
      after: { kind: flag.kind },
    });
  },
});
