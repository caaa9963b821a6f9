import type { DataSource } from 'typeorm';
import type { Logger } from 'pino';
import { appendAudit } from './audit';
import { loadActors } from './actor';

/**
 * Refusals in the audit trail (ASVS 5.0 V16.3.2: failed authorization; V16.3.1: authentication
 * events), summarised so that one caller cannot grow the trail without bound (V16.3.4 keeps the log
 * usable under attack).
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

/** Records one refusal: the first of its minute as an entry, later ones as a count (see above). */
export async function recordRefusal(ds: DataSource, r: Refusal, now = new Date()): Promise<void> {
  const minute = minuteOf(now);
  const actorKey = r.actorUserId ? `user:${r.actorUserId}` : `address:${r.address ?? 'unknown'}`;
  const routeKey = `${r.method} ${r.route}`.slice(0, 300);
  const orgs = r.organizationIds.length ? [...new Set(r.organizationIds)] : [null];
  await ds.transaction(async (m) => {
    for (const organizationId of orgs) {
      const [row]: { hits: number }[] = await m.query(
        `INSERT INTO refusal_counters AS c (chain, actor_key, action, route, minute, hits, organization_id, actor_user_id, address)
         VALUES ($1, $2, $3, $4, $5, 1, $6, $7, $8)
         ON CONFLICT (chain, actor_key, action, route, minute) DO UPDATE SET hits = c.hits + 1
         RETURNING hits`,
        [organizationId ?? 'global', actorKey, r.action, routeKey, minute, organizationId, r.actorUserId, r.address],
      );
      if (row.hits !== 1) continue;
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
  await flushRefusals(ds, now);
}

/** Turns the counters of minutes that are over into summary entries (one per counter with repeats). */
export async function flushRefusals(ds: DataSource, now = new Date()): Promise<number> {
  return ds.transaction(async (m) => {
    // TypeORM answers a DELETE as [rows, affected count].
    const [rows]: [CounterRow[], number] = await m.query(
      `DELETE FROM refusal_counters WHERE minute < $1
       RETURNING chain, action, route, minute, hits, organization_id, actor_user_id, address`,
      [minuteOf(now)],
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

/**
 * Records a refusal without holding up the response; a failure is logged, never thrown (the request
 * itself changed nothing). Starts this process's summary timer on first use.
 */
export function auditRefusal(deps: { ds: DataSource; logger: Logger }, r: Refusal | (() => Promise<Refusal>)): void {
  const { ds, logger } = deps;
  if (!timers.has(ds)) {
    const timer = setInterval(() => {
      if (!ds.isInitialized) return clearInterval(timer);
      flushRefusals(ds).catch((err) => logger.warn({ err }, 'could not summarise refusals'));
    }, 60_000);
    timer.unref();
    timers.set(ds, timer);
  }
  Promise.resolve(typeof r === 'function' ? r() : r)
    .then((refusal) => recordRefusal(ds, refusal))
    .catch((err) => logger.error({ err, requestId: typeof r === 'function' ? null : r.requestId }, 'could not audit a refusal'));
}
