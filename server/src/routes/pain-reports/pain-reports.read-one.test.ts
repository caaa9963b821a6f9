import { randomUUID } from 'node:crypto';
import { beforeAll, describe, expect, it } from 'vitest';
import request from 'supertest';
import type { MemberRef } from '../../test/factories';
import { createOrg, TEST_PASSWORD } from '../../test/factories';
import { signedIn, useHarness } from '../../test/harness';
import { reportBody, reportWorld, type World } from '../../test/worlds/report-world';

const h = useHarness({ SIGNIN_MAX_PER_IP: '1000' });
const { world, freshAthlete } = reportWorld(h);

const viewedAbout = (athleteId: string): Promise<{ actor_user_id: string; subject_id: string | null; after: Record<string, unknown> }[]> =>
  h.ds.query(
    `SELECT actor_user_id, subject_id, after FROM audit_entries WHERE action = 'painReport.viewed' AND athlete_id = $1 ORDER BY id`,
    [athleteId],
  );

describe('GET /pain-reports/:id — one report for its own page (policies/access/athlete-reports.ts PAIN_REPORT_FIELDS)', () => {
  let w: World;
  let athlete: MemberRef;
  let reportId: string;
  const NOTE = `Sharp when I bend ${randomUUID()}`;
  const url = () => `${w.base}/pain-reports/${reportId}`;

  beforeAll(async () => {
    w = await world();
    const fresh = await freshAthlete(w);
    athlete = fresh.ref;
    const res = await fresh.client.post(`${w.base}/pain-reports`, reportBody(athlete.membershipId, { note: NOTE }));
    expect(res.status, JSON.stringify(res.body)).toBe(201);
    reportId = res.body.report.id;
  });

  it('the clinician reads every answer (yes and no), the note, and who was told; one audit entry per read, without the narrative (ASVS 5.0 V16.2.1)', async () => {
    const clinician = await w.as('clinician');
    const res = await clinician.get(url());
    expect(res.status, JSON.stringify(res.body)).toBe(200);
    expect(res.body.report).toMatchObject({
      id: reportId,
      athleteId: athlete.membershipId,
      note: NOTE,
      painNow: 4,
      painWorst24h: 6,
      bodyRegions: ['lower_back'],
      aggravatingPatterns: ['hinge'],
      startedInTraining: true,
      route: 'routine',
    });
    expect(Object.values(res.body.report.redFlags).every((v) => v === false)).toBe(true);
    expect(Object.keys(res.body.report.redFlags).length).toBeGreaterThan(3);
    // The routine notice went to the active care-team clinicians and coach (not the deactivated clinician).
    expect(res.body.told).toEqual(
      expect.arrayContaining([
        { name: w.org.clinician.name, kind: 'pain_report' },
        { name: w.org.clinician2.name, kind: 'pain_report' },
        { name: w.org.coach.name, kind: 'pain_report' },
      ]),
    );
    expect(res.body.told).toHaveLength(3);

    let rows = await viewedAbout(athlete.membershipId);
    expect(rows).toEqual([
      { actor_user_id: w.org.clinician.userId, subject_id: reportId, after: { reportIds: [reportId], fields: ['note', 'redFlags'] } },
    ]);
    expect(JSON.stringify(rows)).not.toContain('Sharp when I bend');
    expect((await clinician.get(url())).status).toBe(200);
    rows = await viewedAbout(athlete.membershipId);
    expect(rows).toHaveLength(2);
  });

  it('the coach gets the coach’s view: scores and places, no `note`, no `redFlags`, and no audit entry', async () => {
    const before = (await viewedAbout(athlete.membershipId)).length;
    const res = await (await w.as('coach')).get(url());
    expect(res.status).toBe(200);
    expect(res.body.report).toMatchObject({ id: reportId, painNow: 4, bodyRegions: ['lower_back'], route: 'routine' });
    expect(res.body.report).not.toHaveProperty('note');
    expect(res.body.report).not.toHaveProperty('redFlags');
    expect(JSON.stringify(res.body)).not.toContain(NOTE);
    expect(await viewedAbout(athlete.membershipId)).toHaveLength(before);
  });

  it('the athlete reads their own report with the note, and it is not audited as someone else’s read', async () => {
    const fresh = await freshAthlete(w);
    const own = await fresh.client.post(`${w.base}/pain-reports`, reportBody(fresh.ref.membershipId, { note: 'mine' }));
    const res = await fresh.client.get(`${w.base}/pain-reports/${own.body.report.id}`);
    expect(res.status).toBe(200);
    expect(res.body.report.note).toBe('mine');
    expect(await viewedAbout(fresh.ref.membershipId)).toEqual([]);
    // …and another athlete's report is not there for them.
    expect((await fresh.client.get(url())).status).toBe(404);
  });

  it.each(['otherClinician', 'otherCoach', 'athlete'] as const)(
    '%s (another care team, or another athlete) → 404, nothing of the report, no audit entry (ASVS 5.0 V8.2.2)',
    async (who) => {
      const before = (await viewedAbout(athlete.membershipId)).length;
      const res = await (await w.as(who)).get(url());
      expect(res.status).toBe(404);
      expect(res.body.error.code).toBe('not_found');
      expect(JSON.stringify(res.body)).not.toContain(NOTE);
      expect(await viewedAbout(athlete.membershipId)).toHaveLength(before);
    },
  );

  it.each(['guardian', 'admin'] as const)('%s → 403 (they read no pain reports), nothing of the report', async (who) => {
    const res = await (await w.as(who)).get(url());
    expect(res.status).toBe(403);
    expect(JSON.stringify(res.body)).not.toContain(NOTE);
  });

  it("another organization's clinician → 404 by our path and by theirs (ASVS 5.0 V8.4.1)", async () => {
    const other = await createOrg(h.ds);
    const outsider = await signedIn(h.app, other.clinician.email, TEST_PASSWORD);
    expect((await outsider.get(url())).status).toBe(404);
    const theirs = await outsider.get(`/api/orgs/${other.id}/pain-reports/${reportId}`);
    expect(theirs.status).toBe(404);
    expect(JSON.stringify(theirs.body)).not.toContain(NOTE);
  });

  it('an unknown id → 404; a malformed id → 400 naming `id`; signed out → 401', async () => {
    const clinician = await w.as('clinician');
    expect((await clinician.get(`${w.base}/pain-reports/${randomUUID()}`)).status).toBe(404);
    const bad = await clinician.get(`${w.base}/pain-reports/not-a-uuid`);
    expect(bad.status).toBe(400);
    expect(Object.keys(bad.body.error.fields)).toEqual(['id']);
    expect((await request(h.app).get(url())).status).toBe(401);
  });
});

