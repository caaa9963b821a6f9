import type { CalendarFeedDto } from '../../../policies/dto';
import { asSubject, defineAbilityFor } from '../../../policies/access';
import { dayInWords } from '../../../policies/load/day-words';
import { inForceOn, type PlanStage } from '../../../policies/load/in-force';
import type { Unit } from '../../../policies/schemas/common';
import { addDays, orgToday } from '../../../policies/today';
import {
  athleteSessionText,
  coachAthleteLine,
  coachSessionText,
  guardianSessionText,
  stageText,
} from '../../../policies/words/calendar-words';
import { authorize } from '../core/authorize';
import { orgQuery, publicQuery, type QueryCtx } from '../core/command';
import { notFound } from '../core/errors';
import { loadActor } from '../services/actor';
import { writeIcs, type FeedEvent } from '../services/calendar-ics';
import { activePlans, athleteStatuses } from '../services/cases';
import { hashToken } from '../services/invitations';

/** The feed shows two weeks back (what was done) and about four months ahead (the season's plan). */
export const FEED_DAYS_BACK = 14;
export const FEED_DAYS_AHEAD = 120;

type Db = QueryCtx['db'];

/** Whether the reader's own feed is on, and since when. The address itself is never shown again. */
export const calendarFeedState = orgQuery({
  name: 'calendar_feed',
  async run(ctx): Promise<CalendarFeedDto> {
    const organizationId = ctx.actor.organizationId;
    authorize(ctx.ability, 'read', 'CalendarFeed', { organizationId, membershipId: ctx.actor.membershipId });
    const rows: { created_at: Date }[] = await ctx.db.query(
      `SELECT created_at FROM calendar_feeds WHERE membership_id = $1 AND revoked_at IS NULL`,
      [ctx.actor.membershipId],
    );
    return { on: rows.length > 0, since: rows[0]?.created_at.toISOString() ?? null };
  },
});

interface SessionRow {
  id: string;
  athlete_id: string;
  athlete_name: string;
  date: string;
  title: string;
  version: number;
  updated_at: Date;
  team_session_id: string | null;
  held: boolean;
}

/** Published sessions of these athletes between two days, with each athlete's own hold. */
async function publishedSessions(db: Db, organizationId: string, athleteIds: string[], from: string, to: string): Promise<SessionRow[]> {
  if (athleteIds.length === 0) return [];
  return db.query(
    `SELECT s.id, pa.athlete_id, u.display_name AS athlete_name, s.date, s.title, s.version, s.updated_at, s.team_session_id,
       EXISTS (SELECT 1 FROM session_holds h WHERE h.session_id = s.id AND h.athlete_id = pa.athlete_id) AS held
     FROM programs p CROSS JOIN LATERAL unnest(p.athlete_ids) AS pa(athlete_id)
     JOIN program_sessions s ON s.program_id = p.id
     JOIN memberships m ON m.id = pa.athlete_id JOIN users u ON u.id = m.user_id
     WHERE p.organization_id = $1 AND p.athlete_ids && $2::uuid[] AND pa.athlete_id = ANY($2::uuid[])
       AND s.status = 'published' AND s.date BETWEEN $3 AND $4
     ORDER BY s.date, s.created_at, u.display_name`,
    [organizationId, athleteIds, from, to],
  );
}

/**
 * The limits of these athletes on each of the days, as the engine works them out (plans in force and
 * the participation status on that day): day by day, since a case that closes or a stage that ends
 * changes them from that day on.
 */
async function limitsOnDays(db: Db, athleteIds: string[], dates: string[]) {
  const out = new Map<
    string,
    { inForce: ReturnType<typeof inForceOn>; status: Awaited<ReturnType<typeof athleteStatuses>> extends Map<string, infer S> ? S : never }
  >();
  for (const date of dates) {
    const plans = await activePlans(db, athleteIds, date);
    const statuses = await athleteStatuses(db, athleteIds, date);
    for (const id of athleteIds) out.set(`${id} ${date}`, { inForce: inForceOn(plans.get(id) ?? [], date), status: statuses.get(id)! });
  }
  return out;
}

