import { z } from 'zod';
import { IsoDateSchema, NothingSchema, OrgItemParamsSchema, OrgParamsSchema } from '../../../../policies/schemas';
import { orgRoute, type RouteDef } from '../../http/route';
import { athleteDay, roster } from '../../queries/roster';
import { athleteWeek } from '../../queries/week';

export const rosterRoutes: RouteDef[] = [
  orgRoute({
    method: 'get',
    path: '/orgs/:orgId/roster',
    summary: "The coach's roster: status, limits in force today, sessions on hold, pending exceptions, next session",
    access: { kind: 'org', action: 'read', subject: 'Athlete' },
    params: OrgParamsSchema,
    query: NothingSchema,
    body: NothingSchema,
    async handler({ read, user }) {
      return read(roster, { unit: user.unitPref });
    },
  }),
  orgRoute({
    method: 'get',
    path: '/orgs/:orgId/athletes/:id/today',
    summary: "An athlete's published sessions for a day, with loads worked out and on-hold sessions marked",
    access: { kind: 'org', action: 'read', subject: 'Program' },
    params: OrgItemParamsSchema,
    body: NothingSchema,
    query: z.strictObject({ date: IsoDateSchema.optional() }),
    async handler({ read, user, params, query }) {
      return read(athleteDay, { athleteId: params.id, date: query.date, unit: user.unitPref });
    },
  }),
  orgRoute({
    method: 'get',
    path: '/orgs/:orgId/athletes/:id/week',
    summary: "An athlete's coming seven days: published sessions and what they may and may not do each day",
    access: { kind: 'org', action: 'read', subject: 'Program' },
    params: OrgItemParamsSchema,
    query: NothingSchema,
    body: NothingSchema,
    async handler({ read, user, params }) {
      return read(athleteWeek, { athleteId: params.id, unit: user.unitPref });
    },
  }),
];
