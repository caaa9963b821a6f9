import { ipKeyGenerator, rateLimit } from 'express-rate-limit';
import { CalendarTokenParamsSchema, NothingSchema, OrgParamsSchema } from '../../../../policies/schemas';
import { startCalendarFeed, stopCalendarFeed } from '../../commands/calendar-feeds';
import { AppError } from '../../core/errors';
import type { Deps } from '../../http/context';
import { orgRoute, publicRoute, type RouteDef } from '../../http/route';
import { limitStore } from '../../http/security';
import { calendarFeedByToken, calendarFeedState } from '../../queries/calendar-feed';

/**
 * The private calendar feed (iCalendar, RFC 5545): a member turns theirs on (the answer holds the address,
 * once), reads whether it is on, and turns it off. The feed itself is public by address: a calendar
 * subscribes without a session, so the 256-bit token is the only key, kept hashed. Fetches are not
 * audited: calendars poll every hour or so and would drown the trail; turning on and off is.
 */
export function calendarFeedRoutes(deps: Deps): RouteDef[] {
  const own = { kind: 'org', action: 'read', subject: 'CalendarFeed' } as const;
  // Calendars poll; a person copying the address tries it once or twice. A per-address ceiling keeps a
  // guessing loop (hopeless against 256 bits anyway) from costing the database anything.
  const feedLimit = rateLimit({
    windowMs: 60_000,
    store: limitStore(deps, 'calendar-feed'),
    limit: 60,
    standardHeaders: 'draft-8',
    legacyHeaders: false,
    keyGenerator: (req) => `feed:${ipKeyGenerator(req.ip ?? 'unknown')}`,
    handler: (_req, _res, next) =>
      next(new AppError('rate_limited', 'Too many calendar requests from this address. Wait a minute and try again.')),
  });
  return [
    orgRoute({
      method: 'get',
      path: '/orgs/:orgId/calendar-feed',
      summary: 'Whether my private calendar feed is on, and since when (the address is shown only when made)',
      access: own,
      params: OrgParamsSchema,
      query: NothingSchema,
      body: NothingSchema,
      handler: ({ read }) => read(calendarFeedState, undefined),
    }),
    orgRoute({
      method: 'post',
      path: '/orgs/:orgId/calendar-feed',
      summary: 'Turn on my private calendar feed, or make a new address and end the old one (the address is in this answer only)',
      access: { kind: 'org', action: 'create', subject: 'CalendarFeed' },
      params: OrgParamsSchema,
      query: NothingSchema,
      body: NothingSchema,
      command: startCalendarFeed,
      status: 201,
      handler: ({ run }) => run(startCalendarFeed, undefined),
    }),
    orgRoute({
      method: 'delete',
      path: '/orgs/:orgId/calendar-feed',
      summary: 'Turn off my private calendar feed: its address answers 404 from now on',
      access: { kind: 'org', action: 'delete', subject: 'CalendarFeed' },
      params: OrgParamsSchema,
      query: NothingSchema,
      body: NothingSchema,
      command: stopCalendarFeed,
      handler: ({ run }) => run(stopCalendarFeed, undefined),
    }),
    publicRoute({
      method: 'get',
      path: '/calendar/:token.ics',
      summary: 'A private calendar feed by its secret address (iCalendar; sessions, limits and stage dates, never a diagnosis)',
      access: { kind: 'public' },
      params: CalendarTokenParamsSchema,
      query: NothingSchema,
      body: NothingSchema,
      before: [feedLimit],
      async handler({ readPublic, params, res }) {
        const ics = await readPublic(calendarFeedByToken, params.token);
        res.setHeader('Content-Type', 'text/calendar; charset=utf-8');
        res.setHeader('Content-Disposition', 'inline; filename="loadline.ics"');
        res.setHeader('Cache-Control', 'no-store');
        res.status(200).send(ics);
        return ics;
      },
    }),
  ];
}
