/**
 * `npm test`: type-check, then unit + integration tests (vitest, real PostgreSQL in a fresh test
 * database), then browser tests (Playwright driving Debian's Chromium against the built app on a
 * fresh e2e database with the demo scenario). Exits non-zero on the first failing stage.
 *
 * `npm run test:model` (the `model` stage, only when named): the model-based test of the guarantee
 * alone, with many runs (MODEL_RUNS, default 300; MODEL_STEPS, default 20) on a fresh database.
 */
import { spawn, spawnSync } from 'node:child_process';
import { existsSync } from 'node:fs';
import path from 'node:path';
import { createInterface } from 'node:readline';
import { ROOT, buildClient, openDatabase } from './runtime';
import { startCluster } from './pg-cluster';

const CHROMIUM = process.env.CHROMIUM_PATH ?? '/usr/bin/chromium';
// Spec files named after the stage (`scripts/test.ts e2e e2e/coach.spec.ts`) narrow the browser tests.
const specs = process.argv.slice(2).filter((a) => a.endsWith('.spec.ts'));
const args = new Set(process.argv.slice(2).filter((a) => !a.endsWith('.spec.ts')));
const only = (stage: string) => args.size === 0 || args.has(stage);

function stage(name: string) {
  console.log(`\n=== ${name} ===`);
}

/** Runs a command; with a prefix, each line of its output is printed with it (shards side by side). */
function run(cmd: string, argv: string[], env: Record<string, string> = {}, prefix = ''): Promise<number> {
  return new Promise((resolve) => {
    const child = spawn(cmd, argv, { cwd: ROOT, stdio: prefix ? ['ignore', 'pipe', 'pipe'] : 'inherit', env: { ...process.env, ...env } });
    if (prefix) {
      for (const [from, to] of [
        [child.stdout, process.stdout],
        [child.stderr, process.stderr],
      ] as const) {
        createInterface({ input: from! }).on('line', (line) => to.write(`${prefix}${line}\n`));
      }
    }
    child.on('exit', (code, signal) => resolve(code ?? (signal ? 1 : 0)));
  });
}

/**
 * Browser-test shards run side by side (E2E_SHARDS, default 2: the machine's two cores). Most of a
 * browser test is waiting on the server, the database and bcrypt, so two at once take well under the
 * time of one after the other.
 */
const E2E_SHARDS = Math.max(1, Number(process.env.E2E_SHARDS ?? 2));

/** Starts scripts/e2e-world.ts for one shard and waits for its address (a process each: see there). */
function startE2eWorld(
  shard: number,
  db: { url: string; ownerUrl: string },
): Promise<{ shard: number; url: string; dbUrl: string; stop(): Promise<void> }> {
  return new Promise((resolve, reject) => {
    const child = spawn(
      process.execPath,
      ['--import', 'tsx', path.join(ROOT, 'scripts', 'e2e-world.ts'), String(shard), db.url, db.ownerUrl],
      {
        cwd: ROOT,
        stdio: ['ignore', 'pipe', 'inherit'],
      },
    );
    const exited = new Promise<void>((done) => child.on('exit', () => done()));
    child.on('exit', (code) => reject(new Error(`the browser-test world ${shard} stopped (exit ${code}) before it was ready`)));
    createInterface({ input: child.stdout }).on('line', (line) => {
      if (!line.startsWith('E2E_WORLD ')) return void process.stdout.write(`[world ${shard}] ${line}\n`);
      const { url, dbUrl } = JSON.parse(line.slice('E2E_WORLD '.length)) as { url: string; dbUrl: string };
      resolve({
        shard,
        url,
        dbUrl,
        async stop() {
          child.kill('SIGTERM');
          await exited;
        },
      });
    });
  });
}

function ensureChromium() {
  if (existsSync(CHROMIUM)) return;
  if (process.getuid?.() !== 0) throw new Error(`Chromium not found at ${CHROMIUM}; install Debian's "chromium" package.`);
  console.log("[e2e] installing Debian's chromium package…");
  const env = { ...process.env, DEBIAN_FRONTEND: 'noninteractive' };
  spawnSync('apt-get', ['update', '-qq'], { stdio: 'inherit', env });
  const res = spawnSync('apt-get', ['install', '-y', '-qq', 'chromium'], { stdio: 'inherit', env });
  if (res.status !== 0 || !existsSync(CHROMIUM)) throw new Error('could not install chromium');
}

