/**
 * Backup and restore of the app database with Debian's pg_dump / pg_restore (custom format), and a
 * tar of the local uploads folder beside the dump. `scripts/db.ts backup | restore` are the command
 * lines over these functions; `scripts/backup.test.ts` calls them directly.
 */
import { closeSync, existsSync, openSync, readSync, statSync } from 'node:fs';
import path from 'node:path';
import pg from 'pg';
import type { EntityManager } from 'typeorm';
import { createDataSource } from '../server/src/data-source';
import { verifyChain, type ChainReport } from '../server/src/services/audit';
import {
  BackupError,
  databaseName,
  pgTool,
  runTool,
  serverMajor,
  stamp,
  toolConnection,
  withClient,
  withDatabase,
  writeThrough,
} from './backup-tools';
import { ROOT } from './pg-cluster';
import { grantRuntimeRole } from './runtime';

export { BackupError, pgTool } from './backup-tools';

export const BACKUP_DIR = path.join(ROOT, '.data', 'backups');
/** Every custom-format archive starts with these bytes. */
const ARCHIVE_MAGIC = 'PGDMP';
/** PostgreSQL truncates identifiers longer than this, which would make two of our names collide. */
const MAX_IDENTIFIER = 63;

/** Rows per table, keyed by table name (`schema.table` outside `public`). */
export type TableCounts = Record<string, number>;

/** Every organization's audit chain (and the chain of entries without one), walked from its start. */
export async function verifyAllChains(manager: EntityManager): Promise<ChainReport[]> {
  const orgs: { organization_id: string | null }[] = await manager.query(
    'SELECT DISTINCT organization_id FROM audit_entries ORDER BY organization_id NULLS FIRST',
  );
  const reports: ChainReport[] = [];
  for (const { organization_id } of orgs) reports.push(await verifyChain(manager, organization_id));
  return reports;
}

/** Row counts of every table outside the system schemas (partitions are counted in their parent). */
export async function countTables(client: pg.Client): Promise<TableCounts> {
  const { rows } = await client.query<{ schema: string; name: string }>(`
    SELECT n.nspname AS schema, c.relname AS name
      FROM pg_class c JOIN pg_namespace n ON n.oid = c.relnamespace
     WHERE c.relkind IN ('r', 'p') AND NOT c.relispartition
       AND n.nspname NOT IN ('pg_catalog', 'information_schema') AND n.nspname NOT LIKE 'pg\\_%'
     ORDER BY n.nspname = 'public' DESC, n.nspname, c.relname`);
  const counts: TableCounts = {};
  for (const { schema, name } of rows) {
    const table = `${pg.escapeIdentifier(schema)}.${pg.escapeIdentifier(name)}`;
    const res = await client.query<{ n: string }>(`SELECT count(*) AS n FROM ${table}`);
    counts[schema === 'public' ? name : `${schema}.${name}`] = Number(res.rows[0].n);
  }
  return counts;
}

export interface BackupOptions {
  /** The database to back up. */
  url: string;
  /** Default: `.data/backups/loadline-<UTC timestamp>.dump`. An existing file is never overwritten. */
  file?: string;
  /** The local uploads folder to archive beside the dump, when it exists (null with S3 storage). */
  uploadsDir?: string | null;
  /** Also count every table's rows in the very snapshot the dump is taken from. */
  counts?: boolean;
}

export interface BackupResult {
  file: string;
  bytes: number;
  /** With `counts`: what a restore of this dump must contain. */
  counts: TableCounts | null;
  uploads: { file: string; bytes: number } | null;
}

