import { describe, expect, it } from 'vitest';
import { orgToday, addDays } from '../../../policies/today';
import { createStorage } from '../storage';
import { signedIn, useHarness } from '../test/harness';
import { DEMO_PASSWORD, loadDemo } from './demo';
import { DEMO_TIME_ZONE } from './demo-zone';
import { SEASON_DAYS } from './demo-season';
import { SQUAD } from './demo-squad';
import { INJURY_SEASON_DAYS, PAST_INJURIES } from './demo-injuries';
import type { InjuryReportDto } from '../../../policies/dto/injury-report';
import { jargonIn } from '../../../policies/plain-words';
import type { TeamGridDto, TeamVersionDto } from '../../../policies/dto/teams';

const at = (local: string) => `${local}@harborpoint.example`;

describe('the demo scenario', () => {
  const h = useHarness({ SIGNIN_MAX_PER_IP: '1000' });
  let organizationId = '';
  const load = async () => {
    if (!organizationId)
      organizationId = (await loadDemo(h.ds, { config: h.config, bcryptCost: 4, storage: createStorage(h.config) })).organizationId;
    return `/api/orgs/${organizationId}`;
  };
  const member = async (local: string): Promise<string> =>
    (
      (await h.ds.query(`SELECT m.id FROM memberships m JOIN users u ON u.id = m.user_id WHERE u.email = $1`, [at(local)])) as {
        id: string;
      }[]
    )[0].id;

  it("loads once, with a referral note on Sam's case that his clinician can download and his coach cannot see", async () => {
    const base = await load();
    const again = await loadDemo(h.ds, { config: h.config, bcryptCost: 4 });
    expect(again).toEqual({ created: false, organizationId });

    const marcus = await signedIn(h.app, at('marcus.bell'), DEMO_PASSWORD);
    const cases = await marcus.get(`${base}/cases?state=open`);
    const samCase = cases.body.find((c: { athleteName: string }) => c.athleteName === 'Sam Whitfield');
    const docs = await marcus.get(`${base}/cases/${samCase.id}/documents`);
    expect(docs.status).toBe(200);
    expect(docs.body).toHaveLength(1);
    expect(docs.body[0]).toMatchObject({ title: 'Referral note (demo)', mediaType: 'application/pdf' });
    const file = await marcus.get(docs.body[0].downloadPath).buffer(true);
    expect(file.status).toBe(200);
    expect(Buffer.from(file.body).subarray(0, 5).toString('latin1')).toBe('%PDF-');

    const rosa = await signedIn(h.app, at('rosa.delgado'), DEMO_PASSWORD);
    expect((await rosa.get(docs.body[0].downloadPath)).status).toBe(404);
  });

  it('is mid-season: eight weeks of check-ins and logs for every athlete, so the workload ratio and monotony show', async () => {
    const base = await load();
    const today = orgToday(DEMO_TIME_ZONE);
    const rows: { athlete: string; logs: number; checkins: number; first: string }[] = await h.ds.query(
      `SELECT u.display_name AS athlete,
              (SELECT count(*)::int FROM training_logs t WHERE t.athlete_id = a.membership_id) AS logs,
              (SELECT count(*)::int FROM check_ins c WHERE c.athlete_id = a.membership_id) AS checkins,
              (SELECT min(date)::text FROM check_ins c WHERE c.athlete_id = a.membership_id) AS first
         FROM athlete_profiles a JOIN memberships m ON m.id = a.membership_id JOIN users u ON u.id = m.user_id
        WHERE a.organization_id = $1 AND NOT (u.email = ANY($2))`,
      [organizationId, SQUAD.map((p) => p.email)],
    );
    // The infield squad's team-mates joined the app with their group this week: the season is the first five's.
    expect(rows).toHaveLength(5);
    for (const r of rows) {
      expect(r.logs, r.athlete).toBeGreaterThanOrEqual(20);
      expect(r.checkins, r.athlete).toBeGreaterThanOrEqual(45);
      expect(r.first <= addDays(today, -SEASON_DAYS + 2), r.athlete).toBe(true);
    }
    const theo = await signedIn(h.app, at('theo.lindqvist'), DEMO_PASSWORD);
    const workload = await theo.get(`${base}/athletes/${await member('jordan.pike')}/workload`);
    expect(workload.status).toBe(200);
    expect(workload.body.acuteChronic.ratio).toBeGreaterThan(0);
    expect(workload.body.weeks.filter((w: { monotony: number | null }) => w.monotony !== null).length).toBeGreaterThanOrEqual(7);
  });

  it("carries the 16-year-old's lower-back case mid-way: report read, Limited, two stages, letter acknowledged, a session on hold", async () => {
    await load();
    const maya = await member('maya.torres');
    const [report] = await h.ds.query(`SELECT id, case_id FROM pain_reports WHERE athlete_id = $1`, [maya]);
    expect(report.case_id).not.toBeNull();
    const viewed = await h.ds.query(`SELECT 1 FROM audit_entries WHERE action = 'painReport.viewed' AND subject_id = $1`, [report.id]);
    expect(viewed).toHaveLength(1);
    const [status] = await h.ds.query(
      `SELECT status FROM participation_status_changes WHERE athlete_id = $1 ORDER BY effective_from DESC, created_at DESC LIMIT 1`,
      [maya],
    );
    expect(status.status).toBe('limited');
    const [plan] = await h.ds.query(
      `SELECT p.version, jsonb_array_length(v.stages) AS stages FROM restriction_plans p
         JOIN restriction_plan_versions v ON v.plan_id = p.id AND v.version = p.version WHERE p.athlete_id = $1`,
      [maya],
    );
    expect(plan).toEqual({ version: 2, stages: 2 });
    const letters: { id: string; status: string; acknowledged: number }[] = await h.ds.query(
      `SELECT l.id, l.status, (SELECT count(*)::int FROM letter_acknowledgements a WHERE a.letter_id = l.id) AS acknowledged
         FROM clearance_letters l WHERE l.athlete_id = $1 ORDER BY l.signed_at`,
      [maya],
    );
    expect(letters.map((l) => [l.status, l.acknowledged])).toEqual([
      ['superseded', 1],
      ['signed', 0],
    ]);
    const holds = await h.ds.query(
      `SELECT s.title FROM session_holds h JOIN program_sessions s ON s.id = h.session_id WHERE h.athlete_id = $1`,
      [maya],
    );
    expect(holds).toEqual([{ title: 'Lower body (light hinge)' }]);
  });

  it("shows Maya's stage criteria part met: the clinician's check done, her readiness not yet (a shared decision, Bern consensus)", async () => {
    await load();
    const maya = await member('maya.torres');
    const readings = await h.ds.query(
      `SELECT kind, met, value::float AS value FROM stage_criterion_readings WHERE athlete_id = $1 ORDER BY kind`,
      [maya],
    );
    expect(readings).toEqual([
      { kind: 'assessment', met: true, value: null },
      { kind: 'readiness', met: null, value: 5 },
    ]);
    const [v] = await h.ds.query(
      `SELECT v.stages->0->'criteria' AS criteria FROM restriction_plans p
         JOIN restriction_plan_versions v ON v.plan_id = p.id AND v.version = p.version WHERE p.athlete_id = $1`,
      [maya],
    );
    expect(v.criteria).toHaveLength(4);
  });

  it('has one case closed with a Full letter, and published sessions in the coming week for every athlete', async () => {
    await load();
    const jordan = await member('jordan.pike');
    const [c] = await h.ds.query(`SELECT closed_on FROM cases WHERE athlete_id = $1`, [jordan]);
    expect(c.closed_on).not.toBeNull();
    const [letter] = await h.ds.query(`SELECT decision, status FROM clearance_letters WHERE athlete_id = $1`, [jordan]);
    expect(letter).toEqual({ decision: 'full', status: 'signed' });
    const today = orgToday(DEMO_TIME_ZONE);
    const ahead: { athlete_id: string }[] = await h.ds.query(
      `SELECT DISTINCT a.athlete_id FROM program_sessions s JOIN programs p ON p.id = s.program_id
         CROSS JOIN LATERAL unnest(p.athlete_ids) AS a(athlete_id)
        WHERE p.organization_id = $1 AND s.status = 'published' AND s.date > $2 AND s.date <= $3`,
      [organizationId, today, addDays(today, 7)],
    );
    expect(ahead).toHaveLength(5 + SQUAD.length);
  });
});

