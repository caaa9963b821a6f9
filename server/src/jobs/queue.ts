import PgBoss from 'pg-boss';
import type { EntityManager } from 'typeorm';
import type { Logger } from 'pino';

export const EMAIL_QUEUE = 'email';
/** The daily audit seal (services/audit-seal-job.ts): one job a day, from a pg-boss schedule. */
export const AUDIT_SEAL_QUEUE = 'audit-seal';
/** A person's whole record as a ZIP (services/record-export.ts): one job per request. */
export const RECORD_EXPORT_QUEUE = 'record-export';
/** Roster imports (services/roster-import-job.ts): one job per uploaded file, worked in batches. */
export const ROSTER_QUEUE = 'roster-import';
/** Unconfirmed sign-up requests deleted (services/signup-purge-job.ts): one job a day, from a pg-boss schedule. */
export const SIGNUP_PURGE_QUEUE = 'signup-purge';

const QUEUES = [
  { name: EMAIL_QUEUE, retryLimit: 5, retryDelay: 2, retryBackoff: true, expireInSeconds: 120 },
  { name: AUDIT_SEAL_QUEUE, retryLimit: 3, retryDelay: 60, retryBackoff: true, expireInSeconds: 15 * 60 },
  { name: RECORD_EXPORT_QUEUE, retryLimit: 3, retryDelay: 10, retryBackoff: true, expireInSeconds: 15 * 60 },
  // A large file takes minutes on a busy server; a retried job resumes where the last batch ended.
  { name: ROSTER_QUEUE, retryLimit: 3, retryDelay: 10, retryBackoff: true, expireInSeconds: 60 * 60 },
  // One DELETE; a failed or crashed run is retried, and tomorrow's run catches anything still left.
  { name: SIGNUP_PURGE_QUEUE, retryLimit: 3, retryDelay: 60, retryBackoff: true, expireInSeconds: 15 * 60 },
];

export interface EmailJob {
  deliveryId: string;
}

export interface RecordExportJob {
  exportId: string;
}

export interface RosterJob {
  importId: string;
}

/**
 * The job queue, kept in PostgreSQL by pg-boss, so jobs survive a crash and any app server can work
 * them. Jobs are sent inside the caller's transaction: the business row and its job commit together.
 */
export class JobQueue {
  readonly boss: PgBoss;
  private started = false;

  /**
   * The app's queue connects as the runtime role, which may not create or alter anything: pg-boss only
   * checks that its schema is there and current (`migrate: false`); JobQueue.install made it.
   */
  constructor(
    databaseUrl: string,
    private readonly logger: Logger,
  ) {
    this.boss = new PgBoss({ connectionString: databaseUrl, max: 4, application_name: 'loadline-jobs', migrate: false });
    this.boss.on('error', (err) => this.logger.warn({ err }, 'job queue error'));
  }

  /**
   * Creates or upgrades pg-boss's schema and our queues (each queue is a table of its own) as the
   * owner role, from `migrate` in scripts/runtime.ts, so the runtime role never needs DDL rights.
   */
  static async install(ownerUrl: string): Promise<void> {
    const boss = new PgBoss({
      connectionString: ownerUrl,
      max: 1,
      application_name: 'loadline-migrate',
      supervise: false,
      schedule: false,
    });
    await boss.start();
    try {
      for (const q of QUEUES) await boss.createQueue(q.name, q);
    } finally {
      await boss.stop({ graceful: false, wait: true });
    }
  }

  async start(): Promise<void> {
    if (this.started) return;
    await this.boss.start();
    // Present already (install); an INSERT … ON CONFLICT DO NOTHING that only confirms it.
    for (const q of QUEUES) await this.boss.createQueue(q.name, q);
    this.started = true;
  }

  /** The daily seal: pg-boss sends one job per cron tick across all app servers (UTC). */
  async scheduleAuditSeal(cron: string, handler: () => Promise<void>): Promise<void> {
    await this.boss.schedule(AUDIT_SEAL_QUEUE, cron, {}, { tz: 'UTC', singletonKey: 'audit-seal' });
    await this.boss.work(AUDIT_SEAL_QUEUE, { pollingIntervalSeconds: 5 }, async () => handler());
  }

  /** The daily purge of unconfirmed sign-ups: one job per cron tick across all app servers (UTC). */
  async scheduleSignupPurge(cron: string, handler: () => Promise<void>): Promise<void> {
    await this.boss.schedule(SIGNUP_PURGE_QUEUE, cron, {}, { tz: 'UTC', singletonKey: 'signup-purge' });
    await this.boss.work(SIGNUP_PURGE_QUEUE, { pollingIntervalSeconds: 5 }, async () => handler());
  }

