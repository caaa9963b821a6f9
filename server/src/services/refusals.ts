import type { DataSource } from 'typeorm';
import type { Logger } from 'pino';
import { appendAudit } from './audit';
import { loadActors } from './actor';

/**
 * Refusals in the audit trail (ASVS 5.0 V16.3.2: failed authorization; V16.3.1: authentication
 * events), summarised so that one caller cannot grow the trail without bound and the log stays
 * usable under attack.
 *
 * The trail is append-only and hash-chained, so an entry's count cannot be raised afterwards. So:
 * the first refusal per trail, actor, action, route and minute is written at once (with its request
 * id, so it can be matched with the request log); later ones in that minute only add to a row of
 * `refusal_counters`; once the minute is over, a row with more than one hit becomes one summary
 * entry carrying the count, and the row is deleted. Summaries are written by the next refusal (from
 * any process on the database) and by a timer of this process. A counter in memory would be lost
 * on a restart and counted per process; the table keeps the count exact across processes.
 */
export interface Refusal {
  /** The trails the refusal belongs in: the organizations concerned, or null for the global trail. */
  organizationIds: (string | null)[];
  /** The signed-in person refused, when there is one. */
  actorUserId: string | null;
  /** The caller's address (the limiter's key for IPv6: its /56), recorded for signed-out callers. */
  address: string | null;
  /** e.g. 'access.refused', 'access.not_found', 'access.csrf_refused', 'auth.sign_in_limited'. */
  action: string;
  method: string;
  /** The route's pattern ('/api/orgs/:orgId/cases/:id'), never a path full of ids, so counts group by route. */
  route: string;
  /** The path actually asked for, kept on the first entry only. */
  path: string;
  requestId: string | null;
  /** What else the first entry says (a sentence, the limit that refused). Never a body or a secret. */
  details?: Record<string, unknown>;
}

interface CounterRow {
  chain: string;
  action: string;
  route: string;
  minute: Date;
  hits: number;
  organization_id: string | null;
  actor_user_id: string | null;
  address: string | null;
}

const minuteOf = (d: Date) => new Date(Math.floor(d.getTime() / 60_000) * 60_000);

/**
 * Records `hits` refusals of one kind: the first of its minute as an entry, later ones as a count
 * (see above). Summaries of minutes that are over are written by `flushRefusals`.
 */
export async function recordRefusal(ds: DataSource, r: Refusal, now = new Date(), hits = 1): Promise<void> {
  const minute = minuteOf(now);
  const actorKey = r.actorUserId ? `user:${r.actorUserId}` : `address:${r.address ?? 'unknown'}`;
  const routeKey = `${r.method} ${r.route}`.slice(0, 300);
  const orgs = r.organizationIds.length ? [...new Set(r.organizationIds)] : [null];
  await ds.transaction(async (m) => {
    for (const organizationId of orgs) {
      // xmax = 0 only on a row this statement inserted: the first refusal of its minute.
      const [row]: { inserted: boolean }[] = await m.query(
        `INSERT INTO refusal_counters AS c (chain, actor_key, action, route, minute, hits, organization_id, actor_user_id, address)
         VALUES ($1, $2, $3, $4, $5, $9, $6, $7, $8)
         ON CONFLICT (chain, actor_key, action, route, minute) DO UPDATE SET hits = c.hits + EXCLUDED.hits
         RETURNING (xmax = 0) AS inserted`,
        [organizationId ?? 'global', actorKey, r.action, routeKey, minute, organizationId, r.actorUserId, r.address, hits],
      );
      if (!row.inserted) continue;
      await appendAudit(m, {
        organizationId,
        actorUserId: r.actorUserId,
        requestId: r.requestId,
        action: r.action,
        subjectType: 'Route',
        after: {
          method: r.method,
          path: r.path,
          route: r.route,
          ...(r.actorUserId ? {} : { address: r.address }),
          ...r.details,
        },
      });
    }
  });
}

/**
 * Turns the counters of minutes that are over into summary entries (one per counter with repeats).
 * The automatic flushes (`byBothClocks`) take only minutes over by this process's clock and the
 * database's alike, so a process whose clock runs ahead (a test's pinned clock, a skewed machine)
 * never summarises another process's minute while it is still counting.
 */
