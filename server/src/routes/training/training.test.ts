import { randomUUID } from 'node:crypto';
import { beforeAll, describe, expect, it } from 'vitest';
import request from 'supertest';
import { todayIso } from '../../../../policies/roles';
import { CareTeamAssignment, GuardianLink } from '../../entities';
import { signedIn, useHarness, type Client } from '../../test/harness';
import { createMember, createOrg, TEST_PASSWORD, type MemberRef, type TestOrg } from '../../test/factories';

const h = useHarness({ SIGNIN_MAX_PER_IP: '1000' });

type Who = 'admin' | 'coach' | 'clinician' | 'athlete' | 'guardian' | 'otherAthlete' | 'otherCoach' | 'otherClinician';

interface World {
  org: TestOrg;
  base: string;
  as: (who: Who) => Promise<Client>;
}

/** One organization for the file; a second care team (otherCoach + otherClinician around otherAthlete). */
async function makeWorld(): Promise<World> {
  const org = await createOrg(h.ds);
  await h.ds.getRepository(CareTeamAssignment).save([
    { organizationId: org.id, athleteId: org.otherAthlete.membershipId, memberId: org.otherClinician.membershipId, role: 'clinician' },
    { organizationId: org.id, athleteId: org.otherAthlete.membershipId, memberId: org.otherCoach.membershipId, role: 'coach' },
  ]);
  const clients = new Map<Who, Promise<Client>>();
  const as = (who: Who) => {
    if (!clients.has(who)) clients.set(who, signedIn(h.app, (org[who] as MemberRef).email, TEST_PASSWORD));
    return clients.get(who)!;
  };
  return { org, base: `/api/orgs/${org.id}`, as };
}
let worldOnce: Promise<World> | null = null;
const world = () => (worldOnce ??= makeWorld());

/** An athlete of their own on the same care team and guardian, signed in: for tests that read the athlete's whole history. */
async function freshAthlete(w: World): Promise<{ ref: MemberRef; client: Client }> {
  const ref = await createMember(h.ds, w.org.id, ['athlete'], { dateOfBirth: '2010-03-14' });
  await h.ds.getRepository(CareTeamAssignment).save([
    { organizationId: w.org.id, athleteId: ref.membershipId, memberId: w.org.coach.membershipId, role: 'coach' },
    { organizationId: w.org.id, athleteId: ref.membershipId, memberId: w.org.clinician.membershipId, role: 'clinician' },
  ]);
  await h.ds
    .getRepository(GuardianLink)
    .save({ organizationId: w.org.id, athleteId: ref.membershipId, guardianId: w.org.guardian.membershipId });
  return { ref, client: await signedIn(h.app, ref.email, TEST_PASSWORD) };
}

const fromToday = (n: number) => {
  const d = new Date(`${todayIso()}T00:00:00Z`);
  d.setUTCDate(d.getUTCDate() + n);
  return d.toISOString().slice(0, 10);
};

const logBody = (athleteId: string, over: Record<string, unknown> = {}) => ({
  athleteId,
  date: '2026-02-02',
  durationMinutes: 60,
  sessionRpe: 5,
  painBefore: 1,
  painDuring: 3,
  ...over,
});

async function logSession(c: Client, w: World, body: Record<string, unknown>) {
  const res = await c.post(`${w.base}/training-logs`, body);
  expect(res.status, JSON.stringify(res.body)).toBe(201);
  return res.body as {
    log: { id: string; version: number; painCeiling: number; sessionLoad: number };
    painRule: { action: string; flags: { kind: string }[]; athleteMessage: string };
  };
}

async function noticesAbout(athleteId: string): Promise<Record<string, string[]>> {
  const rows: { recipient_id: string; kind: string }[] = await h.ds.query(
    'SELECT recipient_id, kind FROM notifications WHERE athlete_id = $1 ORDER BY kind',
    [athleteId],
  );
  const out: Record<string, string[]> = {};
  for (const r of rows) (out[r.recipient_id] ??= []).push(r.kind);
  return out;
}
const flagsFrom = async (logId: string): Promise<{ kind: string; severity: string; suggested_action: string | null }[]> =>
  h.ds.query('SELECT kind, severity, suggested_action FROM flags WHERE source_id = $1', [logId]);
const logsOf = async (athleteId: string): Promise<number> =>
  Number((await h.ds.query('SELECT count(*) FROM training_logs WHERE athlete_id = $1', [athleteId]))[0].count);

