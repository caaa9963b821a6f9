import request from 'supertest';
import { describe, expect, it } from 'vitest';
import { useHarness } from '../../test/harness';
import { addDays, pinClock, TODAY } from '../../test/worlds/test-world';
import { DIAGNOSIS, feedWorld, fetchFeed, NOTES, parse } from '../../test/worlds/calendar-feed-world';

/**
 * A guardian's own calendar feed: the published sessions of each athlete they
 * are linked to, titled with the athlete's first name, read back with ical.js as a calendar would
 * (RFC 5545 §3.6.1: UID and DTSTAMP on every VEVENT). What a guardian may see (PRODUCT.md, minimum
 * necessary): no diagnosis, note or pain report ever, and — since a family calendar is often shared
 * with the household — none of the athlete's limits, status or plan stages either.
 */
describe("a guardian's calendar feed", () => {
  const h = useHarness();
  pinClock();

  async function guardianWorld() {
    const w = await feedWorld(h);
    const guardian = await w.as(w.org.guardian);
    const firstName = w.org.athlete.name.split(/\s+/)[0];
    return { ...w, guardian, firstName, feedPath: `${w.base}/calendar-feed` };
  }

  it("lists each linked athlete's published sessions under their first name, with no limits, stages or diagnosis", async () => {
    const w = await guardianWorld();
    expect((await w.guardian.get(w.feedPath)).body).toEqual({ on: false, since: null });
    const on = await w.guardian.post(w.feedPath);
    expect(on.status, JSON.stringify(on.body)).toBe(201);
    expect(on.body.url).toMatch(/\/api\/calendar\/[A-Za-z0-9_-]{43}\.ics$/);
    expect((await w.guardian.get(w.feedPath)).body).toEqual({ on: true, since: on.body.since });

    // The coach puts the second session on hold: the guardian's entry says so, as the athlete's does.
    await h.ds.query(`INSERT INTO session_holds (session_id, athlete_id, organization_id, breaches) VALUES ($1, $2, $3, '[]')`, [
      w.s2.id,
      w.athlete,
      w.org.id,
    ]);

    const res = await fetchFeed(h, on.body.url);
    expect(res.status).toBe(200);
    expect(res.headers['content-type']).toMatch(/^text\/calendar/);
    expect(res.headers['cache-control']).toBe('no-store');
    const { name, entries } = parse(res.text);
    expect(name).toContain(w.org.guardian.name);
    expect(entries.map((e) => e.summary).sort()).toEqual([`${w.firstName}: Lower body A`, `${w.firstName}: On hold: Lower body B`]);
    const a = entries.find((e) => e.uid === `session-${w.s1.id}-${w.athlete}@loadline`)!;
    expect(a).toMatchObject({ start: addDays(TODAY, 1), end: addDays(TODAY, 2), startIsDate: true, status: 'CONFIRMED' });
    expect(a.description).toContain('Open Loadline to see what they may do that day');
    const b = entries.find((e) => e.uid === `session-${w.s2.id}-${w.athlete}@loadline`)!;
    expect(b.status).toBe('TENTATIVE');
    expect(b.description).toContain(`On hold: the coach is changing this session for ${w.firstName}.`);
    for (const e of entries) expect(e.dtstamp).toMatch(/^\d{4}-\d{2}-\d{2}T\d{2}:\d{2}:\d{2}Z$/);

    // Never the diagnosis, a note, a body region, the pain ceiling, a limit or a stage; no draft.
    for (const secret of [
      DIAGNOSIS,
      NOTES,
      'Lower back',
      'lower_back',
      '/10',
      '60%',
      'Hinge',
      'hinge',
      'jump',
      'Settle',
      'Stage',
      'Draft only',
    ])
      expect(res.text).not.toContain(secret);
  });

  it('ends with the guardianship: the address answers 404 once the link is removed, as a turned-off feed does', async () => {
    const w = await guardianWorld();
    const url = (await w.guardian.post(w.feedPath)).body.url as string;
    expect((await fetchFeed(h, url)).status).toBe(200);

    const admin = await w.as(w.org.admin);
    const [link] = await h.ds.query(`SELECT id FROM guardian_links WHERE guardian_id = $1`, [w.org.guardian.membershipId]);
    const unlinked = await admin.agent.delete(`${w.base}/guardian-links/${link.id}`).set('x-csrf-token', admin.csrf);
    expect(unlinked.status, JSON.stringify(unlinked.body)).toBeLessThan(300);
    const gone = await fetchFeed(h, url);
    expect(gone.status).toBe(404);
    expect(gone.text).not.toContain('BEGIN:VCALENDAR');

    // A guardian linked to nobody (the organization's other guardian) reads nothing either.
    const other = await w.as(w.org.otherGuardian);
    const theirs = await other.post(w.feedPath);
    expect(theirs.status).toBe(201);
    expect((await fetchFeed(h, theirs.body.url)).status).toBe(404);
  });

  it("is the guardian's own: replaced and turned off like the athlete's, audited, and out of reach of others", async () => {
    const w = await guardianWorld();
    const first = (await w.guardian.post(w.feedPath)).body.url as string;
    const second = (await w.guardian.post(w.feedPath)).body.url as string;
    expect((await fetchFeed(h, first)).status).toBe(404);
    expect((await fetchFeed(h, second)).status).toBe(200);
    const off = await w.guardian.agent.delete(w.feedPath).set('x-csrf-token', w.guardian.csrf);
    expect(off.body).toEqual({ on: false, since: null });
    expect((await fetchFeed(h, second)).status).toBe(404);

    const trail = await h.ds.query(
      `SELECT action FROM audit_entries WHERE organization_id = $1 AND subject_type = 'CalendarFeed' ORDER BY id`,
      [w.org.id],
    );
    expect(trail.map((t: { action: string }) => t.action)).toEqual([
      'calendar_feed.started',
      'calendar_feed.started',
      'calendar_feed.stopped',
    ]);
    // The athlete's own feed is untouched by the guardian's, and the guardian's is not the athlete's.
    expect((await w.athleteClient.get(w.feedPath)).body).toEqual({ on: false, since: null });
    // Signed out: 401.
    expect((await request(h.app).get(w.feedPath)).status).toBe(401);
  });
});
