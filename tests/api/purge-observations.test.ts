import fs from 'node:fs';
import { afterAll, beforeAll, describe, expect, it } from 'vitest';
import { purgeObservationsJob } from '@jobs/purge-observations.job';
import { createLogger } from '@server/lib/logger';
import { ingestFiles } from '@server/services/ingest/work-dir';
import { loadObservations } from '@server/services/observations.service';
import { periodIn, purgeExpiredObservations } from '@server/services/retention.service';
import { goodRows, TEST_MAPPING, toCsv } from '../fixtures/extract-files';
import { createTestProgram } from '../fixtures/test-program';
import { acceptAndSettle, mapExtract, settledExtract, uploadExtract } from '../support/extracts';
import { signIn, type SignedInAgent } from '../support/sign-in';
import { buildTestApp } from '../support/test-app';
import { createTestDatabase, type TestDatabase } from '../support/test-database';

describe('purge-observations job', () => {
  let db: TestDatabase;
  let analyst: SignedInAgent;
  let programId: number;
  const ids: Record<string, number> = {};
  const ctx = () => ({ config: db.config, dataSource: db.dataSource, logger: createLogger('silent'), now: () => new Date('2026-03-15T12:00:00Z') });

  beforeAll(async () => {
    db = await createTestDatabase();
    programId = await createTestProgram(db.dataSource);
    await db.dataSource.query('UPDATE program SET retention_months = 12 WHERE id = ?', [programId]);
    analyst = await signIn(buildTestApp(db), { role: 'analyst', programId });
    // 2025-01 twice (the first superseded), 2025-04 once; one rejected row in the first file.
    for (const [key, period, start] of [['jan-first', '2025-01', 1], ['jan', '2025-01', 2], ['apr', '2025-04', 3]] as const) {
      const rows = goodRows(100, period, start);
      if (key === 'jan-first') rows[5] = { ...rows[5]!, score: 'n/a' };
      const up = await uploadExtract(analyst, { programId, content: toCsv(rows), period });
      if (up.extract.status === 'uploaded') await mapExtract(analyst, programId, up.extract.id, TEST_MAPPING);
      await settledExtract(analyst, programId, up.extract.id);
      await acceptAndSettle(analyst, programId, up.extract.id);
      ids[key] = up.extract.id;
    }
  });
  afterAll(async () => {
    await db.drop();
  });

  it('reads the current month in the program’s time zone', () => {
    expect(periodIn(new Date('2026-03-01T03:00:00Z'), 'America/Chicago')).toBe('2026-02');
    expect(periodIn(new Date('2026-03-01T03:00:00Z'), 'UTC')).toBe('2026-03');
  });

  it('deletes rows of cohorts past the retention, keeps records and newer cohorts, and audits it', async () => {
    await purgeObservationsJob.run(ctx());
    // March 2026 minus 12 months: cohorts before 2025-03 go.
    const counts: Array<{ extract_id: number; n: number }> = await db.dataSource.query('SELECT extract_id, COUNT(*) AS n FROM observation GROUP BY extract_id ORDER BY extract_id');
    expect(counts.map((c) => [c.extract_id, Number(c.n)])).toEqual([[ids.apr, 100]]);
    const rejected = await db.dataSource.query('SELECT COUNT(*) AS n FROM extract_rejected_row WHERE extract_id = ?', [ids['jan-first']]);
    expect(Number(rejected[0].n)).toBe(0);

    const jan = await analyst.get(`/api/programs/${programId}/extracts/${ids.jan}`).expect(200);
    expect(jan.body).toMatchObject({ status: 'accepted', rowsAccepted: 100, observationsPurgedAt: '2026-03-15T12:00:00.000Z' });
    const data = await loadObservations(db.dataSource, programId, ['2025-01', '2025-04']);
    expect(data.missingPeriods).toEqual(['2025-01']);
    expect(data.n).toBe(100);

    const events = await db.dataSource.query("SELECT actor_label, details FROM audit_event WHERE action = 'observations.purge'");
    expect(events).toHaveLength(1);
    const details = typeof events[0].details === 'string' ? JSON.parse(events[0].details) : events[0].details;
    expect(events[0].actor_label).toBe('system');
    expect(details).toMatchObject({ retentionMonths: 12, purgedBefore: '2025-03', periods: ['2025-01'], rows: 199 });
    expect([...details.extracts].sort()).toEqual([ids['jan-first'], ids.jan].sort());

    const restore = await analyst.post(`/api/programs/${programId}/extracts/${ids['jan-first']}/restore`).send({}).expect(410);
    expect(restore.body.error.code).toBe('extract_observations_purged');
  });

  it('does nothing the second time', async () => {
    const report = await purgeExpiredObservations(ctx(), new Date('2026-03-15T12:00:00Z'));
    expect(report).toMatchObject({ skipped: false, extracts: 0, rows: 0, capped: false });
    const events = await db.dataSource.query("SELECT COUNT(*) AS n FROM audit_event WHERE action = 'observations.purge'");
    expect(Number(events[0].n)).toBe(1);
  });

  it('stops at its cap and carries on in the next run', async () => {
    await db.dataSource.query('UPDATE program SET retention_months = 1 WHERE id = ?', [programId]);
    const limits = { batchRows: 30, maxRowsPerRun: 70, abandonedAfterDays: 14 };
    const first = await purgeExpiredObservations(ctx(), new Date('2026-03-15T12:00:00Z'), limits);
    expect(first).toMatchObject({ rows: 70, capped: true, extracts: 0 });
    const second = await purgeExpiredObservations(ctx(), new Date('2026-03-15T12:00:00Z'), limits);
    expect(second).toMatchObject({ rows: 30, capped: false, extracts: 1 });
    await db.dataSource.query('UPDATE program SET retention_months = 12 WHERE id = ?', [programId]);
  });

  it('sets aside uploads left without a decision, deleting their files', async () => {
    const up = await uploadExtract(analyst, { programId, content: toCsv(goodRows(10, '2025-06', 9)), period: '2025-06', reviewMapping: true });
    expect(fs.existsSync(ingestFiles(db).upload(up.extract.id, 'csv'))).toBe(true);
    const report = await purgeExpiredObservations(ctx(), new Date(Date.now() + 15 * 24 * 3600 * 1000));
    expect(report.abandoned).toBe(1);
    const after = await analyst.get(`/api/programs/${programId}/extracts/${up.extract.id}`).expect(200);
    expect(after.body).toMatchObject({ status: 'rejected', decided: { by: 'system' } });
    expect(fs.existsSync(ingestFiles(db).extractDir(up.extract.id))).toBe(false);
  });
});