describe('logging a session', () => {
  it('→ 201 with session load = RPE × minutes (Foster et al. 2001, JSCR 15:109–115: 6 × 75 = 450 AU); pain 3 ≤ 5 → keep; audited', async () => {
    const w = await world();
    const rid = `test-${randomUUID()}`;
    const res = await (
      await w.as('athlete')
    )
      .post(
        `${w.base}/training-logs`,
        logBody(w.org.athlete.membershipId, { date: '2025-11-03', sessionRpe: 6, durationMinutes: 75, painDuring: 3, notes: 'Felt fine' }),
      )
      .set('x-request-id', rid);
    expect(res.status, JSON.stringify(res.body)).toBe(201);
    expect(res.body.log).toMatchObject({
      athleteId: w.org.athlete.membershipId,
      date: '2025-11-03',
      sessionRpe: 6,
      durationMinutes: 75,
      sessionLoad: 450,
      painCeiling: 5,
      painNextMorning: null,
      version: 1,
      sets: [],
    });
    expect(res.body.painRule).toMatchObject({ action: 'keep', flags: [] });
    expect(await flagsFrom(res.body.log.id)).toEqual([]);
    const audit = await h.ds.query('SELECT action, subject_id, athlete_id FROM audit_entries WHERE request_id = $1', [rid]);
    expect(audit).toEqual([{ action: 'training_log.created', subject_id: res.body.log.id, athlete_id: w.org.athlete.membershipId }]);
  });

  it('pain during 6 with no plan (ceiling 5) → reduce, a pain_rule flag, one notice each to the clinician and coach (Silbernagel et al. 2007, AJSM 35:897–906)', async () => {
    const w = await world();
    const { ref, client } = await freshAthlete(w);
    const body = await logSession(client, w, logBody(ref.membershipId, { date: '2026-03-02', painDuring: 6 }));
    expect(body.log.painCeiling).toBe(5);
    expect(body.painRule.action).toBe('reduce');
    expect(body.painRule.flags.map((f) => f.kind)).toEqual(['during_over_ceiling']);
    expect(body.painRule.athleteMessage).toMatch(/^Stop the set/);
    expect(await flagsFrom(body.log.id)).toEqual([{ kind: 'pain_rule', severity: 'routine', suggested_action: 'reduce' }]);
    expect(await noticesAbout(ref.membershipId)).toEqual({
      [w.org.clinician.membershipId]: ['pain_rule'],
      [w.org.coach.membershipId]: ['pain_rule'],
    });
  });

  it('three weeks of rising pain → reduce with a rising trend; two weeks are not a trend (common practice reading of Silbernagel et al. 2007)', async () => {
    const w = await world();
    const { ref, client } = await freshAthlete(w);
    const first = await logSession(client, w, logBody(ref.membershipId, { date: '2026-05-04', painDuring: 1 }));
    const second = await logSession(client, w, logBody(ref.membershipId, { date: '2026-05-11', painDuring: 2 }));
    expect([first.painRule.action, second.painRule.action]).toEqual(['keep', 'keep']);
    const third = await logSession(client, w, logBody(ref.membershipId, { date: '2026-05-18', painDuring: 3 }));
    expect(third.painRule.action).toBe('reduce');
    expect(third.painRule.flags.map((f) => f.kind)).toEqual(['rising_trend']);
    expect(await flagsFrom(third.log.id)).toEqual([expect.objectContaining({ kind: 'pain_rule' })]);
  });

  it('a plan stage with pain ceiling 7 in force on the log date: pain 6 → keep; the same pain on a day outside the stage → reduce at 5 (REFERENCES §6: the clinician sets the ceiling)', async () => {
    const w = await world();
    const { ref, client } = await freshAthlete(w);
    const clin = await w.as('clinician');
    const opened = await clin.post(`${w.base}/cases`, {
      athleteId: ref.membershipId,
      bodyRegions: ['lower_back'],
      onsetDate: '2026-02-20',
      status: 'limited',
      statusEffectiveFrom: '2026-02-20',
    });
    expect(opened.status, JSON.stringify(opened.body)).toBe(201);
    const plan = await clin.post(`${w.base}/cases/${opened.body.id}/plan`, {
      stages: [
        {
          id: randomUUID(),
          startDate: '2026-03-01',
          endDate: '2026-03-31',
          painCeiling: 7,
          patterns: { hinge: { mode: 'capped', caps: { maxRpe: 7 } } },
        },
      ],
    });
    expect(plan.status, JSON.stringify(plan.body)).toBe(201);

    const inStage = await logSession(client, w, logBody(ref.membershipId, { date: '2026-03-10', painDuring: 6 }));
    expect(inStage.log.painCeiling).toBe(7);
    expect(inStage.painRule).toMatchObject({ action: 'keep', flags: [] });
    expect(await flagsFrom(inStage.log.id)).toEqual([]);

    const over = await logSession(client, w, logBody(ref.membershipId, { date: '2026-03-11', painDuring: 8 }));
    expect(over.painRule.athleteMessage).toContain('7/10');

    const beforeStage = await logSession(client, w, logBody(ref.membershipId, { date: '2026-02-25', painDuring: 6 }));
    expect(beforeStage.log.painCeiling).toBe(5);
    expect(beforeStage.painRule.action).toBe('reduce');
  });
});

