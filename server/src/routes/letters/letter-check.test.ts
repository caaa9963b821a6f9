import { randomUUID } from 'node:crypto';
import { beforeAll, describe, expect, it } from 'vitest';
import { addDays, orgToday } from '../../../../policies/today';
import { hashCode, initials, newVerificationCode, normalizeCode } from '../../services/letters';
import { Client, useHarness } from '../../test/harness';
import type { MemberRef } from '../../test/factories';
import { letterKit, pinClock, type Signed, type World } from '../../test/worlds/letter-fixtures';

/**
 * The public check page: a verification code answers the letter's standing with dates, decision and
 * initials only — never the athlete's name, notes or limits — and is rate-limited per address.
 */
const h = useHarness({ SIGNIN_MAX_PER_IP: '1000' });
const { world, freshAthlete, signedLetter, check } = letterKit(h);
const now = pinClock('12:00:00');

describe('the public check page', () => {
  const NOTES = `Check notes ${randomUUID()}`;
  const DIAGNOSIS = `Check diagnosis ${randomUUID()}`;
  const PAIN = `Check pain ${randomUUID()}`;
  let w: World;
  let athlete: MemberRef;
  let first: Signed;
  // Its review is still ahead of the pinned day (the organization keeps UTC), so the letter is in force.
  const until = addDays(orgToday('UTC', now()), 60);
  beforeAll(async () => {
    w = await world();
    athlete = await freshAthlete(w, 'Maya Lindqvist-Ortega');
    const c = await (
      await w.as('clinician')
    ).post(`${w.base}/cases`, {
      athleteId: athlete.membershipId,
      bodyRegions: ['lower_leg_left'],
      onsetDate: '2026-01-10',
      diagnosis: DIAGNOSIS,
      clinicalNotes: NOTES,
      status: 'limited',
      statusEffectiveFrom: '2026-01-11',
      statusNote: PAIN,
    });
    expect(c.status, JSON.stringify(c.body)).toBe(201);
    first = await signedLetter(w, athlete.membershipId, {
      decision: 'limited',
      limits: ['Sprint: not allowed for now'],
      effectiveFrom: '2026-03-09',
      validUntil: until,
    });
  });

  it('a signed letter checks valid, with initials, decision, dates, organization and issue date only', async () => {
    const res = await check(first.verificationCode);
    expect(res.status).toBe(200);
    expect(res.headers['cache-control']).toMatch(/no-store/);
    const [org] = await h.ds.query(`SELECT name FROM organizations WHERE id = $1`, [w.org.id]);
    const [{ signed_at: signedAt }] = await h.ds.query(`SELECT signed_at FROM clearance_letters WHERE id = $1`, [first.id]);
    expect(res.body).toEqual({
      status: 'valid',
      athleteInitials: initials(athlete.name),
      decision: 'Limited participation from 9 March 2026',
      effectiveFrom: '2026-03-09',
      validUntil: until,
      organizationName: org.name,
      issuedOn: (signedAt as Date).toISOString().slice(0, 10),
    });
    expect(res.body.athleteInitials).toBe('M. L.');
  });

  it("never holds the athlete's name, notes, diagnosis, pain data or limits", async () => {
    const body = JSON.stringify((await check(first.verificationCode)).body);
    for (const word of athlete.name.split(' ')) expect(body).not.toContain(word);
    for (const secret of [NOTES, DIAGNOSIS, PAIN, 'lower_leg', 'Lower leg', 'Sprint', w.org.clinician.name, athlete.membershipId, first.id])
      expect(body).not.toContain(secret);
  });

  it('takes the code as people type it: lower case, without dashes, with spaces, O for 0 and I or L for 1', async () => {
    const typed = first.verificationCode.toLowerCase().replace(/-/g, '');
    expect((await check(typed)).body.status).toBe('valid');
    expect((await check(first.verificationCode.replace(/-/g, ' '))).body.status).toBe('valid');
    // Look-alikes, on a letter whose code is known to hold 0s and 1s.
    const lookAlike = await signedLetter(w, (await freshAthlete(w)).membershipId, { validUntil: null });
    await h.ds.query(`UPDATE clearance_letters SET code_hash = $2 WHERE id = $1`, [lookAlike.id, hashCode('0A1B-0C1D-00EF-11GH-0101')]);
    expect((await check('oa1b-OcId-ooef-lLgh-oIoL')).body.status).toBe('valid');
    expect((await check('oa1b-OcId-ooef-lLgh-oIoM')).body.status).toBe('unknown');
  });

  it('after a second letter, the first checks superseded and the second valid', async () => {
    const second = await signedLetter(w, athlete.membershipId, { decision: 'full', effectiveFrom: '2026-04-10', validUntil: null });
    expect((await check(first.verificationCode)).body).toMatchObject({
      status: 'superseded',
      decision: 'Limited participation from 9 March 2026',
    });
    expect((await check(second.verificationCode)).body).toMatchObject({
      status: 'valid',
      decision: 'Full participation from 10 April 2026',
      validUntil: null,
    });
  });

  it('a code never issued is unknown, with nothing else; a malformed one is refused (400)', async () => {
    const unknown = await check(newVerificationCode());
    expect(unknown.status).toBe(200);
    expect(unknown.body).toEqual({ status: 'unknown' });
    const bad = await check('<script>alert(1)</script>');
    expect(bad.status).toBe(400);
    expect(bad.body.error.code).toBe('validation_failed');
  });
});

describe('verification codes', () => {
  it('are 100 random bits: 20 Crockford base32 characters in five groups of four, never repeating', () => {
    const seen = new Set<string>();
    const used = new Set<string>();
    for (let i = 0; i < 2000; i++) {
      const code = newVerificationCode();
      expect(code).toMatch(/^[0-9A-HJKMNP-TV-Z]{4}(-[0-9A-HJKMNP-TV-Z]{4}){4}$/);
      seen.add(code);
      for (const ch of code.replace(/-/g, '')) used.add(ch);
    }
    expect(seen.size).toBe(2000);
    // All 32 symbols turn up: no bit is stuck.
    expect(used.size).toBe(32);
  });

  it('normalize the way people type them back', () => {
    expect(normalizeCode('abcd-efgh-jkmn-pqrs-tvwx')).toBe('ABCDEFGHJKMNPQRSTVWX');
    expect(normalizeCode(' o0Oi-IlL1 ')).toBe('00011111');
    expect(hashCode('0A1B-0C1D')).toBe(hashCode('oa ib oc ld'));
    expect(hashCode('0A1B-0C1D')).not.toBe(hashCode('0A1B-0C1E'));
  });
});

describe('the check endpoint is rate-limited per address', () => {
  // An app of its own, so the other tests' checks do not count against this window.
  const rl = useHarness({ SIGNIN_MAX_PER_IP: '1000' });

  it('30 checks in a minute answer; the 31st → 429, and a forged X-Forwarded-For does not reset it', async () => {
    const anon = await Client.anonymous(rl.app);
    for (let i = 0; i < 30; i++) {
      const res = await anon.post('/api/check', { code: newVerificationCode() });
      expect(res.status, `check ${i + 1}`).toBe(200);
    }
    const over = await anon.post('/api/check', { code: newVerificationCode() });
    expect(over.status).toBe(429);
    expect(over.body.error.code).toBe('rate_limited');
    const fresh = await Client.anonymous(rl.app);
    const forged = await fresh.agent
      .post('/api/check')
      .set('x-csrf-token', fresh.csrf)
      .set('x-forwarded-for', '203.0.113.9')
      .send({ code: newVerificationCode() });
    expect(forged.status).toBe(429);
  });
});
