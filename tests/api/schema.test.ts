import { afterAll, beforeAll, describe, expect, it } from 'vitest';
import { createTestDatabase, type TestDatabase } from '../support/test-database';

describe('migrations', () => {
  let db: TestDatabase;
  beforeAll(async () => {
    db = await createTestDatabase();
  });
  afterAll(async () => {
    await db.drop();
  });

  it('build exactly the schema the entities describe (nothing left for synchronize to do)', async () => {
    const pending = await db.dataSource.driver.createSchemaBuilder().log();
    expect(pending.upQueries.map((q) => q.query)).toEqual([]);
  });

  it('can be reverted and applied again', async () => {
    for (let i = 0; i < db.dataSource.migrations.length; i++) await db.dataSource.undoLastMigration({ transaction: 'each' });
    const tables = await db.dataSource.query('SHOW TABLES');
    expect(tables.length).toBeLessThanOrEqual(1); // only TypeORM's own `migrations` table
    await db.dataSource.runMigrations({ transaction: 'each' });
    const pending = await db.dataSource.driver.createSchemaBuilder().log();
    expect(pending.upQueries).toHaveLength(0);
  });
});
