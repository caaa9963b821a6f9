import { beforeAll, describe, expect, it } from 'vitest';
import { RED_FLAG_ITEMS } from '../../../../policies/red-flags';
import type { FlagDto } from '../../../../policies/dto';
import { signedIn, useHarness, type Client } from '../../test/harness';
import { createOrg, TEST_PASSWORD, type TestOrg } from '../../test/factories';

const h = useHarness({ SIGNIN_MAX_PER_IP: '1000' });

const allNo = () => Object.fromEntries(RED_FLAG_ITEMS.map((i) => [i.id, false]));
const CANCER_QUESTION = RED_FLAG_ITEMS.find((i) => i.id === 'cancer_history')!.question;

let org: TestOrg;
let base: string;
let coach: Client;
let clinician: Client;

beforeAll(async () => {
  org = await createOrg(h.ds);
  base = `/api/orgs/${org.id}`;
  const athlete = await signedIn(h.app, org.athlete.email, TEST_PASSWORD);
  coach = await signedIn(h.app, org.coach.email, TEST_PASSWORD);
  clinician = await signedIn(h.app, org.clinician.email, TEST_PASSWORD);
  // Pain 7 during, over the default ceiling of 5 (Silbernagel et al. 2007, AJSM 35:897–906): a pain-response flag.
  const log = await athlete.post(`${base}/training-logs`, {
    athleteId: org.athlete.membershipId,
    date: '2026-01-05',
    durationMinutes: 45,
    sessionRpe: 6,
    painBefore: 1,
    painDuring: 7,
  });
  const report = (redFlags: Record<string, boolean>) =>
    athlete.post(`${base}/pain-reports`, {
      athleteId: org.athlete.membershipId,
      bodyRegions: ['lower_back'],
      painNow: 3,
      painWorst24h: 6,
      onsetDate: '2026-01-04',
      startedInTraining: false,
      redFlags,
    });
  for (const r of [log, await report({ ...allNo(), cancer_history: true }), await report(allNo())])
    expect(r.status, JSON.stringify(r.body)).toBe(201);
});

const flagsOf = async (client: Client): Promise<FlagDto[]> => {
  const res = await client.get(`${base}/flags?athleteId=${org.athlete.membershipId}`);
  expect(res.status, JSON.stringify(res.body)).toBe(200);
  return res.body;
};

describe("the coach's flag list in a coach's words (ASVS 5.0 V8.2.3; 45 CFR 164.502(b) minimum necessary)", () => {
  it('the coach reads a line about training: no pain scores, no places, no warning-sign answers, no ISO dates', async () => {
    const flags = await flagsOf(coach);
    expect(flags.map((f) => f.kind).sort()).toEqual(['pain_report', 'pain_rule', 'red_flag_urgent']);
    for (const f of flags) {
      expect(f.message, f.kind).not.toMatch(/\d+\/10/);
      expect(f.message, f.kind).not.toMatch(/lower back/i);
      expect(f.message, f.kind).not.toContain(CANCER_QUESTION);
      expect(f.message, f.kind).not.toMatch(/\d{4}-\d{2}-\d{2}/);
      expect(f.message, f.kind).toContain(org.athlete.name);
    }
    const rule = flags.find((f) => f.kind === 'pain_rule')!;
    // 5 January 2026 was a Monday.
    expect(rule.message).toBe(`${org.athlete.name}'s response to the session of Mon 5 Jan 2026 calls for a lighter next session.`);
  });

  it('the clinician still reads the clinical message, with its date in words', async () => {
    const flags = await flagsOf(clinician);
    const routine = flags.find((f) => f.kind === 'pain_report')!;
    expect(routine.message).toContain('3/10 now');
    const rule = flags.find((f) => f.kind === 'pain_rule')!;
    expect(rule.message).toContain('session of Mon 5 Jan 2026');
    expect(rule.message).toContain('7/10');
  });

  it("the coach's notice of a pain report carries no scores or places; the clinician's does", async () => {
    const rows: { recipient_id: string; body: string }[] = await h.ds.query(
      `SELECT recipient_id, body FROM notifications WHERE kind = 'pain_report' AND athlete_id = $1`,
      [org.athlete.membershipId],
    );
    const coachNotice = rows.find((r) => r.recipient_id === org.coach.membershipId)!;
    const clinicianNotice = rows.find((r) => r.recipient_id === org.clinician.membershipId)!;
    expect(coachNotice.body).not.toMatch(/\d+\/10|lower back/i);
    expect(clinicianNotice.body).toMatch(/3\/10 now/);
  });
});
