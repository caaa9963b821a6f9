import { describe, expect, it } from 'vitest';
import pg from 'pg';
import { createDataSource } from '../data-source';
import { ownerUrl } from '../test/owner';
import { MIGRATIONS } from './index';

/**
 * Every migration has a working `down`: on a scratch database, all the way up, all the way down
 * (nothing of ours left), and up again.
 */
describe('migrations', () => {
  it('go up, come all the way down, and go up again', async () => {
    // As the owner role: migrations are its work, and the app's own role may not create databases.
    const name = `loadline_migrations_${process.pid}`;
    const client = new pg.Client({ connectionString: ownerUrl('postgres') });
    await client.connect();
    await client.query(`DROP DATABASE IF EXISTS ${name} WITH (FORCE)`);
    await client.query(`CREATE DATABASE ${name}`);
    const ds = createDataSource(ownerUrl(name), 2);
    try {
      await ds.initialize();
      const up = await ds.runMigrations({ transaction: 'each' });
      expect(up.map((m) => m.name)).toEqual(MIGRATIONS.map((M) => new M().name));
      for (let i = 0; i < MIGRATIONS.length; i++) await ds.undoLastMigration({ transaction: 'each' });
      const left: { table_name: string }[] = await ds.query(
        `SELECT table_name FROM information_schema.tables WHERE table_schema = 'public' AND table_name <> 'migrations'`,
      );
      expect(left).toEqual([]);
      const again = await ds.runMigrations({ transaction: 'each' });
      expect(again).toHaveLength(MIGRATIONS.length);
    } finally {
      await ds.destroy();
      await client.query(`DROP DATABASE IF EXISTS ${name} WITH (FORCE)`);
      await client.end();
    }
  });
});
