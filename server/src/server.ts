import 'reflect-metadata';
import type { Server } from 'node:http';
import type { DataSource } from 'typeorm';
import type { Logger } from 'pino';
import { buildApp } from './app';
import type { Config } from './config';
import { connectedRoleOwnsAuditTrail, createDataSource } from './data-source';
import { JobQueue, setNoticeQueue } from './jobs/queue';
import { setNoticeBaseUrl } from './services/notify';
import { publicBaseUrl, rememberListeningAddress } from './core/public-url';
import { createTransport, deliver } from './mail/deliveries';
import { DEFAULT_AUDIT_SEAL_DIR } from './services/audit-seal';
import { sealAll } from './services/audit-seal-job';
import { buildRecordExport } from './services/record-export-job';
import { runRosterImport } from './services/roster-import-job';
import { purgeSignups } from './services/signup-purge-job';
import { createStorage } from './storage';

export interface RunningServer {
  url: string;
  jobs: JobQueue | null;
  server: Server;
  ds: DataSource;
  /**
   * Drains: stops taking connections, lets requests in flight finish (up to SHUTDOWN_GRACE_SECONDS),
   * then lets the queue worker finish its current job, then closes the pools.
   */
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
  let closeTransport = () => {};
  if (config.SMTP_URL) {
    jobs = new JobQueue(config.DATABASE_URL, logger);
    await jobs.start();
    if (config.RUN_WORKERS === 'true') {
      const transport = createTransport(config.SMTP_URL, config.MAIL_CONCURRENCY);
      closeTransport = () => transport.close();
      await jobs.work((job) => deliver(ds, transport, logger, job.deliveryId), { concurrency: config.MAIL_CONCURRENCY });
      // Copies of a person's whole record (services/record-export-job.ts), built one at a time.
      const exportDeps = { ds, config, logger, jobs, storage: createStorage(config) };
      await jobs.workRecordExports((job, lastTry) => buildRecordExport(exportDeps, job.exportId, lastTry));
      // Roster imports from a CSV: batches between which this process keeps serving requests.
      const workerDeps = { ds, config, logger, jobs, storage: createStorage(config) };
      await jobs.workRosterImports((job) => runRosterImport(workerDeps, job.importId));
      // Sign-ups never confirmed are deleted a week after their link expired (GDPR Art. 5(1)(e)).
      await jobs.scheduleSignupPurge(config.SIGNUP_PURGE_CRON, () => purgeSignups(workerDeps));
      // The daily audit seal (ASVS 5.0 V16.4.3): pg-boss sends one job per day, worked by one server.
      if (config.AUDIT_SEAL_KEY) {
        const sealDeps = { ds, key: config.AUDIT_SEAL_KEY, dir: config.AUDIT_SEAL_DIR ?? DEFAULT_AUDIT_SEAL_DIR, queue: jobs, logger };
        await jobs.scheduleAuditSeal(config.AUDIT_SEAL_CRON, async () => void (await sealAll(sealDeps)));
      }
    }
  }
  if (!config.AUDIT_SEAL_KEY) logger.warn('AUDIT_SEAL_KEY is not set: the audit trail is not sealed (README "Audit seals")');
  if (await connectedRoleOwnsAuditTrail(ds)) {
    logger.warn(
      'the app connects as the owner of audit_entries, which could rewrite the trail; give it a role of its own (README "Database roles")',
    );
  }
  setNoticeQueue(jobs);
  const { app, ready, close } = buildApp({ ds, config, logger, jobs });
  await ready;
  const server = await new Promise<Server>((resolve, reject) => {
    const s = app.listen(config.PORT, config.HOST, () => resolve(s));
    s.on('error', reject);
  });
  // An idle kept-alive connection is closed by the server after 65 s, longer than the 60 s that
  // clients and proxies commonly keep one (common practice): the client, not the server, closes first,
  // so a request sent on a connection the server is just closing (ECONNRESET) does not happen.
  // Shutdown still closes idle connections at once (stop below).
  server.keepAliveTimeout = 65_000;
  server.headersTimeout = 66_000;
  // Node ends a request that takes over 5 minutes to arrive; a full-size clip from a phone on a slow
  // uplink needs longer. Allow the largest clip at 256 kB/s (20 minutes for 300 MB).
  server.requestTimeout = Math.max(300_000, Math.ceil((config.UPLOAD_MAX_CLIP_MB * 1024) / 256) * 1000);
  const address = server.address();
  const port = typeof address === 'object' && address ? address.port : config.PORT;
  const url = `http://${config.HOST}:${port}`;
  rememberListeningAddress(config.HOST, port);
  setNoticeBaseUrl(publicBaseUrl(config));
  let stopping: Promise<void> | null = null;
  let draining = false;
  // While draining, every response closes its connection, so a keep-alive client moves on.
  server.prependListener('request', (_req, res) => {
    if (draining) res.setHeader('Connection', 'close');
  });
  return {
    url,
    jobs,
    server,
    ds,
    stop() {
      stopping ??= (async () => {
        draining = true;
        const graceMs = config.SHUTDOWN_GRACE_SECONDS * 1000;
        logger.info({ graceSeconds: config.SHUTDOWN_GRACE_SECONDS }, 'draining: no new connections; requests in flight may finish');
        await new Promise<void>((resolve) => {
          // Closes the listening socket at once (new connections are refused); the callback runs
          // when the last connection has ended.
          server.close(() => resolve());
          server.closeIdleConnections();
          const idle = setInterval(() => server.closeIdleConnections(), 200);
          const cut = setTimeout(() => {
            logger.warn('grace period over: cutting the requests still running');
            server.closeAllConnections();
          }, graceMs);
          server.once('close', () => {
            clearInterval(idle);
            clearTimeout(cut);
          });
        });
        // Then the queue: pg-boss stops fetching and waits for the job in hand (graceful stop).
        await jobs?.stop();
        closeTransport();
        await close();
        await ds.destroy();
        logger.info('stopped');
      })();
      return stopping;
    },
  };
}
