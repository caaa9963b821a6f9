import { randomUUID } from 'node:crypto';
import { describe, expect, it } from 'vitest';
import { addDays, orgToday } from '../../../../policies/today';
import { useHarness } from '../../test/harness';
import { letterKit, pinClock, type World } from '../../test/worlds/letter-fixtures';

/**
 * Letters never go stale: when the plan or status changes while a letter is in
 * force and its limits no longer match, the letter reads "out of date" to everyone who sees it, the
 * public check says a newer decision exists (nothing more), the care team's clinicians get a notice,
 * and the updated letter's form is filled in from what is in force now. The clock is pinned; the
 * organization keeps UTC, so its day is the UTC day.
 */
const h = useHarness({ SIGNIN_MAX_PER_IP: '1000' });
const { world, freshAthlete, draftLetter, signLetter, check } = letterKit(h);
const now = pinClock('12:00:00');
const today = () => orgToday('UTC', now());

type Patterns = Record<string, { mode: string; caps?: Record<string, number | boolean> }>;
const HINGE_60: Patterns = { hinge: { mode: 'capped', caps: { maxPercent1RM: 60, maxRpe: 7 } }, jump: { mode: 'blocked' } };
const stage = (patterns: Patterns, id = randomUUID()) => ({
  id,
  label: 'Protect',
  startDate: addDays(today(), -5),
  endDate: addDays(today(), 30),
  painCeiling: 3,
  patterns,
});

/** A fresh athlete, Limited since two days ago with a one-stage plan, and a Limited letter signed today. */
async function limitedWithLetter(w: World) {
  const athlete = await freshAthlete(w);
  const clin = await w.as('clinician');
  const c = await clin.post(`${w.base}/cases`, {
    athleteId: athlete.membershipId,
    bodyRegions: ['lower_back'],
    onsetDate: addDays(today(), -10),
    status: 'limited',
    statusEffectiveFrom: addDays(today(), -2),
  });
  expect(c.status, JSON.stringify(c.body)).toBe(201);
  const stageId = randomUUID();
  const plan = await clin.post(`${w.base}/cases/${c.body.id}/plan`, { guidance: 'Easy does it', stages: [stage(HINGE_60, stageId)] });
  expect(plan.status, JSON.stringify(plan.body)).toBe(201);
  const letter = await signLetter(
    w,
    await draftLetter(w, athlete.membershipId, { decision: 'limited', effectiveFrom: today(), validUntil: addDays(today(), 30) }),
  );
  let planVersion = plan.body.version as number;
  let caseVersion = c.body.version as number;
  return {
    athlete,
    letter,
    async revise(patterns: Patterns, guidance = 'Easy does it') {
      const res = await clin.agent
        .put(`${w.base}/plans/${plan.body.id}`)
        .set('x-csrf-token', clin.csrf)
        .send({ guidance, stages: [stage(patterns, stageId)], version: planVersion });
      expect(res.status, JSON.stringify(res.body)).toBe(200);
      planVersion = res.body.version;
    },
    async setStatus(status: 'out' | 'limited' | 'full') {
      const res = await clin.post(`${w.base}/cases/${c.body.id}/status`, { status, effectiveFrom: today(), version: caseVersion });
      expect(res.status, JSON.stringify(res.body)).toBe(201);
      caseVersion = res.body.version;
    },
  };
}

async function seenBy(w: World, who: 'clinician' | 'guardian' | 'coach' | 'athlete', athleteId: string, letterId: string) {
  const res = await (await w.as(who)).get(`${w.base}/letters?athleteId=${athleteId}`);
  expect(res.status).toBe(200);
  return (res.body as { id: string; outOfDate: boolean; status: string }[]).find((l) => l.id === letterId)!;
}

async function noticesAbout(athleteId: string) {
  return h.ds.query(`SELECT recipient_id, title, body FROM notifications WHERE kind = 'letter_out_of_date' AND athlete_id = $1`, [
    athleteId,
  ]);
}

describe('a letter whose limits no longer match what is in force', () => {
  it('a plan revised with the same limits (only the guidance changed) leaves the letter current', async () => {
    const w = await world();
    const s = await limitedWithLetter(w);
    expect((await seenBy(w, 'clinician', s.athlete.membershipId, s.letter.id)).outOfDate).toBe(false);
    await s.revise(HINGE_60, 'Walk daily');
    expect((await seenBy(w, 'clinician', s.athlete.membershipId, s.letter.id)).outOfDate).toBe(false);
    expect(await noticesAbout(s.athlete.membershipId)).toEqual([]);
    expect((await check(s.letter.verificationCode)).body).not.toHaveProperty('newerDecision');
  });

  it('a plan revised to other limits marks it out of date for the clinician, the family and the coach', async () => {
    const w = await world();
    const s = await limitedWithLetter(w);
    await s.revise({ hinge: { mode: 'capped', caps: { maxPercent1RM: 50, maxRpe: 7 } }, jump: { mode: 'blocked' } });
    for (const who of ['clinician', 'guardian', 'coach'] as const) {
      expect(await seenBy(w, who, s.athlete.membershipId, s.letter.id), who).toMatchObject({ status: 'signed', outOfDate: true });
    }
  });

  it('a status change (Limited → Full) marks a Limited letter out of date', async () => {
    const w = await world();
    const s = await limitedWithLetter(w);
    await s.setStatus('full');
    expect((await seenBy(w, 'guardian', s.athlete.membershipId, s.letter.id)).outOfDate).toBe(true);
  });

  it('the care team clinicians get one notice (not the coach or family), and not another while it is unread', async () => {
    const w = await world();
    const s = await limitedWithLetter(w);
    await s.revise({ hinge: { mode: 'blocked' } });
    await s.setStatus('out');
    const notices = await noticesAbout(s.athlete.membershipId);
    expect(notices.map((n: { recipient_id: string }) => n.recipient_id)).toEqual([w.org.clinician.membershipId]);
    expect(notices[0].title).toBe(`${s.athlete.name}'s clearance letter is out of date`);
    expect(notices[0].body).toContain('Write the updated letter');
  });
});

