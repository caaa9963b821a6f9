import { beforeAll, describe, expect, it } from 'vitest';
import { addDays, hourIn, orgToday } from '../../../../policies/today';
import { Organization } from '../../entities';
import { useHarness } from '../../test/harness';
import { letterKit, pinClock, type World } from '../../test/worlds/letter-fixtures';

/**
 * A letter's "today" is its organization's day (policies/today.ts), not the server's UTC day. The
 * clock is pinned at 21:00 UTC: 07:00 the next morning in Brisbane (UTC+10 all year, no daylight
 * saving), when the UTC day is still the day before.
 */
const h = useHarness({ SIGNIN_MAX_PER_IP: '1000' });
const { world, freshAthlete, signedLetter, check } = letterKit(h);
const now = pinClock('21:00:00');
const ZONE = 'Australia/Brisbane';

describe('an organization at UTC+10, at 07:00 local time', () => {
  let w: World;
  let localToday: string;
  beforeAll(async () => {
    w = await world();
    await h.ds.getRepository(Organization).update({ id: w.org.id }, { timeZone: ZONE });
    localToday = orgToday(ZONE, now());
  });

  it('is the morning of the next day there', () => {
    expect(hourIn(ZONE, now())).toBe(7);
    expect(localToday).toBe(addDays(orgToday('UTC', now()), 1));
  });

  it('a letter starting today (local) is in force, in the list and on the public check', async () => {
    const athlete = await freshAthlete(w);
    const letter = await signedLetter(w, athlete.membershipId, { effectiveFrom: localToday, validUntil: null });
    // On the UTC day it would not have started yet.
    expect(letter.status).toBe('signed');
    const list = await (await w.as('guardian')).get(`${w.base}/letters?athleteId=${athlete.membershipId}`);
    expect(list.body.map((l: { status: string }) => l.status)).toEqual(['signed']);
    // Issued on the local day too.
    expect((await check(letter.verificationCode)).body).toMatchObject({ status: 'valid', effectiveFrom: localToday, issuedOn: localToday });
  });

  it('a letter valid until yesterday (local) has expired, though that is still the UTC day', async () => {
    const athlete = await freshAthlete(w);
    const yesterday = addDays(localToday, -1);
    const letter = await signedLetter(w, athlete.membershipId, { effectiveFrom: addDays(localToday, -30), validUntil: yesterday });
    expect(letter.status).toBe('expired');
    expect((await check(letter.verificationCode)).body).toMatchObject({ status: 'expired', validUntil: yesterday });
  });

  it('a later letter starting today (local) has already taken over from the earlier one', async () => {
    const athlete = await freshAthlete(w);
    const first = await signedLetter(w, athlete.membershipId, { effectiveFrom: addDays(localToday, -30), validUntil: null });
    const second = await signedLetter(w, athlete.membershipId, { effectiveFrom: localToday, validUntil: null });
    expect((await check(first.verificationCode)).body.status).toBe('superseded');
    expect((await check(second.verificationCode)).body.status).toBe('valid');
  });
});
