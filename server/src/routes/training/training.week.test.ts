import { randomUUID } from 'node:crypto';
import { beforeAll, describe, expect, it } from 'vitest';
import { signedIn, useHarness, type Client } from '../../test/harness';
import { TEST_PASSWORD } from '../../test/factories';
import { addDays, content, pinClock, programWorld, TODAY } from '../../test/worlds/test-world';

// The athlete's week looks ahead and logs from the plan; and logged sets over a limit.
const h = useHarness({ SIGNIN_MAX_PER_IP: '1000' });
pinClock();

const day = (n: number) => addDays(TODAY, n);
const logBody = (athleteId: string, over: Record<string, unknown>) => ({
  athleteId,
  date: TODAY,
  durationMinutes: 50,
  sessionRpe: 5,
  painBefore: 1,
  painDuring: 2,
  ...over,
});

describe('the athlete week and logging from the plan', () => {
  let w: Awaited<ReturnType<typeof programWorld>>;
  let me: Client;
  let deadlift: string;
  let tomorrow: { id: string };
  let today: { id: string };

  beforeAll(async () => {
    w = await programWorld(h);
    deadlift = w.ex('Deadlift');
    // A case with one stage from three days ago to the day after tomorrow: the rest of the week is under no stage.
    const c = await w.clinician.post(`${w.base}/cases`, {
      athleteId: w.athlete,
      bodyRegions: ['lower_back'],
      onsetDate: day(-3),
      status: 'limited',
      statusEffectiveFrom: day(-3),
    });
    expect(c.status, JSON.stringify(c.body)).toBe(201);
    const stages = [
      {
        id: randomUUID(),
        startDate: day(-3),
        endDate: day(2),
        painCeiling: 3,
        patterns: { hinge: { mode: 'capped', caps: { maxLoadKg: 45, maxRpe: 7 } }, jump: { mode: 'blocked' } },
      },
    ];
    const p = await w.clinician.post(`${w.base}/cases/${c.body.id}/plan`, { stages, guidance: '' });
    expect(p.status, JSON.stringify(p.body)).toBe(201);
    const program = await w.program();
    const make = async (date: string, title: string) => {
      const s = await w.session(program.id, date, content(deadlift, [{ kg: 40 }, { kg: 40 }]), title);
      const published = await w.publish(s.id, s.version);
      expect(published.status, JSON.stringify(published.body)).toBe(200);
      return s;
    };
    today = await make(TODAY, 'Hinge day');
    tomorrow = await make(day(1), 'Pull day');
    await make(day(4), 'After the stage');
    // The athlete reads pounds.
    await h.ds.query(`UPDATE users SET unit_pref = 'lb' WHERE id = $1`, [w.org.athlete.userId]);
    me = await signedIn(h.app, w.org.athlete.email, TEST_PASSWORD);
  });

  it("GET /athletes/:id/week: seven days from the organization's today, each with its sessions and its limits in the athlete's words", async () => {
    const res = await me.get(`${w.base}/athletes/${w.athlete}/week`);
    expect(res.status, JSON.stringify(res.body)).toBe(200);
    const days = res.body.days as {
      date: string;
      status: string;
      stages: unknown[];
      limits: { headline: string; mayNot: string[]; withLimits: string[]; pain: string | null };
      sessions: { id: string; title: string; exerciseNames: Record<string, string>; loadsKg: Record<string, number> }[];
    }[];
    expect(res.body).toMatchObject({ from: TODAY, to: day(6), unit: 'lb' });
    expect(days.map((d) => d.date)).toEqual([0, 1, 2, 3, 4, 5, 6].map(day));
    expect(days.map((d) => d.sessions.map((s) => s.title))).toEqual([['Hinge day'], ['Pull day'], [], [], ['After the stage'], [], []]);
    expect(days[1].sessions[0].exerciseNames[deadlift]).toBe('Deadlift');

    // Under the stage: 45 kg = 99.2 lb, shown as a load on the bar, 95 lb (NIST SP 811; 5-lb steps, common practice).
    const under = days[2];
    expect(under.stages).toHaveLength(1);
    expect(under.limits.withLimits).toEqual([
      'lifting from the floor and bending at the hips (hinge): up to 95 lb, effort RPE 7 or easier',
    ]);
    expect(under.limits.mayNot).toEqual(['jumping and landing (jump / landing)']);
    expect(under.limits.pain).toBe('Stop and tell your clinician if pain goes past 3/10.');
    expect(JSON.stringify(under.limits)).not.toContain('99.2');

    // The day after the stage ends: no movement limits, still Limited (the case is open), no sessions.
    const after = days[3];
    expect(after).toMatchObject({ date: day(3), status: 'limited', stages: [], sessions: [] });
    expect(after.limits).toMatchObject({ mayNot: [], withLimits: [], pain: null });
    expect(after.limits.headline).toBe('No movement limits, but follow what your clinician told you.');
  });

  it("ASVS 5.0 V8.2.2: another organization's coach → 404; another athlete may not read this athlete's week", async () => {
    const other = await programWorld(h);
    expect((await other.coach.get(`${w.base}/athletes/${w.athlete}/week`)).status).toBe(404);
    const otherAthlete = await signedIn(h.app, w.org.otherAthlete.email, TEST_PASSWORD);
    const res = await otherAthlete.get(`${w.base}/athletes/${w.athlete}/week`);
    expect([403, 404], JSON.stringify(res.body)).toContain(res.status);
    expect(res.body.days).toBeUndefined();
  });

  it('"Log this session": a log from a planned session keeps the link and the library exercise of each set', async () => {
    const res = await me.post(
      `${w.base}/training-logs`,
      logBody(w.athlete, {
        sessionId: tomorrow.id,
        date: TODAY,
        sets: [
          { exercise: 'Deadlift', exerciseId: deadlift, loadKg: 40, reps: 5 },
          { exercise: 'Deadlift', exerciseId: deadlift, loadKg: 40, reps: 4 },
        ],
      }),
    );
    expect(res.status, JSON.stringify(res.body)).toBe(201);
    expect(res.body.log.sessionId).toBe(tomorrow.id);
    expect(res.body.log.sets[0]).toMatchObject({ exerciseId: deadlift, loadKg: 40, reps: 5 });
    const listed = await me.get(`${w.base}/training-logs?athleteId=${w.athlete}`);
    expect(listed.body.find((l: { id: string }) => l.id === res.body.log.id).sessionId).toBe(tomorrow.id);
  });

  it('"Log this session" for a session not planned for this athlete → 400 naming sessionId, nothing saved', async () => {
    const before = await h.ds.query('SELECT count(*)::int AS n FROM training_logs WHERE athlete_id = $1', [w.athlete]);
    const res = await me.post(`${w.base}/training-logs`, logBody(w.athlete, { sessionId: randomUUID() }));
    expect(res.status, JSON.stringify(res.body)).toBe(400);
    expect(res.body.error.fields).toEqual({ sessionId: ['must be a published session planned for this athlete'] });
    const after = await h.ds.query('SELECT count(*)::int AS n FROM training_logs WHERE athlete_id = $1', [w.athlete]);
    expect(after[0].n).toBe(before[0].n);
  });

  it('a logged set within the limits in force that day raises no flag and no notice', async () => {
    const res = await me.post(
      `${w.base}/training-logs`,
      logBody(w.athlete, { sessionId: today.id, sets: [{ exercise: 'Deadlift', exerciseId: deadlift, loadKg: 45, reps: 5, rpe: 7 }] }),
    );
    expect(res.status, JSON.stringify(res.body)).toBe(201);
    expect(res.body.overLimits).toEqual([]);
    expect(await h.ds.query(`SELECT 1 FROM flags WHERE source_id = $1`, [res.body.log.id])).toEqual([]);
    expect(await h.ds.query(`SELECT 1 FROM notifications WHERE athlete_id = $1 AND kind = 'over_limit'`, [w.athlete])).toEqual([]);
  });

  it('a logged set over a limit is recorded, never refused, and flagged to the clinician and the coach in words', async () => {
    const res = await me.post(
      `${w.base}/training-logs`,
      logBody(w.athlete, {
        sessionId: today.id,
        sets: [
          { exercise: 'Deadlift', exerciseId: deadlift, loadKg: 40, reps: 5 },
          // Edited from the planned 40 kg to what was done.
          { exercise: 'Deadlift', exerciseId: deadlift, loadKg: 100, reps: 5 },
        ],
      }),
    );
    expect(res.status, JSON.stringify(res.body)).toBe(201);
    expect(res.body.log.sets[1]).toMatchObject({ loadKg: 100, reps: 5 });
    const said = 'Deadlift 100 kg × 5 is over the limit for lifting from the floor and bending at the hips (hinge): max 45 kg.';
    // The athlete (who reads pounds) is told in their unit, the limit as a load on the bar: 45 kg = 99.2 lb → 95 lb
    // (NIST SP 811; 5-lb steps, common practice); 100 kg = 220.46 lb.
    expect(res.body.overLimits).toEqual([
      'Deadlift 220.46 lb × 5 was more than your limit for lifting from the floor and bending at the hips (hinge) on 3 December 2026: up to 95 lb.',
    ]);

    const flags = await h.ds.query(`SELECT kind, severity, message FROM flags WHERE source_id = $1`, [res.body.log.id]);
    expect(flags).toHaveLength(1);
    expect(flags[0]).toMatchObject({ kind: 'over_limit', severity: 'routine' });
    expect(flags[0].message).toContain(said);
    expect(flags[0].message).not.toMatch(/\d{4}-\d{2}-\d{2}/);

    const notices: { recipient_id: string; body: string }[] = await h.ds.query(
      `SELECT recipient_id, body FROM notifications WHERE athlete_id = $1 AND kind = 'over_limit' ORDER BY recipient_id`,
      [w.athlete],
    );
    expect(notices.map((n) => n.recipient_id).sort()).toEqual([w.org.clinician.membershipId, w.org.coach.membershipId].sort());
    for (const n of notices) expect(n.body).toContain(said);

    // The coach and the clinician both see the flag on their lists, saying what is over which limit
    // (training, not a clinical account: the coach reads it too).
    for (const staff of [w.coach, w.clinician]) {
      const list = await staff.get(`${w.base}/flags?athleteId=${w.athlete}`);
      expect(list.status).toBe(200);
      const flag = list.body.find((f: { kind: string }) => f.kind === 'over_limit');
      expect(flag?.message).toContain(said);
    }
    const audit = await w.audit('training_log.over_limit', res.body.log.id);
    expect(audit[0].after).toMatchObject({ breaches: [{ set: 2, rule: 'absolute_load', pattern: 'hinge', limit: 'max 45 kg' }] });
  });
});
