/**
 * `npm run dev`: the API on PORT (default 3000) against the local database, and Vite's dev server
 * with hot reload that proxies /api to it. For developers; `npm start` is the production-like run.
 */
import path from 'node:path';
import { loadConfig } from '../server/src/config';
import { createLogger } from '../server/src/logger';
import { startServer } from '../server/src/server';
import { createDataSource } from '../server/src/data-source';
import { loadDemo } from '../server/src/seed/demo';
import { ROOT, auditSealKey, migrate, openDatabase, sessionSecret } from './runtime';
import { startFakeSmtp } from '../server/src/mail/fake-smtp';

const db = await openDatabase('loadline', false);
process.on('exit', () => db.cluster?.stop());
await migrate(db.ownerUrl, db.url);
const fake = process.env.SMTP_URL ? null : await startFakeSmtp(db.url, 0);
const config = loadConfig({
  ...process.env,
  ...(fake ? { SMTP_URL: fake.url, FAKE_MAIL: 'true' } : {}),
  DATABASE_URL: db.url,
  SESSION_SECRET: sessionSecret(),
  AUDIT_SEAL_KEY: auditSealKey(),
  CLIENT_DIST: '/nonexistent',
});
const seedDs = createDataSource(db.url, 2);
await seedDs.initialize();
await loadDemo(seedDs, { config, mail: fake !== null });
await seedDs.destroy();
const api = await startServer(config, createLogger(config.LOG_LEVEL));
const { createServer } = await import('vite');
process.env.API_PORT = String(new URL(api.url).port);
const vite = await createServer({ configFile: path.join(ROOT, 'client', 'vite.config.ts') });
await vite.listen();
vite.printUrls();
console.log(`API on ${api.url}; the dev server proxies /api to it.`);

for (const signal of ['SIGINT', 'SIGTERM'] as const) {
  process.on(signal, () => {
    Promise.allSettled([vite.close(), api.stop(), fake?.stop()]).finally(() => process.exit(0));
  });
}
