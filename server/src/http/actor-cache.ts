import { createHash, randomUUID } from 'node:crypto';
import pg from 'pg';
import type { Logger } from 'pino';

/**
 * A short in-process cache of what the session read loads (the session row joined with its user and
 * that user's actors, http/security.ts), so a signed-in request costs no database round trip before
 * its handler when nothing changed.
 *
 * Kept right across processes by PostgreSQL's LISTEN/NOTIFY: triggers on the session, users,
 * memberships, organizations, care teams, groups and guardian links notify `loadline_actor_cache` when
 * a change commits (migration 1766600000000), and every server drops what the notice names. So a
 * sign-out, a password reset, a removed member or a changed role or care team made on any server (or
 * by any SQL) applies on every server as soon as PostgreSQL delivers the notice (on one machine, well
 * under a millisecond after the commit), and on the server that made it at once.
 *
 * A write made through a command waits, after its commit, until this server has heard every notice
 * committed so far (`settle`), so the server that made a change never serves what it replaced.
 *
 * Fails safe: while the listening connection is down (not yet connected, dropped, reconnecting) the
 * cache is off and cleared, because notices sent meanwhile are lost. An entry also lives at most
 * `ttlMs` and never past the session row's own expiry.
 */
export const ACTOR_CACHE_CHANNEL = 'loadline_actor_cache';

export interface CachedRead {
  /** The row as the session read returned it (the session JSON, the user's columns, the actors). */
  row: Record<string, unknown>;
  /** The session row's `expire`, in ms. */
  expiresAt: number;
}

interface Entry extends CachedRead {
  userId: string | null;
  storedAt: number;
}

/** The key of a session in the cache and in the notices: SHA-256 of its id, as the trigger makes it. */
export function sessionKey(sid: string): string {
  return createHash('sha256').update(sid, 'utf8').digest('hex');
}

export class ActorCache {
  private readonly entries = new Map<string, Entry>();
  /** Bumped by every invalidation: a read that started before one must not be stored after it. */
  private generation = 0;
  private listener: pg.Client | null = null;
  private listening = false;
  private closed = false;
  private retry: NodeJS.Timeout | null = null;
  /** `settle` calls waiting for their own notice to come back. */
  private readonly settling = new Map<string, () => void>();

  constructor(
    private readonly databaseUrl: string,
    private readonly logger: Logger,
    private readonly ttlMs: number,
    private readonly maxEntries = 20_000,
  ) {}

  /** Whether entries may be used (listening, and not turned off with a TTL of 0). */
  get active(): boolean {
    return this.listening && this.ttlMs > 0;
  }

  /** Connects the listening client; resolves once LISTEN is in place (or failed: then the cache stays off and retries). */
  async start(): Promise<void> {
    if (this.ttlMs <= 0) return;
    await this.connect();
  }

  private async connect(): Promise<void> {
    if (this.closed) return;
    const client = new pg.Client({ connectionString: this.databaseUrl, application_name: 'loadline-actor-cache' });
    const lost = (err?: unknown) => {
      if (this.listener !== client) return;
      this.listener = null;
      this.off();
      if (err) this.logger.warn({ err }, 'actor cache: listening connection lost; cache off until it is back');
      client.end().catch(() => undefined);
      this.scheduleReconnect();
    };
    client.on('error', (err) => lost(err));
    client.on('end', () => lost());
    client.on('notification', (n) => {
      if (n.channel !== ACTOR_CACHE_CHANNEL) return;
      const payload = n.payload ?? '*';
      const settled = this.settling.get(payload);
      if (settled) settled();
      else if (!payload.startsWith('sync:')) this.invalidate(payload);
    });
    this.listener = client;
    try {
      await client.connect();
      await client.query(`LISTEN ${ACTOR_CACHE_CHANNEL}`);
      if (this.listener !== client || this.closed) return;
      // Anything cached before this point may have missed a notice.
      this.off();
      this.listening = true;
    } catch (err) {
      lost(err);
    }
  }

  private scheduleReconnect() {
    if (this.closed || this.retry) return;
    this.retry = setTimeout(() => {
      this.retry = null;
      void this.connect();
    }, 1000);
    this.retry.unref();
  }

  private off() {
    this.listening = false;
    this.generation++;
    this.entries.clear();
    for (const done of this.settling.values()) done();
  }

  /**
   * Resolves once this server has heard every notice committed before the call: PostgreSQL delivers
   * notices to each listener in commit order, so our own notice coming back means all earlier ones
   * have. If it does not come back within a second, the cache empties itself instead (safe either way).
   */
  async settle(): Promise<void> {
    const client = this.listener;
    if (!this.active || !client) return;
    const token = `sync:${randomUUID()}`;
    const back = new Promise<boolean>((resolve) => {
      const timer = setTimeout(() => resolve(false), 1000);
      this.settling.set(token, () => {
        clearTimeout(timer);
        resolve(true);
      });
    });
    try {
      await client.query('SELECT pg_notify($1, $2)', [ACTOR_CACHE_CHANNEL, token]);
      if (!(await back)) this.invalidate('*');
    } catch {
      this.invalidate('*');
    } finally {
      this.settling.delete(token);
    }
  }

  /** A notice's payload: `s:<session key>`, `u:<user id>` or `*`. */
  invalidate(payload: string): void {
    this.generation++;
    if (payload.startsWith('s:')) this.entries.delete(payload.slice(2));
    else if (payload.startsWith('u:')) {
      const userId = payload.slice(2);
      for (const [k, e] of this.entries) if (e.userId === userId) this.entries.delete(k);
    } else this.entries.clear();
  }

  /** This process changed or ended the session itself: drop it now, before any notice arrives. */
  forget(sid: string): void {
    this.invalidate(`s:${sessionKey(sid)}`);
  }

  /** The token a read takes before it starts; `put` stores only if nothing was invalidated since. */
  begin(): number {
    return this.generation;
  }

  get(sid: string, now = Date.now()): CachedRead | undefined {
    if (!this.active) return undefined;
    const key = sessionKey(sid);
    const e = this.entries.get(key);
    if (!e) return undefined;
    if (now - e.storedAt > this.ttlMs || now >= e.expiresAt) {
      this.entries.delete(key);
      return undefined;
    }
    return e;
  }

  put(sid: string, token: number, read: CachedRead, userId: string | null, now = Date.now()): void {
    if (!this.active || token !== this.generation) return;
    if (this.entries.size >= this.maxEntries) {
      // Oldest first (a Map keeps insertion order).
      const oldest = this.entries.keys().next().value;
      if (oldest !== undefined) this.entries.delete(oldest);
    }
    this.entries.set(sessionKey(sid), { ...read, userId, storedAt: now });
  }

  /** A session's expiry moved forward in this process (the touch). */
  extend(sid: string, expiresAt: number): void {
    const e = this.entries.get(sessionKey(sid));
    if (e) e.expiresAt = Math.max(e.expiresAt, expiresAt);
  }

  async close(): Promise<void> {
    this.closed = true;
    if (this.retry) clearTimeout(this.retry);
    const client = this.listener;
    this.listener = null;
    this.off();
    await client?.end().catch(() => undefined);
  }
}