async function athleteEvents(ctx: QueryCtx, unit: Unit, from: string, to: string): Promise<FeedEvent[]> {
  const athleteId = ctx.actor.membershipId;
  authorize(ctx.ability, 'read', 'Program', { id: '', organizationId: ctx.actor.organizationId, athleteId });
  authorize(ctx.ability, 'read', 'RestrictionPlan', { id: '', organizationId: ctx.actor.organizationId, athleteId }, 'current');
  const sessions = await publishedSessions(ctx.db, ctx.actor.organizationId, [athleteId], from, to);
  const limits = await limitsOnDays(ctx.db, [athleteId], [...new Set(sessions.map((s) => s.date))]);
  const events: FeedEvent[] = sessions.map((s) => {
    const { inForce, status } = limits.get(`${athleteId} ${s.date}`)!;
    const text = athleteSessionText(s.title, dayInWords(inForce, status.status, unit), s.held);
    return {
      uid: `session-${s.id}@loadline`,
      date: s.date,
      lastDate: s.date,
      ...text,
      changedAt: s.updated_at,
      sequence: s.version,
      tentative: s.held,
    };
  });
  // Stages of the plans of cases open at some point of the window, current versions; a case closed
  // mid-stage ends the stage's entry the day before it closed (closed_on is the first day without it).
  const plans: { version: number; created_at: Date; stages: PlanStage[]; closed_on: string | null }[] = await ctx.db.query(
    `SELECT p.version, v.created_at, v.stages, c.closed_on
       FROM restriction_plans p
       JOIN cases c ON c.id = p.case_id AND (c.closed_on IS NULL OR c.closed_on > $2)
       JOIN restriction_plan_versions v ON v.plan_id = p.id AND v.version = p.version
      WHERE p.athlete_id = $1 AND p.organization_id = $3`,
    [athleteId, from, ctx.actor.organizationId],
  );
  for (const plan of plans) {
    const stages = [...plan.stages].sort((a, b) => a.startDate.localeCompare(b.startDate));
    stages.forEach((stage, i) => {
      const last = plan.closed_on && plan.closed_on <= stage.endDate ? addDays(plan.closed_on, -1) : stage.endDate;
      if (last < stage.startDate || last < from || stage.startDate > to) return;
      events.push({
        uid: `stage-${stage.id}@loadline`,
        date: stage.startDate,
        lastDate: last,
        ...stageText(stage, i, stages.length, unit),
        changedAt: plan.created_at,
        sequence: plan.version,
      });
    });
  }
  return events;
}

/**
 * A coach's sessions: one entry per session, a team session once for the whole group, each athlete
 * in it with their status and limits that day in the staff's words (what the roster shows coaches;
 * no diagnosis or notes, which coaches never read either).
 */
async function coachEvents(ctx: QueryCtx, unit: Unit, from: string, to: string): Promise<FeedEvent[]> {
  const organizationId = ctx.actor.organizationId;
  const athleteIds = ctx.actor.coachOf.filter((athleteId) =>
    ctx.ability.can('read', asSubject('Program', { id: '', organizationId, athleteId }) as never),
  );
  const sessions = await publishedSessions(ctx.db, organizationId, athleteIds, from, to);
  const limits = await limitsOnDays(ctx.db, athleteIds, [...new Set(sessions.map((s) => s.date))]);
  const groups = new Map<string, SessionRow[]>();
  for (const s of sessions) {
    const key = s.team_session_id ?? s.id;
    groups.set(key, [...(groups.get(key) ?? []), s]);
  }
  return [...groups].map(([key, rows]) => {
    const first = rows[0];
    const athletes = rows.map((r) => {
      const { inForce, status } = limits.get(`${r.athlete_id} ${r.date}`)!;
      return { name: r.athlete_name, line: coachAthleteLine(r.athlete_name, status.status, inForce, unit, r.held) };
    });
    const changedAt = new Date(Math.max(...rows.map((r) => r.updated_at.getTime())));
    return {
      uid: `${first.team_session_id ? 'team-session' : 'session'}-${key}@loadline`,
      date: first.date,
      lastDate: first.date,
      ...coachSessionText(first.title, athletes, first.team_session_id !== null),
      changedAt,
      sequence: Math.max(...rows.map((r) => r.version)),
      tentative: rows.some((r) => r.held),
    };
  });
}

