import { beforeAll, describe, expect, it } from 'vitest';
import type { InjuryReportDto, TeamSessionHoursDto } from '../../../../policies/dto/injury-report';
import { Client, signedIn, useHarness } from '../../test/harness';
import { createMember, createOrg, TEST_PASSWORD, type MemberRef, type TestOrg } from '../../test/factories';

/**
 * The injury report on the real database, with the worked example of the IOC consensus
 * definitions (Bahr et al. 2020, BJSM 54:372–389): 18 time-loss injuries and 270 days lost in
 * 12,000 exposure hours → 1.5 injuries and 22.5 days lost per 1,000 h (computed from the definitions).
 */
const h = useHarness({ SIGNIN_MAX_PER_IP: '1000' });

describe('injury report and team session hours', () => {
  let org: TestOrg;
  let orgB: TestOrg;
  let admin: Client, coach: Client, otherCoach: Client, clinician: Client, athlete: Client, adminB: Client;
  let squad: MemberRef[];
  let outsider: MemberRef;
  let groupId: string;
  let base: string;
  const SEPT = 'from=2026-09-01&to=2026-09-30';

  beforeAll(async () => {
    org = await createOrg(h.ds);
    orgB = await createOrg(h.ds);
    base = `/api/orgs/${org.id}`;
    squad = [];
    for (let i = 0; i < 6; i++) squad.push(await createMember(h.ds, org.id, ['athlete'], { name: `Squad ${i}` }));
    outsider = await createMember(h.ds, org.id, ['athlete']);
    await h.ds.query(`UPDATE athlete_profiles SET sport = 'Soccer' WHERE membership_id = ANY($1::uuid[])`, [
      squad.map((a) => a.membershipId),
    ]);
    const clients: Client[] = [];
    for (const m of [org.admin, org.coach, org.otherCoach, org.clinician, org.athlete, orgB.admin])
      clients.push(await signedIn(h.app, m.email, TEST_PASSWORD));
    [admin, coach, otherCoach, clinician, athlete, adminB] = clients;
    // A group whose name a spreadsheet would read as a formula, to check the CSV escapes it.
    const g = await admin.post(`${base}/groups`, {
      name: '=Varsity',
      kind: 'team',
      coachIds: [org.coach.membershipId],
      athleteIds: squad.map((a) => a.membershipId),
    });
    expect(g.status, JSON.stringify(g.body)).toBe(201);
    groupId = g.body.id;
    // 200 sessions × 600 min × 6 athletes = 12,000 h in September.
    await h.ds.query(
      `INSERT INTO team_session_hours (organization_id, group_id, date, minutes, kind, athlete_ids)
       SELECT $1, $2, DATE '2026-09-01' + (i % 30), 600, 'practice', $3::uuid[] FROM generate_series(1, 200) i`,
      [org.id, groupId, squad.map((a) => a.membershipId)],
    );
    // 18 cases, 3 per athlete, each Out for 15 days and then Full: 270 days lost.
    for (let i = 0; i < 18; i++) {
      const a = squad[i % 6];
      const onset = `2026-09-${String(1 + (i % 10)).padStart(2, '0')}`;
      const [c] = await h.ds.query(
        `INSERT INTO cases (organization_id, athlete_id, body_regions, onset_date, version) VALUES ($1, $2, $3, $4, 1) RETURNING id`,
        [org.id, a.membershipId, [i < 10 ? 'knee_left' : 'ankle_foot_right'], onset],
      );
      await h.ds.query(
        `INSERT INTO participation_status_changes (organization_id, athlete_id, case_id, status, effective_from)
         VALUES ($1, $2, $3, 'out', $4), ($1, $2, $3, 'full', $4::date + 15)`,
        [org.id, a.membershipId, c.id, onset],
      );
    }
  });

  describe('team session hours', () => {
    it('a coach records a practice in one step; the whole group is present unless some are unticked; audited', async () => {
      const all = await coach.post(`${base}/groups/${groupId}/session-hours`, { date: '2026-10-05', minutes: 90, kind: 'practice' });
      expect(all.status, JSON.stringify(all.body)).toBe(201);
      expect(all.body).toMatchObject({ date: '2026-10-05', minutes: 90, kind: 'practice', present: 6 });
      const some = await coach.post(`${base}/groups/${groupId}/session-hours`, {
        date: '2026-10-06',
        minutes: 60,
        kind: 'competition',
        athleteIds: squad.slice(0, 4).map((a) => a.membershipId),
      });
      expect(some.status).toBe(201);
      expect((some.body as TeamSessionHoursDto).present).toBe(4);
      const list = await coach.get(`${base}/groups/${groupId}/session-hours`);
      expect(list.status).toBe(200);
      expect((list.body as TeamSessionHoursDto[]).slice(0, 2).map((r) => r.date)).toEqual(['2026-10-06', '2026-10-05']);
      const [entry] = await h.ds.query(
        `SELECT after FROM audit_entries WHERE action = 'team_session_hours.recorded' AND subject_id = $1 ORDER BY id DESC LIMIT 1`,
        [groupId],
      );
      expect(entry.after).toEqual({ group: '=Varsity', date: '2026-10-06', minutes: 60, kind: 'competition', present: 4 });
    });

    it('refuses an athlete of another group, a future date, and bad minutes, naming the field', async () => {
      const url = `${base}/groups/${groupId}/session-hours`;
      const stranger = await coach.post(url, { date: '2026-10-05', minutes: 60, kind: 'practice', athleteIds: [outsider.membershipId] });
      expect(stranger.status).toBe(400);
      expect(stranger.body.error.fields.athleteIds).toEqual(['must all be athletes of this group']);
      const future = await coach.post(url, { date: '2099-01-01', minutes: 60, kind: 'practice' });
      expect(future.status).toBe(400);
      expect(future.body.error.fields.date).toEqual(['must not be after today']);
      const bad = await coach.post(url, { date: '2026-10-05', minutes: 0, kind: 'nap' });
      expect(bad.status).toBe(400);
      expect(Object.keys(bad.body.error.fields).sort()).toEqual(['kind', 'minutes']);
    });

    it("only the group's coaches and admins record hours: another coach gets 404, an athlete 403", async () => {
      const body = { date: '2026-10-05', minutes: 60, kind: 'practice' };
      expect((await otherCoach.post(`${base}/groups/${groupId}/session-hours`, body)).status).toBe(404);
      expect((await athlete.post(`${base}/groups/${groupId}/session-hours`, body)).status).toBe(403);
      expect((await admin.post(`${base}/groups/${groupId}/session-hours`, body)).status).toBe(201);
    });
  });

  describe('the report', () => {
    it('18 injuries and 270 days lost in 12,000 h → 1.5 and 22.5 per 1,000 h (Bahr et al. 2020), exact 95 % CI 0.89–2.37', async () => {
      const res = await admin.get(`${base}/injury-report?${SEPT}`);
      expect(res.status, JSON.stringify(res.body)).toBe(200);
      const r = res.body as InjuryReportDto;
      expect(r.total).toMatchObject({ injuries: 18, daysLost: 270, hours: 12000, hidden: null });
      expect(r.total.incidence!.value).toBeCloseTo(1.5, 10);
      expect(r.total.incidence!.low).toBeCloseTo(0.889, 3); // χ²(0.025; 36)/2 = 10.668 (SciPy 1.17) / 12
      expect(r.total.incidence!.high).toBeCloseTo(2.371, 3); // χ²(0.975; 38)/2 = 28.448 (SciPy 1.17) / 12
      expect(r.total.burden!.value).toBeCloseTo(22.5, 10);
      expect(r.breakdowns.bodyRegion.map((c) => [c.label, c.injuries])).toEqual([
        ['Ankle / foot', 8],
        ['Knee', 10],
      ]);
      expect(r.breakdowns.sport.find((c) => c.label === 'Soccer')).toMatchObject({ injuries: 18 });
      expect(r.breakdowns.group).toEqual([expect.objectContaining({ label: '=Varsity', injuries: 18 })]);
      expect(r.breakdowns.month.map((c) => c.key)).toEqual(['2026-09']);
      // Aggregates only: no athlete's id or name anywhere in the answer.
      const text = JSON.stringify(r);
      for (const a of squad) {
        expect(text).not.toContain(a.membershipId);
        expect(text).not.toContain(a.name);
      }
    });

    it('counts below 5 show as "< 5" with no rates (October: no injuries; two added show as "< 5")', async () => {
      for (const a of squad.slice(0, 2)) {
        const [c] = await h.ds.query(
          `INSERT INTO cases (organization_id, athlete_id, body_regions, onset_date, version) VALUES ($1, $2, '{neck}', '2026-10-07', 1) RETURNING id`,
          [org.id, a.membershipId],
        );
        await h.ds.query(
          `INSERT INTO participation_status_changes (organization_id, athlete_id, case_id, status, effective_from) VALUES ($1, $2, $3, 'limited', '2026-10-07')`,
          [org.id, a.membershipId, c.id],
        );
      }
      const res = await clinician.get(`${base}/injury-report?from=2026-10-01&to=2026-10-31`);
      expect(res.status).toBe(200);
      const r = res.body as InjuryReportDto;
      expect(r.total).toMatchObject({ injuries: null, injuriesText: '< 5', daysLost: null, incidence: null, hidden: 'small-count' });
      // 90 min × 6 + 60 min × 4 + 60 min × 6 (the admin's) = 1,140 min = 19 h.
      expect(r.total.hours).toBe(19);
      expect(r.hoursByKind).toEqual({ training: 0, practice: 15, competition: 4 });
    });

    it('the CSV has the same cells, with a formula-looking group name escaped', async () => {
      const res = await admin.get(`${base}/injury-report.csv?${SEPT}`);
      expect(res.status).toBe(200);
      expect(res.headers['content-type']).toBe('text/csv; charset=utf-8');
      expect(res.headers['content-disposition']).toBe('attachment; filename="loadline-injury-report-2026-09-01-to-2026-09-30.csv"');
      expect(res.text).toContain('Total,All athletes,18,270,12000.0,1.50');
      expect(res.text).toContain("Group,'=Varsity,18,");
    });

    it('admins and clinicians read it; coaches and athletes get 403; another organization 404', async () => {
      expect((await clinician.get(`${base}/injury-report?${SEPT}`)).status).toBe(200);
      expect((await coach.get(`${base}/injury-report?${SEPT}`)).status).toBe(403);
      expect((await athlete.get(`${base}/injury-report?${SEPT}`)).status).toBe(403);
      expect((await adminB.get(`${base}/injury-report?${SEPT}`)).status).toBe(404);
    });

    it('refuses a period that ends before it starts, naming the field', async () => {
      const res = await admin.get(`${base}/injury-report?from=2026-09-30&to=2026-09-01`);
      expect(res.status).toBe(400);
      expect(res.body.error.fields.to).toEqual(['must not be before from']);
    });
  });
});
