import { afterAll, beforeAll, describe, expect, it, vi } from 'vitest';
import { REUSE_READS_MS } from '@server/http/reused-reads';
import { installDemoScenario } from '@server/demo/install-demo';
import { EstimateResult } from '@server/entities/estimate-result.entity';
import { Program } from '@server/entities/program.entity';
import type { CohortDetailDto, CohortTrendDto } from '@shared/api/results';
import { DEMO_WEAK_TAKE_UP_PERIOD } from '@shared/demo/heating-credit';
import { installDemoResults } from '../support/demo-results';
import { signIn } from '../support/sign-in';
import { buildTestApp, type TestApp } from '../support/test-app';
import { createTestDatabase, type TestDatabase } from '../support/test-database';

/** What the result screens read beyond the core contract: take-up either side, acknowledgements in the month's detail. */
describe('results for the screens', () => {
  let db: TestDatabase;
  let t: TestApp;
  let programId: number;
  beforeAll(async () => {
    db = await createTestDatabase();
    programId = (await installDemoScenario(db.dataSource)).programId;
    await installDemoResults(db.dataSource, programId);
    t = buildTestApp(db);
  });
  afterAll(async () => {
    await db.drop();
  });

  it('trend points carry take-up either side of the cutoff, whose difference is the take-up jump', async () => {
    const manager = await signIn(t, { role: 'manager', programId });
    const trend: CohortTrendDto = (await manager.get(`/api/programs/${programId}/results/trend?outcome=shutoff_6m`).expect(200)).body;
    expect(trend.points).toHaveLength(24);
    const ok = trend.points.filter((x) => x.status === 'ok');
    expect(ok.length).toBeGreaterThan(20);
    for (const p of ok) {
      // Identity: the conventional first stage is the difference of the fitted take-up limits.
      expect(p.takeUp!.eligible! - p.takeUp!.ineligible!).toBeCloseTo(p.firstStage!.estimate, 10);
    }
  });

  it('an acknowledgement shows in the month detail the screens read', async () => {
    const manager = await signIn(t, { role: 'manager', programId });
    const url = `/api/programs/${programId}/results/cohorts/${DEMO_WEAK_TAKE_UP_PERIOD}`;
    const before: CohortDetailDto = (await manager.get(url).expect(200)).body;
    const outcome = before.outcomes.find((o) => o.caveats.length > 0);
    expect(outcome, 'the weak take-up month carries a caveat (shared/demo/heating-credit.ts)').toBeDefined();
    expect(outcome!.limits).toBeTruthy();
    const caveatCode = outcome!.caveats[0]!.code;
    await manager.post(`/api/programs/${programId}/results/${outcome!.id}/acknowledgements`).send({ caveatCode, comment: 'Read with care.' }).expect(201);
    const after: CohortDetailDto = (await manager.get(url).expect(200)).body;
    expect(after.outcomes.find((o) => o.id === outcome!.id)!.acknowledgements).toMatchObject([{ caveatCode, comment: 'Read with care.', acknowledgedBy: manager.me.user.displayName }]);
  });

  it('serves cached answers only while nothing they depend on changed', async () => {
    const director = await signIn(t, { role: 'director', programId });
    const url = `/api/programs/${programId}/results`;
    const first = (await director.get(url).expect(200)).body;
    expect(first.stale).toBe(false);
    expect((await director.get(url).expect(200)).body).toEqual(first);
    // Another process (the recompute job) marks a result stale: once this process's reuse of the
    // program's stamp is over (the app runs here, so its clock can be moved), the answer says so.
    await db.dataSource.getRepository(EstimateResult).update({ programId, scopeKey: 'cohort:2026-10', outcomeKey: 'shutoff_6m' }, { stale: true, staleReason: 'A new extract was accepted for 2026-10.' });
    let clock = Date.now();
    const later = () => vi.useFakeTimers({ toFake: ['Date'], now: (clock += REUSE_READS_MS) });
    try {
      later();
      const second = (await director.get(url).expect(200)).body;
      expect(second.stale).toBe(true);
      expect(second.outcomes[0].latest.staleReason).toBe('A new extract was accepted for 2026-10.');
      // A renamed program shows under its new name.
      await db.dataSource.getRepository(Program).update({ id: programId }, { name: 'Winter Heating Credit (renamed)' });
      later();
      expect((await director.get(url).expect(200)).body.programName).toBe('Winter Heating Credit (renamed)');
    } finally {
      vi.useRealTimers();
    }
  });

  it('answers compressed to browsers that accept it, and 304 to one that holds the answer', async () => {
    const manager = await signIn(t, { role: 'manager', programId });
    const url = `/api/programs/${programId}/results/trend?outcome=shutoff_6m`;
    const plain = await manager.get(url).set('Accept-Encoding', 'identity').expect(200);
    expect(plain.headers['content-encoding']).toBeUndefined();
    const zipped = await manager.get(url).set('Accept-Encoding', 'gzip, deflate, br').expect(200);
    expect(zipped.headers['content-encoding']).toBe('gzip');
    expect(zipped.headers.vary).toMatch(/Accept-Encoding/);
    expect(Number(zipped.headers['content-length'])).toBeLessThan(Number(plain.headers['content-length']) / 2);
    expect(zipped.body).toEqual(plain.body);
    await manager.get(url).set('If-None-Match', String(plain.headers.etag)).expect(304);
  });
});
