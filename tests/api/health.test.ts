import request from 'supertest';
import { afterAll, beforeAll, describe, expect, it } from 'vitest';
import { buildTestApp } from '../support/test-app';
import { createTestDatabase, type TestDatabase } from '../support/test-database';

describe('GET /api/health', () => {
  let db: TestDatabase;
  beforeAll(async () => {
    db = await createTestDatabase();
  });
  afterAll(async () => {
    await db.drop();
  });

  it('answers ok with the database reachable and no migration pending', async () => {
    const { app } = buildTestApp(db);
    const res = await request(app).get('/api/health').expect(200);
    expect(res.body).toMatchObject({ status: 'ok', database: { reachable: true, migrationsPending: 0 } });
    expect(res.body.version).toMatch(/^\d+\.\d+\.\d+/);
  });

  it('answers unknown API paths with the common error shape', async () => {
    const { app } = buildTestApp(db);
    const res = await request(app).get('/api/no-such-thing').expect(404);
    expect(res.body).toEqual({ error: { code: 'not_found', message: expect.stringContaining('/api/no-such-thing') } });
  });
});
