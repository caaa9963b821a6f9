/**
 * The PostgreSQL client tools and connections behind backup.ts: finding Debian's pg_dump /
 * pg_restore, running them without the password in the process list, writing their output to a
 * private file, and naming databases.
 */
import { spawn } from 'node:child_process';
import { closeSync, existsSync, fstatSync, mkdirSync, openSync, readdirSync, rmSync } from 'node:fs';
import path from 'node:path';
import pg from 'pg';

/** A problem named in a sentence for the person at the command line (no stack trace needed). */
export class BackupError extends Error {}

/** A UTC timestamp that sorts and is safe in file and database names: 20261202T033612Z. */
export function stamp(at = new Date()): string {
  return at
    .toISOString()
    .replace(/[-:]/g, '')
    .replace(/\.\d+Z$/, 'Z');
}

export function databaseName(url: string): string {
  const name = decodeURIComponent(new URL(url).pathname.slice(1));
  if (!name) throw new BackupError(`the database URL names no database: ${redact(url)}`);
  return name;
}

export function withDatabase(url: string, name: string): string {
  const u = new URL(url);
  u.pathname = `/${encodeURIComponent(name)}`;
  return u.toString();
}

export function redact(url: string): string {
  const u = new URL(url);
  if (u.password) u.password = '***';
  return u.toString();
}

/**
 * The connection string for a client tool, without its password: that goes in PGPASSWORD, so it
 * never shows up in the process list.
 */
export function toolConnection(url: string): { uri: string; env: NodeJS.ProcessEnv } {
  const u = new URL(url);
  const password = decodeURIComponent(u.password);
  u.password = '';
  const env: NodeJS.ProcessEnv = { ...process.env };
  if (password) env.PGPASSWORD = password;
  return { uri: u.toString(), env };
}

export async function withClient<T>(url: string, fn: (c: pg.Client) => Promise<T>): Promise<T> {
  const client = new pg.Client({ connectionString: url });
  await client.connect();
  try {
    return await fn(client);
  } finally {
    await client.end();
  }
}

/**
 * Debian's pg_dump / pg_restore for the server's major version (the one under
 * /usr/lib/postgresql/<version>/bin, as pg-cluster.ts finds initdb). A newer client can read an older
 * server; an older one refuses, so that case is named here rather than by the tool. Without a
 * version: the newest installed.
 */
export function pgTool(tool: 'pg_dump' | 'pg_restore', serverMajor?: number): string {
  const base = '/usr/lib/postgresql';
  const versions = existsSync(base)
    ? readdirSync(base)
        .map(Number)
        .filter((v) => v > 0 && existsSync(path.join(base, String(v), 'bin', tool)))
        .sort((a, b) => a - b)
    : [];
  const fit =
    serverMajor === undefined ? versions.at(-1) : versions.includes(serverMajor) ? serverMajor : versions.find((v) => v > serverMajor);
  if (fit === undefined) {
    const found = versions.length ? `only version ${versions.join(', ')} is installed` : 'none is installed';
    const want = serverMajor ?? '';
    throw new BackupError(
      `${tool}${want ? ` for PostgreSQL ${want}` : ''} is needed under ${base} but ${found}; install Debian's "postgresql-client${want ? `-${want}` : ''}"`,
    );
  }
  return path.join(base, String(fit), 'bin', tool);
}

export async function serverMajor(url: string): Promise<number> {
  return withClient(url, async (c) => {
    const { rows } = await c.query<{ v: string }>("SELECT current_setting('server_version_num') AS v");
    return Math.floor(Number(rows[0].v) / 10_000);
  });
}

/** Runs a tool; its stdout goes to `stdoutFd` when given, otherwise it is returned. */
export function runTool(file: string, args: string[], env: NodeJS.ProcessEnv, stdoutFd?: number, okCodes = [0]): Promise<string> {
  return new Promise((resolve, reject) => {
    const child = spawn(file, args, { env, stdio: ['ignore', stdoutFd ?? 'pipe', 'pipe'] });
    const out: Buffer[] = [];
    const err: Buffer[] = [];
    child.stdout?.on('data', (b: Buffer) => out.push(b));
    child.stderr?.on('data', (b: Buffer) => err.push(b));
    child.on('error', reject);
    child.on('close', (code) => {
      if (code !== null && okCodes.includes(code)) resolve(Buffer.concat(out).toString('utf8'));
      else reject(new BackupError(`${path.basename(file)} failed (exit ${code}): ${Buffer.concat(err).toString('utf8').trim()}`));
    });
  });
}

/** A new file only we can read (0600 from the start, not chmod-ed after the data is in it). */
export function createPrivateFile(file: string): number {
  mkdirSync(path.dirname(file), { recursive: true, mode: 0o700 });
  try {
    return openSync(file, 'wx', 0o600);
  } catch (err) {
    if ((err as NodeJS.ErrnoException).code === 'EEXIST') throw new BackupError(`${file} already exists; give another file name`);
    throw err;
  }
}

/** Writes a file through a tool's stdout; a failed run leaves no partial file behind. */
export async function writeThrough(file: string, write: (fd: number) => Promise<unknown>): Promise<number> {
  const fd = createPrivateFile(file);
  let ok = false;
  try {
    await write(fd);
    ok = true;
    return fstatSync(fd).size;
  } finally {
    closeSync(fd);
    if (!ok) rmSync(file, { force: true });
  }
}