export async function flushRefusals(ds: DataSource, now = new Date(), byBothClocks = false): Promise<number> {
  return ds.transaction(async (m) => {
    // TypeORM answers a DELETE as [rows, affected count].
    const [rows]: [CounterRow[], number] = await m.query(
      `DELETE FROM refusal_counters WHERE minute < $1 AND (NOT $2::boolean OR minute < date_trunc('minute', now()))
       RETURNING chain, action, route, minute, hits, organization_id, actor_user_id, address`,
      [minuteOf(now), byBothClocks],
    );
    const repeated = rows.filter((row) => row.hits > 1);
    // Oldest first, so each trail reads in time order.
    repeated.sort((a, b) => new Date(a.minute).getTime() - new Date(b.minute).getTime());
    for (const row of repeated) {
      const from = new Date(row.minute);
      const space = row.route.indexOf(' ');
      await appendAudit(m, {
        organizationId: row.organization_id,
        actorUserId: row.actor_user_id,
        action: row.action,
        subjectType: 'Route',
        after: {
          summary: true,
          method: row.route.slice(0, space),
          route: row.route.slice(space + 1),
          ...(row.actor_user_id ? {} : { address: row.address }),
          count: row.hits,
          from: from.toISOString(),
          to: new Date(from.getTime() + 60_000).toISOString(),
        },
      });
    }
    return repeated.length;
  });
}

/** The organizations of the account with this e-mail, if it is a member anywhere. */
export async function organizationsOfEmail(ds: DataSource, email: string): Promise<string[]> {
  const [user]: { id: string }[] = await ds.query(`SELECT id FROM users WHERE email = $1`, [email.trim().toLowerCase()]);
  return user ? (await loadActors(ds, user.id)).map((a) => a.organizationId) : [];
}

const timers = new WeakMap<DataSource, NodeJS.Timeout>();

interface Pending {
  make: () => Promise<Refusal>;
  hits: number;
  now: Date;
}
interface Queue {
  items: Map<string, Pending>;
  next: number;
  running: boolean;
  dropped: number;
}
const queues = new WeakMap<DataSource, Queue>();
/** Refusals waiting to be written, per process: beyond this, new kinds are dropped (and counted in the log). */
const MAX_PENDING = 5_000;

/** What makes two refusals "the same" for counting: trail(s), actor or address, action, route, minute. */
function refusalKey(r: Refusal, now: Date): string {
  return [r.organizationIds.join(','), r.actorUserId ?? r.address, r.action, r.method, r.route, minuteOf(now).getTime()].join('|');
}

/**
 * Records a refusal without holding up the response; a failure is logged, never thrown (the request
 * itself changed nothing). Refusals are written one at a time by this process, and a refusal like one
 * already waiting only raises its count: a flood of refusals takes one database connection, never the
 * pool the requests need. `key` groups refusals whose details are looked up later (a function).
 * Starts this process's summary timer on first use.
 */
export function auditRefusal(deps: { ds: DataSource; logger: Logger }, r: Refusal | (() => Promise<Refusal>), key?: string): void {
  const { ds, logger } = deps;
  if (!timers.has(ds)) {
    const timer = setInterval(() => {
      if (!ds.isInitialized) return clearInterval(timer);
      flushRefusals(ds, new Date(), true).catch((err) => logger.warn({ err }, 'could not summarise refusals'));
    }, 60_000);
    timer.unref();
    timers.set(ds, timer);
  }
  let q = queues.get(ds);
  if (!q) queues.set(ds, (q = { items: new Map(), next: 0, running: false, dropped: 0 }));
  const now = new Date();
  const k = typeof r === 'function' ? (key ? `${key}|${minuteOf(now).getTime()}` : `#${q.next++}`) : refusalKey(r, now);
  const waiting = q.items.get(k);
  if (waiting) waiting.hits += 1;
  else if (q.items.size >= MAX_PENDING) q.dropped += 1;
  else q.items.set(k, { make: typeof r === 'function' ? r : async () => r, hits: 1, now });
  if (!q.running) void drain(ds, logger, q);
}

async function drain(ds: DataSource, logger: Logger, q: Queue): Promise<void> {
  q.running = true;
  try {
    // Refusals queued while the closing flush runs are written by the next turn of this loop: before,
    // they waited for the next refusal of the process, which may never come.
    while (q.items.size > 0) {
      for (let first = q.items.entries().next(); !first.done; first = q.items.entries().next()) {
        const [k, item] = first.value;
        q.items.delete(k);
        if (!ds.isInitialized) continue;
        try {
          await recordRefusal(ds, await item.make(), item.now, item.hits);
        } catch (err) {
          logger.error({ err }, 'could not audit a refusal');
        }
      }
      if (q.dropped) {
        logger.warn({ dropped: q.dropped }, 'refusals not audited: too many waiting');
        q.dropped = 0;
      }
      if (ds.isInitialized) await flushRefusals(ds, new Date(), true).catch((err) => logger.warn({ err }, 'could not summarise refusals'));
    }
  } finally {
    q.running = false;
  }
}
