/**
 * Database chores: `npm run db:migrate`, `npm run db:revert` (last migration), `npm run audit:verify`
 * (walks every organization's audit chain and names the first broken entry).
 */
import { createDataSource } from '../server/src/data-source';
import { verifyChain } from '../server/src/services/audit';
import { migrate, openDatabase } from './runtime';

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
    const orgs: { organization_id: string | null }[] = await ds.query('SELECT DISTINCT organization_id FROM audit_entries');
    for (const { organization_id } of orgs) {
      const report = await verifyChain(ds.manager, organization_id);
      const label = organization_id ?? '(no organization)';
      if (report.intact) console.log(`intact   ${label}  ${report.entries} entries`);
      else {
        code = 1;
        console.log(`BROKEN   ${label}  first broken entry #${report.firstBrokenId}: ${report.reason}`);
      }
    }
    await ds.destroy();
  } else {
    console.error('usage: db.ts migrate | revert | audit-verify');
    code = 2;
  }
} catch (err) {
  console.error(err);
  code = 1;
} finally {
  db.cluster?.stop();
}
process.exit(code);
