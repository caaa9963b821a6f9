import { describe, expect, it } from 'vitest';
import { noRedFlags, RED_FLAG_ITEMS, redFlagQuestion, redFlagQuestionsFor } from '../../../../policies/red-flags';
import { PainReport } from '../../entities';
import { useHarness } from '../../test/harness';
import { EMERGENCY_NUMBER, fromToday, reportBody, reportWorld } from '../../test/worlds/report-world';

// Sources: NICE NG59, "Low back pain and sciatica in over 16s" (2016, updated 2020); Finucane et al. 2020,
// JOSPT 50(7):350–372. The adolescent bending-backwards item (pars stress fracture) is from memory.

const h = useHarness({ SIGNIN_MAX_PER_IP: '1000' });
const { world, freshAthlete, noticesAbout, flagsAbout, reportsOf } = reportWorld(h);

const KNEE_URGENT = redFlagQuestionsFor(['knee_left']).filter((i) => i.tier === 'urgent');
const BACK_ONLY_URGENT = RED_FLAG_ITEMS.filter((i) => i.tier === 'urgent' && i.scope === 'back_or_pelvis');
const EMERGENCY = RED_FLAG_ITEMS.filter((i) => i.tier === 'emergency');

describe('the answers must fit the places chosen (ASVS 5.0 V2.2.3: related items checked together; NICE NG59; Finucane et al. 2020)', () => {
  it('a lower-back report missing a cauda equina answer → 400 naming that question; nothing stored', async () => {
    const w = await world();
    const { ref, client } = await freshAthlete(w);
    const body = reportBody(ref.membershipId);
    delete (body.redFlags as Record<string, boolean>).saddle_numbness;
    const res = await client.post(`${w.base}/pain-reports`, body);
    expect(res.status).toBe(400);
    expect(res.body.error).toMatchObject({
      code: 'validation_failed',
      fields: { 'redFlags.saddle_numbness': ['must be answered yes or no'] },
    });
    expect(await reportsOf(ref.membershipId)).toBe(0);
  });

  it('a knee report answering a back question → 400 naming the question not asked for a knee; nothing stored', async () => {
    const w = await world();
    const { ref, client } = await freshAthlete(w);
    const body = reportBody(ref.membershipId, { bodyRegions: ['knee_left'] });
    const res = await client.post(`${w.base}/pain-reports`, { ...body, redFlags: { ...body.redFlags, saddle_numbness: false } });
    expect(res.status).toBe(400);
    expect(res.body.error.fields).toEqual({ 'redFlags.saddle_numbness': ['is not asked for the places chosen'] });
    expect(res.body.error.message).toContain('redFlags.saddle_numbness');
    expect(await reportsOf(ref.membershipId)).toBe(0);
  });

  it('the retired "symptoms in both legs" id → 400 pointing to the question about new symptoms (NICE NG59: new bilateral symptoms)', async () => {
    const w = await world();
    const { ref, client } = await freshAthlete(w);
    const body = reportBody(ref.membershipId);
    const res = await client.post(`${w.base}/pain-reports`, { ...body, redFlags: { ...body.redFlags, both_legs: true } });
    expect(res.status).toBe(400);
    expect(res.body.error.fields).toEqual({ 'redFlags.both_legs': ['is no longer asked; answer both_legs_new instead'] });
  });

  it('a knee report with every knee question answered No → 201 routine (NICE NG59: no flags → reassure)', async () => {
    const w = await world();
    const { ref, client } = await freshAthlete(w);
    const res = await client.post(`${w.base}/pain-reports`, reportBody(ref.membershipId, { bodyRegions: ['knee_left'] }));
    expect(res.status, JSON.stringify(res.body)).toBe(201);
    expect(res.body).toMatchObject({ route: 'routine', statusSetToOut: false });
    expect(Object.keys(res.body.report.redFlags).sort()).toEqual(Object.keys(noRedFlags(['knee_left'])).sort());
  });
});

