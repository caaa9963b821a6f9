import { beforeAll, describe, expect, it } from 'vitest';
import request from 'supertest';
import { useHarness, type Client } from '../../test/harness';
import { fromToday, logBody, logSession, trainingWorld, type World } from '../../test/worlds/training-world';

const h = useHarness({ SIGNIN_MAX_PER_IP: '1000' });
const { world, freshAthlete } = trainingWorld(h);

describe('daily check-in', () => {
  it('the same day twice → one row holding the latest values; audited each time', async () => {
    const w = await world();
    const athlete = await w.as('athlete');
    const date = fromToday(0);
    const a = await athlete.post(`${w.base}/check-ins`, {
      athleteId: w.org.athlete.membershipId,
      date,
      sleepHours: 6,
      soreness: 5,
      readiness: 4,
      painNow: 3,
    });
    expect(a.status, JSON.stringify(a.body)).toBe(200);
    const b = await athlete.post(`${w.base}/check-ins`, {
      athleteId: w.org.athlete.membershipId,
      date,
      sleepHours: 8.5,
      soreness: 2,
      readiness: 8,
      painNow: 1,
    });
    expect(b.status, JSON.stringify(b.body)).toBe(200);
    expect(b.body).toMatchObject({ id: a.body.id, date, sleepHours: 8.5, soreness: 2, readiness: 8, painNow: 1 });
    const rows = await h.ds.query(
      'SELECT sleep_hours::float AS sleep, soreness, readiness, pain_now FROM check_ins WHERE athlete_id = $1 AND date = $2',
      [w.org.athlete.membershipId, date],
    );
    expect(rows).toEqual([{ sleep: 8.5, soreness: 2, readiness: 8, pain_now: 1 }]);
    const audits = await h.ds.query(`SELECT count(*)::int AS n FROM audit_entries WHERE action = 'check_in.recorded' AND subject_id = $1`, [
      a.body.id,
    ]);
    expect(audits[0].n).toBe(2);
    const list = await (await w.as('coach')).get(`${w.base}/check-ins?athleteId=${w.org.athlete.membershipId}`);
    expect(list.body.filter((c: { date: string }) => c.date === date)).toEqual([
      expect.objectContaining({ sleepHours: 8.5, readiness: 8 }),
    ]);
  });

  it('a future check-in → 400 naming `date`; the guardian and another care team read none (403 / empty)', async () => {
    const w = await world();
    const res = await (
      await w.as('athlete')
    ).post(`${w.base}/check-ins`, {
      athleteId: w.org.athlete.membershipId,
      date: fromToday(1),
      sleepHours: 7,
      soreness: 1,
      readiness: 9,
      painNow: 0,
    });
    expect(res.status).toBe(400);
    expect(Object.keys(res.body.error.fields)).toEqual(['date']);
    const q = `${w.base}/check-ins?athleteId=${w.org.athlete.membershipId}`;
    expect((await (await w.as('guardian')).get(q)).status).toBe(403);
    expect((await (await w.as('otherClinician')).get(q)).body).toEqual([]);
  });
});

