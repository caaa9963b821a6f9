import { afterEach, describe, expect, it } from 'vitest';
import { RED_FLAG_ITEMS } from '../../../../policies/red-flags';
import { dayIn } from '../../../../policies/today';
import { humanDate } from '../../../../policies/words/dates';
import { useHarness } from '../../test/harness';
import { heldSessions, onHoldNotices, pinClock, publishSession, unpinClock, zonedWorld } from '../../test/worlds/clock-world';

const h = useHarness({ SIGNIN_MAX_PER_IP: '1000' });

const emergencyReport = (athleteId: string, onsetDate: string) => ({
  athleteId,
  bodyRegions: ['lower_back'],
  painNow: 5,
  painWorst24h: 7,
  onsetDate,
  aggravatingPatterns: ['hinge'],
  startedInTraining: true,
  redFlags: { ...Object.fromEntries(RED_FLAG_ITEMS.map((i) => [i.id, false])), saddle_numbness: true },
});

/**
 * An emergency answer sets Out from the organization's local day (policies/today.ts), not the UTC
 * day: in the evening west of UTC the UTC date is already tomorrow, and an Out from tomorrow would
 * leave that evening's published session neither held nor shown as Out.
 */
describe('an emergency pain report in the evening, west of UTC (NICE NG59: stop training now)', () => {
  afterEach(unpinClock);

  const cases = [
    { when: '18:00 in Los Angeles (02:00 UTC the next day)', instant: '2026-06-10T18:00:00-07:00', day: '2026-06-10', next: '2026-06-12' },
    // DST starts at 02:00 that morning (PST −8 → PDT −7): 23:30 PDT is 06:30 UTC on the 9th.
    {
      when: '23:30 on the spring DST change day in Los Angeles',
      instant: '2026-03-08T23:30:00-07:00',
      day: '2026-03-08',
      next: '2026-03-10',
    },
    // DST ends at 02:00 that morning (PDT −7 → PST −8): 17:30 PST is 01:30 UTC on the 2nd.
    {
      when: '17:30 on the autumn DST change day in Los Angeles',
      instant: '2026-11-01T17:30:00-08:00',
      day: '2026-11-01',
      next: '2026-11-03',
    },
  ];

  for (const c of cases) {
    it(`at ${c.when}: Out from ${c.day}, that evening's published session is held, and the athlete is Out that day`, async () => {
      pinClock(c.instant);
      expect(dayIn('UTC')).not.toBe(c.day); // the UTC day is already the next one
      const w = await zonedWorld(h.ds, h.app, 'America/Los_Angeles');
      const athleteId = w.org.athlete.membershipId;
      const coach = await w.as(w.org.coach);
      const tonight = await publishSession(w, coach, c.day);
      const later = await publishSession(w, coach, c.next);

      const res = await (await w.as(w.org.athlete)).post(`${w.base}/pain-reports`, emergencyReport(athleteId, c.day));
      expect(res.status, JSON.stringify(res.body)).toBe(201);
      expect(res.body).toMatchObject({ route: 'emergency', statusSetToOut: true });

      const clinician = await w.as(w.org.clinician);
      const opened = (await clinician.get(`${w.base}/cases/${res.body.report.caseId}`)).body;
      expect(opened).toMatchObject({ status: 'out', statusEffectiveFrom: c.day, reviewDate: c.day });
      expect((await clinician.get(`${w.base}/athletes/${athleteId}/in-force`)).body).toMatchObject({
        status: 'out',
        statusEffectiveFrom: c.day,
      });
      expect((await clinician.get(`${w.base}/athletes/${athleteId}/in-force?date=${c.day}`)).body.status).toBe('out');

      expect(await heldSessions(h.ds, athleteId)).toEqual([tonight, later].sort());
      const [notice] = await onHoldNotices(h.ds, w.org.id);
      expect(notice).toMatchObject({ recipient_id: w.org.coach.membershipId, title: `${w.org.athlete.name}: 2 sessions on hold` });
      expect(notice.body).toMatch(/^The athlete reported an emergency warning sign and is Out\. /);
      expect(notice.body).toContain(`${humanDate(c.day)}, ${humanDate(c.next)}`);
    });
  }

  it('the status entry in the trail has the same shape as a clinician’s, with the report that caused it', async () => {
    pinClock('2026-06-10T18:00:00-07:00');
    const w = await zonedWorld(h.ds, h.app, 'America/Los_Angeles');
    const res = await (await w.as(w.org.athlete)).post(`${w.base}/pain-reports`, emergencyReport(w.org.athlete.membershipId, '2026-06-09'));
    expect(res.status, JSON.stringify(res.body)).toBe(201);
    const [entry] = await h.ds.query(`SELECT before, after FROM audit_entries WHERE organization_id = $1 AND action = 'status.changed'`, [
      w.org.id,
    ]);
    expect(entry).toEqual({
      before: null,
      after: {
        caseId: res.body.report.caseId,
        status: 'out',
        effectiveFrom: '2026-06-10',
        note: 'Set automatically after an emergency answer in a pain report. Stop training and get urgent medical care.',
        reason: 'emergency red-flag answer',
        painReportId: res.body.report.id,
      },
    });
  });
});
