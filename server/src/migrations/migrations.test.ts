import { describe, expect, it, inject } from 'vitest';
import pg from 'pg';
import { createDataSource } from '../data-source';
import { MIGRATIONS } from './index';

/**
 * Every migration has a working `down`: on a scratch database, all the way up, all the way down
 * (nothing of ours left), and up again.
 */
describe('migrations', () => {
  it('go up, come all the way down, and go up again', async () => {
    const base = new URL(inject('databaseUrl'));
    const name = `loadline_migrations_${process.pid}`;
    const admin = new URL(base);
    admin.pathname = '/postgres';
    const client = new pg.Client({ connectionString: admin.toString() });
    await client.connect();
    await client.query(`DROP DATABASE IF EXISTS ${name} WITH (FORCE)`);
    await client.query(`CREATE DATABASE ${name}`);
    const url = new URL(base);
    url.pathname = `/${name}`;
    const ds = createDataSource(url.toString(), 2);
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
