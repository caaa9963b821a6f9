import bcrypt from 'bcryptjs';
import { afterEach, describe, expect, it, vi } from 'vitest';
import type { DataSource } from 'typeorm';
import { Client, useHarness } from '../../test/harness';
import { createOrg, TEST_PASSWORD, type MemberRef } from '../../test/factories';
import { simulateClock, uniqueEmail } from '../../test/worlds/session-fixtures';

// These tests sign in dozens of times: the people's passwords are stored at bcrypt cost 4 (the
// comparison follows the stored cost), so the limits are tested, not the hashing.
let cheap: Promise<string> | null = null;
async function cheapPasswords(ds: DataSource, people: MemberRef[]): Promise<void> {
  await ds.query(`UPDATE users SET password_hash = $1 WHERE id = ANY($2)`, [
    await (cheap ??= bcrypt.hash(TEST_PASSWORD, 4)),
    people.map((p) => p.userId),
  ]);
}

describe('sign-in rate limit per account (SIGNIN_WINDOW_SECONDS=2, 3 failures per window)', () => {
  const h = useHarness({ SIGNIN_WINDOW_SECONDS: '2', SIGNIN_MAX_FAILURES_PER_ACCOUNT: '3' });
  afterEach(() => {
    vi.useRealTimers();
  });

  it('ASVS 5.0 V6.3.1: 20 bad tries on one account → 429 (the last one too); after the window the real user signs in', async () => {
    const org = await createOrg(h.ds);
    const c = await Client.anonymous(h.app);
    const t0 = simulateClock();
    const statuses: number[] = [];
    let last!: Awaited<ReturnType<Client['post']>>;
    for (let i = 0; i < 20; i++) {
      last = await c.post('/api/session', { email: org.coach.email, password: `guess number ${i}` });
      statuses.push(last.status);
    }
    expect(statuses).toEqual([401, 401, 401, ...Array(17).fill(429)]);
    expect(last.body.error.code).toBe('rate_limited');
    expect(last.body.error.message).toMatch(/for this account.*try again in \d+ minutes?/);

    // Inside the window even the right password is refused (so a lucky guess is not confirmed)...
    const blocked = await c.post('/api/session', { email: org.coach.email, password: TEST_PASSWORD });
    expect(blocked.status).toBe(429);
    // ...while another account from the same address is not locked by this one's failures.
    const other = await (await Client.anonymous(h.app)).signIn(org.clinician.email, TEST_PASSWORD);
    expect(other.status).toBe(200);

    // Once the window has passed the real user gets in: no permanent lockout.
    vi.setSystemTime(t0 + h.config.SIGNIN_WINDOW_SECONDS * 1000 + 1000);
    const ok = await c.signIn(org.coach.email, TEST_PASSWORD);
    expect(ok.status).toBe(200);
    expect(ok.body.user.id).toBe(org.coach.userId);
  });
});

describe('a team on one school network (one shared address) is not locked out (default limits)', () => {
  const h = useHarness();

  it('ASVS 5.0 V6.3.1: 60 successful sign-ins from one address do not lock anyone out', async () => {
    const org = await createOrg(h.ds);
    const team = [org.athlete, org.otherAthlete, org.coach, org.clinician, org.guardian, org.admin];
    await cheapPasswords(h.ds, team);
    const statuses: number[] = [];
    for (let i = 0; i < 60; i++) {
      const res = await (await Client.anonymous(h.app)).signIn(team[i % team.length].email, TEST_PASSWORD);
      statuses.push(res.status);
    }
    expect(statuses).toEqual(Array(60).fill(200));
  });
});

