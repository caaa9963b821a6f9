/** What `npm start`, `npm test` and the helper scripts share: the database, secrets, migrations. */
import { randomBytes } from 'node:crypto';
import { chmodSync, existsSync, mkdirSync, readFileSync, writeFileSync } from 'node:fs';
import path from 'node:path';
import pg from 'pg';
import { createDataSource } from '../server/src/data-source';
import { JobQueue } from '../server/src/jobs/queue';
import { ROOT, ensureDatabase, startCluster, type Cluster } from './pg-cluster';

export { ROOT };

export interface Database {
  /** The runtime role: what the app connects with. */
  url: string;
  /** The owner role: migrations, and nothing else. The same as `url` when only DATABASE_URL is given. */
  ownerUrl: string;
  /** Our own cluster, when DATABASE_URL was not given. */
  cluster: Cluster | null;
}

let warnedSingleRole = false;

/** MIGRATION_DATABASE_URL, or DATABASE_URL with a warning: one role can then rewrite its own audit trail. */
function ownerUrlFromEnv(): string {
  if (process.env.MIGRATION_DATABASE_URL) return process.env.MIGRATION_DATABASE_URL;
  if (!warnedSingleRole) {
    warnedSingleRole = true;
    console.warn(
      '[db] MIGRATION_DATABASE_URL is not set: migrations run as the DATABASE_URL role, which then owns audit_entries ' +
        'and could rewrite the audit trail. Give the app a role of its own (README "Database roles").',
    );
  }
  return process.env.DATABASE_URL!;
}

function withDatabaseName(url: string, name: string): string {
  const u = new URL(url);
  u.pathname = `/${name}`;
  return u.toString();
}

/**
 * DATABASE_URL wins: that server is used and none is started. Otherwise our own cluster under .data
 * is started (with its owner and runtime roles) and the named database created (dropped first when `fresh`).
 */
export async function openDatabase(name: string, fresh: boolean): Promise<Database> {
  if (process.env.DATABASE_URL && !fresh) return { url: process.env.DATABASE_URL, ownerUrl: ownerUrlFromEnv(), cluster: null };
  if (process.env.DATABASE_URL && fresh) {
    const owner = ownerUrlFromEnv();
    await ensureDatabase(withDatabaseName(owner, 'postgres'), name, true);
    return { url: withDatabaseName(process.env.DATABASE_URL, name), ownerUrl: withDatabaseName(owner, name), cluster: null };
  }
  const cluster = startCluster();
  await ensureDatabase(cluster.adminUrl(), name, fresh);
  return { url: cluster.url(name), ownerUrl: cluster.ownerUrl(name), cluster };
}

/**
 * Runs the migrations and installs pg-boss's schema as the owner, then grants the runtime role what
 * the app needs (when it is a different role). Safe to run again: grants are idempotent.
 */
export async function migrate(ownerUrl: string, runtimeUrl: string = ownerUrl): Promise<string[]> {
  const ds = createDataSource(ownerUrl, 2);
  await ds.initialize();
  let ran: string[];
  try {
    ran = (await ds.runMigrations({ transaction: 'each' })).map((m) => m.name);
  } finally {
    await ds.destroy();
  }
  await JobQueue.install(ownerUrl);
  const owner = decodeURIComponent(new URL(ownerUrl).username);
  const runtime = decodeURIComponent(new URL(runtimeUrl).username);
  if (runtime && runtime !== owner) await grantRuntimeRole(ownerUrl, runtime);
  return ran;
}

/**
 * The runtime role's rights (ASVS 5.0 V16.4.2; V13.2.2 least privilege): read and write the ordinary
 * tables, but only SELECT and INSERT on audit_entries, and only read the migrations ledger. It owns
 * nothing, so it cannot ALTER a table or DISABLE TRIGGER. Default privileges cover tables that later
 * migrations make; every `migrate` re-applies the whole set anyway, after the migrations ran.
 */
export async function grantRuntimeRole(ownerUrl: string, role: string): Promise<void> {
  const r = pg.escapeIdentifier(role);
  const c = new pg.Client({ connectionString: ownerUrl });
  await c.connect();
  try {
    await c.query('BEGIN');
    for (const schema of ['public', 'pgboss']) {
      await c.query(`GRANT USAGE ON SCHEMA ${schema} TO ${r}`);
      await c.query(`GRANT SELECT, INSERT, UPDATE, DELETE ON ALL TABLES IN SCHEMA ${schema} TO ${r}`);
      await c.query(`GRANT USAGE, SELECT ON ALL SEQUENCES IN SCHEMA ${schema} TO ${r}`);
      await c.query(`ALTER DEFAULT PRIVILEGES IN SCHEMA ${schema} GRANT SELECT, INSERT, UPDATE, DELETE ON TABLES TO ${r}`);
      await c.query(`ALTER DEFAULT PRIVILEGES IN SCHEMA ${schema} GRANT USAGE, SELECT ON SEQUENCES TO ${r}`);
    }
    await c.query(`REVOKE UPDATE, DELETE, TRUNCATE, REFERENCES, TRIGGER ON audit_entries FROM ${r}`);
    await c.query(`REVOKE INSERT, UPDATE, DELETE, TRUNCATE ON migrations FROM ${r}`);
    await c.query('COMMIT');
  } catch (err) {
    await c.query('ROLLBACK').catch(() => undefined);
    throw err;
  } finally {
    await c.end();
  }
}

/** A stable session secret for local runs, so sessions survive a restart. */
export function sessionSecret(): string {
  if (process.env.SESSION_SECRET) return process.env.SESSION_SECRET;
  const file = path.join(ROOT, '.data', 'session-secret');
  mkdirSync(path.dirname(file), { recursive: true });
  if (!existsSync(file)) {
    writeFileSync(file, randomBytes(48).toString('base64url'));
    chmodSync(file, 0o600);
  }
  return readFileSync(file, 'utf8').trim();
}

const AUDIT_SEAL_KEY_FILE = path.join(ROOT, '.data', 'audit-seal-key');

/** AUDIT_SEAL_KEY, or the local one under .data when it was made; null otherwise (nothing is created). */
export function existingAuditSealKey(): string | null {
  if (process.env.AUDIT_SEAL_KEY) return process.env.AUDIT_SEAL_KEY;
  return existsSync(AUDIT_SEAL_KEY_FILE) ? readFileSync(AUDIT_SEAL_KEY_FILE, 'utf8').trim() : null;
}

/**
 * The audit seal key for local runs (ASVS 5.0 V16.4.3): kept beside the database, never in it, so the
 * seals it makes can show a rewrite done with the database's own credentials.
 */
export function auditSealKey(): string {
  const found = existingAuditSealKey();
  if (found) return found;
  const file = AUDIT_SEAL_KEY_FILE;
  mkdirSync(path.dirname(file), { recursive: true });
  if (!existsSync(file)) {
    writeFileSync(file, randomBytes(32).toString('base64url'));
    chmodSync(file, 0o600);
  }
  return readFileSync(file, 'utf8').trim();
}

export async function buildClient(): Promise<void> {
  const { build } = await import('vite');
  // Vite sets NODE_ENV=production in this process for the build; put it back, or the server started
  // afterwards in the same process (browser tests) would take itself for production and refuse to
  // start without PUBLIC_URL.
  const nodeEnv = process.env.NODE_ENV;
  try {
    await build({ configFile: path.join(ROOT, 'client', 'vite.config.ts'), logLevel: 'warn' });
  } finally {
    if (nodeEnv === undefined) delete process.env.NODE_ENV;
    else process.env.NODE_ENV = nodeEnv;
  }
}