let failed = false;
let cluster: { stop(): void } | null = null;
try {
  if (only('typecheck')) {
    // The three checks are independent and single-threaded: run side by side on the two cores.
    stage('type-check, lint and format (prettier --check), side by side');
    const [types, lint, format] = await Promise.all([
      run('npx', ['tsc', '--noEmit', '-p', '.']),
      run('npx', ['eslint', '.']),
      run('npx', ['prettier', '--check', '--log-level', 'warn', '.']),
    ]);
    if (types !== 0) throw new Error('type-check failed');
    if (lint !== 0) throw new Error('lint failed');
    if (format !== 0) throw new Error('format check failed: run npm run format');
  }

  if (only('unit')) {
    stage('unit and integration tests (vitest, real PostgreSQL)');
    const db = await openDatabase('loadline_test', true);
    cluster ??= db.cluster;
    const code = await run('npx', ['vitest', 'run'], { TEST_DATABASE_URL: db.url, TEST_MIGRATION_DATABASE_URL: db.ownerUrl });
    if (code !== 0) throw new Error('vitest failed');
  }

  if (args.has('model')) {
    stage('model-based test of the guarantee (fast-check, real PostgreSQL)');
    const db = await openDatabase('loadline_test_model', true);
    cluster ??= db.cluster;
    const code = await run('npx', ['vitest', 'run', '--project', 'server', 'server/src/test/model/'], {
      TEST_DATABASE_URL: db.url,
      TEST_MIGRATION_DATABASE_URL: db.ownerUrl,
      MODEL_RUNS: process.env.MODEL_RUNS ?? '300',
      MODEL_STEPS: process.env.MODEL_STEPS ?? '20',
    });
    if (code !== 0) throw new Error('model-based test failed');
  }

  if (only('e2e')) {
    stage(`browser tests (Playwright on Debian Chromium), ${E2E_SHARDS} shard(s) side by side`);
    ensureChromium();
    await buildClient();
    // Each shard is a whole world of its own: its database with the demo, its fake mail server, its app
    // server and its Playwright process, running a share of the spec files. Nothing is shared between
    // shards, so the specs may assume what they assume in one sequential run.
    // The cluster is started here, so this process stops it at the end; the worlds find it running.
    if (!process.env.DATABASE_URL) cluster ??= startCluster();
    // The databases one after the other (roles and databases made side by side collide), then the
    // worlds side by side (migrations and the demo, in databases of their own).
    const databases = [];
    for (let i = 1; i <= E2E_SHARDS; i++) databases.push(await openDatabase(`loadline_e2e_${i}`, true));
    const started = await Promise.allSettled(databases.map((db, i) => startE2eWorld(i + 1, db)));
    const shards = started.flatMap((r) => (r.status === 'fulfilled' ? [r.value] : []));
    const failedToStart = started.find((r) => r.status === 'rejected');
    if (failedToStart) {
      for (const w of shards) await w.stop();
      throw failedToStart.reason as Error;
    }
    try {
      const codes = await Promise.all(
        shards.map((w) =>
          run(
            'npx',
            [
              'playwright',
              'test',
              ...(E2E_SHARDS > 1 ? [`--shard=${w.shard}/${E2E_SHARDS}`] : []),
              `--output=test-results/shard-${w.shard}`,
              ...specs,
            ],
            // The database URL lets a browser test read the fake mailbox (e.g. a password reset link).
            { E2E_BASE_URL: w.url, CHROMIUM_PATH: CHROMIUM, E2E_DATABASE_URL: w.dbUrl },
            E2E_SHARDS > 1 ? `[e2e ${w.shard}/${E2E_SHARDS}] ` : '',
          ),
        ),
      );
      if (codes.some((c) => c !== 0)) throw new Error('browser tests failed');
    } finally {
      for (const w of shards) await w.stop();
    }
  }
  console.log('\nAll tests passed.');
} catch (err) {
  failed = true;
  console.error(`\nTESTS FAILED: ${(err as Error).message}`);
} finally {
  cluster?.stop();
}
process.exit(failed ? 1 : 0);