describe('the demo scenario, as the family hears it', () => {
  const h = useHarness({ SIGNIN_MAX_PER_IP: '1000' });

  it("tells Maya's mother that Maya is Limited, and of each plan version, in plain words with no trade jargon", async () => {
    await loadDemo(h.ds, { config: h.config, bcryptCost: 4 });
    const notices: { kind: string; title: string; body: string }[] = await h.ds.query(
      `SELECT n.kind, n.title, n.body FROM notifications n JOIN memberships m ON m.id = n.recipient_id JOIN users u ON u.id = m.user_id
        WHERE u.email = $1 ORDER BY n.created_at`,
      [at('elena.torres')],
    );
    const kinds = notices.map((n) => n.kind);
    expect(kinds).toContain('status_changed');
    expect(kinds.filter((k) => k === 'plan_changed')).toHaveLength(2);
    for (const n of notices.filter((x) => x.kind === 'status_changed' || x.kind === 'plan_changed')) {
      expect(jargonIn(`${n.title} ${n.body}`), n.title).toEqual([]);
    }
  });

  it("told Maya's clinician that the plan change left the signed letter out of date, and sent the updated letter to the family", async () => {
    await loadDemo(h.ds, { config: h.config, bcryptCost: 4 });
    const [stale] = await h.ds.query(
      `SELECT n.title FROM notifications n JOIN memberships m ON m.id = n.recipient_id JOIN users u ON u.id = m.user_id
        WHERE u.email = $1 AND n.kind = 'letter_out_of_date'`,
      [at('priya.raman')],
    );
    expect(stale.title).toBe("Maya Torres's clearance letter is out of date");
  });
});

