import type { Request, RequestHandler } from 'express';
import session from 'express-session';
import connectPgSimple from 'connect-pg-simple';
import pg from 'pg';
import { Passport } from 'passport';
import type { Deps } from './context';
import { User } from '../entities';
import { actorsFromJson, actorsJsonSql, type ActorRow, type ActorWithOrg } from '../services/actor';
import { AppError } from '../core/errors';
import { attachCsrfKey, csrfKeyFor } from './csrf';
import type { ActorCache } from './actor-cache';

declare module 'express-session' {
  interface SessionData {
    signedInAt?: number;
  }
}

export const SESSION_COOKIE = 'loadline.sid';
export { csrfProtection, ensureCsrfToken, newCsrfToken } from './csrf';
export { signInLimits } from './sign-in-limits';
export { clientAddress, limitStore } from './rate-limit-store';

/** What the session read loaded for the session's signed-in user (keyed by a symbol on `sess.passport`). */
const LOADED = Symbol('loaded with the session');
interface Loaded {
  userId: string;
  user: User | null;
  actors: ActorWithOrg[];
}

/** The signed-in user's actors, loaded with this request's session; undefined when they were not. */
const actorsByUser = new WeakMap<User, ActorWithOrg[]>();

/**
 * The caller's actor in `organizationId` as loaded with this request's session: null when they are
 * no active member there, undefined when nothing was loaded (then the route loads it itself).
 */
export function loadedActor(user: User, organizationId: string): ActorWithOrg | null | undefined {
  const actors = actorsByUser.get(user);
  return actors && (actors.find((a) => a.organizationId === organizationId) ?? null);
}

/** connect-pg-simple's read (same table, same expiry test), joined with the user and their actors. */
function sessionReadSql(deps: Deps): string {
  const columns = deps.ds
    .getMetadata(User)
    .columns.map((c, i) => `u."${c.databaseName}" AS u${i}`)
    .join(', ');
  const userId = `s.sess -> 'passport' ->> 'user'`;
  // The session and the actors as text: a cached row is parsed afresh for each request, so no request
  // shares (and could change) another's objects. The expiry bounds how long the row may be cached.
  return `SELECT s.sess::text AS sess, (extract(epoch FROM s.expire::timestamptz) * 1000)::float8 AS expire_ms, u.id AS user_id, ${columns},
      (CASE WHEN u.id IS NULL THEN NULL ELSE ${actorsJsonSql('u.id')} END)::text AS actors
    FROM "session" s
    LEFT JOIN users u ON u.id = CASE WHEN ${userId} ~ '^[0-9a-fA-F]{8}-[0-9a-fA-F]{4}-[0-9a-fA-F]{4}-[0-9a-fA-F]{4}-[0-9a-fA-F]{12}$' THEN (${userId})::uuid END
    WHERE s.sid = $1 AND s.expire >= to_timestamp($2)`;
}

/** The user row as TypeORM would hydrate it (same column types and conversions as findOne). */
function toUser(deps: Deps, row: Record<string, unknown>): User {
  const user = new User();
  deps.ds.getMetadata(User).columns.forEach((c, i) => c.setEntityValue(user, deps.ds.driver.prepareHydratedValue(row[`u${i}`], c)));
  return user;
}

