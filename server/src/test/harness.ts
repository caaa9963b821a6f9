import { randomUUID } from 'node:crypto';
import { mkdtemp, rm } from 'node:fs/promises';
import os from 'node:os';
import path from 'node:path';
import { afterAll, beforeAll, inject } from 'vitest';
import request from 'supertest';
import express, { type Express } from 'express';
import type { DataSource } from 'typeorm';
import pino from 'pino';
import { buildApp } from '../app';
import type { ActorCache } from '../http/actor-cache';
import { loadConfig, type Config } from '../config';
import { createDataSource } from '../data-source';
import { startFakeSmtp, type FakeSmtp } from '../mail/fake-smtp';
import { JobQueue } from '../jobs/queue';
import { createTransport, deliver } from '../mail/deliveries';

export const TEST_SECRET = 'test-secret-that-is-long-enough-for-the-config-check';

export interface Harness {
  app: Express;
  ds: DataSource;
  config: Config;
  /** With `{ mail: true }`: the real fake SMTP server and the pg-boss queue with its worker. */
  smtp?: FakeSmtp;
  jobs?: JobQueue;
  /** This file's own upload folder (a temporary one), removed after the file's tests. */
  storageDir: string;
  /** The app's actor cache (http/actor-cache.ts); off unless the file sets ACTOR_CACHE_SECONDS. */
  actorCache: ActorCache;
}

/**
 * Builds the real app on the real test database for one test file. Each test creates its own
 * organization through the factories, so files never depend on each other's rows.
 */
export function useHarness(overrides: Record<string, string> = {}, opts: { mail?: boolean } = {}): Harness {
  const h = {} as Harness;
  let close: (() => Promise<void>) | undefined;
  beforeAll(async () => {
    const url = inject('databaseUrl');
    const logger = pino({ level: 'silent' });
    if (opts.mail) h.smtp = await startFakeSmtp(url, 0);
    h.storageDir = await mkdtemp(path.join(os.tmpdir(), 'loadline-test-uploads-'));
    h.config = loadConfig({
      DATABASE_URL: url,
      SESSION_SECRET: TEST_SECRET,
      LOG_LEVEL: 'silent',
      STORAGE_DIR: h.storageDir,
      RATE_LIMIT_NAMESPACE: `test-${randomUUID()}`,
      // Off by default: many files change memberships, care teams or sessions by plain SQL and expect
      // the very next request to see it, which with the cache holds only once PostgreSQL has delivered
      // the notice (commands wait for it; plain SQL does not). The cache's own tests turn it on.
      ACTOR_CACHE_SECONDS: '0',
      ...(h.smtp ? { SMTP_URL: h.smtp.url, FAKE_MAIL: 'true' } : {}),
      ...overrides,
    });
    h.ds = createDataSource(url, 5);
    await h.ds.initialize();
    if (opts.mail) {
      h.jobs = new JobQueue(url, logger);
      await h.jobs.start();
      const transport = createTransport(h.smtp!.url);
      await h.jobs.work((job) => deliver(h.ds, transport, logger, job.deliveryId));
    }
    const built = buildApp({ ds: h.ds, config: h.config, logger, jobs: h.jobs ?? null });
    await built.ready;
    h.actorCache = built.actorCache;
    h.app = behindProxy(built.app, h.config.PUBLIC_URL);
    close = built.close;
  });
  afterAll(async () => {
    await h.jobs?.stop();
    await close?.();
    await h.smtp?.stop();
    await h.ds?.destroy();
    if (h.storageDir) await rm(h.storageDir, { recursive: true, force: true });
  });
  return h;
}

export type Agent = ReturnType<typeof request.agent>;

/** A browser-like client: keeps cookies and sends the session's CSRF token on every write. */
/**
 * With PUBLIC_URL set the app answers only for that host. In production a reverse proxy forwards
 * the public name; here supertest's own loopback Host is replaced by it, and any Host a test sets
 * itself (a forged one) goes through unchanged.
 */
function behindProxy(app: Express, publicUrl: string | undefined): Express {
  if (!publicUrl) return app;
  const host = new URL(publicUrl).host;
  const outer = express();
  outer.use((req, _res, next) => {
    if (/^127\.0\.0\.1:\d+$/.test(req.headers.host ?? '')) req.headers.host = host;
    next();
  });
  outer.use(app);
  return outer;
}

export class Client {
  csrf = '';
  constructor(readonly agent: Agent) {}

  static async anonymous(app: Express): Promise<Client> {
    const c = new Client(request.agent(app));
    await c.refresh();
    return c;
  }

  async refresh() {
    const res = await this.agent.get('/api/session');
    this.csrf = res.body.csrfToken;
    return res;
  }

  get(path: string) {
    return this.agent.get(path);
  }
  post(path: string, body?: object) {
    return this.agent
      .post(path)
      .set('x-csrf-token', this.csrf)
      .send(body ?? {});
  }
  patch(path: string, body?: object) {
    return this.agent
      .patch(path)
      .set('x-csrf-token', this.csrf)
      .send(body ?? {});
  }
  delete(path: string) {
    return this.agent.delete(path).set('x-csrf-token', this.csrf);
  }

  async signIn(email: string, password: string) {
    const res = await this.post('/api/session', { email, password });
    if (res.status === 200) this.csrf = res.body.csrfToken;
    return res;
  }
}

export async function signedIn(app: Express, email: string, password: string): Promise<Client> {
  const c = await Client.anonymous(app);
  const res = await c.signIn(email, password);
  if (res.status !== 200) throw new Error(`sign-in as ${email} failed: ${res.status} ${JSON.stringify(res.body)}`);
  return c;
}
