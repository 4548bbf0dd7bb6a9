import ExcelJS from 'exceljs';
import { afterAll, beforeAll, describe, expect, it } from 'vitest';
import { installDemoScenario } from '@server/demo/install-demo';
import { loadObservations, observationCohortLoader } from '@server/services/observations.service';
import { acceptedExtracts } from '@server/services/recompute/accepted-extracts';
import { demoPeriods, generateDemoCohort } from '@shared/demo/heating-credit';
import { mapExtract, uploadExtract } from '../support/extracts';
import { signIn, type SignedInAgent } from '../support/sign-in';
import { buildTestApp } from '../support/test-app';
import { createTestDatabase, type TestDatabase } from '../support/test-database';

describe('the demo scenario through the ingest path', () => {
  let db: TestDatabase;
  let programId: number;
  let analyst: SignedInAgent;
  beforeAll(async () => {
    db = await createTestDatabase();
    programId = (await installDemoScenario(db.dataSource, { config: db.config })).programId;
    analyst = await signIn(buildTestApp(db), { role: 'analyst', programId });
  });
  afterAll(async () => {
    await db.drop();
  });

  it('loads all 24 months as accepted extracts of the case-management source, mapped by the saved mapping', async () => {
    const list = await analyst.get(`/api/programs/${programId}/extracts?pageSize=50`).expect(200);
    expect(list.body.total).toBe(24);
    for (const e of list.body.items) expect(e).toMatchObject({ status: 'accepted', source: { name: 'Case-management export' }, rowsRejected: 0 });
    const periods = demoPeriods();
    const data = await loadObservations(db.dataSource, programId, periods);
    expect(data.cohorts.map((c) => c.period)).toEqual(periods);
    for (const c of data.cohorts) expect(c.length).toBe(generateDemoCohort(c.period).households.length);
    // The generator's values come through unchanged (first household of the first month).
    const first = generateDemoCohort(periods[0]!).households[0]!;
    expect([data.score[0], data.takeUp![0], data.outcomes.arrears_months![0], data.covariates.household_size![0]]).toEqual([
      first.score,
      first.takeUp,
      first.arrears_months,
      first.household_size,
    ]);
    const again = await installDemoScenario(db.dataSource, { config: db.config });
    expect(again).toEqual({ installed: false, programId });
  });

  it('hands the recompute the cohorts centred on their own cutoffs', async () => {
    const extracts = await acceptedExtracts(db.dataSource.manager, programId);
    const cohorts = extracts.slice(-3).map((e) => ({ ...e, cutoff: 58 }));
    const loaded = await observationCohortLoader(db.dataSource, programId, cohorts);
    const first = generateDemoCohort(cohorts[0]!.period).households[0]!;
    expect(loaded.segments.map((s) => s.period)).toEqual(cohorts.map((c) => c.period));
    expect(loaded.data.centred[0]).toBeCloseTo(first.score - 58, 12);
    expect(loaded.data.cutoffOf[0]).toBe(58);
    expect(loaded.data.cluster).toBeInstanceOf(Int32Array);
    await expect(observationCohortLoader(db.dataSource, programId, [{ ...cohorts[0]!, extractId: 999 }])).rejects.toThrow(/changed while the recompute was planned/);
  });

  it('offers the regional office workbook, which uploads and checks cleanly once mapped', async () => {
    const res = await analyst.get(`/api/programs/${programId}/sample-extract.xlsx`).buffer(true).parse((r, done) => {
      const chunks: Buffer[] = [];
      r.on('data', (c: Buffer) => chunks.push(c));
      r.on('end', () => done(null, Buffer.concat(chunks)));
    });
    expect(res.status).toBe(200);
    const workbook = new ExcelJS.Workbook();
    const bytes = res.body as Buffer;
    await workbook.xlsx.load(bytes.buffer.slice(bytes.byteOffset, bytes.byteOffset + bytes.byteLength) as ArrayBuffer);
    expect(workbook.worksheets.map((w) => w.name)).toEqual(['Applications', 'Notes']);
    const up = await uploadExtract(analyst, { programId, content: res.body as Buffer, fileName: 'regional-office-2026-11.xlsx', period: '2026-11' });
    expect(up.extract).toMatchObject({ status: 'uploaded', format: 'xlsx', sheet: 'Applications' });
    expect(up.extract.suggestedMapping).toMatchObject({ subjectId: 'Case no.', score: 'Hardship index', applicationDate: 'Date applied', takeUp: 'Heating credit received', cluster: 'Office' });
    const report = await mapExtract(
      analyst,
      programId,
      up.extract.id,
      {
        subjectId: 'Case no.',
        score: 'Hardship index',
        takeUp: 'Heating credit received',
        takeUpValues: { yes: ['yes'], no: ['no'] },
        applicationDate: 'Date applied',
        cluster: 'Office',
        outcomes: { shutoff_6m: 'Shut-off within 6 months', arrears_months: 'Months in arrears (6 months)' },
        covariates: { household_size: 'People in household', prior_arrears: 'Arrears months, last year' },
      },
      { newSourceName: 'Regional office workbook' },
    );
    expect(report).toMatchObject({ status: 'awaiting-decision', problem: null, canAccept: true });
    expect(report.report!.rowsAccepted).toBe(generateDemoCohort('2026-11').households.length);
  });
});
