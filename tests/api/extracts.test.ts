import fs from 'node:fs';
import path from 'node:path';
import { ingestWorker } from '@server/services/ingest/ingest-worker';
import { ingestFiles } from '@server/services/ingest/work-dir';
import { afterAll, beforeAll, describe, expect, it } from 'vitest';
import { loadObservations } from '@server/services/observations.service';
import { fixtureDir, goodRows, TEST_HEADER, TEST_MAPPING, toCsv, writeXlsx } from '../fixtures/extract-files';
import { createTestProgram } from '../fixtures/test-program';
import { acceptAndSettle, mapExtract, settledExtract, uploadExtract } from '../support/extracts';
import { buildTestApp, type TestApp } from '../support/test-app';
import { createTestDatabase, type TestDatabase } from '../support/test-database';
import { signIn, type SignedInAgent } from '../support/sign-in';

describe('extracts: formats, mapping, report, accept', () => {
  let db: TestDatabase;
  let app: SignedInAgent;
  let admin: SignedInAgent;
  let dir: string;
  let t: TestApp;
  beforeAll(async () => {
    db = await createTestDatabase();
    t = buildTestApp(db);
    // Programs are made per test, so the analyst's grant is agency-wide.
    app = await signIn(t, { role: 'analyst', displayName: 'Ana Lyst' });
    admin = await signIn(t, { role: 'admin' });
    dir = fixtureDir();
  });
  afterAll(async () => {
    fs.rmSync(dir, { recursive: true, force: true });
    await db.drop();
  });

  it('takes a CSV, asks for a mapping, reports and makes it visible on accept', async () => {
    const programId = await createTestProgram(db.dataSource);
    const rows = goodRows(500);
    const up = await uploadExtract(app, { programId, content: toCsv(rows), fileName: 'april.csv' });
    expect(up.duplicate).toBe(false);
    expect(up.extract).toMatchObject({ status: 'uploaded', period: '2025-04', format: 'csv', fileName: 'april.csv', columns: [...TEST_HEADER], canRemap: true });
    expect(up.extract.suggestedMapping).toMatchObject({ subjectId: 'case_id', score: 'score', applicationDate: 'application_date', cluster: 'office' });

    const report = await mapExtract(app, programId, up.extract.id, TEST_MAPPING);
    expect(report).toMatchObject({ status: 'awaiting-decision', problem: null, canAccept: true, mappingOrigin: 'entered', source: { name: 'Test export' } });
    const eligible = rows.filter((r) => Number(r.score) >= 50).length;
    expect(report.report).toMatchObject({ rowsRead: 500, rowsAccepted: 500, rowsRejected: 0, cutoff: 50, eligibleRows: eligible, ineligibleRows: 500 - eligible, clusters: 3 });
    expect(report.report!.takeUpShare).toBeCloseTo(rows.filter((r) => r.took_part === 1).length / 500, 12);

    const accepted = await acceptAndSettle(app, programId, up.extract.id);
    expect(accepted).toMatchObject({ status: 'accepted', decided: { by: 'Ana Lyst' }, canAccept: false, canRemap: false });
    // The work files go once the load has committed and the worker has tidied up.
    await ingestWorker(t.ctx).idle();
    expect(fs.existsSync(ingestFiles(db).extractDir(up.extract.id))).toBe(false);

    const data = await loadObservations(db.dataSource, programId, ['2025-04']);
    expect(data.n).toBe(500);
    expect(Array.from(data.score)).toEqual(rows.map((r) => r.score));
    expect(Array.from(data.takeUp!)).toEqual(rows.map((r) => r.took_part));
    expect(Array.from(data.outcomes.employed!)).toEqual(rows.map((r) => r.employed));
    expect(Array.from(data.outcomes.earnings!)).toEqual(rows.map((r) => r.earnings));
    expect(Array.from(data.covariates.age!)).toEqual(rows.map((r) => r.age));
    // Cluster codes: one code per office, the same office always the same code.
    const codeOf = new Map<string, number>();
    rows.forEach((r, i) => {
      const code = data.cluster![i]!;
      expect(codeOf.get(String(r.office)) ?? code).toBe(code);
      codeOf.set(String(r.office), code);
    });
    expect(new Set(codeOf.values()).size).toBe(3);
    expect(data.cohorts).toEqual([{ period: '2025-04', extractId: up.extract.id, sha256: up.extract.sha256, offset: 0, length: 500, cutoff: 50 }]);

    const list = await app.get(`/api/programs/${programId}/extracts`).expect(200);
    expect(list.body).toMatchObject({ total: 1, page: 1, items: [{ id: up.extract.id, status: 'accepted', rowsAccepted: 500 }] });
    const cohorts = await db.dataSource.query('SELECT period FROM cohort WHERE program_id = ?', [programId]);
    expect(cohorts).toEqual([{ period: '2025-04' }]);
  });

  it('reads semicolon, tab and pipe files with BOM, CRLF and quoted fields holding delimiters and line breaks', async () => {
    const programId = await createTestProgram(db.dataSource);
    const rows = goodRows(60, '2025-05', 3).map((r, i) => (i === 7 ? { ...r, office: 'east; "upper"\nfloor' } : r));
    let month = 5;
    for (const [delimiter, options] of [
      [';', { bom: true, lineEnd: '\r\n' }],
      ['\t', { quoteAll: true }],
      ['|', {}],
    ] as const) {
      const period = `2025-0${month}`;
      const content = toCsv(month === 5 ? rows : goodRows(60, period, month), { delimiter, ...options });
      const up = await uploadExtract(app, { programId, content, period, fileName: 'file.txt' });
      const done = month === 5 ? await mapExtract(app, programId, up.extract.id, TEST_MAPPING) : await settledExtract(app, programId, up.extract.id);
      expect(done.mappingOrigin).toBe(month === 5 ? 'entered' : 'saved');
      expect(done.report).toMatchObject({ rowsRead: 60, rowsRejected: 0 });
      expect(done.problem).toBeNull();
      month++;
    }
  });

  it('reads the first worksheet of an XLSX, or the one chosen, with real date cells', async () => {
    const programId = await createTestProgram(db.dataSource);
    const rows = goodRows(80, '2025-06', 5).map((r) => ({ ...r, application_date: new Date(`${r.application_date}T00:00:00Z`) }));
    const file = path.join(dir, 'office.xlsx');
    await writeXlsx(file, rows, { sheet: 'Cases' });
    const first = await uploadExtract(app, { programId, content: fs.readFileSync(file), fileName: 'office.xlsx', period: '2025-06' });
    expect(first.extract).toMatchObject({ format: 'xlsx', sheet: 'Cases', columns: [...TEST_HEADER] });
    const report = await mapExtract(app, programId, first.extract.id, TEST_MAPPING);
    expect(report.report).toMatchObject({ rowsRead: 80, rowsAccepted: 80 });

    const other = path.join(dir, 'with-cover.xlsx');
    await writeXlsx(other, goodRows(40, '2025-07', 6), { sheet: 'Data', before: ['Cover'] });
    const chosen = await uploadExtract(app, { programId, content: fs.readFileSync(other), fileName: 'with-cover.xlsx', period: '2025-07', sheet: 'Data' });
    expect(chosen.extract.sheet).toBe('Data');
    const done = await settledExtract(app, programId, chosen.extract.id);
    expect(done).toMatchObject({ mappingOrigin: 'saved', report: { rowsRead: 40, rowsAccepted: 40 } });
  });

  it('accepts with rejected rows left out when under the limit, and lists and downloads them with reasons', async () => {
    const programId = await createTestProgram(db.dataSource);
    const rows = goodRows(400, '2025-04', 11);
    rows[10] = { ...rows[10]!, score: 'n/a' };
    rows[200] = { ...rows[200]!, took_part: 'unknown' };
    rows[300] = { ...rows[300]!, earnings: '=SUM(A1:A9)' };
    const up = await uploadExtract(app, { programId, content: toCsv(rows) });
    const report = await mapExtract(app, programId, up.extract.id, TEST_MAPPING);
    expect(report.problem).toBeNull();
    expect(report.report).toMatchObject({ rowsRead: 400, rowsAccepted: 397, rowsRejected: 3, rejectedRowsKept: 3 });
    expect(report.report!.byReason.map((g) => [g.code, g.column, g.count])).toEqual(
      expect.arrayContaining([
        ['extract_value_not_numeric', 'score', 1],
        ['extract_take_up_unknown', 'took_part', 1],
        ['extract_value_not_numeric', 'earnings', 1],
      ]),
    );

    const page = await app.get(`/api/programs/${programId}/extracts/${up.extract.id}/rejected-rows?pageSize=2`).expect(200);
    expect(page.body).toMatchObject({ total: 3, pageSize: 2 });
    expect(page.body.items[0]).toEqual({ line: 12, column: 'score', code: 'extract_value_not_numeric', reason: "'score' is not a number.", value: 'n/a' });

    const csv = await app.get(`/api/programs/${programId}/extracts/${up.extract.id}/rejected.csv`).expect(200);
    expect(csv.headers['content-type']).toMatch(/^text\/csv/);
    expect(csv.headers['content-disposition']).toContain('rejected.csv');
    expect(csv.text.split('\r\n')).toEqual([
      '\uFEFFline,column,code,reason,value',
      "12,score,extract_value_not_numeric,'score' is not a number.,n/a",
      '202,took_part,extract_take_up_unknown,"The take-up code is not one of the codes listed for ""took up"" or ""did not"".",unknown',
      "302,earnings,extract_value_not_numeric,'earnings' is not a number.,'=SUM(A1:A9)",
      '',
    ]);

    const accepted = await acceptAndSettle(app, programId, up.extract.id);
    expect(accepted.status).toBe('accepted');
    expect((await loadObservations(db.dataSource, programId, ['2025-04'])).n).toBe(397);
  });

  it('recognises a saved mapping by header (any order or case) and asks again when the header changes', async () => {
    const programId = await createTestProgram(db.dataSource);
    const first = await uploadExtract(app, { programId, content: toCsv(goodRows(50, '2025-04', 21)) });
    const mapped = await mapExtract(app, programId, first.extract.id, TEST_MAPPING, { newSourceName: 'County export' });
    const sourceId = mapped.source!.id;

    const reordered = [...TEST_HEADER].reverse().map((h) => h.toUpperCase());
    const rows = goodRows(50, '2025-05', 22).map((r) => Object.fromEntries(Object.entries(r).map(([k, v]) => [k.toUpperCase(), v])));
    const second = await uploadExtract(app, { programId, content: toCsv(rows, { header: reordered }), period: '2025-05' });
    expect(second.extract).toMatchObject({ status: 'validating', mappingOrigin: 'saved', source: { id: sourceId, name: 'County export' } });
    expect(second.extract.headerFingerprint).toBe(first.extract.headerFingerprint);
    expect((await settledExtract(app, programId, second.extract.id)).report).toMatchObject({ rowsAccepted: 50 });

    const review = await uploadExtract(app, { programId, content: toCsv(goodRows(50, '2025-06', 23)), period: '2025-06', reviewMapping: true });
    expect(review.extract).toMatchObject({ status: 'uploaded', suggestedMapping: { subjectId: 'case_id', takeUpValues: { yes: ['1', 'yes'] } } });

    const changed = [...TEST_HEADER.filter((h) => h !== 'office'), 'region'];
    const third = await uploadExtract(app, {
      programId,
      content: toCsv(goodRows(50, '2025-07', 24).map((r) => ({ ...r, region: r.office })), { header: changed }),
      period: '2025-07',
      sourceId,
    });
    expect(third.extract.status).toBe('uploaded');
    expect(third.extract.headerFingerprint).not.toBe(first.extract.headerFingerprint);
    // The source's last mapping still fills the columns that exist; the guess fills the rest.
    expect(third.extract.suggestedMapping).toMatchObject({ subjectId: 'case_id', takeUp: 'took_part', takeUpValues: { yes: ['1', 'yes'] }, cluster: 'region' });

    const sources = await app.get(`/api/programs/${programId}/data-sources`).expect(200);
    expect(sources.body).toEqual([expect.objectContaining({ id: sourceId, name: 'County export', mappings: [expect.objectContaining({ headerFingerprint: first.extract.headerFingerprint })] })]);
  });

  it('lets the analyst change the mapping after the report, and honours the program’s rejection limit', async () => {
    const programId = await createTestProgram(db.dataSource);
    const rows = goodRows(100, '2025-04', 31).map((r, i) => (i < 5 ? { ...r, took_part: 'Y' } : r));
    const up = await uploadExtract(app, { programId, content: toCsv(rows) });
    const strict = await mapExtract(app, programId, up.extract.id, TEST_MAPPING);
    expect(strict.problem).toMatchObject({ code: 'extract_take_up_unknown', message: expect.stringContaining('"y"') });

    const loose = await mapExtract(app, programId, up.extract.id, { ...TEST_MAPPING, takeUpValues: { yes: ['1', 'y'], no: ['0'] } }, { sourceId: strict.source!.id });
    expect(loose).toMatchObject({ problem: null, canAccept: true, report: { rowsRejected: 0 } });

    await admin.put(`/api/programs/${programId}/ingest-settings`).send({ maxRejectedShare: 0.1, retentionMonths: 24 }).expect(200);
    expect((await app.get(`/api/programs/${programId}/ingest-settings`).expect(200)).body).toEqual({ maxRejectedShare: 0.1, retentionMonths: 24 });
    const again = await mapExtract(app, programId, up.extract.id, TEST_MAPPING, { sourceId: strict.source!.id });
    expect(again).toMatchObject({ problem: null, canAccept: true, report: { rowsRejected: 5, maxRejectedShare: 0.1 } });
    const bad = await admin.put(`/api/programs/${programId}/ingest-settings`).send({ maxRejectedShare: 0.9, retentionMonths: 24 }).expect(400);
    expect(bad.body.error.code).toBe('validation_failed');
  });

  it('loads several periods into one set of arrays, cohort after cohort', async () => {
    const programId = await createTestProgram(db.dataSource);
    const ids: number[] = [];
    for (const [period, n] of [['2025-02', 30], ['2025-03', 20]] as const) {
      const up = await uploadExtract(app, { programId, content: toCsv(goodRows(n, period, n)), period });
      if (up.extract.status === 'uploaded') await mapExtract(app, programId, up.extract.id, TEST_MAPPING);
      await settledExtract(app, programId, up.extract.id);
      await acceptAndSettle(app, programId, up.extract.id);
      ids.push(up.extract.id);
    }
    const data = await loadObservations(db.dataSource, programId, ['2025-03', '2025-02', '2025-09']);
    expect(data.n).toBe(50);
    expect(data.cohorts.map((c) => [c.period, c.extractId, c.offset, c.length])).toEqual([
      ['2025-02', ids[0], 0, 30],
      ['2025-03', ids[1], 30, 20],
    ]);
    expect(data.missingPeriods).toEqual(['2025-09']);
    expect(Array.from(data.score.subarray(30))).toEqual(goodRows(20, '2025-03', 20).map((r) => r.score));
  });

  it('answers wrong states, unknown ids and bad bodies in plain words', async () => {
    const programId = await createTestProgram(db.dataSource);
    const up = await uploadExtract(app, { programId, content: toCsv(goodRows(20, '2025-04', 41)) });
    const early = await app.post(`/api/programs/${programId}/extracts/${up.extract.id}/accept`).send({}).expect(409);
    expect(early.body.error).toEqual({ code: 'extract_state_conflict', message: expect.stringContaining('still needs its column mapping'), details: { status: 'uploaded' } });
    await app.post(`/api/programs/${programId}/extracts/${up.extract.id}/restore`).send({}).expect(409);
    await app.get(`/api/programs/${programId}/extracts/999999`).expect(404);
    const other = await createTestProgram(db.dataSource);
    await app.get(`/api/programs/${other}/extracts/${up.extract.id}`).expect(404);
    const noFile = await app.post(`/api/programs/${programId}/extracts`).field('period', '2025-04').expect(400);
    expect(noFile.body.error.message).toMatch(/Choose a file/);
    const badPeriod = await app.post(`/api/programs/${programId}/extracts`).field('period', 'April').attach('file', Buffer.from('a,b\n1,2\n'), 'x.csv').expect(400);
    expect(badPeriod.body.error).toMatchObject({ code: 'validation_failed', message: expect.stringContaining('YYYY-MM') });
    const noSource = await app.put(`/api/programs/${programId}/extracts/${up.extract.id}/mapping`).send({ mapping: TEST_MAPPING }).expect(400);
    expect(noSource.body.error.message).toMatch(/Choose a data source/);
    await app.post(`/api/programs/${programId}/extracts/${up.extract.id}/reject`).send({}).expect(200);
    await app.post(`/api/programs/${programId}/extracts/${up.extract.id}/reject`).send({}).expect(200);
    const late = await app.put(`/api/programs/${programId}/extracts/${up.extract.id}/mapping`).send({ newSourceName: 'X', mapping: TEST_MAPPING }).expect(409);
    expect(late.body.error.message).toMatch(/was rejected/);
    expect(fs.readdirSync(ingestFiles(db).incoming())).toEqual([]);
  });
});
