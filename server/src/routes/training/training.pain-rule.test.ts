import { afterEach, describe, expect, it } from 'vitest';
import { dayIn } from '../../../../policies/today';
import { useHarness } from '../../test/harness';
import { pinClock, unpinClock, zonedWorld, type ZonedWorld } from '../../test/worlds/clock-world';

const h = useHarness({ SIGNIN_MAX_PER_IP: '1000' });
afterEach(unpinClock);

// Los Angeles in January is UTC−8: 23:30 on the 14th there is already 07:30 on the 15th in UTC, so a
// server reading the UTC day would wrongly treat it as "the next morning".
const LA = 'America/Los_Angeles';
const LATE_EVENING = '2026-01-14T23:30:00-08:00';
const NEXT_MORNING = '2026-01-15T06:00:00-08:00';
const SESSION_DAY = '2026-01-14';

const log = (athleteId: string, over: Record<string, unknown> = {}) => ({
  athleteId,
  date: SESSION_DAY,
  durationMinutes: 60,
  sessionRpe: 5,
  painBefore: 1,
  painDuring: 3,
  ...over,
});

async function laWorld(): Promise<ZonedWorld> {
  return zonedWorld(h.ds, h.app, LA);
}

async function logAt(w: ZonedWorld, instant: string, over: Record<string, unknown> = {}) {
  pinClock(instant);
  const athlete = await w.as(w.org.athlete);
  const res = await athlete.post(`${w.base}/training-logs`, log(w.org.athlete.membershipId, over));
  expect(res.status, JSON.stringify(res.body)).toBe(201);
  return res.body as { log: { id: string; version: number }; painRule: { action: string; flags: { kind: string }[] } };
}

const flagsFrom = async (logId: string): Promise<{ message: string }[]> =>
  h.ds.query(`SELECT message FROM flags WHERE source_id = $1 ORDER BY created_at`, [logId]);

const noticesFor = async (w: ZonedWorld, athleteId: string) => {
  const rows: { recipient_id: string; body: string }[] = await h.ds.query(
    `SELECT recipient_id, body FROM notifications WHERE athlete_id = $1 AND kind = 'pain_rule' ORDER BY created_at`,
    [athleteId],
  );
  return {
    clinician: rows.filter((r) => r.recipient_id === w.org.clinician.membershipId).map((r) => r.body),
    coach: rows.filter((r) => r.recipient_id === w.org.coach.membershipId).map((r) => r.body),
  };
};

describe("next-morning pain is the next calendar day's question in the organization's zone (policies/today.ts)", () => {
  it('Los Angeles, 23:30 on the session day → 422 naming painNextMorning, nothing stored; 06:00 the next local day → 200 (Silbernagel et al. 2007: settled by next morning)', async () => {
    const w = await laWorld();
    const { log: saved } = await logAt(w, LATE_EVENING);
    expect(dayIn(LA)).toBe(SESSION_DAY);
    expect(dayIn('UTC')).toBe('2026-01-15');

    const early = await (
      await w.as(w.org.athlete)
    ).post(`${w.base}/training-logs/${saved.id}/next-morning`, { painNextMorning: 1, version: 1 });
    expect(early.status, JSON.stringify(early.body)).toBe(422);
    expect(early.body.error.code).toBe('unprocessable');
    expect(early.body.error.fields).toEqual({ painNextMorning: ['can be recorded from Thu 15 Jan 2026, the morning after the session'] });
    expect((await h.ds.query('SELECT pain_next_morning, version FROM training_logs WHERE id = $1', [saved.id]))[0]).toEqual({
      pain_next_morning: null,
      version: 1,
    });

    pinClock(NEXT_MORNING);
    const morning = await (
      await w.as(w.org.athlete)
    ).post(`${w.base}/training-logs/${saved.id}/next-morning`, {
      painNextMorning: 1,
      version: 1,
    });
    expect(morning.status, JSON.stringify(morning.body)).toBe(200);
    expect(morning.body.log).toMatchObject({ painNextMorning: 1, version: 2 });
    expect(morning.body.painRule).toMatchObject({ action: 'keep', flags: [] });
  });
});

