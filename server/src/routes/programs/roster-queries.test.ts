import pg from 'pg';
import { beforeAll, describe, expect, it, vi } from 'vitest';
import { describeRule } from '../../../../policies/load/describe';
import { signedIn, useHarness } from '../../test/harness';
import { createMember, TEST_PASSWORD, type TestOrg } from '../../test/factories';
import { addDays, createOrg, pinClock, TODAY } from '../../test/worlds/test-world';

// The roster is one set-based read (queries/roster.ts): its round trips to PostgreSQL must not grow
// with the number of athletes, whatever each athlete has (an open case with a plan, a session ahead).
// Counted at the driver (pg's Client#query), so a per-athlete query anywhere in the request shows.
const h = useHarness({ SIGNIN_MAX_PER_IP: '1000' });
pinClock();

describe('GET /roster round trips', () => {
  let org: TestOrg;

  /** Puts `n` more athletes on the coach's care team, each with an open case, a plan and a published session tomorrow. */
  async function addAthletes(n: number) {
    for (let i = 0; i < n; i++) {
      const a = (await createMember(h.ds, org.id, ['athlete'])).membershipId;
      await h.ds.query(`INSERT INTO care_team_assignments (organization_id, athlete_id, member_id, role) VALUES ($1, $2, $3, 'coach')`, [
        org.id,
        a,
        org.coach.membershipId,
      ]);
      const [c] = await h.ds.query(
        `INSERT INTO cases (organization_id, athlete_id, body_regions, onset_date, version) VALUES ($1, $2, '{lower_back}', $3, 1) RETURNING id`,
        [org.id, a, addDays(TODAY, -5)],
      );
      await h.ds.query(
        `INSERT INTO participation_status_changes (organization_id, athlete_id, case_id, status, effective_from) VALUES ($1, $2, $3, 'limited', $4)`,
        [org.id, a, c.id, addDays(TODAY, -5)],
      );
      const [plan] = await h.ds.query(
        `INSERT INTO restriction_plans (organization_id, athlete_id, case_id, version) VALUES ($1, $2, $3, 1) RETURNING id`,
        [org.id, a, c.id],
      );
      const stages = [
        { id: 's1', startDate: addDays(TODAY, -5), endDate: addDays(TODAY, 30), painCeiling: 4, patterns: { jump: { mode: 'blocked' } } },
      ];
      await h.ds.query(`INSERT INTO restriction_plan_versions (plan_id, version, stages, guidance) VALUES ($1, 1, $2, 'Test plan')`, [
        plan.id,
        JSON.stringify(stages),
      ]);
      const [prog] = await h.ds.query(
        `INSERT INTO programs (organization_id, name, athlete_ids, version) VALUES ($1, 'Block', ARRAY[$2::uuid], 1) RETURNING id`,
        [org.id, a],
      );
      await h.ds.query(
        `INSERT INTO program_sessions (organization_id, program_id, date, title, content, status, published_at, version)
           VALUES ($1, $2, $3, 'Tomorrow', '{"exercises":[]}', 'published', now(), 1)`,
        [org.id, prog.id, addDays(TODAY, 1)],
      );
    }
  }

  beforeAll(async () => {
    org = await createOrg(h.ds);
  });

  it('the same number of queries for 1 athlete and for 13, and every athlete listed with its limits', async () => {
    const coach = await signedIn(h.app, org.coach.email, TEST_PASSWORD);
    const spy = vi.spyOn(pg.Client.prototype, 'query');
    const countFor = async (expected: number) => {
      await coach.get(`/api/orgs/${org.id}/roster`); // warm: a first request may prepare statements
      spy.mockClear();
      const res = await coach.get(`/api/orgs/${org.id}/roster`);
      expect(res.status).toBe(200);
      expect(res.body).toHaveLength(expected);
      return { calls: spy.mock.calls.length, body: res.body as { limitsToday: string[] }[] };
    };
    try {
      const one = await countFor(1);
      await addAthletes(12);
      const thirteen = await countFor(13);
      expect(thirteen.calls).toBe(one.calls);
      expect(thirteen.body.filter((r) => r.limitsToday.includes(describeRule('jump', { mode: 'blocked' }, 'kg', 'staff')))).toHaveLength(
        12,
      );
    } finally {
      spy.mockRestore();
    }
  });
});
