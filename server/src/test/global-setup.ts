import type { TestProject } from 'vitest/node';
import { migrate, openDatabase } from '../../../scripts/runtime';

declare module 'vitest' {
  export interface ProvidedContext {
    /** The runtime role: what the app (and the harness) connects with, so every test proves its grants suffice. */
    databaseUrl: string;
    /** The owner role, for fixtures that need owner powers (creating databases, tampering with the trail). */
    ownerDatabaseUrl: string;
  }
}

/**
 * A fresh test database (never the demo one), migrated once for the whole run. `npm test` passes
 * TEST_DATABASE_URL (and TEST_MIGRATION_DATABASE_URL, the owner); a developer running vitest alone gets
 * a database of this run's own (so two runs at once never drop each other's), and the local cluster is
 * left running for the next run.
 */
export default async function setup(project: TestProject) {
  let url = process.env.TEST_DATABASE_URL;
  let ownerUrl = process.env.TEST_MIGRATION_DATABASE_URL ?? url;
  let cleanup: (() => Promise<void>) | undefined;
  if (!url || !ownerUrl) {
    const name = `loadline_test_${process.pid}`;
    const db = await openDatabase(name, true);
    url = db.url;
    ownerUrl = db.ownerUrl;
    cleanup = async () => {
      const admin = new URL(db.ownerUrl);
      admin.pathname = '/postgres';
      const { default: pg } = await import('pg');
      const c = new pg.Client({ connectionString: admin.toString() });
      await c.connect();
      await c.query(`DROP DATABASE IF EXISTS ${name} WITH (FORCE)`).finally(() => c.end());
    };
  }
  await migrate(ownerUrl, url);
  project.provide('databaseUrl', url);
  project.provide('ownerDatabaseUrl', ownerUrl);
  return () => cleanup?.();
}
