/**
 * Database chores: `npm run db:migrate`, `npm run db:revert` (last migration), `npm run audit:verify`
 * (walks every organization's audit chain, checks it against the organization's seals, and names the
 * first broken entry), `npm run audit:seal [-- --no-mail]` (seal every chain now), `npm run db:backup
 * [file]` and `npm run db:restore <file> [--into <database>] [--yes]` (see scripts/backup.ts).
 * Migrations, backups and restores run as the owner role; the audit commands as the app's own role.
 */
import { existsSync } from 'node:fs';
import path from 'node:path';
import { parseArgs } from 'node:util';
import { createDataSource } from '../server/src/data-source';
import { JobQueue } from '../server/src/jobs/queue';
import { createLogger } from '../server/src/logger';
import type { ChainReport } from '../server/src/services/audit';
import { DEFAULT_AUDIT_SEAL_DIR } from '../server/src/services/audit-seal';
import { sealAll } from '../server/src/services/audit-seal-job';
import { describeTrail, trailIntact, verifyTrail } from './audit-trail';
import { BackupError, backupDatabase, formatBytes, restoreBackup } from './backup';
import { ROOT, auditSealKey, existingAuditSealKey, migrate, openDatabase } from './runtime';

function printChains(reports: ChainReport[]): boolean {
  for (const report of reports) {
    const label = report.organizationId ?? '(no organization)';
    if (report.intact) console.log(`intact   ${label}  ${report.entries} entries`);
    else console.log(`BROKEN   ${label}  first broken entry #${report.firstBrokenId}: ${report.reason}`);
  }
  return reports.every((r) => r.intact);
}

const command = process.argv[2];
const db = await openDatabase(process.env.LOADLINE_DB ?? 'loadline', false);
const sealDir = path.resolve(process.env.AUDIT_SEAL_DIR ?? DEFAULT_AUDIT_SEAL_DIR);
let code = 0;
try {
  if (command === 'migrate') {
    const ran = await migrate(db.ownerUrl, db.url);
    console.log(ran.length ? `applied: ${ran.join(', ')}` : 'already up to date');
  } else if (command === 'revert') {
    const ds = createDataSource(db.ownerUrl, 2);
    await ds.initialize();
    await ds.undoLastMigration({ transaction: 'each' });
    await ds.destroy();
    console.log('reverted the last migration');
  } else if (command === 'audit-verify') {
    const key = existingAuditSealKey();
    const ds = createDataSource(db.url, 2);
    await ds.initialize();
    try {
      const reports = await verifyTrail(ds.manager, key, sealDir);
      for (const line of describeTrail(reports, key !== null)) console.log(line);
      if (!trailIntact(reports)) code = 1;
    } finally {
      await ds.destroy();
    }
  } else if (command === 'audit-seal') {
    const { values } = parseArgs({ args: process.argv.slice(3), options: { 'no-mail': { type: 'boolean', default: false } } });
    const logger = createLogger('warn');
    const ds = createDataSource(db.url, 2);
    await ds.initialize();
    // E-mails are queued here and sent by the app's worker, as every other e-mail is.
    const queue = values['no-mail'] ? null : new JobQueue(db.url, logger);
    try {
      await queue?.start();
      for (const o of await sealAll({ ds, key: auditSealKey(), dir: sealDir, queue, logger })) {
        if (o.status === 'sealed')
          console.log(
            `sealed   ${o.organizationId}  up to #${o.seal.lastEntryId} (${o.seal.entries} entries)  ${o.file}  e-mails: ${o.emailed}`,
          );
        if (o.status === 'refused') console.log(`REFUSED  ${o.organizationId}  first broken entry #${o.firstBrokenId ?? '?'}: ${o.reason}`);
        if (o.status === 'refused') code = 1;
      }
    } finally {
      await queue?.stop();
      await ds.destroy();
    }
  } else if (command === 'backup') {
    const { positionals } = parseArgs({ args: process.argv.slice(3), allowPositionals: true });
    // With S3 storage the bucket is backed up by its own means (versioning, replication).
    const uploadsDir = process.env.S3_BUCKET ? null : path.resolve(process.env.STORAGE_DIR ?? path.join(ROOT, '.data', 'uploads'));
    const result = await backupDatabase({ url: db.ownerUrl, file: positionals[0], uploadsDir });
    console.log(`${result.file}  ${formatBytes(result.bytes)}`);
    if (result.uploads) console.log(`${result.uploads.file}  ${formatBytes(result.uploads.bytes)}  (uploads folder ${uploadsDir})`);
  } else if (command === 'restore') {
    const { values, positionals } = parseArgs({
      args: process.argv.slice(3),
      allowPositionals: true,
      options: { into: { type: 'string' }, yes: { type: 'boolean', default: false } },
    });
    if (positionals.length !== 1) throw new BackupError('usage: npm run db:restore -- <file> [--into <database>] [--yes]');
    let url = db.ownerUrl;
    if (values.into !== undefined) {
      if (!/^[a-z_][a-z0-9_]{0,62}$/.test(values.into))
        throw new BackupError(`--into ${values.into}: use lower-case letters, digits and _ (at most 63)`);
      const target = new URL(db.ownerUrl);
      target.pathname = `/${values.into}`;
      url = target.toString();
    }
    const runtimeRole = decodeURIComponent(new URL(db.url).username);
    const result = await restoreBackup({ file: positionals[0], url, yes: values.yes, runtimeRole });
    console.log(`restored ${path.resolve(positionals[0])} into database "${result.database}"`);
    if (result.previous) console.log(`the database it replaced is kept as "${result.previous}"; drop it when satisfied`);
    const width = Math.max(...Object.keys(result.counts).map((t) => t.length));
    for (const [table, rows] of Object.entries(result.counts)) console.log(`${table.padEnd(width)}  ${rows}`);
    if (!printChains(result.chains) || result.unverified) code = 1;
    if (result.unverified) console.log(result.unverified);
    const tar = positionals[0].replace(/\.dump$/, '') + '.uploads.tar';
    if (tar !== positionals[0] && existsSync(tar)) {
      console.log(
        `uploads are not restored by this command; their archive is ${tar}: extract it into the uploads folder with tar -xf ${tar} -C <folder>`,
      );
    }
  } else {
    console.error(
      'usage: db.ts migrate | revert | audit-verify | audit-seal [--no-mail] | backup [file] | restore <file> [--into <database>] [--yes]',
    );
    code = 2;
  }
} catch (err) {
  // A refusal or a named problem is a sentence, not a stack trace.
  const named = err instanceof BackupError || String((err as { code?: unknown }).code).startsWith('ERR_PARSE_ARGS');
  console.error(named ? (err as Error).message : err);
  code = 1;
} finally {
  db.cluster?.stop();
}
process.exit(code);
