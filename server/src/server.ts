import 'reflect-metadata';
import type { Server } from 'node:http';
import type { DataSource } from 'typeorm';
import type { Logger } from 'pino';
import { buildApp } from './app';
import type { Config } from './config';
import { createDataSource } from './data-source';
import { JobQueue, setNoticeQueue } from './jobs/queue';
import { setNoticeBaseUrl } from './services/notify';
import { publicBaseUrl, rememberListeningAddress } from './core/public-url';
import { createTransport, deliver } from './mail/deliveries';

export interface RunningServer {
  url: string;
  jobs: JobQueue | null;
  server: Server;
  ds: DataSource;
  /** Stops taking connections, lets in-flight requests finish, closes the pools. */
  stop(): Promise<void>;
}

/**
 * Opens the database and listens. The pool gets an error listener, so a database that drops or
 * restarts never crashes the process: requests fail with 503 until it is back.
 */
export async function startServer(config: Config, logger: Logger): Promise<RunningServer> {
  const ds = createDataSource(config.DATABASE_URL);
  await ds.initialize();
  const pool = (ds.driver as unknown as { master: import('pg').Pool }).master;
  pool.on('error', (err) => logger.warn({ err }, 'database pool: idle client error'));
  // E-mail goes through the queue; this process also works the queue unless told not to.
  let jobs: JobQueue | null = null;
  if (config.SMTP_URL) {
    jobs = new JobQueue(config.DATABASE_URL, logger);
    await jobs.start();
    if (config.RUN_WORKERS === 'true') {
      const transport = createTransport(config.SMTP_URL);
      await jobs.work((job) => deliver(ds, transport, logger, job.deliveryId));
    }
  }
  setNoticeQueue(jobs);
  const { app, close } = buildApp({ ds, config, logger, jobs });
  const server = await new Promise<Server>((resolve, reject) => {
    const s = app.listen(config.PORT, config.HOST, () => resolve(s));
    s.on('error', reject);
  });
  server.keepAliveTimeout = 5000;
  // Node ends a request that takes over 5 minutes to arrive; a full-size clip from a phone on a slow
  // uplink needs longer. Allow the largest clip at 256 kB/s (20 minutes for 300 MB).
  server.requestTimeout = Math.max(300_000, Math.ceil((config.UPLOAD_MAX_CLIP_MB * 1024) / 256) * 1000);
  const address = server.address();
  const port = typeof address === 'object' && address ? address.port : config.PORT;
  const url = `http://${config.HOST}:${port}`;
  rememberListeningAddress(config.HOST, port);
  setNoticeBaseUrl(publicBaseUrl(config));
  let stopping: Promise<void> | null = null;
  return {
    url,
    jobs,
    server,
    ds,
    stop() {
      stopping ??= (async () => {
        await new Promise<void>((resolve) => {
          server.close(() => resolve());
          server.closeIdleConnections();
          // Requests still running after 10 s are cut, so shutdown always ends.
          setTimeout(() => server.closeAllConnections(), 10_000).unref();
        });
        await jobs?.stop();
        await close();
        await ds.destroy();
      })();
      return stopping;
    },
  };
}
