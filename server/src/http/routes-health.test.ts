import net from 'node:net';
import { afterAll, beforeAll, describe, expect, inject, it } from 'vitest';
import request from 'supertest';
import type { Express } from 'express';
import pino from 'pino';
import { buildApp } from '../app';
import { loadConfig } from '../config';
import { createDataSource } from '../data-source';
import { signedIn, TEST_SECRET } from '../test/harness';
import { createOrg, TEST_PASSWORD } from '../test/factories';
import { expectNoStack } from '../test/no-stack';

/** A TCP proxy in front of PostgreSQL that the test can cut and restore, like a database restart. */
class PgProxy {
  private server: net.Server | null = null;
  private sockets = new Set<net.Socket>();
  port = 0;

  constructor(private readonly target: { host: string; port: number }) {}

  async open(port = this.port): Promise<void> {
    const server = net.createServer((client) => {
      const upstream = net.connect(this.target.port, this.target.host);
      for (const s of [client, upstream]) {
        this.sockets.add(s);
        s.on('close', () => this.sockets.delete(s));
        s.on('error', () => {
          client.destroy();
          upstream.destroy();
        });
      }
      client.pipe(upstream);
      upstream.pipe(client);
    });
    await new Promise<void>((resolve, reject) => {
      server.once('error', reject);
      server.listen(port, '127.0.0.1', () => resolve());
    });
    this.server = server;
    this.port = (server.address() as net.AddressInfo).port;
  }

  /** Stops listening and cuts every open connection. */
  async cut(): Promise<void> {
    const server = this.server;
    this.server = null;
    for (const s of this.sockets) s.destroy();
    this.sockets.clear();
    if (server) await new Promise<void>((resolve) => server.close(() => resolve()));
  }
}

describe('health while the database goes away and comes back', () => {
  const dbUrl = new URL(inject('databaseUrl'));
  const proxy = new PgProxy({ host: dbUrl.hostname, port: Number(dbUrl.port || 5432) });
  let app: Express;
  let close: (() => Promise<void>) | undefined;
  let ds: ReturnType<typeof createDataSource> | undefined;

  beforeAll(async () => {
    await proxy.open(0);
    const viaProxy = new URL(dbUrl);
    viaProxy.hostname = '127.0.0.1';
    viaProxy.port = String(proxy.port);
    // The app's pools (TypeORM's and the session store's) both go through the proxy.
    const config = loadConfig({ DATABASE_URL: viaProxy.toString(), SESSION_SECRET: TEST_SECRET, LOG_LEVEL: 'silent' });
    ds = createDataSource(viaProxy.toString(), 3);
    await ds.initialize();
    const built = buildApp({ ds, config, logger: pino({ level: 'silent' }) });
    app = built.app;
    close = built.close;
  });

  afterAll(async () => {
    await proxy.open().catch(() => undefined);
    await close?.();
    await ds?.destroy();
    await proxy.cut();
  });

  it('answers 503 while the database is away and 200 again after, without a restart', async () => {
    const org = await createOrg(ds!);
    const user = await signedIn(app, org.coach.email, TEST_PASSWORD);
    const up = await request(app).get('/api/health');
    expect(up.status).toBe(200);
    expect(up.body).toEqual({ status: 'ok', database: 'up' });

    await proxy.cut();
    const down = await request(app).get('/api/health');
    expect(down.status).toBe(503);
    expect(down.body).toEqual({ status: 'degraded', database: 'down' });
    expect(down.headers['cache-control']).toBe('no-store');
    // A signed-in request needs the session store, which is away too: a clean error, not a crash.
    const whileDown = await user.get('/api/session');
    expect(whileDown.status).toBe(503);
    expect(whileDown.body.error.code).toBe('unavailable');
    expectNoStack(whileDown.text);
    expect((await request(app).get('/api/health')).status).toBe(503);

    await proxy.open();
    const back = await request(app).get('/api/health');
    expect(back.status).toBe(200);
    expect(back.body).toEqual({ status: 'ok', database: 'up' });
    // The session survived in the database: the same person is still signed in.
    const again = await user.get('/api/session');
    expect(again.status).toBe(200);
    expect(again.body.user?.id).toBe(org.coach.userId);
  });
});
