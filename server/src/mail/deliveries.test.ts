import { randomUUID } from 'node:crypto';
import net from 'node:net';
import { afterAll, beforeAll, describe, expect, inject, it } from 'vitest';
import pg from 'pg';
import pino from 'pino';
import type { DataSource } from 'typeorm';
import type { Express } from 'express';
import { RED_FLAG_ITEMS } from '../../../policies/red-flags';
import { todayIso } from '../../../policies/roles';
import { EMAIL_CAUTION } from '../../../templates/email/layout';
import { emails } from '../../../templates/email/messages';
import { buildApp } from '../app';
import { loadConfig } from '../config';
import { createDataSource } from '../data-source';
import { EMAIL_QUEUE, JobQueue, setNoticeQueue } from '../jobs/queue';
import { migrate } from '../../../scripts/runtime';
import { signedIn, TEST_SECRET, useHarness, type Client } from '../test/harness';
import { createOrg, TEST_PASSWORD, type TestOrg } from '../test/factories';
import { createTransport, deliver, enqueueEmail, type EnqueueInput } from './deliveries';
import { startFakeSmtp, type FakeSmtp } from './fake-smtp';

/**
 * E-mail through the durable queue (SECURITY items 22, 33, 34): the real fake SMTP server, the real
 * pg-boss queue and worker, the real database. Nothing of ours is mocked.
 */
const logger = pino({ level: 'silent' });

/** Polls until `fn` answers something truthy; fails the test after `ms`. */
async function waitFor<T>(what: string, fn: () => Promise<T | null | undefined | false>, ms = 20_000): Promise<T> {
  const end = Date.now() + ms;
  for (;;) {
    const v = await fn();
    if (v) return v;
    if (Date.now() > end) throw new Error(`timed out waiting for ${what}`);
    await new Promise((r) => setTimeout(r, 100));
  }
}

interface MailRow {
  envelope_to: string[];
  subject: string | null;
  message_id: string | null;
  text_body: string | null;
  html_body: string | null;
  attachments: { filename: string; contentType: string; size: number; sha256: string }[];
}
const mailTo = (db: DataSource, addresses: string[]): Promise<MailRow[]> =>
  db.query(
    `SELECT envelope_to, subject, message_id, text_body, html_body, attachments FROM fake_mailbox WHERE envelope_to && $1 ORDER BY id`,
    [addresses],
  );
const letterMailTo = async (db: DataSource, addresses: string[]) =>
  (await mailTo(db, addresses)).filter((m) => m.subject?.startsWith('Clearance letter for '));

interface DeliveryRow {
  id: string;
  to_address: string;
  kind: string;
  status: string;
  attempts: number;
  last_error: string | null;
  body_text: string | null;
  body_html: string | null;
  sent_at: Date | null;
  message_id: string | null;
}
const deliveriesWhere = (db: DataSource, where: string, params: unknown[]): Promise<DeliveryRow[]> =>
  db.query(
    `SELECT id, to_address, kind, status, attempts, last_error, body_text, body_html, sent_at, message_id FROM email_deliveries WHERE ${where} ORDER BY to_address`,
    params,
  );

const jobsFor = async (db: DataSource, deliveryIds: string[]): Promise<{ state: string; delivery_id: string }[]> =>
  db.query(`SELECT state, data->>'deliveryId' AS delivery_id FROM pgboss.job WHERE name = $1 AND data->>'deliveryId' = ANY($2)`, [
    EMAIL_QUEUE,
    deliveryIds,
  ]);

async function signLetter(app: Express, org: TestOrg, athleteId = org.athlete.membershipId, clin?: Client) {
  const c = clin ?? (await signedIn(app, org.clinician.email, TEST_PASSWORD));
  const base = `/api/orgs/${org.id}`;
  const draft = await c.post(`${base}/letters`, {
    athleteId,
    decision: 'full',
    effectiveFrom: '2026-12-01',
    validUntil: '2027-03-01',
    credential: 'ATC',
    licenceNumber: 'AT-1',
    familyNote: '',
  });
  expect(draft.status, JSON.stringify(draft.body)).toBe(201);
  const signed = await c.post(`${base}/letters/${draft.body.id}/sign`, { signature: org.clinician.name, version: draft.body.version });
  expect(signed.status, JSON.stringify(signed.body)).toBe(200);
  return { id: signed.body.id as string, pdfSha256: signed.body.pdfSha256 as string, clin: c };
}