/** The athletes a guardian's feed is about: those they are linked to now and may read (active links only, services/actor.ts). */
function wardsOf(ctx: QueryCtx): string[] {
  const organizationId = ctx.actor.organizationId;
  return ctx.actor.guardianOf.filter((id) => ctx.ability.can('read', asSubject('Athlete', { id, organizationId }) as never));
}

/**
 * A guardian's feed: each linked athlete's published sessions, as dated and held in the athlete's own
 * feed, titled with the athlete's first name. Nothing of the athlete's limits, status or plan (see
 * guardianSessionText); a session the athletes share is one entry per athlete, so each has its own UID.
 */
async function guardianEvents(ctx: QueryCtx, from: string, to: string): Promise<FeedEvent[]> {
  const sessions = await publishedSessions(ctx.db, ctx.actor.organizationId, wardsOf(ctx), from, to);
  return sessions.map((s) => ({
    uid: `session-${s.id}-${s.athlete_id}@loadline`,
    date: s.date,
    lastDate: s.date,
    ...guardianSessionText(s.athlete_name.split(/\s+/)[0] || s.athlete_name, s.title, s.held),
    changedAt: s.updated_at,
    sequence: s.version,
    tentative: s.held,
  }));
}

/**
 * The feed behind a secret address, for a calendar that subscribes to it (no session, no cookie).
 * The token finds a live feed by its hash; the owner's rules are then built as for any request, so a
 * member who left, or lost the role, reads nothing. Unknown, revoked or orphaned: one 404 for all; so is
 * a guardian's feed once they are linked to no athlete (the guardianship ended) and have no other role
 * with a calendar.
 */
export const calendarFeedByToken = publicQuery({
  name: 'calendar_feed.read',
  async run(ctx, token: string): Promise<string> {
    const rows: { organization_id: string; membership_id: string; user_id: string; display_name: string; unit_pref: Unit }[] =
      await ctx.db.query(
        `SELECT f.organization_id, f.membership_id, m.user_id, u.display_name, u.unit_pref
           FROM calendar_feeds f JOIN memberships m ON m.id = f.membership_id JOIN users u ON u.id = m.user_id
          WHERE f.token_hash = $1 AND f.revoked_at IS NULL`,
        [hashToken(token)],
      );
    const feed = rows[0];
    if (!feed) throw notFound('calendar');
    const actor = await loadActor(ctx.db, feed.user_id, feed.organization_id);
    const ability = defineAbilityFor(actor);
    if (
      !actor ||
      !ability.can('read', asSubject('CalendarFeed', { organizationId: feed.organization_id, membershipId: feed.membership_id }) as never)
    )
      throw notFound('calendar');
    const today = orgToday(actor.timeZone, ctx.now);
    const qctx: QueryCtx = { db: ctx.db, deps: ctx.deps, userId: feed.user_id, actor, ability, now: ctx.now, today };
    const asGuardian = actor.roles.includes('guardian') && wardsOf(qctx).length > 0;
    if (!asGuardian && !actor.roles.includes('athlete') && !actor.roles.includes('coach')) throw notFound('calendar');
    const from = addDays(today, -FEED_DAYS_BACK);
    const to = addDays(today, FEED_DAYS_AHEAD);
    const events: FeedEvent[] = [];
    if (actor.roles.includes('athlete')) events.push(...(await athleteEvents(qctx, feed.unit_pref, from, to)));
    if (actor.roles.includes('coach')) events.push(...(await coachEvents(qctx, feed.unit_pref, from, to)));
    if (asGuardian) events.push(...(await guardianEvents(qctx, from, to)));
    events.sort((a, b) => a.date.localeCompare(b.date) || a.uid.localeCompare(b.uid));
    return writeIcs(`Loadline: ${feed.display_name} (${actor.organizationName})`, events);
  },
});
