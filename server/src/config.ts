import { z } from 'zod';

const ConfigSchema = z.object({
  DATABASE_URL: z.string().min(1, { message: 'DATABASE_URL is required' }),
  PORT: z.coerce.number().int().min(0).max(65535).default(3000),
  HOST: z.string().default('127.0.0.1'),
  /**
   * On SIGTERM the server stops taking connections and lets requests in flight finish (a clip upload
   * on a slow uplink can take minutes) for up to this long, then cuts what is left.
   */
  SHUTDOWN_GRACE_SECONDS: z.coerce.number().min(0).max(3600).default(300),
  SESSION_SECRET: z.string().min(32, { message: 'SESSION_SECRET must be at least 32 characters' }),
  /**
   * The address people use to reach Loadline (scheme, host, port, optional path): every link in an
   * e-mail or letter starts with it, and requests for any other Host are refused. Required in
   * production (NODE_ENV=production or SECURE_COOKIES=true); `npm start` sets it to its own address.
   */
  PUBLIC_URL: z
    .string()
    .url()
    .refine((v) => /^https?:\/\//i.test(v) && !/[?#]/.test(v), {
      message: 'PUBLIC_URL must be an http(s) address without a query or fragment',
    })
    .optional(),
  /** Cookies get the Secure flag when the app is served over TLS (behind a proxy that terminates it). */
  SECURE_COOKIES: z.enum(['true', 'false']).default('false'),
  TRUST_PROXY: z.enum(['true', 'false']).default('false'),
  LOG_LEVEL: z.enum(['fatal', 'error', 'warn', 'info', 'debug', 'trace', 'silent']).default('info'),
  SIGNIN_WINDOW_SECONDS: z.coerce
    .number()
    .int()
    .min(1)
    .default(15 * 60),
  /** Failed sign-ins (wrong password or code) per account, from anywhere, per SIGNIN_WINDOW_SECONDS. */
  SIGNIN_MAX_FAILURES_PER_ACCOUNT: z.coerce.number().int().min(1).default(10),
  /** Failed sign-ins per account from one address: one guesser is stopped before the owner is. */
  SIGNIN_MAX_FAILURES_PER_ADDRESS_ACCOUNT: z.coerce.number().int().min(1).default(5),
  /**
   * Failed sign-ins from one address across all accounts. Successful ones never count, and the
   * ceiling is high because a whole team on one school network shares one address.
   */
  SIGNIN_MAX_PER_IP: z.coerce.number().int().min(1).default(300),
  /**
   * Rate-limit counters live in PostgreSQL, so every app process on the database counts against the
   * same limits. Processes with the same namespace share counters (tests give each app its own).
   */
  RATE_LIMIT_NAMESPACE: z.string().min(1).max(100).default('loadline'),
  SESSION_IDLE_MINUTES: z.coerce.number().min(1).max(30).default(30),
  SESSION_ABSOLUTE_HOURS: z.coerce.number().min(0.001).max(12).default(12),
  /**
   * How long a server may reuse a signed-in person's session, user and memberships without reading
   * them again (http/actor-cache.ts). Changes still apply on the next request: PostgreSQL notifies every
   * server of them. 0 turns the cache off.
   */
  ACTOR_CACHE_SECONDS: z.coerce.number().min(0).max(300).default(30),
  INVITATION_TTL_HOURS: z.coerce
    .number()
    .min(1)
    .max(24 * 14)
    .default(72),
  /**
   * Whether anyone may start an organization from the public page (organizations start themselves).
   * `closed` for a private installation: the page says so, the sign-up routes answer 404, and operators
   * use `npm run org:create`.
   */
  ORG_SIGNUP: z.enum(['open', 'closed']).default('open'),
  /** A sign-up's confirmation link works once and for this many hours. */
  ORG_SIGNUP_TTL_HOURS: z.coerce.number().min(1).max(168).default(24),
  /** Sign-up requests per IP address and per e-mail address typed, over SIGNIN_WINDOW_SECONDS. */
  ORG_SIGNUP_MAX_PER_IP: z.coerce.number().int().min(1).default(10),
  ORG_SIGNUP_MAX_PER_ACCOUNT: z.coerce.number().int().min(1).default(3),
  BCRYPT_COST: z.coerce.number().int().min(12).max(15).default(12),
  /** Password reset links work once and for this many minutes. */
  RESET_TTL_MINUTES: z.coerce
    .number()
    .min(1)
    .max(24 * 60)
    .default(30),
  /** Reset requests per e-mail address and per IP address, over SIGNIN_WINDOW_SECONDS. */
  RESET_MAX_PER_ACCOUNT: z.coerce.number().int().min(1).default(5),
  RESET_MAX_PER_IP: z.coerce.number().int().min(1).default(20),
  /**
   * 32 bytes (64 hex characters or base64) that encrypt two-step sign-in secrets at rest. Unset: a key
   * is derived from SESSION_SECRET, so changing SESSION_SECRET then makes enrolled authenticators unusable.
   */
  TOTP_KEY: z
    .string()
    .refine((v) => /^[0-9a-fA-F]{64}$/.test(v.trim()) || Buffer.from(v.trim(), 'base64').length === 32, {
      message: 'TOTP_KEY must be 32 bytes, written as 64 hex characters or base64',
    })
    .optional(),
  CLIENT_DIST: z.string().optional(),
  /** Where e-mail goes. Unset: no e-mail is queued (the app still works; notices stay in-app). */
  SMTP_URL: z.string().optional(),
  /** Set by npm start / npm test when SMTP_URL is our local fake: enables the admin's outbox page. */
  FAKE_MAIL: z.enum(['true', 'false']).default('false'),
  /** Run the e-mail worker in this process (one or more app servers may do so). */
  RUN_WORKERS: z.enum(['true', 'false']).default('true'),
  /**
   * E-mails this server's worker sends at once (each holds an SMTP connection of a shared pool and,
   * briefly, a database connection). 8 sends well over 50 a second to the local fake SMTP (bench/mail.ts).
   */
  MAIL_CONCURRENCY: z.coerce.number().int().min(1).max(50).default(8),
  /** Uploaded files on local disk (default `<repo>/.data/uploads`); unused when S3_BUCKET is set. */
  STORAGE_DIR: z.string().optional(),
  /** Upload size limits in MB (fractions allowed, so tests can use small ones). */
  UPLOAD_MAX_DOCUMENT_MB: z.coerce.number().positive().default(20),
  UPLOAD_MAX_CLIP_MB: z.coerce.number().positive().default(300),
  /** Uploads go to this bucket through the S3 API when set. */
  S3_BUCKET: z.string().optional(),
  S3_ENDPOINT: z.string().url().optional(),
  S3_REGION: z.string().default('us-east-1'),
  S3_ACCESS_KEY_ID: z.string().optional(),
  S3_SECRET_ACCESS_KEY: z.string().optional(),
  S3_FORCE_PATH_STYLE: z.enum(['true', 'false']).default('false'),
  /**
   * Audit trail protection (ASVS 5.0 V16.4.2, V16.4.3). The app connects with DATABASE_URL, a role that
   * may only SELECT and INSERT audit entries; MIGRATION_DATABASE_URL is the owner role, used by the
   * migration scripts only (they read it from the environment; the app never connects with it).
   */
  MIGRATION_DATABASE_URL: z.string().optional(),
  /**
   * HMAC-SHA256 key (at least 32 bytes) that signs each organization's daily audit seal. It must never
   * be stored in the database. Unset: no seal is made (npm start and npm test keep one under .data).
   */
  AUDIT_SEAL_KEY: z
    .string()
    .refine((v) => Buffer.byteLength(v, 'utf8') >= 32, { message: 'AUDIT_SEAL_KEY must be at least 32 bytes' })
    .optional(),
  /** Where seals are appended, one JSON-lines file per organization (default `<repo>/.data/audit-seals`). */
  AUDIT_SEAL_DIR: z.string().optional(),
  /** When the daily seal runs (cron, UTC); pg-boss runs it once across all app servers. */
  AUDIT_SEAL_CRON: z.string().default('0 2 * * *'),
  /** When unconfirmed sign-up requests are purged (cron, UTC; commands/organization-signup.ts). */
  SIGNUP_PURGE_CRON: z.string().default('30 2 * * *'),
});

export type Config = z.infer<typeof ConfigSchema>;

export function loadConfig(env: Record<string, string | undefined> = process.env, overrides: Partial<Config> = {}): Config {
  const parsed = ConfigSchema.safeParse(env);
  if (!parsed.success) {
    const lines = parsed.error.issues.map((i) => `  ${i.path.join('.')}: ${i.message}`);
    throw new Error(`Invalid configuration:\n${lines.join('\n')}`);
  }
  const config = { ...parsed.data, ...overrides };
  const production = env.NODE_ENV === 'production' || config.SECURE_COOKIES === 'true';
  if (production && !config.PUBLIC_URL) {
    throw new Error(
      'Invalid configuration:\n  PUBLIC_URL: is required in production (NODE_ENV=production or SECURE_COOKIES=true), e.g. PUBLIC_URL=https://loadline.example.org — links in e-mails are built from it, never from the request',
    );
  }
  return config;
}
