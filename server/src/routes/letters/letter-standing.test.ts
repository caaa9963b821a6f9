import { describe, expect, it } from 'vitest';
import { addDays, orgToday } from '../../../../policies/today';
import { useHarness } from '../../test/harness';
import { letterKit, pinClock } from '../../test/worlds/letter-fixtures';

/**
 * Where a signed letter stands on the organization's day: scheduled until its start date, then in
 * force until a later letter starts or its valid-until day has passed. The clock is pinned; the
 * world's organization keeps UTC, so its day is the UTC day here (letter-time-zone.test.ts covers
 * an organization in another zone).
 */
const h = useHarness({ SIGNIN_MAX_PER_IP: '1000' });
const { world, freshAthlete, signedLetter, auditActions, check } = letterKit(h);
const now = pinClock('12:00:00');

describe('a letter signed to start later', () => {
  it('leaves the earlier letter in force until its start date, then takes over (list and public check)', async () => {
    const w = await world();
    const athlete = await freshAthlete(w);
    const today = orgToday('UTC', now());
    const a = await signedLetter(w, athlete.membershipId, { effectiveFrom: today, validUntil: null });
    const b = await signedLetter(w, athlete.membershipId, { effectiveFrom: addDays(today, 7), validUntil: null });
    const standings = async () => {
      const list = await (await w.as('guardian')).get(`${w.base}/letters?athleteId=${athlete.membershipId}`);
      expect(list.status).toBe(200);
      return Object.fromEntries(
        list.body.map((l: { id: string; status: string; supersededBy: string | null }) => [
          l.id,
          { status: l.status, supersededBy: l.supersededBy },
        ]),
      );
    };

    // B is signed and sent but has not started: A is still the letter in force.
    expect(b.status).toBe('scheduled');
    expect(await standings()).toEqual({
      [a.id]: { status: 'signed', supersededBy: null },
      [b.id]: { status: 'scheduled', supersededBy: null },
    });
    expect((await check(a.verificationCode)).body.status).toBe('valid');
    expect((await check(b.verificationCode)).body).toMatchObject({ status: 'scheduled', effectiveFrom: addDays(today, 7) });
    // Signing still records who replaces whom, in the row and in the audit entry.
    const [row] = await h.ds.query(`SELECT superseded_by FROM clearance_letters WHERE id = $1`, [a.id]);
    expect(row.superseded_by).toBe(b.id);
    expect((await auditActions(b.id)).find((e) => e.action === 'letter.signed')?.after).toMatchObject({ supersedes: [a.id] });

    // A week on (both start dates moved back instead): B has started, so A is superseded.
    await h.ds.query(`UPDATE clearance_letters SET effective_from = effective_from - 8 WHERE id = ANY($1)`, [[a.id, b.id]]);
    expect(await standings()).toEqual({
      [a.id]: { status: 'superseded', supersededBy: b.id },
      [b.id]: { status: 'signed', supersededBy: null },
    });
    expect((await check(a.verificationCode)).body.status).toBe('superseded');
    expect((await check(b.verificationCode)).body.status).toBe('valid');
  });

  it('a letter signed afterwards that starts sooner replaces the scheduled one; the latest-signed letter that has started is in force', async () => {
    const w = await world();
    const athlete = await freshAthlete(w);
    const today = orgToday('UTC', now());
    const a = await signedLetter(w, athlete.membershipId, { effectiveFrom: addDays(today, -30), validUntil: null });
    const b = await signedLetter(w, athlete.membershipId, { effectiveFrom: addDays(today, 10), validUntil: null });
    const c = await signedLetter(w, athlete.membershipId, { effectiveFrom: today, validUntil: null });
    const list = await (await w.as('clinician')).get(`${w.base}/letters?athleteId=${athlete.membershipId}`);
    const byId = Object.fromEntries(list.body.map((l: { id: string }) => [l.id, l]));
    expect(byId[a.id]).toMatchObject({ status: 'superseded', supersededBy: c.id });
    expect(byId[b.id]).toMatchObject({ status: 'superseded', supersededBy: c.id });
    expect(byId[c.id]).toMatchObject({ status: 'signed', supersededBy: null });
    expect((await check(b.verificationCode)).body.status).toBe('superseded');
    expect((await check(c.verificationCode)).body.status).toBe('valid');
  });
});

describe('a letter past its valid-until day', () => {
  it('lists as expired and checks expired; the day itself is still in force; a superseded one stays superseded', async () => {
    const w = await world();
    const athlete = await freshAthlete(w);
    const today = orgToday('UTC', now());
    const old = await signedLetter(w, athlete.membershipId, { effectiveFrom: addDays(today, -60), validUntil: addDays(today, -40) });
    const a = await signedLetter(w, athlete.membershipId, { effectiveFrom: addDays(today, -30), validUntil: today });
    const standings = async () => {
      const list = await (await w.as('guardian')).get(`${w.base}/letters?athleteId=${athlete.membershipId}`);
      expect(list.status).toBe(200);
      return Object.fromEntries(list.body.map((l: { id: string; status: string }) => [l.id, l.status]));
    };

    // Valid until today: still in force today.
    expect(await standings()).toEqual({ [old.id]: 'superseded', [a.id]: 'signed' });
    expect((await check(a.verificationCode)).body.status).toBe('valid');

    await h.ds.query(`UPDATE clearance_letters SET valid_until = $2 WHERE id = $1`, [a.id, addDays(today, -1)]);
    expect(await standings()).toEqual({ [old.id]: 'superseded', [a.id]: 'expired' });
    expect((await check(a.verificationCode)).body).toMatchObject({ status: 'expired', validUntil: addDays(today, -1) });
    expect((await check(old.verificationCode)).body.status).toBe('superseded');
  });
});
