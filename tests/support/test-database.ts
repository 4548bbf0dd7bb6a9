import { randomBytes } from 'node:crypto';
import fs from 'node:fs';
import path from 'node:path';
import mysql from 'mysql2/promise';
import type { DataSource } from 'typeorm';
import { loadConfig, type Config } from '@server/config/env';
import { createDataSource } from '@server/db/data-source';

export interface TestDatabase {
  dataSource: DataSource;
  /** Configuration pointing at this database (use it for `createApp` and child processes). */
  config: Config;
  drop: () => Promise<void>;
}

/** Configuration of the test run; explains itself when a test is started outside the runner. */
export function testConfig(): Config {
  if (process.env.CUTLINE_TEST_RUN !== '1') {
    throw new Error('This test needs the private test database: run it with `npm test` or `npm run test:one -- <file>`.');
  }
  return loadConfig();
}

/**
 * A fresh, migrated database of its own for one test file, with a runtime folder of its own
 * (uploads, work files), so files can run in parallel. Drop it in `afterAll`.
 */
export async function createTestDatabase(): Promise<TestDatabase> {
  const base = testConfig();
  const name = `cutline_test_${process.pid}_${randomBytes(4).toString('hex')}`;
  const admin = await mysql.createConnection({ host: base.db.host, port: base.db.port, user: base.db.user, password: base.db.password });
  await admin.query(`CREATE DATABASE \`${name}\` CHARACTER SET utf8mb4 COLLATE utf8mb4_unicode_ci`);
  await admin.end();
  const config: Config = { ...base, varDir: path.join(base.varDir, 'databases', name), db: { ...base.db, database: name } };
  fs.mkdirSync(config.varDir, { recursive: true });
  const dataSource = createDataSource(config.db);
  await dataSource.initialize();
  await dataSource.runMigrations({ transaction: 'each' });
  return {
    dataSource,
    config,
    drop: async () => {
      await dataSource.query(`DROP DATABASE \`${name}\``);
      await dataSource.destroy();
      fs.rmSync(config.varDir, { recursive: true, force: true });
    },
  };
}
