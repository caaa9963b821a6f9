import type { NotificationDto } from '../../../policies/dto';
import { accessibleWhere } from '../core/accessible';
import { orgQuery } from '../core/command';

/** The reader's own notices, newest first (the access rules give everyone their own only). */
export const myNoticesQuery = orgQuery({
  name: 'myNotices',
  async run(ctx, _input: void): Promise<NotificationDto[]> {
    const acl = accessibleWhere(ctx.ability, 'read', 'Notification', {
      organizationId: 'n.organization_id',
      recipientId: 'n.recipient_id',
    });
    const rows = await ctx.db
      .createQueryBuilder()
      .select([
        'n.id AS id',
        'n.athlete_id AS "athleteId"',
        'n.kind AS kind',
        'n.severity AS severity',
        'n.title AS title',
        'n.body AS body',
        'n.created_at AS "createdAt"',
        'n.read_at AS "readAt"',
      ])
      .from('notifications', 'n')
      .where('n.organization_id = :org AND n.recipient_id = :me', { org: ctx.actor.organizationId, me: ctx.actor.membershipId })
      .andWhere(acl.sql, acl.params)
      .orderBy('n.created_at', 'DESC')
      .limit(100)
      .getRawMany();
    return rows.map((n): NotificationDto => ({
      ...n,
      createdAt: new Date(n.createdAt).toISOString(),
      readAt: n.readAt ? new Date(n.readAt).toISOString() : null,
    }));
  },
});
