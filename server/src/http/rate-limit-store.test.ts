import { describe, expect, it, vi } from 'vitest';
import { PgRateLimitStore } from './rate-limit-store';
import pino from 'pino';
import { buildApp } from '../app';
import { Client, useHarness } from '../test/harness';
import { createOrg, TEST_PASSWORD } from '../test/factories';

describe('sign-in limits are counted in PostgreSQL, across app processes', () => {
  const h = useHarness({ SIGNIN_MAX_FAILURES_PER_ACCOUNT: '4', SIGNIN_MAX_PER_IP: '1000' });

  it('two app instances on one database share the per-account count (ASVS 5.0 V6.3.1)', async () => {
    const org = await createOrg(h.ds);
    // A second process: same database, same configuration, its own Express app and memory.
    const other = buildApp({ ds: h.ds, config: h.config, logger: pino({ level: 'silent' }) });
    try {
      const a = await Client.anonymous(h.app);
      const b = await Client.anonymous(other.app);
      for (const c of [a, a, b, b]) expect((await c.signIn(org.coach.email, 'not-the-password')).status).toBe(401);
      // The fifth try, even with the right password and on the first app, is over the shared limit.
      const fifth = await a.signIn(org.coach.email, TEST_PASSWORD);
      expect(fifth.status).toBe(429);
      expect(fifth.body.error.code).toBe('rate_limited');
      // Another account is not affected.
      expect((await b.signIn(org.clinician.email, TEST_PASSWORD)).status).toBe(200);
    } finally {
      await other.close();
    }
  });

  it('keeps no e-mail or IP address in the table, only hashes', async () => {
    const org = await createOrg(h.ds);
    const c = await Client.anonymous(h.app);
    await c.signIn(org.athlete.email, 'wrong-password');
    const rows: { key: string }[] = await h.ds.query(`SELECT key FROM rate_limit_counters`);
    expect(rows.length).toBeGreaterThan(0);
    for (const r of rows) expect(r.key).toMatch(/^[0-9a-f]{64}$/);
  });

  it('a process whose clock runs a year ahead does not sweep away the windows others are counting in', async () => {
    const counting = new PgRateLimitStore(h.ds, `clock-test-${Date.now()}`);
    counting.init({ windowMs: 60_000 } as Parameters<PgRateLimitStore['init']>[0]);
    await counting.increment('someone');
    const ahead = new PgRateLimitStore(h.ds, `clock-ahead-${Date.now()}`);
    ahead.init({ windowMs: 60_000 } as Parameters<PgRateLimitStore['init']>[0]);
    vi.useFakeTimers({ toFake: ['Date'] });
    vi.setSystemTime(Date.now() + 365 * 24 * 3_600_000);
    const random = vi.spyOn(Math, 'random').mockReturnValue(0); // every increment sweeps
    try {
      await ahead.increment('anyone');
      await new Promise((r) => setTimeout(r, 200)); // the sweep runs after the increment answers
    } finally {
      random.mockRestore();
      vi.useRealTimers();
    }
    expect((await counting.get('someone'))?.totalHits).toBe(1);
  });
});
