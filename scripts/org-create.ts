/**
 * `npm run org:create -- --name "Fjord Rowing" --admin-email ingrid@example.org [--admin-name "Ingrid
 * Solberg"] [--country NO] [--time-zone Europe/Oslo]`: an operator makes an organization (on a
 * private installation, where the public sign-up page is closed) and gets a one-time invitation link
 * for its first admin, printed here to hand over. The database is the one `npm start` uses (or
 * DATABASE_URL); links start with PUBLIC_URL (else http://127.0.0.1:$PORT).
 */
import { parseArgs } from 'node:util';
import { OrganizationCreateSchema } from '../policies/schemas';
import { dayIn } from '../policies/today';
import { loadConfig } from '../server/src/config';
import { createDataSource } from '../server/src/data-source';
import { createLogger } from '../server/src/logger';
import { createStorage } from '../server/src/storage';
import { runPublicCommand } from '../server/src/commands/run';
import { createOrganizationByOperator } from '../server/src/commands/organizations';
import { migrate, openDatabase, sessionSecret } from './runtime';

const { values } = parseArgs({
  args: process.argv.slice(2),
  options: {
    name: { type: 'string' },
    'admin-email': { type: 'string' },
    'admin-name': { type: 'string' },
    country: { type: 'string' },
    'time-zone': { type: 'string' },
  },
});

const parsed = OrganizationCreateSchema.safeParse({
  name: values.name,
  adminEmail: values['admin-email'],
  adminName: values['admin-name'],
  country: values.country,
  timeZone: values['time-zone'],
});
if (!parsed.success) {
  const flag = (key: string) => `--${key.replace(/[A-Z]/g, (c) => `-${c.toLowerCase()}`)}`;
  for (const issue of parsed.error.issues) console.error(`${flag(String(issue.path[0]))}: ${issue.message}`);
  console.error(
    'usage: npm run org:create -- --name <name> --admin-email <address> [--admin-name <name>] [--country XX] [--time-zone Area/City]',
  );
  process.exit(2);
}

const db = await openDatabase(process.env.LOADLINE_DB ?? 'loadline', false);
let code = 0;
try {
  await migrate(db.ownerUrl, db.url);
  const port = process.env.PORT ?? '3000';
  const config = loadConfig({
    ...process.env,
    DATABASE_URL: db.url,
    SESSION_SECRET: sessionSecret(),
    PUBLIC_URL: process.env.PUBLIC_URL ?? `http://127.0.0.1:${port}`,
  });
  const ds = createDataSource(db.url, 2);
  await ds.initialize();
  try {
    const deps = { ds, config, logger: createLogger('warn'), jobs: null, storage: createStorage(config) };
    const made = await runPublicCommand(createOrganizationByOperator, { deps, requestId: 'org:create', userId: null }, parsed.data);
    console.log(`created  ${made.name}  (${made.organizationId}), time zone ${parsed.data.timeZone}`);
    console.log(`\nSend this one-time link to ${parsed.data.adminEmail}; it makes them the organization's admin.`);
    console.log(`It works once, until ${dayIn(parsed.data.timeZone, made.expiresAt)} (${parsed.data.timeZone}):\n\n  ${made.link}\n`);
  } finally {
    await ds.destroy();
  }
} catch (err) {
  console.error(err instanceof Error ? err.message : err);
  code = 1;
} finally {
  db.cluster?.stop();
}
process.exit(code);
