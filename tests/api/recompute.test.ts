import { spawn } from 'node:child_process';
import path from 'node:path';
import readline from 'node:readline';
import { afterAll, beforeAll, describe, expect, it } from 'vitest';
import { REPO_ROOT } from '@server/config/env';
import { createDataSource } from '@server/db/data-source';
import { installDemoScenario } from '@server/demo/install-demo';
import { EstimateResult } from '@server/entities/estimate-result.entity';
import { Extract } from '@server/entities/extract.entity';
import { RecomputeRun } from '@server/entities/recompute-run.entity';
import { createDesignVersion, getDesign } from '@server/services/designs.service';
import type { Analyzer } from '@server/services/recompute/analyzer';
import { engineAnalyzer } from '@server/services/recompute/engine-analyzer';
import { executeRun, processRecomputeQueue } from '@server/services/recompute/run-recompute';
import { isLockFree, recomputeLockName } from '@server/services/recompute/named-lock';
import { requestRecompute } from '@server/services/recompute/run-queue';
import { ENGINE_VERSION } from '@shared/estimation';
import { demoPeriods } from '@shared/demo/heating-credit';
import { signIn } from '../support/sign-in';
import { buildTestApp } from '../support/test-app';
import { createDemoDesign, testRecomputeDeps } from '../support/recompute';
import { createTestDatabase, type TestDatabase } from '../support/test-database';

const ANALYST = { userId: null, label: 'Test analyst' };
/** 24 cohorts + windows last-3, last-6, last-12 and previous-3, each for 2 outcomes. */
const SCOPES = 24 + 4;