describe('the public check of an out-of-date letter', () => {
  it('ASVS 5.0 V8.2.3 (field-level access): says a newer decision exists and nothing of what it is', async () => {
    const w = await world();
    const s = await limitedWithLetter(w);
    await s.revise({ hinge: { mode: 'capped', caps: { maxPercent1RM: 40 } } });
    const res = await check(s.letter.verificationCode);
    expect(res.status).toBe(200);
    expect(res.body).toMatchObject({ status: 'valid', newerDecision: true });
    expect(Object.keys(res.body).sort()).toEqual(
      ['athleteInitials', 'decision', 'effectiveFrom', 'issuedOn', 'newerDecision', 'organizationName', 'status', 'validUntil'].sort(),
    );
    expect(JSON.stringify(res.body)).not.toMatch(/hinge|40%|60%|back|RPE|blocked|capped/i);
  });
});

describe('the updated letter', () => {
  it("is filled in from today's status and limits, with the signer's credential; signing it ends the out-of-date mark", async () => {
    const w = await world();
    const s = await limitedWithLetter(w);
    await s.revise({ hinge: { mode: 'capped', caps: { maxPercent1RM: 50 } } });
    const clin = await w.as('clinician');
    const prefill = await clin.get(`${w.base}/letters/prefill?athleteId=${s.athlete.membershipId}`);
    expect(prefill.status, JSON.stringify(prefill.body)).toBe(200);
    expect(prefill.body).toEqual({
      athleteId: s.athlete.membershipId,
      status: 'limited',
      decision: 'limited',
      effectiveFrom: today(),
      validUntil: null,
      limits: [
        'Lifting things from the floor or bending forward at the hips: weights no heavier than half of the most that can be lifted once.',
      ],
      credential: 'ATC',
      licenceNumber: 'AT-12345',
    });
    // Only those who may write letters get it.
    expect((await (await w.as('coach')).get(`${w.base}/letters/prefill?athleteId=${s.athlete.membershipId}`)).status).toBe(403);
    expect((await (await w.as('guardian')).get(`${w.base}/letters/prefill?athleteId=${s.athlete.membershipId}`)).status).toBe(403);

    const { athleteId, decision, effectiveFrom, credential, licenceNumber } = prefill.body;
    const updated = await signLetter(
      w,
      await draftLetter(w, athleteId, { decision, effectiveFrom, validUntil: null, credential, licenceNumber }),
    );
    expect(updated).toMatchObject({ status: 'signed', outOfDate: false });
    expect(await seenBy(w, 'guardian', athleteId, s.letter.id)).toMatchObject({ status: 'superseded', outOfDate: false });
    expect((await seenBy(w, 'guardian', athleteId, updated.id)).outOfDate).toBe(false);
    expect((await check(s.letter.verificationCode)).body).toMatchObject({ status: 'superseded' });
    expect((await check(s.letter.verificationCode)).body).not.toHaveProperty('newerDecision');
    expect((await check(updated.verificationCode)).body).not.toHaveProperty('newerDecision');
  });

  it('NIST SP 811 (1 lb = 0.45359237 kg): its limits are in the family’s unit, loads rounded down', async () => {
    const w = await world();
    const s = await limitedWithLetter(w);
    await s.revise({ squat: { mode: 'capped', caps: { maxLoadKg: 40 } } });
    await h.ds.query(`UPDATE users SET unit_pref = 'lb' WHERE id = (SELECT user_id FROM memberships WHERE id = $1)`, [
      w.org.guardian.membershipId,
    ]);
    try {
      // 40 kg = 88.1849… lb: 85 lb on the bar (5-lb steps, common practice), never more than the cap.
      const prefill = await (await w.as('clinician')).get(`${w.base}/letters/prefill?athleteId=${s.athlete.membershipId}`);
      expect(prefill.body.limits).toEqual(['Squatting down and standing back up with weight: nothing heavier than 85 lb.']);
      const draft = await draftLetter(w, s.athlete.membershipId, { decision: 'limited', effectiveFrom: today(), validUntil: null });
      expect(draft.limits).toEqual(['Squatting down and standing back up with weight: nothing heavier than 85 lb.']);
    } finally {
      await h.ds.query(`UPDATE users SET unit_pref = 'kg' WHERE id = (SELECT user_id FROM memberships WHERE id = $1)`, [
        w.org.guardian.membershipId,
      ]);
    }
  });
});
