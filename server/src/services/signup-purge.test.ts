import { randomUUID } from 'node:crypto';
import pino from 'pino';
import { afterEach, describe, expect, inject, it, vi } from 'vitest';
import type { CoreDeps } from '../core/command';
import { OrganizationSignup } from '../entities';
import { JobQueue, SIGNUP_PURGE_QUEUE } from '../jobs/queue';
import { waitFor } from '../test/worlds/account-security-fixtures';
import { SIGNUP_PURGE_AFTER_DAYS } from '../commands/organization-signup';
import { useHarness } from '../test/harness';
import { purgeSignups } from './signup-purge-job';

/**
 * Storage limitation (GDPR Art. 5(1)(e)): a request to start an organization that is never confirmed
 * is deleted SIGNUP_PURGE_AFTER_DAYS after its link expired, by a daily pg-boss job.
 */
// No queue in the harness: pg-boss's own timers would read the pinned clock. The schedule test starts one.
const h = useHarness();
const DAY = 86_400_000;
// A pinned instant earlier than any other test file's sign-ups, which expire around the real now: the
// purge can reach only this file's rows.
const NOW = new Date('2026-01-15T02:30:00Z');

afterEach(() => {
  vi.useRealTimers();
});

const deps = (): CoreDeps => ({
  ds: h.ds,
  config: h.config,
  logger: pino({ level: 'silent' }),
  jobs: null,
  storage: null as never,
});

async function signup(expiresAt: Date, confirmedAt: Date | null = null): Promise<string> {
  const row = await h.ds.getRepository(OrganizationSignup).save({
    organizationName: 'Fjord Rowing',
    country: 'NO',
    timeZone: 'Europe/Oslo',
    adminName: 'Ingrid Solberg',
    email: `purge-${randomUUID().slice(0, 8)}@example.test`,
    passwordHash: null,
    tokenHash: randomUUID().replaceAll('-', '').padEnd(64, '0'),
    expiresAt,
    confirmedAt,
  });
  return row.id;
}

const left = async (ids: string[]): Promise<string[]> =>
  (await h.ds.query(`SELECT id FROM organization_signups WHERE id = ANY ($1::uuid[])`, [ids])).map((r: { id: string }) => r.id);

const purgeEntries = (): Promise<{ organization_id: string | null; actor_user_id: string | null; after: Record<string, unknown> }[]> =>
  h.ds.query(
    `SELECT organization_id, actor_user_id, after FROM audit_entries WHERE action = 'organization.signups_purged' ORDER BY occurred_at`,
  );

describe('unconfirmed sign-up requests are purged (GDPR Art. 5(1)(e) storage limitation)', () => {
  it(`deletes only unconfirmed requests whose link expired more than ${SIGNUP_PURGE_AFTER_DAYS} days ago, once, with an entry that names no one`, async () => {
    vi.useFakeTimers({ toFake: ['Date'] });
    vi.setSystemTime(NOW);
    const ago = (ms: number) => new Date(NOW.getTime() - ms);
    const stale = await signup(ago(SIGNUP_PURGE_AFTER_DAYS * DAY + 60_000));
    const onTheLine = await signup(ago(SIGNUP_PURGE_AFTER_DAYS * DAY));
    const recent = await signup(ago(6 * DAY));
    const open = await signup(new Date(NOW.getTime() + DAY));
    const confirmed = await signup(ago(30 * DAY), ago(31 * DAY));
    const all = [stale, onTheLine, recent, open, confirmed];

    await purgeSignups(deps());
    expect(await left(all)).toEqual(expect.arrayContaining([onTheLine, recent, open, confirmed]));
    expect(await left(all)).not.toContain(stale);
    const entries = await purgeEntries();
    expect(entries).toHaveLength(1);
    expect(entries[0]).toMatchObject({ organization_id: null, actor_user_id: null });
    expect(entries[0].after).toEqual({ deleted: 1, expiredBefore: ago(SIGNUP_PURGE_AFTER_DAYS * DAY).toISOString(), afterDays: 7 });
    expect(JSON.stringify(entries[0].after)).not.toContain('@');

    // Again the same day (a retried or doubled job): nothing more goes, and no entry says otherwise.
    await purgeSignups(deps());
    expect(await left(all)).toHaveLength(4);
    expect(await purgeEntries()).toHaveLength(1);

    // A day later the one on the line has passed it.
    vi.setSystemTime(new Date(NOW.getTime() + DAY));
    await purgeSignups(deps());
    expect((await left(all)).sort()).toEqual([recent, open, confirmed].sort());
    expect((await purgeEntries()).map((e) => e.after.deleted)).toEqual([1, 1]);
  });

  it('is a daily pg-boss schedule (it survives a restart), whose job runs the purge', async () => {
    const jobs = new JobQueue(inject('databaseUrl'), pino({ level: 'silent' }));
    await jobs.start();
    let ran = 0;
    try {
      await jobs.scheduleSignupPurge('30 2 * * *', async () => void ran++);
      const schedules = await jobs.boss.getSchedules();
      expect(schedules.find((s) => s.name === SIGNUP_PURGE_QUEUE)).toMatchObject({ cron: '30 2 * * *', timezone: 'UTC' });
      await jobs.boss.send(SIGNUP_PURGE_QUEUE, {});
      await waitFor('the purge job', async () => ran > 0);
    } finally {
      await jobs.boss.unschedule(SIGNUP_PURGE_QUEUE);
      await jobs.stop();
    }
  });
});
