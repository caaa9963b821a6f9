import { createHash, randomBytes, timingSafeEqual } from 'node:crypto';
import type { RequestHandler } from 'express';
import session from 'express-session';
import connectPgSimple from 'connect-pg-simple';
import pg from 'pg';
import { Passport } from 'passport';
import { Strategy as LocalStrategy } from 'passport-local';
import bcrypt from 'bcryptjs';
import { rateLimit, ipKeyGenerator } from 'express-rate-limit';
import type { Deps } from './context';
import { User } from '../entities';
import { AppError } from './errors';

declare module 'express-session' {
  interface SessionData {
    csrfToken?: string;
    signedInAt?: number;
  }
}

export const SESSION_COOKIE = 'loadline.sid';

export function newCsrfToken(): string {
  return randomBytes(32).toString('base64url');
}

/** The session's CSRF token, created on first use. */
export function ensureCsrfToken(req: Parameters<RequestHandler>[0]): string {
  if (!req.session.csrfToken) req.session.csrfToken = newCsrfToken();
  return req.session.csrfToken;
}

export function buildSession(deps: Deps): { middleware: RequestHandler; close: () => Promise<void> } {
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
      errorLog: (...args: unknown[]) => deps.logger.warn({ args }, 'session store error'),
  });
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
    touch(sid, sess, cb);
  };
  const middleware = session({
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
  // The store's prune timer stops before its pool ends, so shutdown leaves nothing running.
  const close = async () => {
    store.close();
    await pool.end();
  };
  return { middleware, close };
}

/** A bcrypt hash to compare against when the e-mail is unknown, so both paths take the same time. */
let dummyHash: Promise<string> | null = null;
function getDummyHash(cost: number) {
  dummyHash ??= bcrypt.hash(randomBytes(16).toString('hex'), cost);
  return dummyHash;
}

export function buildPassport(deps: Deps) {
  const passport = new Passport();
  passport.use(
    new LocalStrategy({ usernameField: 'email', passwordField: 'password', session: true }, (email, password, done) => {
      (async () => {
        const user = await deps.ds.getRepository(User).findOne({ where: { email: email.trim().toLowerCase() } });
        const hash = user?.passwordHash ?? (await getDummyHash(deps.config.BCRYPT_COST));
        const ok = await bcrypt.compare(password, hash);
        return user && ok ? user : false;
      })().then(
        (user) => done(null, user),
        (err) => done(err),
      );
    }),
  );
  passport.serializeUser<string>((user, done) => done(null, (user as User).id));
  passport.deserializeUser<string>((id, done) => {
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

const SAFE_METHODS = new Set(['GET', 'HEAD', 'OPTIONS']);

/**
 * CSRF defence in depth: a cross-site Fetch Metadata header or a foreign Origin is refused, and every
 * state-changing request must echo the session's token in X-CSRF-Token.
 */
export function csrfProtection(): RequestHandler {
  return (req, _res, next) => {
    if (SAFE_METHODS.has(req.method)) return next();
    const site = req.get('sec-fetch-site');
    if (site && site !== 'same-origin' && site !== 'none') {
      return next(new AppError('csrf_failed', 'This request came from another site and was refused.'));
    }
    const origin = req.get('origin');
    if (origin) {
      const host = req.get('host');
      let originHost: string | null;
      try {
        originHost = new URL(origin).host;
      } catch {
        originHost = null;
      }
      if (!host || originHost !== host) {
        return next(new AppError('csrf_failed', 'This request came from another site and was refused.'));
      }
    }
    const sent = req.get('x-csrf-token') ?? '';
    const expected = req.session?.csrfToken ?? '';
    const ok = sent.length > 0 && sent.length === expected.length && timingSafeEqual(Buffer.from(sent), Buffer.from(expected));
    if (!ok) {
      return next(new AppError('csrf_failed', 'Your page is out of date (security check failed). Reload the page and try again.'));
    }
    next();
  };
}

const rateLimited = new AppError('rate_limited', 'Too many sign-in attempts. Wait a few minutes and try again.');

/**
 * Sign-in limits: per IP address, and per account (failures only), over a sliding window. No
 * permanent lockout: when the window passes, the real owner can sign in again.
 */
export function signInLimits(
  deps: Deps,
  /** For routes whose body names no account (the second sign-in step): the e-mail to count failures under. */
  opts: { accountOf?: (req: Parameters<RequestHandler>[0]) => string | undefined } = {},
): RequestHandler[] {
  const windowMs = deps.config.SIGNIN_WINDOW_SECONDS * 1000;
  const byIp = rateLimit({
    windowMs,
    limit: deps.config.SIGNIN_MAX_PER_IP,
    standardHeaders: 'draft-8',
    legacyHeaders: false,
    keyGenerator: (req) => `ip:${ipKeyGenerator(req.ip ?? 'unknown')}`,
    handler: (_req, _res, next) => next(rateLimited),
  });
  const byAccount = rateLimit({
    windowMs,
    limit: deps.config.SIGNIN_MAX_FAILURES_PER_ACCOUNT,
    skipSuccessfulRequests: true,
    standardHeaders: 'draft-8',
    legacyHeaders: false,
    keyGenerator: (req) => {
      const named = req.body?.email ?? opts.accountOf?.(req);
      const email = typeof named === 'string' ? named.trim().toLowerCase() : '';
      if (email) return `account:${email}`;
      // Invitation routes carry a token, not an e-mail: count failures per link. A single shared key
      // would let ten bad requests from anyone block every invitation for the whole window.
      const token = typeof req.body?.token === 'string' ? req.body.token : '';
      return `invitation:${createHash('sha256').update(token).digest('hex')}`;
    },
    handler: (_req, _res, next) => next(rateLimited),
  });
  return [byIp, byAccount];
}
