import { Notification } from '../entities';
import { authorize } from '../core/authorize';
import { orgCommand } from '../core/command';

/**
 * Marking notices read is a change to the record like any other: in one transaction with one audit
 * entry per request, so "no warning sign goes unread" can be checked against who cleared what, when
 * (45 CFR 164.312(b)). A request that changes nothing writes nothing.
 */
export const markNoticeRead = orgCommand({
  name: 'markNoticeRead',
  async run(ctx, input: { noticeId: string }): Promise<void> {
    const n = await ctx.m.findOne(Notification, { where: { id: input.noticeId, organizationId: ctx.actor.organizationId } });
    authorize(ctx.ability, 'update', 'Notification', n);
    if (n.readAt) return;
    await ctx.m.update(Notification, { id: n.id }, { readAt: ctx.now });
    await ctx.audit({ action: 'notification.read', subjectType: 'Notification', subjectId: n.id, after: { ids: [n.id] } });
  },
});

export const markAllNoticesRead = orgCommand({
  name: 'markAllNoticesRead',
  async run(ctx, _input: void): Promise<void> {
    const { affected } = await ctx.m
      .createQueryBuilder()
      .update(Notification)
      .set({ readAt: ctx.now })
      .where('organization_id = :org AND recipient_id = :me AND read_at IS NULL', {
        org: ctx.actor.organizationId,
        me: ctx.actor.membershipId,
      })
      .execute();
    const count = affected ?? 0;
    if (count === 0) return;
    await ctx.audit({ action: 'notification.read', subjectType: 'Notification', subjectId: null, after: { ids: 'all', count } });
  },
});
