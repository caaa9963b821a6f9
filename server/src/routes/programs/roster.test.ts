import { beforeAll, describe, expect, it } from 'vitest';
import { signedIn, useHarness } from '../../test/harness';
import { createMember, createOrg, TEST_PASSWORD, type MemberRef, type TestOrg } from '../../test/factories';
import { addDays, pinClock, TODAY } from '../../test/worlds/test-world';

// The roster is one set-based query (queries/roster.ts); this fixes what each column
// must say when an athlete has several cases, holds, exceptions and sessions around today.
const h = useHarness({ SIGNIN_MAX_PER_IP: '1000' });
pinClock();

const day = (n: number) => addDays(TODAY, n);

describe('GET /roster', () => {
  let org: TestOrg;
  let second: MemberRef;
  let nextId: string;

  async function openCase(
    athleteId: string,
    closedOn: string | null,
    statuses: [status: string, from: string, secondsAgo: number][],
    patterns?: object,
  ): Promise<string> {
    const [c] = await h.ds.query(
      `INSERT INTO cases (organization_id, athlete_id, body_regions, onset_date, closed_on, version) VALUES ($1, $2, '{lower_back}', $3, $4, 1) RETURNING id`,
      [org.id, athleteId, day(-30), closedOn],
    );
    for (const [status, from, ago] of statuses) {
      await h.ds.query(
        `INSERT INTO participation_status_changes (organization_id, athlete_id, case_id, status, effective_from, created_at) VALUES ($1, $2, $3, $4, $5, now() - make_interval(secs => $6))`,
        [org.id, athleteId, c.id, status, from, ago],
      );
    }
    if (patterns) {
      const [p] = await h.ds.query(
        `INSERT INTO restriction_plans (organization_id, athlete_id, case_id, version) VALUES ($1, $2, $3, 1) RETURNING id`,
        [org.id, athleteId, c.id],
      );
      const stages = [{ id: 'stage-1', startDate: day(-30), endDate: day(30), painCeiling: 4, patterns }];
      await h.ds.query(`INSERT INTO restriction_plan_versions (plan_id, version, stages, guidance) VALUES ($1, 1, $2, 'Test plan')`, [
        p.id,
        JSON.stringify(stages),
      ]);
    }
    return c.id;
  }

  beforeAll(async () => {
    org = await createOrg(h.ds);
    second = await createMember(h.ds, org.id, ['athlete'], { name: 'zz second' });
    await h.ds.query(`INSERT INTO care_team_assignments (organization_id, athlete_id, member_id, role) VALUES ($1, $2, $3, 'coach')`, [
      org.id,
      second.membershipId,
      org.coach.membershipId,
    ]);
    const a = org.athlete.membershipId;
    // Limited under a hinge cap; Out since yesterday on a second case (Full is only scheduled for
    // tomorrow); a case closed yesterday whose plan blocked squats no longer counts.
    await openCase(a, null, [['limited', day(-10), 900]], { hinge: { mode: 'capped', caps: { maxPercent1RM: 60 } } });
    await openCase(a, null, [
      ['out', day(-1), 600],
      ['full', day(1), 300],
    ]);
    await openCase(a, day(-1), [['out', day(-20), 1200]], { squat: { mode: 'blocked' } });
    // One program for both athletes: a past session, today's draft, and two published ones ahead.
    const [prog] = await h.ds.query(
      `INSERT INTO programs (organization_id, name, athlete_ids, version) VALUES ($1, 'Block', ARRAY[$2::uuid, $3::uuid], 1) RETURNING id`,
      [org.id, a, second.membershipId],
    );
    const session = async (date: string, status: string, title: string) =>
      (
        await h.ds.query(
          `INSERT INTO program_sessions (organization_id, program_id, date, title, content, status, published_at, version) VALUES ($1, $2, $3, $4, '{"exercises":[]}', $5, $6, 1) RETURNING id`,
          [org.id, prog.id, date, title, status, status === 'published' ? new Date() : null],
        )
      )[0].id as string;
    const past = await session(day(-1), 'published', 'Yesterday');
    await session(day(0), 'draft', 'Draft today');
    nextId = await session(day(1), 'published', 'Tomorrow');
    await session(day(3), 'published', 'Later');
    // Holds: the past one does not count, the one ahead does. Two pending exceptions, one granted.
    for (const s of [past, nextId])
      await h.ds.query(`INSERT INTO session_holds (session_id, athlete_id, organization_id, breaches) VALUES ($1, $2, $3, '[]')`, [
        s,
        a,
        org.id,
      ]);
    for (const status of ['pending', 'pending', 'granted']) {
      await h.ds.query(
        `INSERT INTO program_exceptions (organization_id, session_id, athlete_id, set_ids, reason, status) VALUES ($1, $2, $3, '{}', 'Test', $4)`,
        [org.id, nextId, a, status],
      );
    }
  });

  it("the coach's roster: each care-team athlete's status, today's limits, holds ahead, pending exceptions and next session", async () => {
    const coach = await signedIn(h.app, org.coach.email, TEST_PASSWORD);
    const res = await coach.get(`/api/orgs/${org.id}/roster`);
    expect(res.status).toBe(200);
    const next = { id: nextId, date: day(1), title: 'Tomorrow' };
    expect(res.body).toEqual([
      {
        athleteId: org.athlete.membershipId,
        athleteName: org.athlete.name,
        status: 'out',
        limitsToday: ['Hinge: up to 60% of estimated 1RM'],
        sessionsOnHold: 1,
        pendingExceptions: 2,
        nextSession: next,
      },
      {
        athleteId: second.membershipId,
        athleteName: 'zz second',
        status: 'full',
        limitsToday: [],
        sessionsOnHold: 0,
        pendingExceptions: 0,
        nextSession: next,
      },
    ]);
  });

  it("lists only the reader's athletes: the clinician's care team, the admin's whole organization, another organization's admin nobody", async () => {
    const ids = async (email: string, orgId = org.id) => {
      const res = await (await signedIn(h.app, email, TEST_PASSWORD)).get(`/api/orgs/${orgId}/roster`);
      return res.status === 200 ? (res.body as { athleteId: string }[]).map((r) => r.athleteId).sort() : res.status;
    };
    expect(await ids(org.clinician.email)).toEqual([org.athlete.membershipId]);
    expect(await ids(org.admin.email)).toEqual([org.athlete.membershipId, org.otherAthlete.membershipId, second.membershipId].sort());
    const other = await createOrg(h.ds);
    expect(await ids(other.admin.email)).toEqual(404);
  });
});
