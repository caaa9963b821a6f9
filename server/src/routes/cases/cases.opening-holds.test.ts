import { afterEach, describe, expect, it } from 'vitest';
import { useHarness } from '../../test/harness';
import { heldSessions, onHoldNotices, pinClock, publishSession, unpinClock, zonedWorld } from '../../test/worlds/clock-world';

const h = useHarness({ SIGNIN_MAX_PER_IP: '1000' });

/**
 * Opening a case carries its first participation status, so it changes what the athlete may do
 * exactly as a later status change does: the athlete's published sessions from today on are checked
 * again, what now breaches is held, and the coach is told (one "limits changed" path).
 */
describe('opening a case re-checks the athlete’s published sessions', () => {
  afterEach(unpinClock);

  it('a case opened with Out from today holds today’s and tomorrow’s published sessions, not yesterday’s, and tells the coach once', async () => {
    pinClock('2026-06-10T12:00:00-07:00');
    const w = await zonedWorld(h.ds, h.app, 'America/Los_Angeles');
    const coach = await w.as(w.org.coach);
    const yesterday = await publishSession(w, coach, '2026-06-09');
    const today = await publishSession(w, coach, '2026-06-10');
    const tomorrow = await publishSession(w, coach, '2026-06-11');
    expect(await heldSessions(h.ds, w.org.athlete.membershipId)).toEqual([]);

    const clinician = await w.as(w.org.clinician);
    const opened = await clinician.post(`${w.base}/cases`, {
      athleteId: w.org.athlete.membershipId,
      bodyRegions: ['lower_back'],
      onsetDate: '2026-06-09',
      status: 'out',
      statusEffectiveFrom: '2026-06-10',
      statusNote: 'Rest until reviewed',
    });
    expect(opened.status, JSON.stringify(opened.body)).toBe(201);
    expect(opened.body).toMatchObject({ status: 'out', statusEffectiveFrom: '2026-06-10', version: 1 });

    const held = await heldSessions(h.ds, w.org.athlete.membershipId);
    expect(held).toEqual([today, tomorrow].sort());
    expect(held).not.toContain(yesterday);
    const [hold] = await h.ds.query(`SELECT breaches FROM session_holds WHERE session_id = $1`, [today]);
    expect(hold.breaches.map((b: { rule: string }) => b.rule)).toEqual(['status_out']);

    const notices = await onHoldNotices(h.ds, w.org.id);
    expect(notices).toEqual([
      {
        recipient_id: w.org.coach.membershipId,
        title: `${w.org.athlete.name}: 2 sessions on hold`,
        body: expect.stringMatching(
          /^The clinician opened a case with the status out from Wed 10 Jun 2026\. .*Wed 10 Jun 2026, Thu 11 Jun 2026\.$/,
        ),
      },
    ]);
    // The coach reads it among their own notices.
    const mine = (await coach.get(`${w.base}/notifications`)).body as { kind: string }[];
    expect(mine.filter((n) => n.kind === 'sessions_on_hold')).toHaveLength(1);
  });

  it('a case opened with Out from a later day holds only the sessions from that day on', async () => {
    pinClock('2026-06-10T12:00:00-07:00');
    const w = await zonedWorld(h.ds, h.app, 'America/Los_Angeles');
    const coach = await w.as(w.org.coach);
    const before = await publishSession(w, coach, '2026-06-11');
    const onTheDay = await publishSession(w, coach, '2026-06-13');
    const opened = await (
      await w.as(w.org.clinician)
    ).post(`${w.base}/cases`, {
      athleteId: w.org.athlete.membershipId,
      bodyRegions: ['knee_left'],
      onsetDate: '2026-06-10',
      status: 'out',
      statusEffectiveFrom: '2026-06-13',
    });
    expect(opened.status, JSON.stringify(opened.body)).toBe(201);
    expect(await heldSessions(h.ds, w.org.athlete.membershipId)).toEqual([onTheDay]);
    expect(await heldSessions(h.ds, w.org.athlete.membershipId)).not.toContain(before);
  });

  it('a case opened with Full holds nothing and tells nobody', async () => {
    pinClock('2026-06-10T12:00:00-07:00');
    const w = await zonedWorld(h.ds, h.app, 'America/Los_Angeles');
    const coach = await w.as(w.org.coach);
    await publishSession(w, coach, '2026-06-10');
    const opened = await (
      await w.as(w.org.clinician)
    ).post(`${w.base}/cases`, {
      athleteId: w.org.athlete.membershipId,
      bodyRegions: ['knee_left'],
      onsetDate: '2026-06-10',
      status: 'full',
      statusEffectiveFrom: '2026-06-10',
    });
    expect(opened.status, JSON.stringify(opened.body)).toBe(201);
    expect(await heldSessions(h.ds, w.org.athlete.membershipId)).toEqual([]);
    expect(await onHoldNotices(h.ds, w.org.id)).toEqual([]);
  });
});
