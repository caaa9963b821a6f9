import { afterEach, beforeAll, describe, expect, it } from 'vitest';
import { dayIn } from '../../../../policies/today';
import { useHarness } from '../../test/harness';
import { pinClock, unpinClock, zonedWorld, type ZonedWorld } from '../../test/worlds/clock-world';
import { AWKWARD_INSTANTS, nextDay } from '../cases/today-rows';

const h = useHarness({ SIGNIN_MAX_PER_IP: '1000' });

const logBody = (athleteId: string, date: string) => ({
  athleteId,
  date,
  durationMinutes: 45,
  sessionRpe: 5,
  painBefore: 1,
  painDuring: 2,
});
const checkInBody = (athleteId: string, date: string) => ({ athleteId, date, sleepHours: 7.5, soreness: 3, readiness: 7, painNow: 1 });

/**
 * A log or a check-in records what happened, so a date after today is refused (common practice) —
 * today being the organization's local day (policies/today.ts), not the UTC day.
 */
describe("logs and check-ins: 'cannot be in the future' means after the organization's today", () => {
  let w: ZonedWorld;
  beforeAll(async () => {
    w = await zonedWorld(h.ds, h.app, 'UTC');
  });
  afterEach(unpinClock);

  it("at 07:30 in Sydney (21:30 UTC the day before) an athlete logs this morning's session and checks in", async () => {
    pinClock('2026-06-11T07:30:00+10:00');
    await w.setZone('Australia/Sydney');
    expect(dayIn('UTC')).toBe('2026-06-10');
    const me = await w.as(w.org.athlete);
    const athleteId = w.org.athlete.membershipId;
    const logged = await me.post(`${w.base}/training-logs`, logBody(athleteId, '2026-06-11'));
    expect(logged.status, JSON.stringify(logged.body)).toBe(201);
    expect(logged.body.log).toMatchObject({ date: '2026-06-11' });
    const checked = await me.post(`${w.base}/check-ins`, checkInBody(athleteId, '2026-06-11'));
    expect(checked.status, JSON.stringify(checked.body)).toBe(200);
    // The default window of the lists ends on the organization's today, so this morning is in it.
    expect((await me.get(`${w.base}/training-logs?athleteId=${athleteId}`)).body.map((l: { date: string }) => l.date)).toContain(
      '2026-06-11',
    );
    const load = (await me.get(`${w.base}/athletes/${athleteId}/workload`)).body;
    expect(load.to).toBe('2026-06-11');
    expect(load.daily.at(-1)).toEqual({ date: '2026-06-11', load: 225 });
  });

  for (const row of AWKWARD_INSTANTS) {
    it(`at ${row.when}: a log or check-in for ${nextDay(row.day)} → 400 naming date; for ${row.day} → accepted`, async () => {
      pinClock(row.instant);
      await w.setZone(row.timeZone);
      expect(dayIn(row.timeZone)).toBe(row.day);
      expect(dayIn('UTC')).not.toBe(row.day);
      const me = await w.as(w.org.athlete);
      const athleteId = w.org.athlete.membershipId;
      for (const [path, body, ok] of [
        ['training-logs', logBody, 201],
        ['check-ins', checkInBody, 200],
      ] as const) {
        const early = await me.post(`${w.base}/${path}`, body(athleteId, nextDay(row.day)));
        expect(early.status, `${path} ${JSON.stringify(early.body)}`).toBe(400);
        expect(early.body.error.fields).toEqual({ date: ['cannot be in the future'] });
        const res = await me.post(`${w.base}/${path}`, body(athleteId, row.day));
        expect(res.status, `${path} ${JSON.stringify(res.body)}`).toBe(ok);
      }
    });
  }
});
