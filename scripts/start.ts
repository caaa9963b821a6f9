/**
 * `npm start`: database (our own cluster unless DATABASE_URL is set), migrations, demo data, client
 * build, then the app and API on one port. Ctrl-C stops the server, then the database.
 */
import { loadConfig } from '../server/src/config';
import { createStorage } from '../server/src/storage';
import { createLogger } from '../server/src/logger';
import { startServer } from '../server/src/server';
import { createDataSource } from '../server/src/data-source';
import { DEMO_PASSWORD, DEMO_PEOPLE, loadDemo } from '../server/src/seed/demo';
import { SQUAD } from '../server/src/seed/demo-squad';
import { auditSealKey, buildClient, migrate, openDatabase, sessionSecret } from './runtime';
import { startFakeSmtp, type FakeSmtp } from '../server/src/mail/fake-smtp';

/**
 * Links in e-mails and the Host the server answers to come from PUBLIC_URL. Unset, it is this
 * server's own address (loopback names on the same port work too); set it to serve another name.
 */
function publicUrl(): string {
  if (process.env.PUBLIC_URL) return process.env.PUBLIC_URL;
  const host = process.env.HOST && !['0.0.0.0', '::'].includes(process.env.HOST) ? process.env.HOST : '127.0.0.1';
  return `http://${host.includes(':') ? `[${host}]` : host}:${process.env.PORT ?? 3000}`;
}

const db = await openDatabase('loadline', false);
let stopping = false;
const stopDb = () => db.cluster?.stop();
process.on('exit', stopDb);

try {
  const ran = await migrate(db.ownerUrl, db.url);
  if (ran.length) console.log(`[db] migrations applied: ${ran.join(', ')}`);
  // Without SMTP_URL, mail goes to our local fake SMTP server (loopback) and the admin's outbox page.
  let fake: FakeSmtp | null = null;
  if (!process.env.SMTP_URL) fake = await startFakeSmtp(db.url, Number(process.env.LOADLINE_SMTP_PORT ?? 0));
  const mailEnv = fake ? { SMTP_URL: fake.url, FAKE_MAIL: 'true' } : {};
  const config = loadConfig({
    ...process.env,
    ...mailEnv,
    PUBLIC_URL: publicUrl(),
    DATABASE_URL: db.url,
    SESSION_SECRET: sessionSecret(),
    AUDIT_SEAL_KEY: auditSealKey(),
  });

  const seedDs = createDataSource(db.url, 2);
  await seedDs.initialize();
  // The demo's referral note goes to the same storage the server will use (local folder or S3); its
  // story's e-mails are queued only for the local fake mail server, never for a real one.
  const demo = await loadDemo(seedDs, { config, storage: createStorage(config), mail: fake !== null });
  await seedDs.destroy();
  console.log(demo.created ? '[demo] demo scenario loaded' : '[demo] demo scenario already present (unchanged)');
  console.log('[client] building…');
  await buildClient();

  const logger = createLogger(config.LOG_LEVEL);
  const running = await startServer(config, logger);

  const width = Math.max(...DEMO_PEOPLE.map((p) => p.email.length));
  console.log(`\nLoadline is running at ${config.PUBLIC_URL}`);
  if (!process.env.PUBLIC_URL)
    console.log('(Set PUBLIC_URL to the address people use, e.g. https://loadline.example.org, to serve it there.)');
  console.log(
    fake
      ? `E-mail goes to the local fake SMTP server on 127.0.0.1:${fake.port} (admins: Outbox page).\n`
      : `E-mail goes to ${config.SMTP_URL}.\n`,
  );
  console.log(`Demo accounts (password for all: ${DEMO_PASSWORD}):`);
  for (const p of DEMO_PEOPLE) console.log(`  ${p.email.padEnd(width)}  ${p.roles.join(', ').padEnd(9)}  ${p.name}`);
  console.log(`  …and Maya's softball infield squad, e.g. ${SQUAD[0].email} (${SQUAD[0].name}), ${SQUAD.length} athletes in all.`);
  console.log('\nPress Ctrl-C to stop.\n');

  for (const signal of ['SIGINT', 'SIGTERM'] as const) {
    process.on(signal, () => {
      if (stopping) {
        console.log(`${signal} again: stopping now.`);
        stopDb();
        process.exit(1);
      }
      stopping = true;
      console.log(`\n${signal}: stopping the server…`);
      running
        .stop()
        .then(() => fake?.stop())
        .catch((err) => console.error(err))
        .finally(() => {
          stopDb();
          process.exit(0);
        });
    });
  }
} catch (err) {
  console.error(err);
  stopDb();
  process.exit(1);
}
