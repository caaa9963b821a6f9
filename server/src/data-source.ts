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

/** For the TypeORM CLI (migration:generate / run / revert): the one exported DataSource. */
export const AppDataSource = createDataSource(process.env.DATABASE_URL ?? 'postgres://localhost/loadline');
