import { createHash } from 'node:crypto';
import request from 'supertest';
import { describe, expect, it } from 'vitest';
import { useHarness } from '../../test/harness';
import { addDays, pinClock, programWorld, put, TODAY } from '../../test/worlds/test-world';
import { DIAGNOSIS, feedWorld, fetchFeed, NOTES, parse } from '../../test/worlds/calendar-feed-world';

/**
 * The private calendar feed: written with `ics`, read back here with a separate parser
 * (ical.js) as a calendar would. RFC 5545 [confirmed: IETF] §3.6.1: every VEVENT has UID and DTSTAMP;
 * an all-day entry is DTSTART;VALUE=DATE with an exclusive DTEND.
 */

describe('the private calendar feed', () => {
  const h = useHarness();
  pinClock();
  const world = () => feedWorld(h);

  it("turns on, lists the athlete's published sessions and stages with the day's limits, and never a diagnosis", async () => {
    const w = await world();
    const feedPath = `${w.base}/calendar-feed`;
    expect((await w.athleteClient.get(feedPath)).body).toEqual({ on: false, since: null });

    const on = await w.athleteClient.post(feedPath);
    expect(on.status, JSON.stringify(on.body)).toBe(201);
    expect(on.body.on).toBe(true);
    const token = /\/api\/calendar\/([A-Za-z0-9_-]{43})\.ics$/.exec(on.body.url)?.[1];
    expect(token).toBeDefined();
    // Only the hash is kept.
    const stored = await h.ds.query(`SELECT token_hash FROM calendar_feeds WHERE membership_id = $1`, [w.athlete]);
    expect(stored).toEqual([{ token_hash: createHash('sha256').update(token!).digest('hex') }]);
    const state = (await w.athleteClient.get(feedPath)).body;
    expect(state).toEqual({ on: true, since: on.body.since });

    const res = await fetchFeed(h, on.body.url);
    expect(res.status).toBe(200);
    expect(res.headers['content-type']).toMatch(/^text\/calendar/);
    expect(res.headers['cache-control']).toBe('no-store');
    expect(res.text).toContain('\r\n');
    // Folded at 75: `ics` counts characters where RFC 5545 §3.1 says octets (a SHOULD), so the check is
    // in characters; our own words are ASCII, so only a name with accents makes a longer line in octets.
    expect(res.text.split('\r\n').every((line) => [...line].length <= 75)).toBe(true);

    const { name, entries } = parse(res.text);
    expect(name).toContain(w.org.athlete.name);
    const byUid = new Map(entries.map((e) => [e.uid, e]));
    const a = byUid.get(`session-${w.s1.id}@loadline`)!;
    expect(a).toMatchObject({
      summary: 'Lower body A',
      start: addDays(TODAY, 1),
      end: addDays(TODAY, 2),
      startIsDate: true,
      status: 'CONFIRMED',
    });
    // The Settle stage that day: hinge capped, jumping not for now, the pain ceiling.
    expect(a.description).toContain('Some movements have limits today.');
    expect(a.description).toContain('Not for now: jumping and landing');
    expect(a.description).toContain('With limits: lifting from the floor and bending at the hips (hinge): up to 60% of your best lift.');
    expect(a.description).toContain('pain goes past 3/10');
    // The Build stage on the second session's day has no movement limits.
    const b = byUid.get(`session-${w.s2.id}@loadline`)!;
    expect(b.description).toContain('No movement limits, but follow what your clinician told you.');
    expect(entries.some((e) => e.summary.includes('Draft only'))).toBe(false);

    const settle = byUid.get(`stage-${w.stages[0].id}@loadline`)!;
    expect(settle).toMatchObject({
      summary: 'Stage 1 of 2: Settle',
      start: addDays(TODAY, -30),
      end: addDays(TODAY, 10),
      startIsDate: true,
    });
    expect(settle.description).toContain('Jump / landing: not allowed for now');
    const build = byUid.get(`stage-${w.stages[1].id}@loadline`)!;
    expect(build).toMatchObject({ summary: 'Stage 2 of 2: Build', start: addDays(TODAY, 10), end: addDays(TODAY, 41) });

    // DTSTAMP is a UTC date-time on every entry.
    for (const e of entries) expect(e.dtstamp).toMatch(/^\d{4}-\d{2}-\d{2}T\d{2}:\d{2}:\d{2}Z$/);
    // No diagnosis, clinical note, guidance or body region ever leaves in the feed.
    for (const secret of [DIAGNOSIS, NOTES, 'Lower back', 'lower_back']) expect(res.text).not.toContain(secret);

    // Stable: a second fetch is the same text (UIDs and DTSTAMPs do not move with the clock).
    expect((await fetchFeed(h, on.body.url)).text).toBe(res.text);

    // An edit keeps the UID and raises SEQUENCE.
    const edited = await put(w.coach, `${w.base}/sessions/${w.s1.id}`, { title: 'Lower body A (moved)', version: w.s1.version + 1 });
    expect(edited.status, JSON.stringify(edited.body)).toBe(200);
    const after = parse((await fetchFeed(h, on.body.url)).text).entries.find((e) => e.uid === a.uid)!;
    expect(after.summary).toBe('Lower body A (moved)');
    expect(after.sequence).toBeGreaterThan(a.sequence);
  });

  it('a new address ends the old one; turning off ends it too; both are audited', async () => {
    const w = await world();
    const feedPath = `${w.base}/calendar-feed`;
    const first = (await w.athleteClient.post(feedPath)).body.url as string;
    const second = await w.athleteClient.post(feedPath);
    expect(second.status).toBe(201);
    expect(second.body.url).not.toBe(first);
    expect((await fetchFeed(h, first)).status).toBe(404);
    expect((await fetchFeed(h, second.body.url)).status).toBe(200);

    const off = await w.athleteClient.agent.delete(feedPath).set('x-csrf-token', w.athleteClient.csrf);
    expect(off.status).toBe(200);
    expect(off.body).toEqual({ on: false, since: null });
    const gone = await fetchFeed(h, second.body.url);
    expect(gone.status).toBe(404);
    expect(gone.text).not.toContain('BEGIN:VCALENDAR');
    expect((await w.athleteClient.get(feedPath)).body).toEqual({ on: false, since: null });

    const trail = await h.ds.query(
      `SELECT action, after FROM audit_entries WHERE organization_id = $1 AND subject_type = 'CalendarFeed' ORDER BY id`,
      [w.org.id],
    );
    expect(trail).toEqual([
      { action: 'calendar_feed.started', after: { replaced: false } },
      { action: 'calendar_feed.started', after: { replaced: true } },
      { action: 'calendar_feed.stopped', after: null },
    ]);
  });

  it("a coach's feed has their athletes' sessions with each athlete's limits, in the staff's words", async () => {
    const w = await world();
    const on = await w.coach.post(`${w.base}/calendar-feed`);
    expect(on.status).toBe(201);
    const res = await fetchFeed(h, on.body.url);
    const entries = parse(res.text).entries;
    const a = entries.find((e) => e.uid === `session-${w.s1.id}@loadline`)!;
    expect(a.summary).toBe(`${w.org.athlete.name}: Lower body A`);
    expect(a.description).toContain(
      `${w.org.athlete.name}: Limited; Hinge: up to 60% of estimated 1RM; Jump / landing: not allowed for now`,
    );
    for (const secret of [DIAGNOSIS, NOTES, 'Lower back']) expect(res.text).not.toContain(secret);
    // Another coach of the organization, on no care team, sees none of it.
    const other = await w.as(w.org.otherCoach);
    const theirs = await fetchFeed(h, (await other.post(`${w.base}/calendar-feed`)).body.url);
    expect(parse(theirs.text).entries).toEqual([]);
  });

  it('refuses roles without a training calendar, strangers and bad addresses; a member who leaves reads nothing', async () => {
    const w = await world();
    const feedPath = `${w.base}/calendar-feed`;
    expect((await (await w.as(w.org.admin)).post(feedPath)).status).toBe(403);
    expect((await w.clinician.post(feedPath)).status).toBe(403);
    // Signed out: 401; another organization's member: 404.
    expect((await request(h.app).get(feedPath)).status).toBe(401);
    const stranger = await programWorld(h);
    expect((await stranger.coach.post(feedPath)).status).toBe(404);
    // An address of the wrong shape: 400 naming the field; an unknown one: 404.
    const bad = await request(h.app).get('/api/calendar/short.ics');
    expect(bad.status).toBe(400);
    expect(JSON.stringify(bad.body)).toContain('token');
    expect((await request(h.app).get(`/api/calendar/${'A'.repeat(43)}.ics`)).status).toBe(404);

    const url = (await w.athleteClient.post(feedPath)).body.url as string;
    expect((await fetchFeed(h, url)).status).toBe(200);
    await h.ds.query(`UPDATE memberships SET active = false WHERE id = $1`, [w.athlete]);
    expect((await fetchFeed(h, url)).status).toBe(404);
  });
});
