import { beforeAll, describe, expect, it } from 'vitest';
import { randomUUID } from 'node:crypto';
import { signedIn, useHarness } from '../../test/harness';
import { TEST_PASSWORD, type TestOrg } from '../../test/factories';
import { content, createOrg, pinClock } from '../../test/worlds/test-world';

/**
 * "Today" is the organization's calendar day (policies/today.ts), not the UTC date. An organization
 * in Los Angeles (UTC−8 in December) at 18:00 on 3 December is already at 02:00 on 4 December in
 * UTC: tonight's session is still today's, and a plan stage ending today is still in force.
 */
const EVENING = new Date('2026-12-04T02:00:00Z');
const LOCAL_TODAY = '2026-12-03';

describe("the organization's day at 18:00 in Los Angeles (02:00 UTC the next day)", () => {
  const h = useHarness();
  pinClock(EVENING);
  let org: TestOrg;
  let tonight: string;
  let sled: string;

  beforeAll(async () => {
    org = await createOrg(h.ds);
    await h.ds.query(`UPDATE organizations SET time_zone = 'America/Los_Angeles' WHERE id = $1`, [org.id]);
    const a = org.athlete.membershipId;
    // A case with a stage that ends today (local): squats blocked, the hinge capped at 60%.
    const [c] = await h.ds.query(
      `INSERT INTO cases (organization_id, athlete_id, body_regions, onset_date, version) VALUES ($1, $2, '{lower_back}', '2026-11-01', 1) RETURNING id`,
      [org.id, a],
    );
    await h.ds.query(
      `INSERT INTO participation_status_changes (organization_id, athlete_id, case_id, status, effective_from) VALUES ($1, $2, $3, 'limited', '2026-11-01')`,
      [org.id, a, c.id],
    );
    const [plan] = await h.ds.query(
      `INSERT INTO restriction_plans (organization_id, athlete_id, case_id, version) VALUES ($1, $2, $3, 1) RETURNING id`,
      [org.id, a, c.id],
    );
    const stages = [
      {
        id: randomUUID(),
        startDate: '2026-11-01',
        endDate: LOCAL_TODAY,
        painCeiling: 4,
        patterns: { squat: { mode: 'blocked' }, hinge: { mode: 'capped', caps: { maxPercent1RM: 60 } } },
      },
    ];
    await h.ds.query(`INSERT INTO restriction_plan_versions (plan_id, version, stages, guidance) VALUES ($1, 1, $2, '')`, [
      plan.id,
      JSON.stringify(stages),
    ]);
    const [ex] = await h.ds.query(
      `INSERT INTO exercises (organization_id, name, patterns, equipment, ballistic, steps, version)
       VALUES ($1, 'Sled drag', '{carry}', 'sled', false, '{"kind":"increment","step":5,"unit":"kg"}', 1) RETURNING id`,
      [org.id],
    );
    sled = ex.id;
    const [prog] = await h.ds.query(
      `INSERT INTO programs (organization_id, name, athlete_ids, version) VALUES ($1, 'Block', ARRAY[$2::uuid], 1) RETURNING id`,
      [org.id, a],
    );
    const [s] = await h.ds.query(
      `INSERT INTO program_sessions (organization_id, program_id, date, title, content, status, published_at, version)
       VALUES ($1, $2, $3, 'Tonight', $4, 'published', now(), 1) RETURNING id`,
      [org.id, prog.id, LOCAL_TODAY, JSON.stringify(content(sled, [{ kg: 40 }]))],
    );
    tonight = s.id;
  });

  it("the roster's next session is tonight's and today's limits are those of the stage ending today", async () => {
    const coach = await signedIn(h.app, org.coach.email, TEST_PASSWORD);
    const row = (await coach.get(`/api/orgs/${org.id}/roster`)).body.find(
      (r: { athleteId: string }) => r.athleteId === org.athlete.membershipId,
    );
    expect(row).toMatchObject({
      status: 'limited',
      nextSession: { id: tonight, date: LOCAL_TODAY, title: 'Tonight' },
      limitsToday: ['Hinge: up to 60% of estimated 1RM', 'Squat: not allowed for now'],
    });
  });

  it("the athlete's day without a date is the local day, with tonight's session", async () => {
    const athlete = await signedIn(h.app, org.athlete.email, TEST_PASSWORD);
    const day = (await athlete.get(`/api/orgs/${org.id}/athletes/${org.athlete.membershipId}/today`)).body;
    expect(day.date).toBe(LOCAL_TODAY);
    expect(day.sessions.map((s: { id: string }) => s.id)).toEqual([tonight]);
  });

  it("an exercise edit in the evening holds tonight's session, which is today's, not yesterday's", async () => {
    const coach = await signedIn(h.app, org.coach.email, TEST_PASSWORD);
    const res = await coach.patch(`/api/orgs/${org.id}/exercises/${sled}`, { patterns: ['carry', 'squat'], version: 1 });
    expect(res.status, JSON.stringify(res.body)).toBe(200);
    const held = await h.ds.query(`SELECT session_id FROM session_holds WHERE athlete_id = $1`, [org.athlete.membershipId]);
    expect(held).toEqual([{ session_id: tonight }]);
  });
});
