import { spawn, type ChildProcess } from 'node:child_process';
import { mkdtemp, rm } from 'node:fs/promises';
import http from 'node:http';
import net from 'node:net';
import os from 'node:os';
import path from 'node:path';
import { randomUUID } from 'node:crypto';
import { afterAll, beforeAll, describe, expect, it, inject } from 'vitest';
import type { DataSource } from 'typeorm';
import { createDataSource } from './data-source';
import { startFakeSmtp, type FakeSmtp } from './mail/fake-smtp';
import { createOrg, TEST_PASSWORD, type TestOrg } from './test/factories';
import { TEST_SECRET } from './test/harness';
import { createLog, MP4 } from './test/worlds/uploads-fixtures';

const ROOT = path.resolve(import.meta.dirname, '../..');

/** A cookie jar and CSRF token over plain fetch: this test talks to a real server process. */
class Browser {
  private cookies = new Map<string, string>();
  csrf = '';
  constructor(readonly base: string) {}

  cookieHeader(): string {
    return [...this.cookies].map(([k, v]) => `${k}=${v}`).join('; ');
  }

  async fetch(pathname: string, init: { method?: string; body?: unknown } = {}) {
    const res = await fetch(`${this.base}${pathname}`, {
      method: init.method ?? 'GET',
      headers: {
        cookie: this.cookieHeader(),
        'x-csrf-token': this.csrf,
        ...(init.body === undefined ? {} : { 'content-type': 'application/json' }),
      },
      body: init.body === undefined ? undefined : JSON.stringify(init.body),
    });
    for (const c of res.headers.getSetCookie()) {
      const [pair] = c.split(';');
      const at = pair!.indexOf('=');
      this.cookies.set(pair!.slice(0, at), pair!.slice(at + 1));
    }
    const body = res.headers.get('content-type')?.includes('json') ? await res.json() : null;
    if (body?.csrfToken) this.csrf = body.csrfToken;
    return { status: res.status, body };
  }

  static async signedIn(base: string, email: string): Promise<Browser> {
    const b = new Browser(base);
    await b.fetch('/api/session');
    const res = await b.fetch('/api/session', { method: 'POST', body: { email, password: TEST_PASSWORD } });
    expect(res.status, JSON.stringify(res.body)).toBe(200);
    return b;
  }
}

/** Starts `server/src/main.ts` as its own process and waits for its "listening" line. */
function startProcess(env: Record<string, string>): Promise<{ child: ChildProcess; url: string; log: () => string }> {
  const child = spawn(process.execPath, ['--import', 'tsx', 'server/src/main.ts'], {
    cwd: ROOT,
    env: { ...process.env, ...env },
    stdio: ['ignore', 'pipe', 'pipe'],
  });
  let out = '';
  child.stdout!.on('data', (d) => (out += d));
  child.stderr!.on('data', (d) => (out += d));
  return new Promise((resolve, reject) => {
    const timer = setTimeout(() => reject(new Error(`the server did not start:\n${out}`)), 60_000);
    child.on('exit', (code) => reject(new Error(`the server exited (${code}):\n${out}`)));
    child.stdout!.on('data', () => {
      const m = /Loadline listening on (http:\/\/[\d.]+:\d+)/.exec(out);
      if (m) {
        clearTimeout(timer);
        resolve({ child, url: m[1]!, log: () => out });
      }
    });
  });
}

const exited = (child: ChildProcess) =>
  new Promise<number | null>((resolve) => {
    if (child.exitCode !== null) resolve(child.exitCode);
    else child.on('exit', (code) => resolve(code));
  });

const sleep = (ms: number) => new Promise((r) => setTimeout(r, ms));

/** Can a new TCP connection still be opened to the server? */
const connects = (url: string) =>
  new Promise<boolean>((resolve) => {
    const { hostname, port } = new URL(url);
    const socket = net.connect(Number(port), hostname);
    socket.once('connect', () => {
      socket.destroy();
      resolve(true);
    });
    socket.once('error', () => resolve(false));
  });

