import { describe, expect, it } from 'vitest';
import { RED_FLAG_ITEMS } from '../../../../policies/red-flags';
import { useHarness, signedIn } from '../../test/harness';
import { createOrg, TEST_PASSWORD } from '../../test/factories';

const noFlags = Object.fromEntries(RED_FLAG_ITEMS.map((i) => [i.id, false]));

describe('opening a case from a pain report', () => {
  const h = useHarness();
  it("links the report to the new case and the case back to the report, and refuses another athlete's report", async () => {
    const org = await createOrg(h.ds);
    const base = `/api/orgs/${org.id}`;
    const athlete = await signedIn(h.app, org.athlete.email, TEST_PASSWORD);
    const report = await athlete.post(`${base}/pain-reports`, {
      athleteId: org.athlete.membershipId,
      bodyRegions: ['lower_back'],
      painNow: 4,
      painWorst24h: 6,
      onsetDate: '2026-11-28',
      aggravatingPatterns: ['hinge'],
      startedInTraining: true,
      redFlags: noFlags,
    });
    expect(report.status).toBe(201);
    const clin = await signedIn(h.app, org.clinician.email, TEST_PASSWORD);
    const payload = {
      athleteId: org.athlete.membershipId,
      bodyRegions: ['lower_back'],
      onsetDate: '2026-11-28',
      status: 'limited',
      statusEffectiveFrom: '2026-11-29',
    };
    const wrong = await clin.post(`${base}/cases`, {
      ...payload,
      athleteId: org.athlete.membershipId,
      painReportId: '00000000-0000-4000-8000-000000000000',
    });
    expect(wrong.status).toBe(400);
    expect(wrong.body.error.fields.painReportId).toBeDefined();
    const created = await clin.post(`${base}/cases`, { ...payload, painReportId: report.body.report.id });
    expect(created.status).toBe(201);
    const reports = await clin.get(`${base}/pain-reports?athleteId=${org.athlete.membershipId}`);
    expect(reports.body[0].caseId).toBe(created.body.id);
    // The case links back to its report (ids and times only: no narrative in the case read).
    const theCase = await clin.get(`${base}/cases/${created.body.id}`);
    expect(theCase.body.painReports).toEqual([{ id: report.body.report.id, reportedAt: report.body.report.reportedAt }]);
    const coachCase = await (await signedIn(h.app, org.coach.email, TEST_PASSWORD)).get(`${base}/cases/${created.body.id}`);
    expect(coachCase.status).toBe(200);
    expect(coachCase.body.painReports).toEqual([{ id: report.body.report.id, reportedAt: report.body.report.reportedAt }]);
  });
});
