import { afterAll, beforeAll, describe, expect, it } from 'vitest';
import { installDemoScenario } from '@server/demo/install-demo';
import { AuditEvent } from '@server/entities/audit-event.entity';
import { RecomputeRun } from '@server/entities/recompute-run.entity';
import { defaultDesignSettings } from '@shared/schemas/design';
import { signIn, type SignedInAgent } from '../support/sign-in';
import { buildTestApp, type TestApp } from '../support/test-app';
import { createTestDatabase, type TestDatabase } from '../support/test-database';

describe('evaluation designs API', () => {
  let db: TestDatabase;
  let t: TestApp;
  let programId: number;
  let analyst: SignedInAgent;
  const settings = defaultDesignSettings(['shutoff_6m', 'arrears_months'], ['household_size', 'prior_arrears']);
  beforeAll(async () => {
    db = await createTestDatabase();
    programId = (await installDemoScenario(db.dataSource)).programId;
    // Accepting the demo's extracts queued a recompute; start from an empty queue so the first
    // test sees the design's own request rather than joining that one.
    await db.dataSource.getRepository(RecomputeRun).delete({ programId });
    t = buildTestApp(db);
    analyst = await signIn(t, { role: 'analyst', programId });
  });
  afterAll(async () => {
    await db.drop();
  });

  it('creates the first design as the primary one, with version 1, and queues a recompute', async () => {
    const res = await analyst.post(`/api/programs/${programId}/designs`).send({ name: 'Main plan', settings }).expect(201);
    expect(res.body).toMatchObject({ name: 'Main plan', primary: true, lock: null, deviationCount: 0, currentVersion: { version: 1, settings } });
    expect(res.body.versions).toHaveLength(1);
    const queued = await db.dataSource.getRepository(RecomputeRun).findBy({ programId, status: 'queued' });
    expect(queued.map((r) => r.trigger)).toEqual(['design-changed']);
  });

  it('writes a new version on edit and never changes the old one', async () => {
    const [design] = (await analyst.get(`/api/programs/${programId}/designs`).expect(200)).body.items;
    const edited = { ...settings, kernel: 'epanechnikov', donutRadius: 0.5 };
    const res = await analyst.post(`/api/programs/${programId}/designs/${design.id}/versions`).send({ settings: edited }).expect(201);
    expect(res.body.currentVersion).toMatchObject({ version: 2, settings: edited });
    expect(res.body.versions.map((v: { version: number }) => v.version)).toEqual([2, 1]);
    expect(res.body.versions[1].settings).toEqual(settings);
    const cmp = await analyst.get(`/api/programs/${programId}/designs/${design.id}/compare?from=1&to=2`).expect(200);
    expect(cmp.body.changes).toEqual([
      { setting: 'kernel', from: 'triangular', to: 'epanechnikov' },
      { setting: 'donutRadius', from: 0, to: 0.5 },
    ]);
    // Two triggers while one run is queued: still one queued run.
    expect(await db.dataSource.getRepository(RecomputeRun).countBy({ programId, status: 'queued' })).toBe(1);
  });

  it('refuses an edit that changes nothing, and unknown outcomes, in plain words', async () => {
    const [design] = (await analyst.get(`/api/programs/${programId}/designs`).expect(200)).body.items;
    const same = await analyst.post(`/api/programs/${programId}/designs/${design.id}/versions`).send({ settings: design.currentVersion.settings }).expect(409);
    expect(same.body.error.code).toBe('design_unchanged');
    const unknown = await analyst.post(`/api/programs/${programId}/designs`).send({ name: 'Other', settings: { ...settings, outcomes: ['nope'] } }).expect(422);
    expect(unknown.body.error).toMatchObject({ code: 'design_setting_unknown', details: { outcomes: ['nope'] } });
    const invalid = await analyst.post(`/api/programs/${programId}/designs`).send({ name: 'Other', settings: { ...settings, bandwidthRule: 'fixed' } }).expect(400);
    expect(invalid.body.error.code).toBe('validation_failed');
  });

  it('lets only analysts change designs, and managers read them', async () => {
    const manager = await signIn(t, { role: 'manager', programId });
    await manager.get(`/api/programs/${programId}/designs`).expect(200);
    await manager.post(`/api/programs/${programId}/designs`).send({ name: 'X', settings }).expect(403);
  });

  it('makes another design primary on request, one primary per program', async () => {
    const res = await analyst.post(`/api/programs/${programId}/designs`).send({ name: 'Sensitivity plan', settings: { ...settings, order: 2 } }).expect(201);
    expect(res.body.primary).toBe(false);
    const switched = await analyst.patch(`/api/programs/${programId}/designs/${res.body.id}`).send({ primary: true }).expect(200);
    expect(switched.body.primary).toBe(true);
    const list = (await analyst.get(`/api/programs/${programId}/designs`).expect(200)).body.items;
    expect(list.filter((d: { primary: boolean }) => d.primary)).toHaveLength(1);
    expect(list[0].id).toBe(res.body.id);
    const audit = await db.dataSource.getRepository(AuditEvent).findBy({ action: 'design.create' });
    expect(audit).toHaveLength(2);
  });
});
