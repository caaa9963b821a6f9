import { randomUUID } from 'node:crypto';
import { beforeAll, describe, expect, it } from 'vitest';
import request from 'supertest';
import { signedIn, useHarness } from '../../test/harness';
import { createOrg, TEST_PASSWORD } from '../../test/factories';
import { reportBody, reportWorld, type World } from '../../test/worlds/report-world';

const h = useHarness({ SIGNIN_MAX_PER_IP: '1000' });
const { world, casesOf, reportsOf } = reportWorld(h);

describe('who may report, and a report must answer every question', () => {
  it('an athlete cannot report for another athlete → 404; nothing stored (ASVS 5.0 V8.2.2)', async () => {
    const w = await world();
    const res = await (
      await w.as('athlete')
    ).post(`${w.base}/pain-reports`, reportBody(w.org.otherAthlete.membershipId, {}, ['both_legs_new']));
    expect(res.status).toBe(404);
    expect(res.body.error.code).toBe('not_found');
    expect(await reportsOf(w.org.otherAthlete.membershipId)).toBe(0);
    expect(await casesOf(w.org.otherAthlete.membershipId)).toEqual([]);
  });

  it.each(['coach', 'clinician', 'guardian', 'admin'] as const)('%s cannot file a report for the athlete → 403', async (who) => {
    const w = await world();
    const before = await reportsOf(w.org.athlete.membershipId);
    const res = await (await w.as(who)).post(`${w.base}/pain-reports`, reportBody(w.org.athlete.membershipId));
    expect(res.status).toBe(403);
    expect(res.body.error.code).toBe('forbidden');
    expect(await reportsOf(w.org.athlete.membershipId)).toBe(before);
  });

  it("another organization's athlete cannot report into ours (ASVS 5.0 V8.4.1)", async () => {
    const w = await world();
    const outsiderOrg = await createOrg(h.ds);
    const outsider = await signedIn(h.app, outsiderOrg.athlete.email, TEST_PASSWORD);
    const res = await outsider.post(`${w.base}/pain-reports`, reportBody(outsiderOrg.athlete.membershipId));
    expect([403, 404]).toContain(res.status);
    expect(await reportsOf(outsiderOrg.athlete.membershipId)).toBe(0);
  });

  it('signed out → 401', async () => {
    const w = await world();
    expect((await request(h.app).get(`${w.base}/pain-reports`)).status).toBe(401);
  });

  it('a report missing one red-flag answer → 400 naming that item; nothing stored (NICE NG59: every question asked)', async () => {
    const w = await world();
    const body = reportBody(w.org.athlete.membershipId);
    delete (body.redFlags as Record<string, boolean>).night_pain;
    const before = await reportsOf(w.org.athlete.membershipId);
    const res = await (await w.as('athlete')).post(`${w.base}/pain-reports`, body);
    expect(res.status).toBe(400);
    expect(Object.keys(res.body.error.fields)).toEqual(['redFlags.night_pain']);
    expect(await reportsOf(w.org.athlete.membershipId)).toBe(before);
  });
});

describe('reading reports (minimum necessary, policies/access/athlete-reports.ts PAIN_REPORT_FIELDS)', () => {
  let w: World;
  const NOTE = `Hurts when I deadlift ${randomUUID()}`;
  let reportId: string;

  beforeAll(async () => {
    w = await world();
    const res = await (
      await w.as('athlete')
    ).post(`${w.base}/pain-reports`, reportBody(w.org.athlete.membershipId, { note: NOTE }, ['night_pain']));
    expect(res.status, JSON.stringify(res.body)).toBe(201);
    reportId = res.body.report.id;
  });

  it('the clinician sees the note and the red-flag answers', async () => {
    const res = await (await w.as('clinician')).get(`${w.base}/pain-reports?athleteId=${w.org.athlete.membershipId}`);
    expect(res.status).toBe(200);
    const mine = res.body.find((r: { id: string }) => r.id === reportId);
    expect(mine).toMatchObject({
      note: NOTE,
      redFlags: expect.objectContaining({ night_pain: true, both_legs_new: false }),
      painNow: 4,
      route: 'urgent',
    });
  });

  it('the coach sees scores and places but no `note` and no `redFlags` keys', async () => {
    const res = await (await w.as('coach')).get(`${w.base}/pain-reports`);
    expect(res.status).toBe(200);
    const mine = res.body.find((r: { id: string }) => r.id === reportId);
    expect(mine).toMatchObject({ painNow: 4, painWorst24h: 6, bodyRegions: ['lower_back'], route: 'urgent' });
    for (const r of res.body) {
      expect(r).not.toHaveProperty('note');
      expect(r).not.toHaveProperty('redFlags');
    }
    expect(JSON.stringify(res.body)).not.toContain(NOTE);
  });

  it("another care team's coach and clinician see none of the athlete's reports (ASVS 5.0 V8.2.2)", async () => {
    for (const who of ['otherCoach', 'otherClinician'] as const) {
      const res = await (await w.as(who)).get(`${w.base}/pain-reports`);
      expect(res.status).toBe(200);
      expect(res.body.map((r: { athleteId: string }) => r.athleteId)).not.toContain(w.org.athlete.membershipId);
      const filtered = await (await w.as(who)).get(`${w.base}/pain-reports?athleteId=${w.org.athlete.membershipId}`);
      expect(filtered.body).toEqual([]);
    }
  });

  it('the athlete lists only their own reports', async () => {
    const res = await (await w.as('athlete')).get(`${w.base}/pain-reports`);
    expect(res.status).toBe(200);
    expect(res.body.length).toBeGreaterThan(0);
    expect(new Set(res.body.map((r: { athleteId: string }) => r.athleteId))).toEqual(new Set([w.org.athlete.membershipId]));
  });

  it.each(['guardian', 'admin'] as const)('%s → 403 on /pain-reports (they read no reports)', async (who) => {
    const res = await (await w.as(who)).get(`${w.base}/pain-reports?athleteId=${w.org.athlete.membershipId}`);
    expect(res.status).toBe(403);
    expect(JSON.stringify(res.body)).not.toContain(NOTE);
  });
});
