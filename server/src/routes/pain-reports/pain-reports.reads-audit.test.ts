import { describe, expect, it } from 'vitest';
import { useHarness } from '../../test/harness';
import { reportBody, reportWorld } from '../../test/worlds/report-world';

const h = useHarness({ SIGNIN_MAX_PER_IP: '1000' });
const { world, freshAthlete } = reportWorld(h);

const viewedAbout = (athleteId: string): Promise<{ actor_user_id: string; subject_id: string | null; after: Record<string, unknown> }[]> =>
  h.ds.query(
    `SELECT actor_user_id, subject_id, after FROM audit_entries WHERE action = 'painReport.viewed' AND athlete_id = $1 ORDER BY id`,
    [athleteId],
  );

describe('reads of pain reports with the narrative or red-flag answers are audited (ASVS 5.0 V16.2.1; 45 CFR 164.312(b))', () => {
  it('a clinician’s read writes one entry naming the athlete and the reports; the trail holds no narrative', async () => {
    const w = await world();
    const { ref, client: athlete } = await freshAthlete(w);
    const note = 'Sharp pain when I bend, worse at night';
    const filed = await athlete.post(`${w.base}/pain-reports`, reportBody(ref.membershipId, { note }));
    expect(filed.status).toBe(201);
    const reportId = filed.body.report?.id ?? filed.body.id;

    const clinician = await w.as('clinician');
    const res = await clinician.get(`${w.base}/pain-reports?athleteId=${ref.membershipId}`);
    expect(res.status).toBe(200);
    expect(res.body[0].note).toBe(note);
    const rows = await viewedAbout(ref.membershipId);
    expect(rows).toHaveLength(1);
    expect(rows[0]).toMatchObject({
      actor_user_id: w.org.clinician.userId,
      after: { reportIds: [reportId], fields: ['note', 'redFlags'] },
    });
    expect(JSON.stringify(rows)).not.toContain('Sharp pain');
  });

  it('a coach’s read (no narrative, no answers) and the athlete’s read of their own reports write nothing', async () => {
    const w = await world();
    const { ref, client: athlete } = await freshAthlete(w);
    expect((await athlete.post(`${w.base}/pain-reports`, reportBody(ref.membershipId))).status).toBe(201);
    const coachRead = await (await w.as('coach')).get(`${w.base}/pain-reports?athleteId=${ref.membershipId}`);
    expect(coachRead.status).toBe(200);
    expect(coachRead.body[0]).not.toHaveProperty('note');
    expect(coachRead.body[0]).not.toHaveProperty('redFlags');
    expect((await athlete.get(`${w.base}/pain-reports?athleteId=${ref.membershipId}`)).status).toBe(200);
    expect(await viewedAbout(ref.membershipId)).toEqual([]);
  });
});