describe('"contact your clinician today": every urgent item routes as urgent, never Out (NICE NG59; Finucane et al. 2020)', () => {
  it.each([...KNEE_URGENT.map((i) => [i.id, 'knee_left'] as const), ...BACK_ONLY_URGENT.map((i) => [i.id, 'lower_back'] as const)])(
    '%s (%s) → 201 urgent: review-today flag and notice to the clinicians, status unchanged',
    async (id, region) => {
      const w = await world();
      const { ref, client } = await freshAthlete(w);
      const res = await client.post(`${w.base}/pain-reports`, reportBody(ref.membershipId, { bodyRegions: [region] }, [id]));
      expect(res.status, JSON.stringify(res.body)).toBe(201);
      expect(res.body).toMatchObject({ route: 'urgent', statusSetToOut: false });
      expect(res.body.message).toMatch(/contact your clinician today/i);
      expect(res.body.message).not.toMatch(/emergency|call 112/i);
      expect(await flagsAbout(ref.membershipId)).toEqual([expect.objectContaining({ kind: 'red_flag_urgent', severity: 'urgent' })]);
      const notices = await noticesAbout(ref.membershipId);
      expect(notices[w.org.clinician.membershipId]).toEqual(['red_flag_urgent']);
      expect(notices[w.org.guardian.membershipId]).toBeUndefined();
      const body: { body: string }[] = await h.ds.query(
        `SELECT body FROM notifications WHERE athlete_id = $1 AND kind = 'red_flag_urgent'`,
        [ref.membershipId],
      );
      expect(body[0].body).toContain(redFlagQuestion(id)!.question);
    },
  );
});

describe('"stop and get urgent care now": every emergency item routes as an emergency (NICE NG59; Finucane et al. 2020)', () => {
  it.each(EMERGENCY.map((i) => i.id))(
    '%s (pelvis, marked as hip / groin) → 201 emergency, set to Out, clinicians and the minor’s guardian alerted',
    async (id) => {
      const w = await world();
      const { ref, client } = await freshAthlete(w);
      const res = await client.post(
        `${w.base}/pain-reports`,
        reportBody(ref.membershipId, { bodyRegions: ['hip_groin_right'], painNow: 2, painWorst24h: 2 }, [id]),
      );
      expect(res.status, JSON.stringify(res.body)).toBe(201);
      expect(res.body).toMatchObject({ route: 'emergency', statusSetToOut: true, emergencyNumber: EMERGENCY_NUMBER });
      expect(res.body.message).toContain(`call ${EMERGENCY_NUMBER}`);
      const notices = await noticesAbout(ref.membershipId);
      expect(notices[w.org.clinician.membershipId]).toEqual(['red_flag_emergency']);
      expect(notices[w.org.guardian.membershipId]).toEqual(['red_flag_emergency_guardian']);
    },
  );
});

describe('old reports keep reading (retired ids)', () => {
  it('a stored report with the retired "both_legs" answer is listed with that answer, and its words are still known', async () => {
    const w = await world();
    const { ref } = await freshAthlete(w);
    const old = { ...noRedFlags(['lower_back']), both_legs: true } as Record<string, boolean>;
    delete old.both_legs_new;
    const stored = await h.ds.getRepository(PainReport).save({
      organizationId: w.org.id,
      athleteId: ref.membershipId,
      reportedBy: ref.userId,
      bodyRegions: ['lower_back'],
      painNow: 3,
      painWorst24h: 4,
      onsetDate: fromToday(-30),
      aggravatingPatterns: [],
      startedInTraining: true,
      note: null,
      redFlags: old,
      route: 'emergency',
      caseId: null,
    });
    const res = await (await w.as('clinician')).get(`${w.base}/pain-reports?athleteId=${ref.membershipId}`);
    expect(res.status).toBe(200);
    const mine = res.body.find((r: { id: string }) => r.id === stored.id);
    expect(mine.redFlags).toMatchObject({ both_legs: true });
    for (const id of Object.keys(mine.redFlags)) expect(redFlagQuestion(id), id).toBeDefined();
    expect(redFlagQuestion('both_legs')!.question).toBe('Do you have pain, numbness, tingling or weakness in both legs?');
  });
});
