/** What `npm start`, `npm test` and the helper scripts share: the database, secrets, migrations. */
import { randomBytes } from 'node:crypto';
import { chmodSync, existsSync, mkdirSync, readFileSync, writeFileSync } from 'node:fs';
import path from 'node:path';
import { createDataSource } from '../server/src/data-source';
import { ROOT, ensureDatabase, startCluster, type Cluster } from './pg-cluster';

export { ROOT };

export interface Database {
  url: string;
  /** Our own cluster, when DATABASE_URL was not given. */
  cluster: Cluster | null;
}

/**
 * DATABASE_URL wins: that server is used and none is started. Otherwise our own cluster under .data
 * is started and the named database created (dropped first when `fresh`).
 */
export async function openDatabase(name: string, fresh: boolean): Promise<Database> {
  if (process.env.DATABASE_URL && !fresh) return { url: process.env.DATABASE_URL, cluster: null };
  if (process.env.DATABASE_URL && fresh) {
    const base = new URL(process.env.DATABASE_URL);
    const admin = new URL(base);
    admin.pathname = '/postgres';
    await ensureDatabase(admin.toString(), name, true);
    base.pathname = `/${name}`;
    return { url: base.toString(), cluster: null };
  }
  const cluster = startCluster();
  await ensureDatabase(cluster.adminUrl(), name, fresh);
  return { url: cluster.url(name), cluster };
}

export async function migrate(url: string): Promise<string[]> {
  const ds = createDataSource(url, 2);
  await ds.initialize();
  try {
    const ran = await ds.runMigrations({ transaction: 'each' });
    return ran.map((m) => m.name);
  } finally {
    await ds.destroy();
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

export async function buildClient(): Promise<void> {
  const { build } = await import('vite');
  await build({ configFile: path.join(ROOT, 'client', 'vite.config.ts'), logLevel: 'warn' });
}