describe('an emergency report: the page says who was told, and the flag and notice point at it', () => {
  it('clinicians (answers), coach (Out) and guardian are listed; the flag and the clinician’s notice carry the report id, the guardian’s notice does not', async () => {
    const w = await world();
    const { ref, client } = await freshAthlete(w);
    const filed = await client.post(`${w.base}/pain-reports`, reportBody(ref.membershipId, {}, ['saddle_numbness']));
    expect(filed.status, JSON.stringify(filed.body)).toBe(201);
    const id = filed.body.report.id;
    const clinician = await w.as('clinician');
    const res = await clinician.get(`${w.base}/pain-reports/${id}`);
    expect(res.status).toBe(200);
    expect(res.body.report).toMatchObject({ route: 'emergency', caseId: expect.any(String) });
    expect(res.body.report.redFlags.saddle_numbness).toBe(true);
    expect(res.body.told).toEqual(
      expect.arrayContaining([
        { name: w.org.clinician.name, kind: 'red_flag_emergency' },
        { name: w.org.coach.name, kind: 'status_out' },
        { name: w.org.guardian.name, kind: 'red_flag_emergency_guardian' },
      ]),
    );
    const flags = await clinician.get(`${w.base}/flags?athleteId=${ref.membershipId}`);
    expect(flags.body.map((f: { painReportId: string }) => f.painReportId)).toEqual([id]);
    const notices = await clinician.get(`${w.base}/notifications`);
    const mine = notices.body.filter((n: { athleteId: string }) => n.athleteId === ref.membershipId);
    expect(mine.map((n: { painReportId: string }) => n.painReportId)).toEqual([id]);
    const guardians = await (await w.as('guardian')).get(`${w.base}/notifications`);
    const told = guardians.body.filter((n: { athleteId: string }) => n.athleteId === ref.membershipId);
    expect(told.map((n: { painReportId: string | null }) => n.painReportId)).toEqual([null]);
  });
});
