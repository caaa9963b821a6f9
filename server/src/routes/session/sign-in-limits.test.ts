import { afterEach, describe, expect, it, vi } from 'vitest';
import { Client, useHarness } from '../../test/harness';
import { createOrg, TEST_PASSWORD } from '../../test/factories';
import { simulateClock, uniqueEmail } from './fixtures';

describe('sign-in rate limit per account (SIGNIN_WINDOW_SECONDS=2, 3 failures per window)', () => {
  const h = useHarness({ SIGNIN_WINDOW_SECONDS: '2', SIGNIN_MAX_FAILURES_PER_ACCOUNT: '3' });
  afterEach(() => {
    vi.useRealTimers();
  });

  it('20 bad tries on one account → 429 (the last one too); after the window the real user signs in', async () => {
    const org = await createOrg(h.ds);
    const c = await Client.anonymous(h.app);
    const t0 = simulateClock();
    const statuses: number[] = [];
    let last!: Awaited<ReturnType<Client['post']>>;
    for (let i = 0; i < 20; i++) {
      last = await c.post('/api/session', { email: org.coach.email, password: `guess number ${i}` });
      statuses.push(last.status);
    }
    expect(statuses.filter((s) => s === 429).length).toBeGreaterThanOrEqual(1);
    expect(statuses).toEqual([401, 401, 401, ...Array(17).fill(429)]);
    expect(last.status).toBe(429);
    expect(last.body.error.code).toBe('rate_limited');

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

describe('sign-in rate limit per IP address (SIGNIN_WINDOW_SECONDS=2, 3 tries per window)', () => {
  const h = useHarness({ SIGNIN_WINDOW_SECONDS: '2', SIGNIN_MAX_PER_IP: '3' });
  afterEach(() => {
    vi.useRealTimers();
  });

  it('limits tries from one address across many accounts, then lets the address in again', async () => {
    const org = await createOrg(h.ds);
    const c = await Client.anonymous(h.app);
    const t0 = simulateClock();
    const statuses: number[] = [];
    for (let i = 0; i < 4; i++) {
      const res = await c.post('/api/session', { email: uniqueEmail('spray'), password: 'guessing the passphrase' });
      statuses.push(res.status);
    }
    expect(statuses).toEqual([401, 401, 401, 429]);
    expect((await c.post('/api/session', { email: org.coach.email, password: TEST_PASSWORD })).status).toBe(429);

    vi.setSystemTime(t0 + h.config.SIGNIN_WINDOW_SECONDS * 1000 + 1000);
    const ok = await c.signIn(org.coach.email, TEST_PASSWORD);
    expect(ok.status).toBe(200);
  });
});