describe('recompute', { timeout: 240_000 }, () => {
  let db: TestDatabase;
  let programId: number;
  let designId: number;
  beforeAll(async () => {
    db = await createTestDatabase();
    programId = (await installDemoScenario(db.dataSource, { config: db.config })).programId;
    designId = await createDemoDesign(db, programId);
  }, 300_000);
  afterAll(async () => {
    await db.drop();
  });

  const results = () => db.dataSource.getRepository(EstimateResult).find({ where: { designId }, order: { id: 'ASC' } });
  const bump = async (kernel: 'uniform' | 'epanechnikov' | 'triangular') => {
    const design = await getDesign(db.dataSource, programId, designId);
    await createDesignVersion(db.dataSource, programId, designId, ANALYST, { settings: { ...design.currentVersion.settings, kernel } });
  };

  it('after the accepted extracts, stores every cohort and window for every outcome, with provenance', async () => {
    const [report] = await processRecomputeQueue(testRecomputeDeps(db));
    expect(report).toMatchObject({ outcome: 'succeeded', scopesComputed: SCOPES, resultsWritten: SCOPES * 2 });
    const rows = await results();
    expect(rows).toHaveLength(SCOPES * 2);
    const extracts = await db.dataSource.getRepository(Extract).findBy({ programId, status: 'accepted' });
    const sha = new Map(extracts.map((e) => [e.period, e.sha256]));
    for (const period of demoPeriods()) {
      for (const outcome of ['shutoff_6m', 'arrears_months']) {
        const r = rows.find((x) => x.scopeKey === `cohort:${period}` && x.outcomeKey === outcome);
        expect(r, `${period} ${outcome}`).toBeDefined();
        expect(r!.provenance).toMatchObject({ designId, designVersion: 1, engineVersion: ENGINE_VERSION, runId: report!.runId, extracts: [{ period, sha256: sha.get(period) }] });
        expect(r!.stale).toBe(false);
      }
    }
    // The demo's ordinary months have a strong take-up jump (0.70 vs 0.08 by construction, shared/demo/heating-credit.ts).
    const ok = rows.filter((r) => r.status === 'ok' && r.scopeKind === 'cohort');
    expect(ok.length).toBeGreaterThanOrEqual(44);
    const window12 = rows.find((r) => r.scopeKey === 'window:last-12' && r.outcomeKey === 'shutoff_6m')!;
    expect(window12.provenance.extracts).toHaveLength(12);
    // The cutoff moved from 60 to 58 in 2025-11: the last 12 months straddle no change (2025-11…2026-10), the last-12 window has one cutoff.
    expect(window12.figures.pooling?.weights.map((w) => w.cutoff)).toEqual([58]);
    const run = await db.dataSource.getRepository(RecomputeRun).findOneByOrFail({ id: report!.runId });
    expect(run).toMatchObject({ status: 'succeeded', progressDone: SCOPES, progressTotal: SCOPES, attempts: 1 });
  });

  it('reads the same results through the API, for every role that may', async () => {
    const t = buildTestApp(db);
    const director = await signIn(t, { role: 'director', programId });
    const overview = (await director.get(`/api/programs/${programId}/results`).expect(200)).body;
    expect(overview).toMatchObject({ latestPeriod: '2026-10', stale: false, design: { id: designId, version: 1 } });
    expect(overview.outcomes.map((o: { outcome: { key: string } }) => o.outcome.key)).toEqual(['shutoff_6m', 'arrears_months']);
    expect(overview.outcomes[0].windows.map((w: { scope: { key: string } }) => w.scope.key)).toEqual(['window:last-3', 'window:last-6', 'window:last-12']);
    const trend = (await director.get(`/api/programs/${programId}/results/trend?outcome=arrears_months`).expect(200)).body;
    expect(trend.points).toHaveLength(24);
    const manager = await signIn(t, { role: 'manager', programId });
    const detail = (await manager.get(`/api/programs/${programId}/results/cohorts/2026-04`).expect(200)).body;
    expect(detail).toMatchObject({ period: '2026-04', cutoff: 58 });
    expect(detail.outcomes[0].bins.length).toBeGreaterThan(10);
    await director.get(`/api/programs/${programId}/results/cohorts/2026-04`).expect(403);
    await director.get(`/api/programs/${programId}/runs`).expect(403);
  });

  it('a second run with nothing new changes nothing', async () => {
    const before = await results();
    const { run } = await db.dataSource.transaction((tx) => requestRecompute(tx, { programId, trigger: 'on-demand', actor: ANALYST }));
    const report = await executeRun(testRecomputeDeps(db), run.id);
    expect(report.outcome).toBe('up-to-date');
    expect(await results()).toEqual(before);
    expect(await db.dataSource.getRepository(RecomputeRun).findOneByOrFail({ id: run.id })).toMatchObject({ status: 'up-to-date', resultsWritten: 0 });
  });

  it('two concurrent triggers, and two instances, run once', async () => {
    const ds = db.dataSource;
    const trigger = (kind: 'on-demand' | 'extract-accepted') => ds.transaction((tx) => requestRecompute(tx, { programId, trigger: kind, actor: ANALYST }));
    const [a, b] = await Promise.all([trigger('on-demand'), trigger('extract-accepted')]);
    expect(a.run.id).toBe(b.run.id);
    expect([a.joined, b.joined].sort()).toEqual([false, true]);
    // A second app instance: its own connection pool to the same database.
    const other = createDataSource(db.config.db);
    await other.initialize();
    const both = (runId: number) => Promise.all([executeRun(testRecomputeDeps(db), runId), executeRun({ ...testRecomputeDeps(db), dataSource: other }, runId)]);
    try {
      expect((await both(a.run.id)).map((r) => r.outcome).sort()).toEqual(['skipped', 'up-to-date']);
      await bump('uniform');
      const queued = await ds.getRepository(RecomputeRun).findOneByOrFail({ programId, status: 'queued' });
      expect((await both(queued.id)).map((r) => r.outcome).sort()).toEqual(['skipped', 'succeeded']);
    } finally {
      await other.destroy();
    }
    const runs = await ds.getRepository(RecomputeRun).findBy({ programId });
    expect(runs.filter((r) => r.status === 'queued' || r.status === 'running')).toEqual([]);
    expect((await results()).every((r) => r.designVersion === 2 && !r.stale)).toBe(true);
  });

  it('a run killed mid-way leaves the previous results intact and stale; the retry completes', async () => {
    const before = await results();
    await bump('epanechnikov');
    const { run } = await db.dataSource.transaction((tx) => requestRecompute(tx, { programId, trigger: 'on-demand', actor: ANALYST }));
    // node with tsx's loader, not the tsx command: one process, so the kill ends its connection and lock.
    const child = spawn(process.execPath, ['--import', 'tsx', path.join(REPO_ROOT, 'tests', 'support', 'recompute-child.ts'), String(run.id)], {
      cwd: REPO_ROOT,
      env: { ...process.env, CUTLINE_DB_NAME: db.config.db.database },
      stdio: ['ignore', 'pipe', 'inherit'],
    });
    const exited = new Promise<void>((resolve) => child.once('exit', () => resolve()));
    for await (const line of readline.createInterface({ input: child.stdout! })) if (line === 'HOLDING') break;
    expect(await db.dataSource.getRepository(RecomputeRun).findOneByOrFail({ id: run.id })).toMatchObject({ status: 'running', progressDone: 1 });
    child.kill('SIGKILL');
    await exited;
    // The server lets go of the lock when it sees the connection close.
    while (!(await isLockFree(db.dataSource, recomputeLockName(db.dataSource, programId)))) await new Promise((r) => setTimeout(r, 20));

    const after = await results();
    expect(after.map((r) => [r.id, r.designVersion, r.inputSignature])).toEqual(before.map((r) => [r.id, r.designVersion, r.inputSignature]));
    expect(after.every((r) => r.stale && r.staleReason === 'The design changed (now version 3).')).toBe(true);

    const reports = await processRecomputeQueue(testRecomputeDeps(db));
    expect(reports.map((r) => [r.runId, r.outcome])).toEqual([[run.id, 'succeeded']]);
    const retried = await db.dataSource.getRepository(RecomputeRun).findOneByOrFail({ id: run.id });
    expect(retried).toMatchObject({ status: 'succeeded', attempts: 2 });
    const fresh = await results();
    expect(fresh).toHaveLength(SCOPES * 2);
    expect(fresh.every((r) => r.designVersion === 3 && !r.stale)).toBe(true);
  });

  it('retries a failed attempt after its back-off (30 s, then 2 min)', async () => {
    await bump('triangular');
    let failures = 2;
    const flaky: Analyzer = {
      ...engineAnalyzer,
      analyze(input) {
        if (failures > 0) {
          failures--;
          throw new Error('the database went away');
        }
        return engineAnalyzer.analyze(input);
      },
    };
    const t0 = new Date('2027-01-04T10:00:00Z');
    let clock = t0;
    const deps = testRecomputeDeps(db, { analyzer: flaky, retryBaseMs: 30_000, now: () => clock });
    const { run } = await db.dataSource.transaction((tx) => requestRecompute(tx, { programId, trigger: 'on-demand', actor: ANALYST, now: t0 }));
    expect((await processRecomputeQueue(deps)).map((r) => r.outcome)).toEqual(['retrying']);
    const first = await db.dataSource.getRepository(RecomputeRun).findOneByOrFail({ id: run.id });
    expect(first).toMatchObject({ status: 'queued', attempts: 1, errorCode: 'recompute_failed' });
    expect(first.nextAttemptAt.toISOString()).toBe('2027-01-04T10:00:30.000Z');
    clock = new Date('2027-01-04T10:00:29Z');
    expect(await processRecomputeQueue(deps)).toEqual([]);
    clock = new Date('2027-01-04T10:00:30Z');
    expect((await processRecomputeQueue(deps)).map((r) => r.outcome)).toEqual(['retrying']);
    expect((await db.dataSource.getRepository(RecomputeRun).findOneByOrFail({ id: run.id })).nextAttemptAt.toISOString()).toBe('2027-01-04T10:02:30.000Z');
    expect((await results()).every((r) => r.stale)).toBe(true);
    clock = new Date('2027-01-04T10:02:30Z');
    expect((await processRecomputeQueue(deps)).map((r) => r.outcome)).toEqual(['succeeded']);
    expect((await results()).every((r) => r.designVersion === 4 && !r.stale)).toBe(true);
  });
});
