import PgBoss from 'pg-boss';
import type { EntityManager } from 'typeorm';
import type { Logger } from 'pino';

export const EMAIL_QUEUE = 'email';

export interface EmailJob {
  deliveryId: string;
}

/**
 * The job queue, kept in PostgreSQL by pg-boss, so jobs survive a crash and any app server can work
 * them. Jobs are sent inside the caller's transaction: the business row and its job commit together.
 */
export class JobQueue {
  readonly boss: PgBoss;
  private started = false;

  constructor(
    databaseUrl: string,
    private readonly logger: Logger,
  ) {
    this.boss = new PgBoss({ connectionString: databaseUrl, max: 4, application_name: 'loadline-jobs' });
    this.boss.on('error', (err) => this.logger.warn({ err }, 'job queue error'));
  }

  async start(): Promise<void> {
    if (this.started) return;
    await this.boss.start();
    await this.boss.createQueue(EMAIL_QUEUE, { name: EMAIL_QUEUE, retryLimit: 5, retryDelay: 2, retryBackoff: true, expireInSeconds: 120 });
    this.started = true;
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

  async work(handler: (job: EmailJob) => Promise<void>): Promise<void> {
    await this.boss.work<EmailJob>(EMAIL_QUEUE, { pollingIntervalSeconds: 0.5 }, async (jobs) => {
      for (const job of jobs) await handler(job.data);
    });
  }

  async stop(): Promise<void> {
    if (!this.started) return;
    await this.boss.stop({ graceful: true, wait: true, timeout: 10_000 });
    this.started = false;
  }
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