describe('next-morning pain (Silbernagel et al. 2007: settled by next morning, not above the pre-session level)', () => {
  let w: World;
  let logId: string;
  let first: request.Response;

  beforeAll(async () => {
    w = await world();
    // Pain 3 during (fine), 1 before; next morning 3 = 2 above baseline (REFERENCES §6 check 3).
    const body = await logSession(
      await w.as('athlete'),
      w,
      logBody(w.org.athlete.membershipId, { date: '2025-10-06', painBefore: 1, painDuring: 3 }),
    );
    expect(body.painRule.action).toBe('keep');
    logId = body.log.id;
    first = await (await w.as('athlete')).post(`${w.base}/training-logs/${logId}/next-morning`, { painNextMorning: 3, version: 1 });
  });

  it('2 above baseline → reduce, flagged, the version moves on (REFERENCES §6 check 3)', async () => {
    expect(first.status, JSON.stringify(first.body)).toBe(200);
    expect(first.body.log).toMatchObject({ id: logId, painNextMorning: 3, version: 2 });
    expect(first.body.painRule.action).toBe('reduce');
    expect(first.body.painRule.flags.map((f: { kind: string }) => f.kind)).toEqual(['next_morning_above_baseline']);
    expect(await flagsFrom(logId)).toEqual([expect.objectContaining({ kind: 'pain_rule', suggested_action: 'reduce' })]);
  });

  it('a second next-morning report → 409 conflict; a stale version → 409 version_conflict; the first answer stands (SECURITY item 32)', async () => {
    const athlete = await w.as('athlete');
    const again = await athlete.post(`${w.base}/training-logs/${logId}/next-morning`, { painNextMorning: 0, version: 2 });
    expect(again.status).toBe(409);
    expect(again.body.error.code).toBe('conflict');
    const stale = await athlete.post(`${w.base}/training-logs/${logId}/next-morning`, { painNextMorning: 0, version: 1 });
    expect(stale.status).toBe(409);
    expect(stale.body.error.code).toBe('version_conflict');
    const row = (await h.ds.query('SELECT pain_next_morning, version FROM training_logs WHERE id = $1', [logId]))[0];
    expect(row).toEqual({ pain_next_morning: 3, version: 2 });
    expect(await flagsFrom(logId)).toHaveLength(1);
  });

  it('next morning at baseline → keep, no flag (REFERENCES §6 check 1)', async () => {
    const athlete = await w.as('athlete');
    const body = await logSession(athlete, w, logBody(w.org.athlete.membershipId, { date: '2025-09-01', painBefore: 2, painDuring: 4 }));
    const res = await athlete.post(`${w.base}/training-logs/${body.log.id}/next-morning`, { painNextMorning: 2, version: 1 });
    expect(res.status).toBe(200);
    expect(res.body.painRule).toMatchObject({ action: 'keep', flags: [] });
    expect(await flagsFrom(body.log.id)).toEqual([]);
  });

  it('coaches may read the log but never record next-morning pain → 403; another athlete → 404 (SECURITY item 14)', async () => {
    const body = await logSession(await w.as('athlete'), w, logBody(w.org.athlete.membershipId, { date: '2025-08-04' }));
    const url = `${w.base}/training-logs/${body.log.id}/next-morning`;
    for (const who of ['coach', 'otherCoach'] as const) {
      const res = await (await w.as(who)).post(url, { painNextMorning: 5, version: 1 });
      expect(res.status, who).toBe(403);
    }
    const other = await (await w.as('otherAthlete')).post(url, { painNextMorning: 5, version: 1 });
    expect(other.status).toBe(404);
    expect(other.body.error.code).toBe('not_found');
    expect((await h.ds.query('SELECT pain_next_morning FROM training_logs WHERE id = $1', [body.log.id]))[0].pain_next_morning).toBeNull();
  });
});