  /** One job per delivery (the delivery id is the singleton key), in the caller's transaction. */
  async sendEmail(m: EntityManager, deliveryId: string): Promise<void> {
    await this.boss.send(EMAIL_QUEUE, { deliveryId } satisfies EmailJob, {
      singletonKey: deliveryId,
      retryLimit: 5,
      retryDelay: 2,
      retryBackoff: true,
      db: { executeSql: async (text: string, values: unknown[]) => ({ rows: await m.query(text, values as unknown[]) }) },
    });
  }

  /** One job per record request (its id is the singleton key), in the caller's transaction. */
  async sendRecordExport(m: EntityManager, exportId: string): Promise<void> {
    await this.boss.send(RECORD_EXPORT_QUEUE, { exportId } satisfies RecordExportJob, {
      singletonKey: exportId,
      retryLimit: 3,
      retryDelay: 10,
      retryBackoff: true,
      db: { executeSql: async (text: string, values: unknown[]) => ({ rows: await m.query(text, values as unknown[]) }) },
    });
  }

  /** Builds record ZIPs one at a time: each reads a person's whole history and files. */
  async workRecordExports(handler: (job: RecordExportJob, lastTry: boolean) => Promise<void>): Promise<void> {
    await this.boss.work<RecordExportJob>(
      RECORD_EXPORT_QUEUE,
      { pollingIntervalSeconds: 1, batchSize: 1, includeMetadata: true },
      async (jobs) => {
        for (const job of jobs) await handler(job.data, job.retryCount >= job.retryLimit);
      },
    );
  }

  /** One job per roster import (its id is the singleton key), in the caller's transaction. */
  async sendRosterImport(m: EntityManager, importId: string): Promise<void> {
    await this.boss.send(ROSTER_QUEUE, { importId } satisfies RosterJob, {
      singletonKey: importId,
      retryLimit: 3,
      retryDelay: 10,
      retryBackoff: true,
      db: { executeSql: async (text: string, values: unknown[]) => ({ rows: await m.query(text, values as unknown[]) }) },
    });
  }

  async workRosterImports(handler: (job: RosterJob) => Promise<void>): Promise<void> {
    await this.boss.work<RosterJob>(ROSTER_QUEUE, { pollingIntervalSeconds: 1 }, async (jobs) => {
      for (const job of jobs) await handler(job.data);
    });
  }

  /**
   * Works e-mail jobs: up to `batchSize` fetched at once, up to `concurrency` of them sent at a time
   * (one at a time, with the poll's half-second pause between fetches, made ≈ 2 messages a second).
   * Each job succeeds or fails on its own: a failed one is handed back to pg-boss for its retry with
   * back-off, the others of its batch complete. A crash leaves the fetched jobs active until they
   * expire, then pg-boss retries them: a message sent but not yet marked sent can go twice, as before.
   */
  async work(handler: (job: EmailJob) => Promise<void>, { concurrency = 8, batchSize = 50 } = {}): Promise<void> {
    await this.boss.work<EmailJob>(EMAIL_QUEUE, { pollingIntervalSeconds: 0.5, batchSize }, async (jobs) => {
      await eachBounded(jobs, concurrency, async (job) => {
        try {
          await handler(job.data);
        } catch (err) {
          // pg-boss completes the batch's jobs still active; this one is in `retry` (or `failed`) by then.
          await this.boss.fail(EMAIL_QUEUE, job.id, { message: (err as Error)?.message?.slice(0, 500) ?? 'failed' });
        }
      });
    });
  }

  async stop(): Promise<void> {
    if (!this.started) return;
    await this.boss.stop({ graceful: true, wait: true, timeout: 10_000 });
    this.started = false;
  }
}

/** Runs `fn` over `items` with at most `limit` at a time; resolves when all have settled. */
async function eachBounded<T>(items: T[], limit: number, fn: (item: T) => Promise<void>): Promise<void> {
  let next = 0;
  const lane = async () => {
    while (next < items.length) await fn(items[next++]);
  };
  await Promise.all(Array.from({ length: Math.min(limit, items.length) }, lane));
}

/**
 * The queue e-mail copies of in-app notices go through. Set once by the app that owns the queue;
 * null in processes that send no e-mail (then notices stay in-app only).
 */
let noticeQueue: JobQueue | null = null;
export function setNoticeQueue(queue: JobQueue | null): void {
  noticeQueue = queue;
}
export function getNoticeQueue(): JobQueue | null {
  return noticeQueue;
}
