import { NothingSchema, NoticePreferencesUpdateSchema, OrgParamsSchema } from '../../../../policies/schemas';
import { orgRoute, type RouteDef } from '../../http/route';
import { updateNoticePreferences } from '../../commands/notice-preferences';
import { noticePreferencesQuery } from '../../queries/notice-preferences';

/** My own choice of which notices also come by e-mail. Everyone reads and changes only their own. */
export const noticePreferenceRoutes: RouteDef[] = [
  orgRoute({
    method: 'get',
    path: '/orgs/:orgId/notice-preferences',
    summary: 'Which of my notices also come by e-mail',
    access: { kind: 'org', action: 'read', subject: 'Notification' },
    params: OrgParamsSchema,
    query: NothingSchema,
    body: NothingSchema,
    handler: ({ read }) => read(noticePreferencesQuery, undefined),
  }),
  orgRoute({
    method: 'patch',
    path: '/orgs/:orgId/notice-preferences',
    summary: 'Switch the e-mail copy of kinds of my notices on or off (never emergencies)',
    access: { kind: 'org', action: 'update', subject: 'Notification' },
    params: OrgParamsSchema,
    query: NothingSchema,
    body: NoticePreferencesUpdateSchema,
    command: updateNoticePreferences,
    handler: ({ run, body }) => run(updateNoticePreferences, body),
  }),
];