describe('who may log, and what is refused', () => {
  it('an athlete logging for another athlete → 404; nothing stored (SECURITY item 14)', async () => {
    const w = await world();
    const res = await (await w.as('athlete')).post(`${w.base}/training-logs`, logBody(w.org.otherAthlete.membershipId));
    expect(res.status).toBe(404);
    expect(await logsOf(w.org.otherAthlete.membershipId)).toBe(0);
  });

  it.each(['coach', 'clinician'] as const)('%s cannot log for the athlete → 403', async (who) => {
    const w = await world();
    const before = await logsOf(w.org.athlete.membershipId);
    const res = await (await w.as(who)).post(`${w.base}/training-logs`, logBody(w.org.athlete.membershipId));
    expect(res.status).toBe(403);
    expect(await logsOf(w.org.athlete.membershipId)).toBe(before);
  });

  it('a future date → 400 naming `date`; nothing stored (common practice: a log records what happened)', async () => {
    const w = await world();
    const before = await logsOf(w.org.athlete.membershipId);
    const res = await (await w.as('athlete')).post(`${w.base}/training-logs`, logBody(w.org.athlete.membershipId, { date: fromToday(1) }));
    expect(res.status).toBe(400);
    expect(res.body.error.fields).toEqual({ date: ['cannot be in the future'] });
    expect(await logsOf(w.org.athlete.membershipId)).toBe(before);
  });

  it('session RPE 11 → 400 naming `sessionRpe` (Foster et al. 2001: CR-10 is 0–10)', async () => {
    const w = await world();
    const res = await (await w.as('athlete')).post(`${w.base}/training-logs`, logBody(w.org.athlete.membershipId, { sessionRpe: 11 }));
    expect(res.status).toBe(400);
    expect(Object.keys(res.body.error.fields)).toEqual(['sessionRpe']);
  });

  it('the coach lists the team athlete’s logs; another care team, the guardian and the admin do not (policies/access/athlete-reports.ts)', async () => {
    const w = await world();
    await logSession(await w.as('athlete'), w, logBody(w.org.athlete.membershipId, { date: fromToday(-3) }));
    const q = `${w.base}/training-logs?athleteId=${w.org.athlete.membershipId}`;
    const mine = await (await w.as('coach')).get(q);
    expect(mine.status).toBe(200);
    expect(mine.body.length).toBeGreaterThan(0);
    expect((await (await w.as('otherCoach')).get(q)).body).toEqual([]);
    expect((await (await w.as('guardian')).get(q)).status).toBe(403);
    expect((await (await w.as('admin')).get(q)).status).toBe(403);
    expect((await request(h.app).get(q)).status).toBe(401);
  });
});

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

describe("workload from Foster's week (Foster 1998, MSSE 30:1164–1168; Foster et al. 2001; REFERENCES §4)", () => {
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

  it('the week totals 2100 AU with monotony 1.44 and strain 3018 (population SD; REFERENCES §4)', async () => {
    const res = await athlete.get(path('to=2026-01-11&days=14'));
    expect(res.status, JSON.stringify(res.body)).toBe(200);
    expect(res.body.daily.slice(-7).map((d: { load: number }) => d.load)).toEqual([300, 450, 0, 400, 350, 600, 0]);
    const last = res.body.weeks.at(-1);
    expect(last).toMatchObject({ start: '2026-01-05', end: '2026-01-11', total: 2100 });
    expect(last.monotony).toBeCloseTo(1.44, 2);
    expect(last.strain).toBeCloseTo(3018, 0);
    // The week before has no training: SD 0, monotony undefined (REFERENCES §4).
    expect(res.body.weeks[0]).toMatchObject({ total: 0, monotony: null, strain: null });
  });

  it('acute:chronic is hidden under 28 days of data, and the description says there is not enough history (REFERENCES §5)', async () => {
    const res = await athlete.get(path('to=2026-01-11&days=14'));
    expect(res.body.acuteChronic).toMatchObject({ ratio: null, daysOfData: 7 });
    expect(res.body.acuteChronic.description).toMatch(/not enough training history/i);
    expect(res.body.acuteChronic.description).not.toMatch(/risk/i);
  });

  it('day 27 still hidden; on day 28 the ratio appears as acute / chronic (Williams et al. 2017, BJSM 51:209; REFERENCES §5)', async () => {
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

  it('the care-team coach reads it; another team’s coach or clinician → 404; guardian and admin → 403; signed out → 401 (SECURITY item 14)', async () => {
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