describe('pain after the session, that evening (Silbernagel et al. 2007, AJSM 35:897–906: ≤ ceiling and settled by next morning)', () => {
  it('given with the log: 6 over the ceiling of 5 → reduce, one flag; the clinician reads why, the coach the action without the account', async () => {
    const w = await laWorld();
    const { log: saved, painRule } = await logAt(w, LATE_EVENING, { painAfter: 6, painDuring: 2 });
    expect(painRule.action).toBe('reduce');
    expect(painRule.flags.map((f) => f.kind)).toEqual(['after_over_ceiling']);
    const flags = await flagsFrom(saved.id);
    expect(flags).toHaveLength(1);
    expect(flags[0].message).toContain('Pain after the session (that evening) was 6/10, above the ceiling of 5.');
    const notices = await noticesFor(w, w.org.athlete.membershipId);
    expect(notices.clinician).toEqual([expect.stringContaining('was 6/10, above the ceiling of 5')]);
    expect(notices.coach).toEqual([expect.stringContaining('reduce the next session (pain after the session above the ceiling)')]);
    expect(notices.coach[0]).not.toContain('6/10');
  });

  it('added later the same local day → 200 and judged; a second time → 409; the next local day → 422 naming painAfter; coaches → 403 (ASVS 5.0 V8.2.2)', async () => {
    const w = await laWorld();
    const { log: saved } = await logAt(w, '2026-01-14T17:00:00-08:00');
    const url = `${w.base}/training-logs/${saved.id}/after`;

    pinClock(LATE_EVENING);
    const coach = await (await w.as(w.org.coach)).post(url, { painAfter: 4, version: 1 });
    expect(coach.status).toBe(403);
    const evening = await (await w.as(w.org.athlete)).post(url, { painAfter: 4, version: 1 });
    expect(evening.status, JSON.stringify(evening.body)).toBe(200);
    expect(evening.body.log).toMatchObject({ painAfter: 4, version: 2 });
    expect(evening.body.painRule).toMatchObject({ action: 'keep', flags: [] });
    const again = await (await w.as(w.org.athlete)).post(url, { painAfter: 2, version: 2 });
    expect(again.status).toBe(409);
    expect(again.body.error.code).toBe('conflict');

    const second = await logAt(w, '2026-01-14T18:00:00-08:00');
    pinClock(NEXT_MORNING);
    const late = await (await w.as(w.org.athlete)).post(`${w.base}/training-logs/${second.log.id}/after`, { painAfter: 3, version: 1 });
    expect(late.status, JSON.stringify(late.body)).toBe(422);
    expect(late.body.error.fields).toEqual({ painAfter: ['can be recorded only on Wed 14 Jan 2026, the day of the session'] });
  });

  it('worked sequence: before 1, during 3, evening 5, next morning 3 → not settled by the next morning, one flag (Silbernagel et al. 2007)', async () => {
    const w = await laWorld();
    const { log: saved, painRule } = await logAt(w, LATE_EVENING, { painBefore: 1, painDuring: 3, painAfter: 5 });
    expect(painRule).toMatchObject({ action: 'keep', flags: [] });
    pinClock(NEXT_MORNING);
    const res = await (
      await w.as(w.org.athlete)
    ).post(`${w.base}/training-logs/${saved.id}/next-morning`, { painNextMorning: 3, version: 1 });
    expect(res.status, JSON.stringify(res.body)).toBe(200);
    expect(res.body.painRule.flags).toEqual([
      {
        kind: 'not_settled_next_morning',
        message: 'Pain after the session (5/10 that evening) had not settled by the next morning: 3/10, above the 1/10 before the session.',
      },
    ]);
    expect(await flagsFrom(saved.id)).toHaveLength(1);
  });

  it('an evening already flagged over the ceiling is not flagged again at the next morning (Silbernagel et al. 2007)', async () => {
    const w = await laWorld();
    const { log: saved } = await logAt(w, LATE_EVENING, { painBefore: 2, painAfter: 7 });
    pinClock(NEXT_MORNING);
    const res = await (
      await w.as(w.org.athlete)
    ).post(`${w.base}/training-logs/${saved.id}/next-morning`, { painNextMorning: 2, version: 1 });
    expect(res.body.painRule).toMatchObject({ action: 'keep', flags: [] });
    expect(await flagsFrom(saved.id)).toHaveLength(1);
  });

  it('painAfter 11 → 400 naming painAfter, nothing stored (0–10 numeric rating scale)', async () => {
    const w = await laWorld();
    pinClock(LATE_EVENING);
    const res = await (await w.as(w.org.athlete)).post(`${w.base}/training-logs`, log(w.org.athlete.membershipId, { painAfter: 11 }));
    expect(res.status).toBe(400);
    expect(Object.keys(res.body.error.fields)).toEqual(['painAfter']);
  });
});
