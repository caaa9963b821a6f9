import { randomUUID } from 'node:crypto';
import { beforeAll, describe, expect, it } from 'vitest';
import request from 'supertest';
import { useHarness } from '../../test/harness';
import { fromToday, logBody, logSession, trainingWorld, type World } from '../../test/worlds/training-world';

const h = useHarness({ SIGNIN_MAX_PER_IP: '1000' });
const { world, freshAthlete, noticesAbout, flagsFrom, logsOf } = trainingWorld(h);

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

  it('one rise from week to week → reduce with a weekly-rise flag; a flat week → keep (Silbernagel et al. 2007, AJSM 35:897–906: no rise week to week)', async () => {
    const w = await world();
    const { ref, client } = await freshAthlete(w);
    const first = await logSession(client, w, logBody(ref.membershipId, { date: '2026-05-04', painDuring: 2 }));
    const flat = await logSession(client, w, logBody(ref.membershipId, { date: '2026-05-11', painDuring: 2 }));
    expect([first.painRule.action, flat.painRule.action]).toEqual(['keep', 'keep']);
    const rise = await logSession(client, w, logBody(ref.membershipId, { date: '2026-05-18', painDuring: 3 }));
    expect(rise.painRule.action).toBe('reduce');
    expect(rise.painRule.flags.map((f) => f.kind)).toEqual(['weekly_rise']);
    expect(await flagsFrom(rise.log.id)).toEqual([expect.objectContaining({ kind: 'pain_rule' })]);
  });

  it('a plan stage with pain ceiling 7 in force on the log date: pain 6 → keep; the same pain on a day outside the stage → reduce at 5 (Silbernagel et al. 2007: for the back, the clinician sets the ceiling)', async () => {
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
    // Pain 3 during (fine), 1 before; next morning 3 = 2 above baseline (Silbernagel et al. 2007, AJSM 35:897–906).
    const body = await logSession(
      await w.as('athlete'),
      w,
      logBody(w.org.athlete.membershipId, { date: '2025-10-06', painBefore: 1, painDuring: 3 }),
    );
    expect(body.painRule.action).toBe('keep');
    logId = body.log.id;
    first = await (await w.as('athlete')).post(`${w.base}/training-logs/${logId}/next-morning`, { painNextMorning: 3, version: 1 });
  });

  it('2 above baseline → reduce, flagged, the version moves on (Silbernagel et al. 2007, AJSM 35:897–906)', async () => {
    expect(first.status, JSON.stringify(first.body)).toBe(200);
    expect(first.body.log).toMatchObject({ id: logId, painNextMorning: 3, version: 2 });
    expect(first.body.painRule.action).toBe('reduce');
    expect(first.body.painRule.flags.map((f: { kind: string }) => f.kind)).toEqual(['next_morning_above_baseline']);
    expect(await flagsFrom(logId)).toEqual([expect.objectContaining({ kind: 'pain_rule', suggested_action: 'reduce' })]);
  });

  it('a second next-morning report → 409 conflict; a stale version → 409 version_conflict; the first answer stands (optimistic locking; RFC 9110 §15.5.10 409 Conflict)', async () => {
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

  it('next morning at baseline → keep, no flag (Silbernagel et al. 2007, AJSM 35:897–906)', async () => {
    const athlete = await w.as('athlete');
    const body = await logSession(athlete, w, logBody(w.org.athlete.membershipId, { date: '2025-09-01', painBefore: 2, painDuring: 4 }));
    const res = await athlete.post(`${w.base}/training-logs/${body.log.id}/next-morning`, { painNextMorning: 2, version: 1 });
    expect(res.status).toBe(200);
    expect(res.body.painRule).toMatchObject({ action: 'keep', flags: [] });
    expect(await flagsFrom(body.log.id)).toEqual([]);
  });

  it('coaches may read the log but never record next-morning pain → 403; another athlete → 404 (ASVS 5.0 V8.2.2)', async () => {
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
  it('an athlete logging for another athlete → 404; nothing stored (ASVS 5.0 V8.2.2)', async () => {
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
