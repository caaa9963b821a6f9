import type { NotificationDto } from '../../../policies/dto';
import { accessibleWhere } from '../core/accessible';
import { orgQuery } from '../core/command';
import { PAIN_REPORT_NOTICE_KINDS } from './reports';

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
        'pr.id AS "painReportId"',
      ])
      .from('notifications', 'n')
      // A notice sent with a pain report was written in the report's transaction: same athlete, same instant.
      .leftJoin(
        'pain_reports',
        'pr',
        'pr.athlete_id = n.athlete_id AND pr.organization_id = n.organization_id AND pr.reported_at = n.created_at AND n.kind IN (:...painKinds)',
        { painKinds: PAIN_REPORT_NOTICE_KINDS },
      )
      .where('n.organization_id = :org AND n.recipient_id = :me', { org: ctx.actor.organizationId, me: ctx.actor.membershipId })
      .andWhere(acl.sql, acl.params)
      .orderBy('n.created_at', 'DESC')
      .limit(100)
      .getRawMany();
    // Only someone who reads pain reports gets the link (a guardian is told, but never reads the report).
    const readsReports = ctx.ability.can('read', 'PainReport');
    return rows.map((n): NotificationDto => ({
      ...n,
      painReportId: readsReports ? n.painReportId : null,
      createdAt: new Date(n.createdAt).toISOString(),
      readAt: n.readAt ? new Date(n.readAt).toISOString() : null,
    }));
  },
});
