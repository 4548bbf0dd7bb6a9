import { afterAll, beforeAll, describe, expect, it } from 'vitest';
import { installDemoScenario } from '@server/demo/install-demo';
import { DEMO_PROGRAM } from '@shared/demo/heating-credit';
import { signIn, type SignedInAgent } from '../support/sign-in';
import { buildTestApp, type TestApp } from '../support/test-app';
import { createTestDatabase, type TestDatabase } from '../support/test-database';

describe('programs API', () => {
  let db: TestDatabase;
  let t: TestApp;
  let programId: number;
  let manager: SignedInAgent;
  beforeAll(async () => {
    db = await createTestDatabase();
    programId = (await installDemoScenario(db.dataSource)).programId;
    t = buildTestApp(db);
    manager = await signIn(t, { role: 'manager', programId });
  });
  afterAll(async () => {
    await db.drop();
  });

  it('installs the demo scenario once', async () => {
    const again = await installDemoScenario(db.dataSource);
    expect(again).toEqual({ installed: false, programId });
  });

  it('lists the demo program with its current cutoff and cohorts', async () => {
    const res = await manager.get('/api/programs').expect(200);
    expect(res.body).toMatchObject({ total: 1, page: 1, pageSize: 50 });
    expect(res.body.items[0]).toMatchObject({
      id: programId,
      name: DEMO_PROGRAM.name,
      eligibleSide: 'at-or-above',
      currentCutoff: 58,
      cohortCount: 24,
      latestPeriod: '2026-10',
    });
  });

  it('shows only the programs the caller is granted', async () => {
    const nobody = await signIn(t, {});
    const res = await nobody.get('/api/programs').expect(200);
    expect(res.body).toMatchObject({ items: [], total: 0 });
  });

  it('returns one program with its schedule and definitions', async () => {
    const res = await manager.get(`/api/programs/${programId}`).expect(200);
    expect(res.body.cutoffSchedule).toEqual([
      expect.objectContaining({ cutoff: 60, firstPeriod: '2024-11' }),
      expect.objectContaining({ cutoff: 58, firstPeriod: '2025-11' }),
    ]);
    expect(res.body.outcomes.map((o: { key: string }) => o.key)).toEqual(['shutoff_6m', 'arrears_months']);
  });

  it('rejects bad ids and pages in plain words', async () => {
    const admin = await signIn(t, { role: 'admin' });
    const bad = await admin.get('/api/programs/abc').expect(400);
    expect(bad.body.error).toMatchObject({ code: 'bad_request', message: 'Program id must be a positive whole number.' });
    await admin.get('/api/programs/999999').expect(404);
    const page = await admin.get('/api/programs?page=0').expect(400);
    expect(page.body.error.code).toBe('validation_failed');
  });
});
