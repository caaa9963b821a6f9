/**
 * Database chores: `npm run db:migrate`, `npm run db:revert` (last migration), `npm run audit:verify`
 * (walks every organization's audit chain and names the first broken entry), `npm run db:backup
 * [file]` and `npm run db:restore <file> [--into <database>] [--yes]` (see scripts/backup.ts).
 */
import { existsSync } from 'node:fs';
import path from 'node:path';
import { parseArgs } from 'node:util';
import { createDataSource } from '../server/src/data-source';
import type { ChainReport } from '../server/src/services/audit';
import { BackupError, backupDatabase, formatBytes, restoreBackup, verifyAllChains } from './backup';
import { ROOT, migrate, openDatabase } from './runtime';

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
let code = 0;
try {
  if (command === 'migrate') {
    const ran = await migrate(db.url);
    console.log(ran.length ? `applied: ${ran.join(', ')}` : 'already up to date');
  } else if (command === 'revert') {
    const ds = createDataSource(db.url, 2);
    await ds.initialize();
    await ds.undoLastMigration({ transaction: 'each' });
    await ds.destroy();
    console.log('reverted the last migration');
  } else if (command === 'audit-verify') {
    const ds = createDataSource(db.url, 2);
    await ds.initialize();
    if (!printChains(await verifyAllChains(ds.manager))) code = 1;
    await ds.destroy();
  } else if (command === 'backup') {
    const { positionals } = parseArgs({ args: process.argv.slice(3), allowPositionals: true });
    // With S3 storage the bucket is backed up by its own means (versioning, replication).
    const uploadsDir = process.env.S3_BUCKET ? null : path.resolve(process.env.STORAGE_DIR ?? path.join(ROOT, '.data', 'uploads'));
    const result = await backupDatabase({ url: db.url, file: positionals[0], uploadsDir });
    console.log(`${result.file}  ${formatBytes(result.bytes)}`);
    if (result.uploads) console.log(`${result.uploads.file}  ${formatBytes(result.uploads.bytes)}  (uploads folder ${uploadsDir})`);
  } else if (command === 'restore') {
    const { values, positionals } = parseArgs({
      args: process.argv.slice(3),
      allowPositionals: true,
      options: { into: { type: 'string' }, yes: { type: 'boolean', default: false } },
    });
    if (positionals.length !== 1) throw new BackupError('usage: npm run db:restore -- <file> [--into <database>] [--yes]');
    let url = db.url;
    if (values.into !== undefined) {
      if (!/^[a-z_][a-z0-9_]{0,62}$/.test(values.into))
        throw new BackupError(`--into ${values.into}: use lower-case letters, digits and _ (at most 63)`);
      const target = new URL(db.url);
      target.pathname = `/${values.into}`;
      url = target.toString();
    }
    const result = await restoreBackup({ file: positionals[0], url, yes: values.yes });
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
    console.error('usage: db.ts migrate | revert | audit-verify | backup [file] | restore <file> [--into <database>] [--yes]');
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
