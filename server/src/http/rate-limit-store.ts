import { createHash } from 'node:crypto';
import type { Request } from 'express';
import { ipKeyGenerator, type ClientRateLimitInfo, type IncrementResponse, type Options, type Store } from 'express-rate-limit';
import type { DataSource } from 'typeorm';
import type { Config } from '../config';

/**
 * An express-rate-limit store on PostgreSQL, so every app process counts against the same limit
 * (the default memory store counts per process). Fixed windows, like the memory store: the first hit
 * opens a window of `windowMs`; a hit after it ends starts a new one. Keys are stored as SHA-256 of
 * prefix + key, so no e-mail address or IP address sits in the table. Expired rows are swept now and
 * then by the increments themselves. Times come from this process's clock (like the memory store's),
 * so windows behave the same under a simulated clock in tests.
 */
export class PgRateLimitStore implements Store {
  private windowMs = 60_000;
  /** Tells express-rate-limit that counts are shared, not local to this process. */
  readonly localKeys = false;

  constructor(
    private readonly ds: DataSource,
    readonly prefix: string,
  ) {}

  init(options: Options): void {
    this.windowMs = options.windowMs;
  }

  private hash(key: string): string {
    return createHash('sha256').update(`${this.prefix}:${key}`).digest('hex');
  }

  async get(key: string): Promise<ClientRateLimitInfo | undefined> {
    const rows: { hits: number; reset_at: Date }[] = await this.ds.query(
      `SELECT hits, reset_at FROM rate_limit_counters WHERE key = $1 AND reset_at > $2`,
      [this.hash(key), new Date()],
    );
    return rows[0] ? { totalHits: rows[0].hits, resetTime: new Date(rows[0].reset_at) } : undefined;
  }

  async increment(key: string): Promise<IncrementResponse> {
    const now = Date.now();
    const rows: { hits: number; reset_at: Date }[] = await this.ds.query(
      `INSERT INTO rate_limit_counters AS c (key, hits, reset_at) VALUES ($1, 1, $3)
       ON CONFLICT (key) DO UPDATE SET
         hits = CASE WHEN c.reset_at <= $2 THEN 1 ELSE c.hits + 1 END,
         reset_at = CASE WHEN c.reset_at <= $2 THEN EXCLUDED.reset_at ELSE c.reset_at END
       RETURNING hits, reset_at`,
      [this.hash(key), new Date(now), new Date(now + this.windowMs)],
    );
    if (Math.random() < 0.02) void this.sweep();
    return { totalHits: rows[0].hits, resetTime: new Date(rows[0].reset_at) };
  }

  /**
   * Runs after a response that did not count (a success, for the sign-in limits); a lost decrement only
   * leaves the limit stricter. One that lands while the app is shutting down is dropped quietly.
   */
  async decrement(key: string): Promise<void> {
    if (!this.ds.isInitialized) return;
    await this.ds
      .query(`UPDATE rate_limit_counters SET hits = greatest(hits - 1, 0) WHERE key = $1 AND reset_at > $2`, [this.hash(key), new Date()])
      .catch((err: unknown) => {
        if (this.ds.isInitialized) throw err;
      });
  }

  async resetKey(key: string): Promise<void> {
    await this.ds.query(`DELETE FROM rate_limit_counters WHERE key = $1`, [this.hash(key)]);
  }

  /**
   * Drops windows that ended over an hour ago, by this process's clock and the database's alike: one
   * process whose clock runs ahead (a test with a pinned clock, a skewed machine) must not sweep away
   * the windows other processes are still counting in. A failure only delays the sweep.
   */
  private async sweep(): Promise<void> {
    await this.ds
      .query(`DELETE FROM rate_limit_counters WHERE reset_at < LEAST($1::timestamptz, now() - interval '1 hour')`, [
        new Date(Date.now() - 3_600_000),
      ])
      .catch(() => undefined);
  }
}

/** A counter store shared by every app process on the database (see PgRateLimitStore). */
export function limitStore(deps: { ds: DataSource; config: Pick<Config, 'RATE_LIMIT_NAMESPACE'> }, name: string): PgRateLimitStore {
  return new PgRateLimitStore(deps.ds, `${deps.config.RATE_LIMIT_NAMESPACE}:${name}`);
}

/** The caller's address as the limiters key it (an IPv6 address by its /56), also for refusals of signed-out callers. */
export function clientAddress(req: Request): string {
  return ipKeyGenerator(req.ip ?? 'unknown');
}