describe('SIGTERM drains a real server process (graceful shutdown, as in The Twelve-Factor App, IX. Disposability)', () => {
  let ds: DataSource;
  let smtp: FakeSmtp;
  let storageDir: string;
  let org: TestOrg;
  const url = inject('databaseUrl');

  beforeAll(async () => {
    ds = createDataSource(url, 2);
    await ds.initialize();
    smtp = await startFakeSmtp(url, 0);
    storageDir = await mkdtemp(path.join(os.tmpdir(), 'loadline-shutdown-'));
    org = await createOrg(ds);
  });
  afterAll(async () => {
    await smtp?.stop();
    await ds?.destroy();
    await rm(storageDir, { recursive: true, force: true });
  });

  it('refuses new connections, lets a slow clip upload finish (201), sends or keeps the queued e-mail, then exits 0', async () => {
    const server = await startProcess({
      DATABASE_URL: url,
      SESSION_SECRET: TEST_SECRET,
      PORT: '0',
      HOST: '127.0.0.1',
      SMTP_URL: smtp.url,
      FAKE_MAIL: 'true',
      STORAGE_DIR: storageDir,
      LOG_LEVEL: 'info',
      RATE_LIMIT_NAMESPACE: `shutdown-${randomUUID()}`,
      SHUTDOWN_GRACE_SECONDS: '60',
    });
    try {
      const log = await createLog(ds, org.id, org.athlete.membershipId);
      const athlete = await Browser.signedIn(server.url, org.athlete.email);

      // An e-mail in the queue: a reset asked for just before the signal.
      const anonymous = new Browser(server.url);
      await anonymous.fetch('/api/session');
      expect((await anonymous.fetch('/api/password-reset', { method: 'POST', body: { email: org.coach.email } })).status).toBe(202);

      // A clip upload that takes a while to arrive: the head now, the rest after the signal.
      const boundary = `----loadline${randomUUID()}`;
      const field = (k: string, v: string) => `--${boundary}\r\nContent-Disposition: form-data; name="${k}"\r\n\r\n${v}\r\n`;
      const head = Buffer.from(
        field('athleteId', org.athlete.membershipId) +
          field('trainingLogId', log.id) +
          field('exercise', 'Back squat') +
          `--${boundary}\r\nContent-Disposition: form-data; name="file"; filename="set.mp4"\r\nContent-Type: video/mp4\r\n\r\n`,
      );
      const { hostname, port } = new URL(server.url);
      const req = http.request({
        host: hostname,
        port: Number(port),
        method: 'POST',
        path: `/api/orgs/${org.id}/clips`,
        headers: {
          cookie: athlete.cookieHeader(),
          'x-csrf-token': athlete.csrf,
          'content-type': `multipart/form-data; boundary=${boundary}`,
        },
      });
      const response = new Promise<{ status: number; body: string }>((resolve, reject) => {
        req.on('response', (res) => {
          let body = '';
          res.on('data', (d) => (body += d));
          res.on('end', () => resolve({ status: res.statusCode!, body }));
        });
        req.on('error', reject);
      });
      req.write(head);
      req.write(MP4.subarray(0, 1000));
      await sleep(300);

      server.child.kill('SIGTERM');
      await sleep(500);
      expect(await connects(server.url)).toBe(false);

      // The rest of the clip, slowly, after the signal: over 12 s in all, longer than a fixed
      // 10-second cut-off would allow (the grace period here is 60 s).
      for (let i = 1000; i < MP4.length; i += 1000) {
        req.write(MP4.subarray(i, i + 1000));
        await sleep(2500);
      }
      req.end(Buffer.from(`\r\n--${boundary}--\r\n`));
      const res = await response;
      expect(res.status, res.body).toBe(201);
      expect(JSON.parse(res.body)).toMatchObject({ athleteId: org.athlete.membershipId });

      expect(await exited(server.child)).toBe(0);
      expect(server.log()).toMatch(/draining/);

      // Nothing lost: the queued reset e-mail was sent exactly once, or is still queued for the next start.
      const [delivery] = await ds.query(`SELECT id, status FROM email_deliveries WHERE to_address = $1 AND kind = 'password_reset'`, [
        org.coach.email,
      ]);
      expect(delivery).toBeDefined();
      if (delivery.status === 'sent') {
        const mails = await ds.query(`SELECT id FROM fake_mailbox WHERE envelope_to && $1`, [[org.coach.email]]);
        expect(mails).toHaveLength(1);
      } else {
        const jobs = await ds.query(`SELECT state FROM pgboss.job WHERE data->>'deliveryId' = $1`, [delivery.id]);
        expect(jobs.map((j: { state: string }) => j.state)).toEqual([expect.stringMatching(/^(created|retry|active)$/)]);
      }
    } finally {
      if (server.child.exitCode === null) server.child.kill('SIGKILL');
    }
  }, 120_000);
});
