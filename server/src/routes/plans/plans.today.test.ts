import { afterEach, describe, expect, it } from 'vitest';
import { useHarness } from '../../test/harness';
import { pinClock, unpinClock, zonedWorld } from '../../test/worlds/clock-world';
import { twoStages } from '../../test/worlds/plan-world';

const h = useHarness({ SIGNIN_MAX_PER_IP: '1000' });

/** "What is in force today" is the organization's today (policies/today.ts), not the UTC date. */
describe('what is in force with no date given', () => {
  afterEach(unpinClock);

  const rows = [
    // Stage 1 ends on 18 January; stage 2 starts on the 25th.
    {
      when: '23:30 in Los Angeles on stage 1’s last day (07:30 UTC the next day)',
      zone: 'America/Los_Angeles',
      instant: '2026-01-18T23:30:00-08:00',
      day: '2026-01-18',
      labels: ['Protect'],
    },
    {
      when: '00:30 in Sydney on stage 2’s first day (13:30 UTC the day before)',
      zone: 'Australia/Sydney',
      instant: '2026-01-25T00:30:00+11:00',
      day: '2026-01-25',
      labels: ['Build'],
    },
  ];

  for (const row of rows) {
    it(`at ${row.when}: the date is ${row.day} and its stage is in force`, async () => {
      pinClock(row.instant);
      const w = await zonedWorld(h.ds, h.app, row.zone);
      const clinician = await w.as(w.org.clinician);
      const athleteId = w.org.athlete.membershipId;
      const opened = await clinician.post(`${w.base}/cases`, {
        athleteId,
        bodyRegions: ['lower_back'],
        onsetDate: '2026-01-02',
        status: 'limited',
        statusEffectiveFrom: '2026-01-03',
      });
      expect(opened.status, JSON.stringify(opened.body)).toBe(201);
      const plan = await clinician.post(`${w.base}/cases/${opened.body.id}/plan`, { stages: twoStages(), guidance: '' });
      expect(plan.status, JSON.stringify(plan.body)).toBe(201);
      const res = await clinician.get(`${w.base}/athletes/${athleteId}/in-force`);
      expect(res.status).toBe(200);
      expect(res.body).toMatchObject({ date: row.day, restricted: true, status: 'limited' });
      expect(res.body.stages.map((s: { stage: { label: string } }) => s.stage.label)).toEqual(row.labels);
    });
  }
});