export async function backupDatabase(opts: BackupOptions): Promise<BackupResult> {
  const file = path.resolve(opts.file ?? path.join(BACKUP_DIR, `loadline-${stamp()}.dump`));
  const pgDump = pgTool('pg_dump', await serverMajor(opts.url));
  const { uri, env } = toolConnection(opts.url);
  const args = ['--format=custom', '--no-password', `--dbname=${uri}`];

  let counts: TableCounts | null = null;
  const bytes = await writeThrough(file, async (fd) => {
    if (!opts.counts) return runTool(pgDump, args, env, fd);
    // pg_dump joins this transaction's exported snapshot, so the counts describe exactly what it dumps
    // even while the app (or another test file) keeps writing. They are taken after the dump: table
    // locks held here while pg_dump queued for its own behind someone's ALTER TABLE would deadlock
    // across the two sessions, where PostgreSQL cannot see it.
    return withClient(opts.url, async (c) => {
      await c.query('BEGIN ISOLATION LEVEL REPEATABLE READ READ ONLY');
      try {
        const { rows } = await c.query<{ id: string }>('SELECT pg_export_snapshot() AS id');
        await runTool(pgDump, [...args, `--snapshot=${rows[0].id}`], env, fd);
        counts = await countTables(c);
      } finally {
        await c.query('COMMIT');
      }
    });
  });

  // After the dump, so every file a dumped row refers to is already on disk when tar reads the folder.
  let uploads: BackupResult['uploads'] = null;
  if (opts.uploadsDir && existsSync(opts.uploadsDir) && statSync(opts.uploadsDir).isDirectory()) {
    const tarFile = file.replace(/\.dump$/, '') + '.uploads.tar';
    const tarBytes = await writeThrough(tarFile, (fd) =>
      // Unfinished uploads (`.partial`) are not files yet; `-C dir .` keeps paths relative to the folder.
      // GNU tar exits 1 when a file was deleted or renamed into place while it read the folder: on a
      // live app that is expected, and the archive is still whole.
      runTool('tar', ['--create', '--file=-', '--exclude=*.partial', '-C', opts.uploadsDir!, '.'], process.env, fd, [0, 1]),
    );
    uploads = { file: tarFile, bytes: tarBytes };
  }
  return { file, bytes, counts, uploads };
}

/** Refuses, naming the problem, anything that is not a readable custom-format archive. */
export async function checkArchive(file: string): Promise<void> {
  if (!existsSync(file)) throw new BackupError(`${file}: no such file`);
  if (!statSync(file).isFile()) throw new BackupError(`${file} is not a file`);
  const head = Buffer.alloc(ARCHIVE_MAGIC.length);
  const fd = openSync(file, 'r');
  try {
    readSync(fd, head, 0, head.length, 0);
  } finally {
    closeSync(fd);
  }
  if (head.toString('latin1') !== ARCHIVE_MAGIC) {
    throw new BackupError(
      `${file} is not a pg_dump custom-format archive (what npm run db:backup writes); a plain SQL dump is restored with psql`,
    );
  }
  // The newest pg_restore installed reads archives of every older version.
  await runTool(pgTool('pg_restore'), ['--list', file], process.env).catch((err: Error) => {
    throw new BackupError(`${file} could not be read as an archive: ${err.message}`);
  });
}

export interface RestoreOptions {
  file: string;
  /** The database to restore into; created when missing. */
  url: string;
  /** Replace a database that already holds tables (it is kept under another name, not dropped). */
  yes?: boolean;
  /**
   * The app's own role: the restore is owned by the restoring (owner) role and carries no grants, so
   * the runtime role's are given again, audit_entries SELECT and INSERT only (ASVS 5.0 V16.4.2).
   */
  runtimeRole?: string;
}

export interface RestoreResult {
  database: string;
  /** With `yes` over a database that held tables: the name the previous one is kept under. */
  previous: string | null;
  counts: TableCounts;
  chains: ChainReport[];
  intact: boolean;
  /** Why the chains could not be checked at all, if they could not. */
  unverified: string | null;
}

async function relationCount(url: string): Promise<number> {
  return withClient(url, async (c) => {
    const { rows } = await c.query<{ n: string }>(`
      SELECT count(*) AS n FROM pg_class c JOIN pg_namespace n ON n.oid = c.relnamespace
       WHERE c.relkind IN ('r', 'p', 'v', 'm', 'S', 'f')
         AND n.nspname NOT IN ('pg_catalog', 'information_schema') AND n.nspname NOT LIKE 'pg\\_%'`);
    return Number(rows[0].n);
  });
}

/** Restores and checks the result: row counts and every audit chain. */
async function restoreInto(file: string, url: string, runtimeRole?: string): Promise<Omit<RestoreResult, 'previous'>> {
  const pgRestore = pgTool('pg_restore', await serverMajor(url));
  const { uri, env } = toolConnection(url);
  // One transaction: a failed restore leaves the database as empty as it was. Owners and grants are
  // those of the restoring role, so a dump moves between servers with different role names.
  await runTool(
    pgRestore,
    ['--no-owner', '--no-privileges', '--single-transaction', '--exit-on-error', '--no-password', `--dbname=${uri}`, file],
    env,
  );
  if (runtimeRole && runtimeRole !== decodeURIComponent(new URL(url).username)) await grantRuntimeRole(url, runtimeRole);
  const counts = await withClient(url, countTables);
  const ds = createDataSource(url, 2);
  await ds.initialize();
  try {
    const chains = await verifyAllChains(ds.manager);
    return { database: databaseName(url), counts, chains, intact: chains.every((r) => r.intact), unverified: null };
  } catch (err) {
    // A backup from before a migration that changed audit_entries is read with today's entity: the
    // restore itself is sound, and the check works once the schema is brought up to date.
    const unverified =
      `the audit chains could not be checked on this schema (${(err as Error).message}); ` +
      'run npm run db:migrate on it, then npm run audit:verify';
    return { database: databaseName(url), counts, chains: [], intact: false, unverified };
  } finally {
    await ds.destroy();
  }
}

