/**
 * One browser-test world, in a process of its own: a fresh database with the demo and the clean
 * athletes, a fake mail server, uploads in a temporary folder, and the app server. scripts/test.ts
 * starts one per shard. A process each, because the server keeps some state per process (the notice
 * queue, the address its e-mailed links point to), so two servers in one process would mix them.
 *
 *   node --import tsx scripts/e2e-world.ts <shard> <database url> <owner url>
 *
 * The database is made (fresh) by scripts/test.ts, one after the other: making roles and databases
 * side by side in one cluster collides ("tuple concurrently updated").
 * Prints one line `E2E_WORLD {"url":…,"dbUrl":…}` when ready; stops everything on SIGTERM.
 */
import { mkdtemp, rm } from 'node:fs/promises';
import os from 'node:os';
import path from 'node:path';
import { loadConfig } from '../server/src/config';
import { createDataSource } from '../server/src/data-source';
import { createLogger } from '../server/src/logger';
import { startFakeSmtp } from '../server/src/mail/fake-smtp';
import { loadDemo } from '../server/src/seed/demo';
import { startServer } from '../server/src/server';
import { addCleanAthletes } from '../server/src/test/e2e-athletes';
import { ROOT, migrate, openDatabase } from './runtime';

const [shardArg, url, ownerUrl] = process.argv.slice(2);
const shard = Number(shardArg ?? 1);
const db = url && ownerUrl ? { url, ownerUrl } : await openDatabase(`loadline_e2e_${shard}`, true);
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
// The demo people sign in in almost every browser test: their password is stored at bcrypt's lowest
// cost here (a third of a second of CPU saved per sign-in). `npm start` keeps the production cost, and
// passwords set through the app in these tests (invitations, resets) still use the configured one.
await loadDemo(seedDs, { config, mail: true, bcryptCost: 4 });
// Browser tests that need an athlete with nothing under way use their own (e2e/helpers.ts CLEAN).
await addCleanAthletes(seedDs);
await seedDs.destroy();
const server = await startServer(config, createLogger(config.LOG_LEVEL));
console.log(`E2E_WORLD ${JSON.stringify({ url: server.url, dbUrl: db.url })}`);

let stopping = false;
async function stop() {
  if (stopping) return;
  stopping = true;
  await server.stop();
  await fake.stop();
  await rm(storageDir, { recursive: true, force: true });
  process.exit(0);
}
process.on('SIGTERM', () => void stop());
process.on('SIGINT', () => void stop());
