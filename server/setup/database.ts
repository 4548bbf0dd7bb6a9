import path from 'node:path';
import type { DataSource } from 'typeorm';
import type { Config } from '../config/env';
import { createDataSource } from '../db/data-source';
import { PrivateMariaDb } from '../db/private-mariadb';

/** The private MariaDB of `npm start`, under `var/mariadb`. */
export function devDatabaseServer(config: Config): PrivateMariaDb {
  return new PrivateMariaDb({ baseDir: path.join(config.varDir, 'mariadb'), port: config.db.port });
}

/**
 * Starts (or reuses) the private server, makes sure the app database and user exist, connects as
 * that user and applies pending migrations.
 */
export async function openDevDatabase(config: Config, log: (line: string) => void): Promise<DataSource> {
  const server = devDatabaseServer(config);
  const state = await server.start({ detached: true });
  log(state === 'started' ? `MariaDB started on 127.0.0.1:${config.db.port}` : `MariaDB already running on 127.0.0.1:${config.db.port}`);
  await server.ensureAppDatabase({ database: config.db.database, user: config.db.user, password: config.db.password });
  const dataSource = createDataSource(config.db);
  await dataSource.initialize();
  const applied = await dataSource.runMigrations({ transaction: 'each' });
  if (applied.length > 0) log(`Applied ${applied.length} migration(s).`);
  return dataSource;
}