/** `prefix_suffix`, shortening the prefix so the whole stays a distinct PostgreSQL identifier. */
function sideName(prefix: string, suffix: string): string {
  return `${prefix.slice(0, MAX_IDENTIFIER - suffix.length - 1)}_${suffix}`;
}

/**
 * Restores an archive into the database `url` names. A missing database is created, an empty one is
 * filled. One that already holds tables is refused unless `yes`; then the archive is restored into a
 * new database beside it and the two swap names once that restore has succeeded, so the previous
 * database stays available (under `previous`) until someone drops it. A chain that does not verify is
 * reported, not refused: the trail is append-only, so a break the backup already held can never be
 * repaired, and refusing would make such a backup impossible to restore when it is needed most.
 */
export async function restoreBackup(opts: RestoreOptions): Promise<RestoreResult> {
  const file = path.resolve(opts.file);
  await checkArchive(file);
  const name = databaseName(opts.url);
  // The maintenance database is where the creating and renaming happen from; templates seed new ones.
  if (['postgres', 'template0', 'template1'].includes(name))
    throw new BackupError(`will not restore into the "${name}" database; name another with --into`);
  const admin = withDatabase(opts.url, 'postgres');
  const q = pg.escapeIdentifier;
  const exists = await withClient(
    admin,
    async (c) => (await c.query('SELECT 1 FROM pg_database WHERE datname = $1', [name])).rowCount === 1,
  );
  const create = (db: string) =>
    withClient(admin, (c) => c.query(`CREATE DATABASE ${q(db)}`)).catch((err: Error) => {
      throw new BackupError(`could not create database "${db}" to restore into: ${err.message}`);
    });

  if (!exists) {
    await create(name);
    try {
      return { ...(await restoreInto(file, opts.url, opts.runtimeRole)), previous: null };
    } catch (err) {
      await withClient(admin, (c) => c.query(`DROP DATABASE IF EXISTS ${q(name)} WITH (FORCE)`));
      throw err;
    }
  }
  const relations = await relationCount(opts.url);
  if (relations === 0) return { ...(await restoreInto(file, opts.url, opts.runtimeRole)), previous: null };
  if (!opts.yes) {
    throw new BackupError(
      `database "${name}" already exists and holds ${relations} tables, sequences or views; ` +
        'pass --yes to replace it (it is kept under another name), or --into <new name> to restore beside it',
    );
  }

  const at = stamp().toLowerCase();
  const incoming = sideName(name, `restoring_${at}`);
  const previous = sideName(name, `before_restore_${at}`);
  await create(incoming);
  let result: Omit<RestoreResult, 'previous'>;
  try {
    result = await restoreInto(file, withDatabase(opts.url, incoming), opts.runtimeRole);
  } catch (err) {
    await withClient(admin, (c) => c.query(`DROP DATABASE IF EXISTS ${q(incoming)} WITH (FORCE)`));
    throw err;
  }
  await withClient(admin, async (c) => {
    // A database with connections cannot be renamed: the app's are closed (stop the app first, or
    // its pool reconnects at once and the rename is retried).
    for (let attempt = 1; ; attempt++) {
      await c.query('SELECT pg_terminate_backend(pid) FROM pg_stat_activity WHERE datname = $1 AND pid <> pg_backend_pid()', [name]);
      try {
        await c.query(`ALTER DATABASE ${q(name)} RENAME TO ${q(previous)}`);
        break;
      } catch (err) {
        if (attempt >= 5)
          throw new BackupError(
            `could not rename "${name}" aside (stop the app and retry): ${(err as Error).message}; the restored copy is in "${incoming}"`,
          );
        await new Promise((r) => setTimeout(r, 200 * attempt));
      }
    }
    try {
      await c.query(`ALTER DATABASE ${q(incoming)} RENAME TO ${q(name)}`);
    } catch (err) {
      await c.query(`ALTER DATABASE ${q(previous)} RENAME TO ${q(name)}`);
      throw err;
    }
  });
  return { ...result, database: name, previous };
}

export function formatBytes(bytes: number): string {
  if (bytes < 1024) return `${bytes} B`;
  if (bytes < 1024 * 1024) return `${(bytes / 1024).toFixed(1)} kB`;
  return `${(bytes / 1024 / 1024).toFixed(1)} MB`;
}