describe('the demo scenario, the softball infield squad', () => {
  const h = useHarness({ SIGNIN_MAX_PER_IP: '1000' });

  it("gives Theo one team program for the nine infielders, with Maya's and Tessa's versions fitted to their own limits and the rest as written", async () => {
    const { organizationId } = await loadDemo(h.ds, { config: h.config, bcryptCost: 4 });
    const base = `/api/orgs/${organizationId}`;
    const memberOf = async (local: string): Promise<string> =>
      (
        (await h.ds.query(`SELECT m.id FROM memberships m JOIN users u ON u.id = m.user_id WHERE u.email = $1`, [at(local)])) as {
          id: string;
        }[]
      )[0].id;
    const theo = await signedIn(h.app, at('theo.lindqvist'), DEMO_PASSWORD);
    const programs = await theo.get(`${base}/team-programs`);
    expect(programs.body.map((p: { name: string; groupName: string }) => [p.name, p.groupName])).toEqual([
      ['Softball infield strength', 'Softball infield'],
    ]);
    const grid = (await theo.get(`${base}/team-programs/${programs.body[0].id}/grid`)).body as TeamGridDto;
    expect(grid.athletes).toHaveLength(1 + SQUAD.length);
    const [published, draft] = grid.sessions;
    expect([published.status, draft.status]).toEqual(['published', 'draft']);
    const maya = await memberOf('maya.torres');
    const tessa = await memberOf('tessa.grant');
    const cell = (athleteId: string, sessionId: string) =>
      grid.cells.find((c) => c.athleteId === athleteId && c.teamSessionId === sessionId)!;
    expect(cell(maya, published.id)).toMatchObject({ state: 'fitted', published: true });
    expect(cell(tessa, published.id)).toMatchObject({ state: 'fitted', published: true });
    for (const a of grid.athletes.filter((x) => x.id !== maya && x.id !== tessa))
      expect(cell(a.id, published.id), a.name).toMatchObject({ state: 'as_written', changes: 0, published: true });
    // Two days later Maya is in her Build back stage (hinge up to 75 %), so the draft's deadlift fits her as written.
    expect(cell(maya, draft.id).state).toBe('as_written');
    expect(cell(tessa, draft.id).state).toBe('fitted');

    const mayaVersion = (await theo.get(`${base}/team-sessions/${published.id}/versions/${maya}`)).body as TeamVersionDto;
    expect(mayaVersion.changes.length).toBeGreaterThan(0);
    expect(mayaVersion.breaches.filter((b) => !b.waived)).toEqual([]);
    // Tessa's sprints are blocked: the library's "use instead" list swaps them for bike intervals.
    const tessaVersion = (await theo.get(`${base}/team-sessions/${published.id}/versions/${tessa}`)).body as TeamVersionDto;
    const [bike] = (await h.ds.query(`SELECT id FROM exercises WHERE organization_id = $1 AND name = 'Bike intervals'`, [
      organizationId,
    ])) as {
      id: string;
    }[];
    expect(tessaVersion.changes.filter((c) => c.kind === 'swapped').map((c) => c.swappedToExerciseId)).toContain(bike.id);
    expect(tessaVersion.breaches.filter((b) => !b.waived)).toEqual([]);
  });

  it("gives Dana a season's injury report for Harbor Point: a total to show, the infield's hours, small rows withheld", async () => {
    // loadDemo loads once per database and answers the same organization after that.
    const { organizationId } = await loadDemo(h.ds, { config: h.config, bcryptCost: 4 });
    const base = `/api/orgs/${organizationId}`;
    const dana = await signedIn(h.app, at('dana.okafor'), DEMO_PASSWORD);
    const today = orgToday(DEMO_TIME_ZONE);
    const res = await dana.get(`${base}/injury-report?from=${addDays(today, -INJURY_SEASON_DAYS)}&to=${today}`);
    expect(res.status, JSON.stringify(res.body)).toBe(200);
    const r = res.body as InjuryReportDto;
    // The eight past injuries of the infield, plus the cases of the story.
    expect(r.total.hidden).toBeNull();
    expect(r.total.injuries).toBeGreaterThanOrEqual(PAST_INJURIES.length);
    expect(r.hoursByKind.practice).toBeGreaterThan(1000);
    expect(r.hoursByKind.competition).toBeGreaterThan(100);
    expect(r.breakdowns.group.find((c) => c.label === 'Softball infield')).toMatchObject({ hidden: null });
    expect(r.breakdowns.bodyRegion.some((c) => c.injuriesText === '< 5')).toBe(true);
  });
});
