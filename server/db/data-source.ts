import 'reflect-metadata';
import { DataSource } from 'typeorm';
import type { Config } from '../config/env';
import { ENTITIES } from '../entities';
import { MIGRATIONS } from '../migrations';
import { SnakeNamingStrategy } from './naming-strategy';

/**
 * The TypeORM data source for MariaDB. Schema changes only ever come from migrations
 * (`synchronize` stays off); `tests/support/test-database.ts` builds throw-away databases the same way.
 */
export function createDataSource(db: Config['db']): DataSource {
  return new DataSource({
    type: 'mariadb',
    host: db.host,
    port: db.port,
    username: db.user,
    password: db.password,
    database: db.database,
    charset: 'utf8mb4_unicode_ci',
    timezone: 'Z',
    entities: ENTITIES,
    migrations: MIGRATIONS,
    migrationsRun: false,
    synchronize: false,
    namingStrategy: new SnakeNamingStrategy(),
    logging: ['error'],
    // trace: false — mysql2 otherwise captures a stack trace for every query, a measurable share of each API answer.
    extra: { connectionLimit: 10, decimalNumbers: true, trace: false },
  });
}

/** Number of migrations not yet applied. */
export async function pendingMigrationCount(dataSource: DataSource): Promise<number> {
  const executed = await dataSource.query('SELECT COUNT(*) AS n FROM migrations').catch(() => [{ n: 0 }]);
  return dataSource.migrations.length - Number((executed as Array<{ n: number | string }>)[0]?.n ?? 0);
}