/** A port nothing listens on: an SMTP server that is down. */
async function closedPort(): Promise<number> {
  const server = net.createServer();
  await new Promise<void>((r) => server.listen(0, '127.0.0.1', () => r()));
  const { port } = server.address() as net.AddressInfo;
  await new Promise<void>((r) => server.close(() => r()));
  return port;
}

const sample = (to: string, over: Partial<EnqueueInput> = {}): EnqueueInput => ({
  organizationId: null,
  kind: 'test',
  to,
  content: emails.notice(),
  ...over,
});

describe('with the worker running', () => {
  const h = useHarness({ SIGNIN_MAX_PER_IP: '1000' }, { mail: true });
  let org: TestOrg;
  beforeAll(async () => {
    // Notices go out by e-mail through the process-wide queue, as server.ts wires it.
    setNoticeQueue(h.jobs!);
    org = await createOrg(h.ds);
  });
  afterAll(() => setNoticeQueue(null));

  describe('a signed letter', () => {
    let letter: Awaited<ReturnType<typeof signLetter>>;
    let rows: DeliveryRow[];
    beforeAll(async () => {
      letter = await signLetter(h.app, org);
      rows = await waitFor('every delivery of the letter sent', async () => {
        const r = await deliveriesWhere(h.ds, 'letter_id = $1', [letter.id]);
        return r.length > 0 && r.every((d) => d.status === 'sent') ? r : null;
      });
    });

    it('reaches the guardian, the athlete and the coach: exactly one message each, the signed PDF attached', async () => {
      const recipients = [org.guardian.email, org.athlete.email, org.coach.email];
      const mail = await letterMailTo(h.ds, recipients);
      expect(mail.map((m) => m.envelope_to).sort()).toEqual(recipients.map((r) => [r]).sort());
      for (const m of mail) {
        expect(m.subject).toBe(`Clearance letter for ${org.athlete.name}`);
        expect(m.attachments).toEqual([
          {
            filename: 'clearance-letter-2026-12-01.pdf',
            contentType: 'application/pdf',
            size: expect.any(Number),
            sha256: letter.pdfSha256,
          },
        ]);
        expect(m.text_body).toContain('Full participation from 1 December 2026');
        expect(m.text_body).toContain(EMAIL_CAUTION);
        expect(m.html_body).toContain(EMAIL_CAUTION);
      }
      // Nobody else: not the clinician who signed, not the admin, not another athlete's people.
      const others = [org.clinician.email, org.admin.email, org.otherGuardian.email, org.otherAthlete.email, org.otherCoach.email];
      expect(await mailTo(h.ds, others)).toEqual([]);
    });

    it("each delivery row ends 'sent' after one attempt, its body cleared, its message id recorded", async () => {
      expect(rows.map((r) => r.to_address).sort()).toEqual([org.guardian.email, org.athlete.email, org.coach.email].sort());
      for (const r of rows) {
        expect(r).toMatchObject({
          kind: 'letter',
          status: 'sent',
          attempts: 1,
          last_error: null,
          body_text: null,
          body_html: null,
          message_id: `<${r.id}@loadline.invalid>`,
        });
        expect(r.sent_at).toBeInstanceOf(Date);
      }
      const mail = await letterMailTo(
        h.ds,
        rows.map((r) => r.to_address),
      );
      expect(mail.map((m) => m.message_id).sort()).toEqual(rows.map((r) => `<${r.id}@loadline.invalid>`).sort());
      // The clinician sees the same in the letter's delivery list.
      const list = await letter.clin.get(`/api/orgs/${org.id}/letters?athleteId=${org.athlete.membershipId}`);
      const dto = list.body.find((l: { id: string }) => l.id === letter.id);
      expect(dto.deliveries.map((d: { status: string }) => d.status)).toEqual(['sent', 'sent', 'sent']);
    });

    it('a job run again for a delivery already sent sends nothing more, whether run directly or through the queue', async () => {
      const transport = createTransport(h.smtp!.url);
      for (const r of rows) await deliver(h.ds, transport, logger, r.id);
      const again = await h.jobs!.boss.send(EMAIL_QUEUE, { deliveryId: rows[0].id });
      expect(again).toBeTruthy();
      await waitFor('the repeated job to finish', async () => (await h.jobs!.boss.getJobById(EMAIL_QUEUE, again!))?.state === 'completed');
      expect(
        await letterMailTo(
          h.ds,
          rows.map((r) => r.to_address),
        ),
      ).toHaveLength(3);
      expect((await deliveriesWhere(h.ds, 'letter_id = $1', [letter.id])).map((r) => [r.status, r.attempts])).toEqual(
        rows.map(() => ['sent', 1]),
      );
    });
  });

  it('the delivery row and its job commit with the change, or not at all', async () => {
    let rolledBack: string | null = null;
    await expect(
      h.ds.transaction(async (m) => {
        rolledBack = await enqueueEmail(m, h.jobs!, sample(`rollback-${randomUUID()}@test.example`));
        throw new Error('the change failed after the e-mail was queued');
      }),
    ).rejects.toThrow('the change failed');
    expect(rolledBack).toMatch(/^[0-9a-f-]{36}$/);
    expect(await deliveriesWhere(h.ds, 'id = $1', [rolledBack])).toEqual([]);
    expect(await jobsFor(h.ds, [rolledBack!])).toEqual([]);

    // The same, committed: both are there (so the queries above could have found them).
    const to = `commit-${randomUUID()}@test.example`;
    const committed = await h.ds.transaction((m) => enqueueEmail(m, h.jobs!, sample(to)));
    expect(await deliveriesWhere(h.ds, 'id = $1', [committed])).toHaveLength(1);
    expect(await jobsFor(h.ds, [committed!])).toHaveLength(1);
    await waitFor('the committed e-mail', async () => (await mailTo(h.ds, [to])).length === 1);
  });

  it('CR or LF in a recipient address or subject is refused, and nothing is queued', async () => {
    const tag = randomUUID();
    for (const input of [
      sample(`victim-${tag}@test.example\r\nBcc: attacker-${tag}@test.example`),
      sample(`victim-${tag}@test.example\nBcc: attacker-${tag}@test.example`),
      sample(`victim-${tag}@test.example`, { content: { ...emails.notice(), subject: `Hello\r\nBcc: attacker-${tag}@test.example` } }),
    ]) {
      await expect(h.ds.transaction((m) => enqueueEmail(m, h.jobs!, input))).rejects.toThrow(/line break/);
    }
    expect(await deliveriesWhere(h.ds, 'to_address LIKE $1', [`%${tag}%`])).toEqual([]);
    // Through the API, such an address never gets that far.
    const admin = await signedIn(h.app, org.admin.email, TEST_PASSWORD);
    const res = await admin.post(`/api/orgs/${org.id}/invitations`, {
      email: `victim-${tag}@test.example\r\nBcc: attacker-${tag}@test.example`,
      roles: ['coach'],
    });
    expect(res.status).toBe(400);
    expect(await deliveriesWhere(h.ds, 'to_address LIKE $1', [`%${tag}%`])).toEqual([]);
  });

  it('an invitation e-mails its one-time link to the invited address; the link is not kept once sent', async () => {
    const admin = await signedIn(h.app, org.admin.email, TEST_PASSWORD);
    const email = `invited-${randomUUID()}@test.example`;
    const res = await admin.post(`/api/orgs/${org.id}/invitations`, { email, roles: ['coach'] });
    expect(res.status, JSON.stringify(res.body)).toBe(201);
    const link = res.body.link as string;
    const token = new URL(link).hash.slice(1);
    expect(token.length).toBeGreaterThanOrEqual(20);
    const [mail] = await waitFor('the invitation e-mail', async () => {
      const m = await mailTo(h.ds, [email]);
      return m.length ? m : null;
    });
    expect(mail.envelope_to).toEqual([email]);
    expect(mail.text_body).toContain('/invite#');
    expect(mail.text_body).toContain(`Accept the invitation: ${link}`);
    expect(mail.html_body).toContain(`href="${link}"`);
    expect(mail.subject).toMatch(/^You're invited to .+ on Loadline$/);
    const [row] = await waitFor('the invitation delivery marked sent', async () => {
      const r = await deliveriesWhere(h.ds, 'to_address = $1', [email]);
      return r[0]?.status === 'sent' ? r : null;
    });
    expect(row).toMatchObject({ kind: 'invitation', body_text: null, body_html: null });
    const [stored] = await h.ds.query(`SELECT to_jsonb(d) AS r FROM email_deliveries d WHERE id = $1`, [row.id]);
    expect(JSON.stringify(stored.r)).not.toContain(token);
    expect(await mailTo(h.ds, [email])).toHaveLength(1);
  });

  it("an emergency red-flag report e-mails the athlete's clinicians and guardian (the guardian without the answers or narrative)", async () => {
    const athlete = await signedIn(h.app, org.athlete.email, TEST_PASSWORD);
    const NOTE = `Narrative ${randomUUID()}`;
    const saddle = RED_FLAG_ITEMS.find((i) => i.id === 'saddle_numbness')!;
    const res = await athlete.post(`/api/orgs/${org.id}/pain-reports`, {
      athleteId: org.athlete.membershipId,
      bodyRegions: ['lower_back'],
      painNow: 2,
      painWorst24h: 3,
      onsetDate: todayIso(),
      aggravatingPatterns: ['hinge'],
      startedInTraining: true,
      note: NOTE,
      redFlags: { ...Object.fromEntries(RED_FLAG_ITEMS.map((i) => [i.id, false])), saddle_numbness: true },
    });
    expect(res.status, JSON.stringify(res.body)).toBe(201);
    expect(res.body.route).toBe('emergency');
    const byTo = await waitFor('the clinician and guardian e-mails', async () => {
      const m = await mailTo(h.ds, [org.clinician.email, org.guardian.email]);
      const notices = m.filter((x) => !x.subject?.startsWith('Clearance letter'));
      return notices.length >= 2 ? new Map(notices.map((x) => [x.envelope_to[0], x])) : null;
    });
    const clin = byTo.get(org.clinician.email)!;
    expect(clin.subject).toBe(`Emergency warning sign: ${org.athlete.name}`);
    expect(clin.text_body).toContain(saddle.question);
    const guardian = byTo.get(org.guardian.email)!;
    expect(guardian.subject).toBe(`${org.athlete.name} has been told to get urgent medical care`);
    expect(guardian.text_body).toContain('get urgent medical care now');
    expect(guardian.text_body).not.toContain(saddle.question);
    for (const m of byTo.values()) {
      expect(m.text_body).not.toContain(NOTE);
      expect(m.text_body).toContain(EMAIL_CAUTION);
    }
    // Only the athlete's own circle: the clinician of nobody here gets nothing.
    expect((await mailTo(h.ds, [org.otherClinician.email])).length).toBe(0);
    const notices = await deliveriesWhere(h.ds, `kind LIKE 'notice:%' AND recipient_id = ANY($1)`, [
      [org.clinician.membershipId, org.guardian.membershipId],
    ]);
    expect(notices.map((n) => n.kind).sort()).toEqual(['notice:red_flag_emergency', 'notice:red_flag_emergency_guardian']);
  });
});

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
    const base = new URL(inject('databaseUrl'));
    const admin = new URL(base);
    admin.pathname = '/postgres';
    adminUrl = admin.toString();
    const c = new pg.Client({ connectionString: adminUrl });
    await c.connect();
    await c.query(`CREATE DATABASE ${name}`).finally(() => c.end());
    base.pathname = `/${name}`;
    url = base.toString();
    await migrate(url);
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