describe('failures on one account do not block others on the same address until the network ceiling (3 per account, 10 per address)', () => {
  const h = useHarness({ SIGNIN_MAX_FAILURES_PER_ACCOUNT: '3', SIGNIN_MAX_PER_IP: '10' });

  it('ASVS 5.0 V6.3.1: a person hammering their paused account uses none of the network’s budget; the ceiling then says it is the network’s', async () => {
    const org = await createOrg(h.ds);
    await cheapPasswords(h.ds, [org.athlete, org.otherAthlete, org.coach]);
    const forgetful = await Client.anonymous(h.app);
    const statuses: number[] = [];
    for (let i = 0; i < 25; i++) {
      statuses.push((await forgetful.post('/api/session', { email: org.athlete.email, password: `not it ${i}` })).status);
    }
    expect(statuses).toEqual([401, 401, 401, ...Array(22).fill(429)]);

    // Teammates on the same address still get in: 3 failures so far, the ceiling is 10.
    expect((await (await Client.anonymous(h.app)).signIn(org.otherAthlete.email, TEST_PASSWORD)).status).toBe(200);
    // A success is counted on arrival and taken back once answered; let that land before counting on.
    await new Promise((resolve) => setTimeout(resolve, 300));

    // Seven more failures across other accounts reach the network's ceiling...
    const spray = await Client.anonymous(h.app);
    for (let i = 0; i < 7; i++) {
      const email = i < 3 ? org.coach.email : uniqueEmail(`spray${i}`);
      expect((await spray.post('/api/session', { email, password: 'still guessing' })).status).toBe(401);
    }
    // ...and then the refusal says plainly that the limit is the network's, not the person's.
    const refused = await (await Client.anonymous(h.app)).post('/api/session', { email: org.otherAthlete.email, password: TEST_PASSWORD });
    expect(refused.status).toBe(429);
    expect(refused.body.error.code).toBe('rate_limited_network');
    expect(refused.body.error.message).toMatch(/from this network.*not about your account.*wait \d+ minutes?/);
  });
});

describe('per account from one address (TRUST_PROXY=true; 10 per account, 2 per address and account)', () => {
  const h = useHarness({ TRUST_PROXY: 'true', SIGNIN_MAX_FAILURES_PER_ACCOUNT: '10', SIGNIN_MAX_FAILURES_PER_ADDRESS_ACCOUNT: '2' });

  it('ASVS 5.0 V6.3.1: a guesser on one address is stopped before the account’s owner elsewhere is', async () => {
    const org = await createOrg(h.ds);
    await cheapPasswords(h.ds, [org.coach]);
    const guesser = await Client.anonymous(h.app);
    const tries: number[] = [];
    for (let i = 0; i < 4; i++) {
      const res = await guesser.agent
        .post('/api/session')
        .set('X-Forwarded-For', '203.0.113.7')
        .set('x-csrf-token', guesser.csrf)
        .send({ email: org.coach.email, password: `g${i}` });
      tries.push(res.status);
    }
    expect(tries).toEqual([401, 401, 429, 429]);

    const owner = await Client.anonymous(h.app);
    const res = await owner.agent
      .post('/api/session')
      .set('X-Forwarded-For', '198.51.100.2')
      .set('x-csrf-token', owner.csrf)
      .send({ email: org.coach.email, password: TEST_PASSWORD });
    expect(res.status).toBe(200);
  });
});

describe('sign-in rate limit per IP address (SIGNIN_WINDOW_SECONDS=2, 3 failures per window)', () => {
  const h = useHarness({ SIGNIN_WINDOW_SECONDS: '2', SIGNIN_MAX_PER_IP: '3' });
  afterEach(() => {
    vi.useRealTimers();
  });

  it('ASVS 5.0 V6.3.1: limits failures from one address across many accounts, then lets the address in again', async () => {
    const org = await createOrg(h.ds);
    const c = await Client.anonymous(h.app);
    const t0 = simulateClock();
    const statuses: number[] = [];
    for (let i = 0; i < 4; i++) {
      const res = await c.post('/api/session', { email: uniqueEmail('spray'), password: 'guessing the passphrase' });
      statuses.push(res.status);
    }
    expect(statuses).toEqual([401, 401, 401, 429]);
    const refused = await c.post('/api/session', { email: org.coach.email, password: TEST_PASSWORD });
    expect(refused.status).toBe(429);
    expect(refused.body.error.code).toBe('rate_limited_network');

    vi.setSystemTime(t0 + h.config.SIGNIN_WINDOW_SECONDS * 1000 + 1000);
    const ok = await c.signIn(org.coach.email, TEST_PASSWORD);
    expect(ok.status).toBe(200);
  });
});
