import type { TestProject } from 'vitest/node';
import { migrate, openDatabase } from '../../../scripts/runtime';

declare module 'vitest' {
  export interface ProvidedContext {
    databaseUrl: string;
  }
}

/**
 * A fresh test database (never the demo one), migrated once for the whole run. `npm test` passes
 * TEST_DATABASE_URL; a developer running vitest alone gets a database of this run's own (so two
 * runs at once never drop each other's), and the local cluster is left running for the next run.
 */
export default async function setup(project: TestProject) {
  let url = process.env.TEST_DATABASE_URL;
  let cleanup: (() => Promise<void>) | undefined;
  if (!url) {
    const name = `loadline_test_${process.pid}`;
    const db = await openDatabase(name, true);
    url = db.url;
    cleanup = async () => {
      const admin = new URL(db.url);
      admin.pathname = '/postgres';
      const { default: pg } = await import('pg');
      const c = new pg.Client({ connectionString: admin.toString() });
      await c.connect();
      await c.query(`DROP DATABASE IF EXISTS ${name} WITH (FORCE)`).finally(() => c.end());
    };
  }
  await migrate(url);
  project.provide('databaseUrl', url);
  return () => cleanup?.();
}
