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
import { mkdtemp, rm } from 'node:fs/promises';
import os from 'node:os';
import path from 'node:path';
import { createInterface } from 'node:readline';
import { loadConfig } from '../server/src/config';
import { createLogger } from '../server/src/logger';
import { startServer } from '../server/src/server';
import { createDataSource } from '../server/src/data-source';
import { loadDemo } from '../server/src/seed/demo';
import { addCleanAthletes } from '../server/src/test/e2e-athletes';
import { ROOT, buildClient, migrate, openDatabase } from './runtime';
import { startFakeSmtp } from '../server/src/mail/fake-smtp';

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

async function startE2eWorld(shard: number) {
  const db = await openDatabase(`loadline_e2e_${shard}`, true);
  await migrate(db.ownerUrl, db.url);
  const fake = await startFakeSmtp(db.url, 0);
  // Uploads made by the browser tests go to a folder of their own, removed afterwards.
  const storageDir = await mkdtemp(path.join(os.tmpdir(), `loadline-e2e-uploads-${shard}-`));
  const config = loadConfig({
    ...process.env,
    SMTP_URL: fake.url,
    FAKE_MAIL: 'true',
    DATABASE_URL: db.url,
    SESSION_SECRET: 'e2e-secret-e2e-secret-e2e-secret-e2e-secret',
    PORT: '0',
    LOG_LEVEL: 'warn',
    // Every browser test signs in from the same address; the per-IP limit is tested in vitest.
    SIGNIN_MAX_PER_IP: '1000',
    ORG_SIGNUP_MAX_PER_IP: '1000',
    CLIENT_DIST: path.join(ROOT, 'client', 'dist'),
    STORAGE_DIR: storageDir,
  });
  const seedDs = createDataSource(db.url, 2);
  await seedDs.initialize();
  await loadDemo(seedDs, { config, mail: true });
  // Browser tests that need an athlete with nothing under way use their own (e2e/helpers.ts CLEAN).
  await addCleanAthletes(seedDs);
  await seedDs.destroy();
  const server = await startServer(config, createLogger(config.LOG_LEVEL));
  return {
    shard,
    cluster: db.cluster,
    url: server.url,
    dbUrl: db.url,
    async stop() {
      await server.stop();
      await fake.stop();
      await rm(storageDir, { recursive: true, force: true });
    },
  };
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
    const shards = await Promise.all(Array.from({ length: E2E_SHARDS }, (_, i) => startE2eWorld(i + 1)));
    cluster ??= shards[0].cluster;
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