describe("workload from Foster's week (Foster 1998, MSSE 30:1164–1168; Foster et al. 2001)", () => {
  let w: World;
  let athleteId: string;
  let athlete: Client;
  const path = (q: string) => `${w.base}/athletes/${athleteId}/workload?${q}`;

  beforeAll(async () => {
    w = await world();
    const fresh = await freshAthlete(w);
    athleteId = fresh.ref.membershipId;
    athlete = fresh.client;
    // Monday 5 January 2026 to Sunday 11 January: Wednesday and Sunday are rest days (not logged).
    const week: [string, number, number, object[]][] = [
      [
        '2026-01-05',
        5,
        60,
        [
          { exercise: 'Back squat', loadKg: 90, reps: 5 },
          { exercise: 'Back squat', loadKg: 100, reps: 5 },
          { exercise: 'Deadlift', loadKg: 60, reps: 15 },
        ],
      ],
      ['2026-01-06', 6, 75, [{ exercise: 'Bench press', loadKg: 100, reps: 5, rpe: 8 }]],
      ['2026-01-08', 5, 80, []],
      ['2026-01-09', 7, 50, []],
      ['2026-01-10', 8, 75, []],
    ];
    for (const [date, sessionRpe, durationMinutes, sets] of week) {
      await logSession(athlete, w, logBody(athleteId, { date, sessionRpe, durationMinutes, sets, painBefore: 0, painDuring: 2 }));
    }
  });

  it('the week totals 2100 AU with monotony 1.44 and strain 3018 (population SD; Foster 1998)', async () => {
    const res = await athlete.get(path('to=2026-01-11&days=14'));
    expect(res.status, JSON.stringify(res.body)).toBe(200);
    expect(res.body.daily.slice(-7).map((d: { load: number }) => d.load)).toEqual([300, 450, 0, 400, 350, 600, 0]);
    const last = res.body.weeks.at(-1);
    expect(last).toMatchObject({ start: '2026-01-05', end: '2026-01-11', total: 2100 });
    expect(last.monotony).toBeCloseTo(1.44, 2);
    expect(last.strain).toBeCloseTo(3018, 0);
    // The week before has no training: SD 0, monotony undefined (Foster 1998).
    expect(res.body.weeks[0]).toMatchObject({ total: 0, monotony: null, strain: null });
  });

  it('acute:chronic is hidden under 28 days of data, and the description says there is not enough history (Williams et al. 2017, BJSM 51:209)', async () => {
    const res = await athlete.get(path('to=2026-01-11&days=14'));
    expect(res.body.acuteChronic).toMatchObject({ ratio: null, daysOfData: 7 });
    expect(res.body.acuteChronic.description).toMatch(/not enough training history/i);
    expect(res.body.acuteChronic.description).not.toMatch(/risk/i);
  });

  it('day 27 still hidden; on day 28 the ratio appears as acute / chronic (Williams et al. 2017, BJSM 51:209)', async () => {
    const day27 = (await athlete.get(path('to=2026-01-31&days=28'))).body.acuteChronic;
    expect(day27).toMatchObject({ ratio: null, daysOfData: 27 });
    const day28 = (await athlete.get(path('to=2026-02-01&days=28'))).body.acuteChronic;
    expect(day28.daysOfData).toBe(28);
    expect(day28.ratio).not.toBeNull();
    expect(day28.ratio).toBeCloseTo(day28.acute / day28.chronic, 10);
    expect(day28.description).not.toMatch(/not enough/i);
    expect(day28.description).not.toMatch(/risk/i);
  });

  it('e1RM: 100 kg × 5 → 116.7 (Epley, from memory), the best set of the day; 60 kg × 15 → 90.0 marked low reliability (Reynolds et al. 2006, JSCR 20:584–592); 100 kg × 5 @ RPE 8 → 123.3 (common practice RIR adjustment)', async () => {
    const { e1rm } = (await athlete.get(path('to=2026-01-11&days=14'))).body;
    const find = (exercise: string) => e1rm.filter((e: { exercise: string }) => e.exercise === exercise);
    expect(find('Back squat')).toEqual([{ exercise: 'Back squat', date: '2026-01-05', value: 116.7, lowReliability: false }]);
    expect(find('Deadlift')).toEqual([{ exercise: 'Deadlift', date: '2026-01-05', value: 90, lowReliability: true }]);
    expect(find('Bench press')).toEqual([{ exercise: 'Bench press', date: '2026-01-06', value: 123.3, lowReliability: false }]);
  });

  it('pain against load lists each session with its ceiling (Silbernagel et al. 2007)', async () => {
    const { pain } = (await athlete.get(path('to=2026-01-11&days=14'))).body;
    expect(pain.map((p: { date: string; load: number; ceiling: number }) => [p.date, p.load, p.ceiling])).toEqual([
      ['2026-01-05', 300, 5],
      ['2026-01-06', 450, 5],
      ['2026-01-08', 400, 5],
      ['2026-01-09', 350, 5],
      ['2026-01-10', 600, 5],
    ]);
  });

  it('the care-team coach reads it; another team’s coach or clinician → 404; guardian and admin → 403; signed out → 401 (ASVS 5.0 V8.2.2)', async () => {
    expect((await (await w.as('coach')).get(path('to=2026-01-11&days=7'))).body.weeks[0].total).toBe(2100);
    for (const who of ['otherCoach', 'otherClinician'] as const) {
      const res = await (await w.as(who)).get(path('to=2026-01-11&days=7'));
      expect(res.status, who).toBe(404);
      expect(JSON.stringify(res.body)).not.toContain('2100');
    }
    for (const who of ['guardian', 'admin'] as const) expect((await (await w.as(who)).get(path('days=7'))).status, who).toBe(403);
    expect((await request(h.app).get(path('days=7'))).status).toBe(401);
    // The factory athlete reading this athlete's workload: not theirs.
    expect((await (await w.as('athlete')).get(path('days=7'))).status).toBe(404);
  });
});