export function buildSession(deps: Deps, cache: ActorCache): { middleware: RequestHandler; close: () => Promise<void> } {
  const { config } = deps;
  const PgStore = connectPgSimple(session);
  // A small pool of its own, so session reads never queue behind long queries; errors are logged,
  // never thrown, so a restarting database cannot crash the process.
  const pool = new pg.Pool({ connectionString: config.DATABASE_URL, max: 5, connectionTimeoutMillis: 5000 });
  pool.on('error', (err) => deps.logger.warn({ err }, 'session pool: idle client error'));
  const idleMs = config.SESSION_IDLE_MINUTES * 60_000;
  const touchEveryMs = Math.min(60_000, idleMs / 10);
  const store = new PgStore({
    pool,
    tableName: 'session',
    createTableIfMissing: false,
    pruneSessionInterval: 15 * 60,
    // Under `err`, so the logger's serializer reduces a database error to its code (logger.ts).
    errorLog: (err: unknown) => deps.logger.warn({ err }, 'session store error'),
  });
  // The session row, its signed-in user and that user's memberships (the actor of each organization)
  // in one query, kept for a few seconds in the actor cache (http/actor-cache.ts), which every server
  // empties of what changed when PostgreSQL notifies it: a signed-in request usually costs no round
  // trip before its handler, and sign-out, a password reset that deletes sessions, a deactivated
  // membership or a changed role or care team still applies on the next request, on every server.
  let readSql: string | null = null;
  const fromRow = (sid: string, row: Record<string, unknown>, cb: (err: unknown, session?: session.SessionData | null) => void) => {
    let sess: session.SessionData & { passport?: { user?: unknown } };
    try {
      sess = typeof row.sess === 'string' ? JSON.parse(row.sess) : row.sess;
    } catch {
      return store.destroy(sid, (err) => cb(err, null));
    }
    const userId = sess.passport?.user;
    if (typeof userId === 'string') {
      const user = row.user_id === null ? null : toUser(deps, row);
      const actorRows = (typeof row.actors === 'string' ? JSON.parse(row.actors) : row.actors) as ActorRow[];
      const actors = user ? actorsFromJson(user.id, actorRows) : [];
      // A symbol key: never serialised, so it is never written back into the session row.
      Object.defineProperty(sess.passport, LOADED, { value: { userId, user, actors } satisfies Loaded, enumerable: false });
    }
    cb(null, sess);
  };
  store.get = (sid: string, cb: (err: unknown, session?: session.SessionData | null) => void) => {
    const cached = cache.get(sid);
    if (cached) return fromRow(sid, cached.row, cb);
    readSql ??= sessionReadSql(deps);
    const token = cache.begin();
    // A named (prepared) statement: planning this query cost more than running it.
    pool.query({ name: 'loadline-session-read', text: readSql, values: [sid, Math.ceil(Date.now() / 1000)] }).then(
      ({ rows: [row] }) => {
        if (!row) return cb(null, null);
        cache.put(sid, token, { row, expiresAt: Number(row.expire_ms) }, (row.user_id as string | null) ?? null);
        fromRow(sid, row, cb);
      },
      (err: unknown) => cb(err),
    );
  };
  // A session this process changes or ends leaves the cache at once (other servers hear it by NOTIFY).
  const set = store.set.bind(store);
  store.set = (sid: string, sess: session.SessionData, cb?: (err?: unknown) => void) => {
    cache.forget(sid);
    set(sid, sess, (err?: unknown) => {
      cache.forget(sid);
      cb?.(err);
    });
  };
  const destroy = store.destroy.bind(store);
  store.destroy = (sid: string, cb?: (err?: unknown) => void) => {
    cache.forget(sid);
    destroy(sid, (err?: unknown) => {
      cache.forget(sid);
      // A sign-out answers once this server has heard the deletion's notice (the others hear it with it).
      void cache.settle().then(() => cb?.(err));
    });
  };
  // Rolling sessions would write the row's expiry on every request. Touch each session at most once a
  // minute instead: the stored expiry then lags by under a minute, so the server-side idle timeout
  // can only end a session slightly earlier, never later.
  const lastTouch = new Map<string, number>();
  const touch = store.touch.bind(store);
  store.touch = (sid: string, sess: session.SessionData, cb?: (err?: unknown) => void) => {
    const now = Date.now();
    if (now - (lastTouch.get(sid) ?? 0) < touchEveryMs) return cb?.();
    if (lastTouch.size > 50_000) lastTouch.clear();
    lastTouch.set(sid, now);
    touch(sid, sess, (err?: unknown) => {
      if (!err && sess.cookie?.expires) cache.extend(sid, new Date(sess.cookie.expires).getTime());
      cb?.(err);
    });
  };
  const sessions = session({
    name: SESSION_COOKIE,
    secret: config.SESSION_SECRET,
    store,
    resave: false,
    saveUninitialized: false,
    // Each request pushes the idle expiry forward; the store's row expires with the cookie, so an
    // idle session is gone on the server too, not just in the browser.
    rolling: true,
    cookie: {
      httpOnly: true,
      sameSite: 'lax',
      path: '/',
      secure: config.SECURE_COOKIES === 'true',
      maxAge: idleMs,
    },
  });
  // The signed-out CSRF token's key travels with the request to the check and GET /api/session (http/csrf.ts).
  const csrfKey = csrfKeyFor(config.SESSION_SECRET, config.SECURE_COOKIES === 'true');
  const middleware: RequestHandler = (req, res, next) => {
    attachCsrfKey(req, csrfKey);
    sessions(req, res, next);
  };
  // The store's prune timer stops before its pool ends, so shutdown leaves nothing running.
  const close = async () => {
    store.close();
    await cache.close();
    await pool.end();
  };
  return { middleware, close };
}

/**
 * Passport keeps who is signed in on the session (serialise to the user id, read back with the
 * session row). The password itself is checked by the signIn command (commands/account.ts), which
 * the route runs before http/sign-in.ts logs the person in.
 */
export function buildPassport(deps: Deps) {
  const passport = new Passport();
  passport.serializeUser<string>((user, done) => done(null, (user as User).id));
  passport.deserializeUser<string>((req: Request, id: string, done: (err: unknown, user?: Express.User | false | null) => void) => {
    // Loaded with the session row moments ago in this same request (see buildSession).
    const loaded = (req.session as { passport?: { [LOADED]?: Loaded } } | undefined)?.passport?.[LOADED];
    if (loaded && loaded.userId === id) {
      if (loaded.user) actorsByUser.set(loaded.user, loaded.actors);
      return done(null, loaded.user ?? false);
    }
    deps.ds
      .getRepository(User)
      .findOne({ where: { id } })
      .then((user) => done(null, user ?? false), done);
  });
  return passport;
}

/** Absolute session lifetime, enforced on the server whatever the cookie says. */
export function absoluteTimeout(deps: Deps): RequestHandler {
  const maxMs = deps.config.SESSION_ABSOLUTE_HOURS * 3_600_000;
  return (req, _res, next) => {
    const started = req.session?.signedInAt;
    if (req.user && started && Date.now() - started > maxMs) {
      req.session.destroy(() => next(new AppError('session_expired', 'Your session has ended. Please sign in again.')));
      return;
    }
    next();
  };
}

/**
 * The trails a signed-in person's CSRF refusal belongs in: the organization named in the path when
 * they are a member there, else every organization they belong to (the global trail if none).
 */
export function csrfTrails(user: User, path: string): (string | null)[] {
  const actors = actorsByUser.get(user) ?? [];
  const named = /^\/api\/orgs\/([0-9a-fA-F-]{36})(?:\/|$)/.exec(path)?.[1];
  const inPath = named ? actors.find((a) => a.organizationId === named.toLowerCase()) : undefined;
  if (inPath) return [inPath.organizationId];
  return actors.length ? actors.map((a) => a.organizationId) : [null];
}
