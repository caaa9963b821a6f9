import { afterEach, beforeAll, describe, expect, it } from 'vitest';
import { addDays, dayIn } from '../../../../policies/today';
import { useHarness } from '../../test/harness';
import { pinClock, unpinClock, zonedWorld, type ZonedWorld } from '../../test/worlds/clock-world';
import { AWKWARD_INSTANTS, nextDay } from './today-rows';

const h = useHarness({ SIGNIN_MAX_PER_IP: '1000' });

/**
 * Closing lifts a case's limits, so it cannot be dated after today — the organization's today
 * (policies/today.ts), whatever the UTC date is at that instant.
 */
describe("closing a case: 'cannot be in the future' means after the organization's today", () => {
  let w: ZonedWorld;
  beforeAll(async () => {
    w = await zonedWorld(h.ds, h.app, 'UTC');
  });
  afterEach(unpinClock);

  for (const row of AWKWARD_INSTANTS) {
    it(`at ${row.when}: closing on ${nextDay(row.day)} → 400 naming closedOn; on ${row.day} → 200`, async () => {
      pinClock(row.instant);
      await w.setZone(row.timeZone);
      expect(dayIn(row.timeZone)).toBe(row.day);
      expect(dayIn('UTC')).not.toBe(row.day);
      const clinician = await w.as(w.org.clinician);
      const opened = await clinician.post(`${w.base}/cases`, {
        athleteId: w.org.athlete.membershipId,
        bodyRegions: ['lower_back'],
        onsetDate: addDays(row.day, -5),
        status: 'limited',
        statusEffectiveFrom: addDays(row.day, -5),
      });
      expect(opened.status, JSON.stringify(opened.body)).toBe(201);

      const early = await clinician.post(`${w.base}/cases/${opened.body.id}/close`, { closedOn: nextDay(row.day), version: 1 });
      expect(early.status, JSON.stringify(early.body)).toBe(400);
      expect(early.body.error.fields).toEqual({ closedOn: ['cannot be in the future'] });

      const closed = await clinician.post(`${w.base}/cases/${opened.body.id}/close`, { closedOn: row.day, version: 1 });
      expect(closed.status, JSON.stringify(closed.body)).toBe(200);
      expect(closed.body).toMatchObject({ closedOn: row.day });
    });
  }
});
