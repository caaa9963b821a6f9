import { randomBytes } from 'node:crypto';
import { IsNull } from 'typeorm';
import type { CalendarFeedDto } from '../../../policies/dto';
import { authorize } from '../core/authorize';
import { orgCommand, type OrgCommandCtx } from '../core/command';
import { publicBaseUrl } from '../core/public-url';
import { CalendarFeed } from '../entities';
import { hashToken } from '../services/invitations';

/**
 * A member's private calendar feed (iCalendar, RFC 5545). Turning it on makes a 256-bit token, keeps only its
 * SHA-256 and answers the address once; turning it on again makes a new address and ends the old one
 * (for a link that was shared by mistake). Turning it off ends the address at once: the feed answers
 * 404. Neither changes anything an athlete may do.
 */

async function endLiveFeed(ctx: OrgCommandCtx): Promise<string | null> {
  const live = await ctx.m.findOneBy(CalendarFeed, { membershipId: ctx.actor.membershipId, revokedAt: IsNull() });
  if (!live) return null;
  await ctx.m.update(CalendarFeed, { id: live.id }, { revokedAt: ctx.now });
  return live.id;
}

const own = (ctx: OrgCommandCtx) => ({ organizationId: ctx.actor.organizationId, membershipId: ctx.actor.membershipId });

export const startCalendarFeed = orgCommand({
  name: 'calendarFeed.start',
  async run(ctx): Promise<CalendarFeedDto> {
    authorize(ctx.ability, 'create', 'CalendarFeed', own(ctx));
    const replaced = await endLiveFeed(ctx);
    // 256 random bits (ASVS 5.0 V7.2.3 asks for at least 128), URL-safe; only the hash is stored.
    const token = randomBytes(32).toString('base64url');
    const feed = await ctx.m.save(ctx.m.create(CalendarFeed, { ...own(ctx), tokenHash: hashToken(token), createdAt: ctx.now }));
    await ctx.audit({
      action: 'calendar_feed.started',
      subjectType: 'CalendarFeed',
      subjectId: feed.id,
      after: { replaced: replaced !== null },
    });
    return { on: true, since: feed.createdAt.toISOString(), url: `${publicBaseUrl(ctx.deps.config)}/api/calendar/${token}.ics` };
  },
});

export const stopCalendarFeed = orgCommand({
  name: 'calendarFeed.stop',
  async run(ctx): Promise<CalendarFeedDto> {
    authorize(ctx.ability, 'delete', 'CalendarFeed', own(ctx));
    const ended = await endLiveFeed(ctx);
    // Turning off a feed that is already off changes nothing, so it records nothing either.
    if (ended) await ctx.audit({ action: 'calendar_feed.stopped', subjectType: 'CalendarFeed', subjectId: ended });
    return { on: false, since: null };
  },
});
