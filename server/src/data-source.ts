import 'reflect-metadata';
import { DataSource } from 'typeorm';
import pg from 'pg';
import { ENTITIES } from './entities';
import { MIGRATIONS } from './migrations';

// Calendar dates stay 'YYYY-MM-DD' strings: turning them into Dates would shift them by time zone.
pg.types.setTypeParser(pg.types.builtins.DATE, (value: string) => value);

export function createDataSource(url: string, poolSize = 20): DataSource {
  return new DataSource({
    type: 'postgres',
    url,
    entities: ENTITIES,
    migrations: MIGRATIONS,
    migrationsTransactionMode: 'each',
    synchronize: false,
    logging: false,
    extra: { max: poolSize, connectionTimeoutMillis: 5000 },
  });
}

/**
 * For the TypeORM CLI (migration:generate / run / revert): the one exported DataSource. Migrations are
 * the owner's work, so it prefers MIGRATION_DATABASE_URL; the app's own role may not change the schema.
 */
export const AppDataSource = createDataSource(
  process.env.MIGRATION_DATABASE_URL ?? process.env.DATABASE_URL ?? 'postgres://localhost/loadline',
);

/**
 * Whether the connected role owns audit_entries. An owner can disable the append-only trigger and
 * rewrite the trail, so the app should connect as a role that owns nothing (README "Database roles").
 */
export async function connectedRoleOwnsAuditTrail(ds: DataSource): Promise<boolean> {
  const rows: { owns: boolean }[] = await ds.query(
    `SELECT pg_has_role(current_user, tableowner, 'USAGE') AS owns FROM pg_tables WHERE schemaname = 'public' AND tablename = 'audit_entries'`,
  );
  return rows[0]?.owns ?? false;
}
