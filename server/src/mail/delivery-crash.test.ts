import { randomUUID } from 'node:crypto';
import { afterAll, beforeAll, describe, expect, inject, it } from 'vitest';
import pg from 'pg';
import type { DataSource } from 'typeorm';
import type { Express } from 'express';
import { buildApp } from '../app';
import { loadConfig } from '../config';
import { createDataSource } from '../data-source';
import { EMAIL_QUEUE, JobQueue } from '../jobs/queue';
import { migrate } from '../../../scripts/runtime';
import { TEST_SECRET } from '../test/harness';
import { ownerUrl } from '../test/owner';
import { createOrg, type TestOrg } from '../test/factories';
import { createTransport, deliver, enqueueEmail } from './deliveries';
import { startFakeSmtp, type FakeSmtp } from './fake-smtp';
import { closedPort, deliveriesWhere, jobsFor, logger, mailTo, sample, signLetter, waitFor } from './mail-fixtures';

/**
 * A database of its own: the other test files' workers share the test database's queue and would
 * deliver these jobs, so "nothing is sent while no worker runs" can only be shown where none runs.
 */
describe('a crash between commit and send (a database with no worker)', () => {
  const name = `loadline_mail_${process.pid}_${randomUUID().slice(0, 8)}`;
  let adminUrl: string;
  let url: string;
  let ds: DataSource;
  let smtp: FakeSmtp;
  let crashed: JobQueue;
  let restarted: JobQueue | null = null;
  let app: Express;
  let closeApp: () => Promise<void>;
  let org: TestOrg;

  beforeAll(async () => {
    // Created and migrated by the owner role; the app below connects as its own role, as everywhere.
    adminUrl = ownerUrl('postgres');
    const c = new pg.Client({ connectionString: adminUrl });
    await c.connect();
    await c.query(`CREATE DATABASE ${name}`).finally(() => c.end());
    const base = new URL(inject('databaseUrl'));
    base.pathname = `/${name}`;
    url = base.toString();
    await migrate(ownerUrl(name), url);
    smtp = await startFakeSmtp(url, 0);
    ds = createDataSource(url, 5);
    await ds.initialize();
    // The app's queue sends jobs, but this process never works them: it "dies" before it can.
    crashed = new JobQueue(url, logger);
    await crashed.start();
    const config = loadConfig({
      DATABASE_URL: url,
      SESSION_SECRET: TEST_SECRET,
      LOG_LEVEL: 'silent',
      SMTP_URL: smtp.url,
      FAKE_MAIL: 'true',
      SIGNIN_MAX_PER_IP: '1000',
    });
    const built = buildApp({ ds, config, logger, jobs: crashed });
    app = built.app;
    closeApp = built.close;
    org = await createOrg(ds);
  });

  afterAll(async () => {
    await restarted?.stop();
    await crashed?.stop();
    await closeApp?.();
    await smtp?.stop();
    await ds?.destroy();
    const c = new pg.Client({ connectionString: adminUrl });
    await c.connect();
    await c.query(`DROP DATABASE IF EXISTS ${name} WITH (FORCE)`).finally(() => c.end());
  });

  it('a failing SMTP server: the reason is recorded and the job retried; after the last attempt the delivery is marked failed', async () => {
    const down = createTransport(`smtp://127.0.0.1:${await closedPort()}?ignoreTLS=true&connectionTimeout=2000`);
    const retried = await ds.transaction((m) => enqueueEmail(m, crashed, sample(`down-1-${randomUUID()}@test.example`)));
    await expect(deliver(ds, down, logger, retried!, 2)).rejects.toThrow();
    let [row] = await deliveriesWhere(ds, 'id = $1', [retried]);
    expect(row).toMatchObject({ status: 'queued', attempts: 1, sent_at: null });
    expect(row.last_error).toMatch(/ECONNREFUSED|connect/i);
    expect(row.body_text).not.toBeNull();
    // The second of two attempts: no more retries (no rethrow), visibly failed.
    await expect(deliver(ds, down, logger, retried!, 2)).resolves.toBeUndefined();
    [row] = await deliveriesWhere(ds, 'id = $1', [retried]);
    expect(row).toMatchObject({ status: 'failed', attempts: 2, sent_at: null });
    expect(row.last_error).toMatch(/ECONNREFUSED|connect/i);

    const once = await ds.transaction((m) => enqueueEmail(m, crashed, sample(`down-2-${randomUUID()}@test.example`)));
    await expect(deliver(ds, down, logger, once!, 1)).resolves.toBeUndefined();
    [row] = await deliveriesWhere(ds, 'id = $1', [once]);
    expect(row).toMatchObject({ status: 'failed', attempts: 1 });
    expect(row.last_error).toBeTruthy();
    expect(await ds.query(`SELECT id FROM fake_mailbox`)).toEqual([]);
  });

  it('a letter signed while no worker runs is delivered exactly once per recipient after a worker starts', async () => {
    const letter = await signLetter(app, org);
    // Committed: one delivery row and one job per recipient, nothing sent.
    const rows = await deliveriesWhere(ds, 'letter_id = $1', [letter.id]);
    expect(rows.map((r) => [r.to_address, r.status])).toEqual(
      [org.guardian.email, org.athlete.email, org.coach.email].sort().map((e) => [e, 'queued']),
    );
    const jobs = await jobsFor(
      ds,
      rows.map((r) => r.id),
    );
    expect(jobs.map((j) => j.state)).toEqual(['created', 'created', 'created']);
    expect(new Set(jobs.map((j) => j.delivery_id))).toEqual(new Set(rows.map((r) => r.id)));
    await new Promise((r) => setTimeout(r, 1000));
    expect(await ds.query(`SELECT id FROM fake_mailbox`)).toEqual([]);

    // The process that queued them is gone; a new one starts a worker.
    await crashed.stop();
    restarted = new JobQueue(url, logger);
    await restarted.start();
    const transport = createTransport(smtp.url);
    await restarted.work((job) => deliver(ds, transport, logger, job.deliveryId));
    await waitFor('every job completed', async () => {
      const j = await jobsFor(ds, rows.map((r) => r.id).concat());
      return j.length === 3 && j.every((x) => x.state === 'completed');
    });
    const mail = await mailTo(ds, [org.guardian.email, org.athlete.email, org.coach.email]);
    expect(mail.map((m) => m.envelope_to[0]).sort()).toEqual([org.guardian.email, org.athlete.email, org.coach.email].sort());
    expect(mail.every((m) => m.attachments.length === 1 && m.attachments[0].sha256 === letter.pdfSha256)).toBe(true);
    expect((await deliveriesWhere(ds, 'letter_id = $1', [letter.id])).map((r) => [r.status, r.attempts])).toEqual([
      ['sent', 1],
      ['sent', 1],
      ['sent', 1],
    ]);

    // The deliveries that failed for good are not retried by their late jobs: still only the letter's three messages.
    await waitFor("the failed deliveries' jobs done", async () => {
      const j: { state: string }[] = await ds.query(`SELECT state FROM pgboss.job WHERE name = $1`, [EMAIL_QUEUE]);
      return j.length === 5 && j.every((x) => x.state === 'completed');
    });
    expect(await ds.query(`SELECT id FROM fake_mailbox`)).toHaveLength(3);
    expect((await deliveriesWhere(ds, `status = 'failed'`, [])).length).toBe(2);
  });
});
