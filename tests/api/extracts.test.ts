import request from 'supertest';
import { afterAll, beforeAll, describe, expect, it } from 'vitest';
import { loadObservations } from '@server/services/observations.service';
import { goodRows, TEST_MAPPING, toCsv } from '../fixtures/extract-files';
import { createTestProgram } from '../fixtures/test-program';
import { acceptAndSettle, mapExtract, settledExtract, uploadExtract } from '../support/extracts';
import { buildTestApp } from '../support/test-app';
import { createTestDatabase, type TestDatabase } from '../support/test-database';

describe('extracts: upload, map, report, accept', () => {
  let db: TestDatabase;
  let app: ReturnType<typeof buildTestApp>['app'];
  let programId: number;
  beforeAll(async () => {
    db = await createTestDatabase();
    app = buildTestApp(db).app;
    programId = await createTestProgram(db.dataSource);
  });
  afterAll(async () => {
    await db.drop();
  });

  it('takes a CSV, asks for a mapping, reports and loads it on accept', async () => {
    const rows = goodRows(500);
    const up = await uploadExtract(app, { programId, content: toCsv(rows), fileName: 'april.csv' });
    expect(up.duplicate).toBe(false);
    expect(up.extract).toMatchObject({ status: 'uploaded', period: '2025-04', format: 'csv', columns: [...Object.keys(rows[0]!)] });
    expect(up.extract.suggestedMapping).toMatchObject({ subjectId: 'case_id', score: 'score' });

    const report = await mapExtract(app, programId, up.extract.id, TEST_MAPPING);
    expect(report.status).toBe('awaiting-decision');
    expect(report.problem).toBeNull();
    expect(report.report).toMatchObject({ rowsRead: 500, rowsAccepted: 500, rowsRejected: 0, cutoff: 50 });
    expect(report.canAccept).toBe(true);

    const accepted = await acceptAndSettle(app, programId, up.extract.id);
    expect(accepted.status).toBe('accepted');

    const data = await loadObservations(db.dataSource, programId, ['2025-04']);
    expect(data.n).toBe(500);
    expect(Array.from(data.score.subarray(0, 3))).toEqual(rows.slice(0, 3).map((r) => r.score));
    expect(Array.from(data.outcomes.earnings!.subarray(0, 3))).toEqual(rows.slice(0, 3).map((r) => r.earnings));
    expect(data.takeUp!.reduce((a, b) => a + b, 0)).toBe(rows.reduce((a, r) => a + Number(r.took_part), 0));
    expect(data.cluster!.every((c) => c > 0)).toBe(true);
    expect(data.cohorts).toEqual([expect.objectContaining({ period: '2025-04', extractId: up.extract.id, offset: 0, length: 500, cutoff: 50 })]);

    const list = await request(app).get(`/api/programs/${programId}/extracts`).expect(200);
    expect(list.body.items[0]).toMatchObject({ id: up.extract.id, status: 'accepted', rowsAccepted: 500 });
    await settledExtract(app, programId, up.extract.id);
  });
});
