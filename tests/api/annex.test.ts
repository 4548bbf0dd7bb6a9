import JSZip from 'jszip';
import ExcelJS from 'exceljs';
import { afterAll, beforeAll, describe, expect, it } from 'vitest';
import { installDemoScenario } from '@server/demo/install-demo';
import { AuditEvent } from '@server/entities/audit-event.entity';
import { DesignVersion } from '@server/entities/design-version.entity';
import { EvaluationDesign } from '@server/entities/evaluation-design.entity';
import { OutcomeDefinition } from '@server/entities/outcome-definition.entity';
import { Program } from '@server/entities/program.entity';
import { createDesign } from '@server/services/designs.service';
import type { CohortDetailDto, CohortTrendDto, OutcomeResultDto } from '@shared/api/results';
import { DEMO_COVARIATES, DEMO_OUTCOMES, DEMO_PROGRAM } from '@shared/demo/heating-credit';
import { defaultDesignSettings } from '@shared/schemas/design';
import { demoCohortRows } from '../fixtures/demo-cohort-rows';
import { binaryBody, tableRows } from '../support/read-workbook';
import { signIn, type SignedInAgent } from '../support/sign-in';
import { storeAnalyzedResults } from '../support/stored-results';
import { buildTestApp, type TestApp } from '../support/test-app';
import { createTestDatabase, type TestDatabase } from '../support/test-database';

const PERIODS = ['2025-03', '2025-04', '2025-05', '2025-06'];
const SHEETS = ['Cover', 'Summary', 'Diagnostics', 'Binned data', 'Caveats', 'Method notes', 'Data dictionary'];

/**
 * Summary headers and where the same figure is in the API's result DTO (written out here, apart
 * from the annex code, so a wrong mapping there cannot pass unnoticed).
 */
const FIGURES: Array<[string, (r: OutcomeResultDto) => number | null | undefined]> = [
  ['Cohorts', (r) => r.scope.cohortCount],
  ['Design version', (r) => r.provenance.designVersion],
  ['Confidence level', (r) => r.level],
  ['Take-up jump (first stage)', (r) => r.firstStage?.conventional.estimate],
  ['Take-up jump SE', (r) => r.firstStage?.conventional.se],
  ['First-stage F', (r) => r.firstStage?.f],
  ['Take-up jump robust CI low', (r) => r.firstStage?.robust.ciLow],
  ['Take-up jump robust CI high', (r) => r.firstStage?.robust.ciHigh],
  ['ITT jump', (r) => r.itt?.conventional.estimate],
  ['ITT SE', (r) => r.itt?.conventional.se],
  ['ITT CI low', (r) => r.itt?.conventional.ciLow],
  ['ITT CI high', (r) => r.itt?.conventional.ciHigh],
  ['ITT robust CI low', (r) => r.itt?.robust.ciLow],
  ['ITT robust CI high', (r) => r.itt?.robust.ciHigh],
  ['ITT robust p', (r) => r.itt?.robust.p],
  ['Complier effect (conventional)', (r) => r.effect?.conventional.estimate],
  ['Complier effect SE (conventional)', (r) => r.effect?.conventional.se],
  ['Complier effect CI low (conventional)', (r) => r.effect?.conventional.ciLow],
  ['Complier effect CI high (conventional)', (r) => r.effect?.conventional.ciHigh],
  ['Complier effect p (conventional)', (r) => r.effect?.conventional.p],
  ['Complier effect robust bias-corrected', (r) => r.effect?.robust.estimate],
  ['Complier effect robust SE', (r) => r.effect?.robust.se],
  ['Complier effect robust CI low', (r) => r.effect?.robust.ciLow],
  ['Complier effect robust CI high', (r) => r.effect?.robust.ciHigh],
  ['Complier effect robust p', (r) => r.effect?.robust.p],
  ['Bandwidth h (score)', (r) => r.bandwidth?.h],
  ['Bias bandwidth b (score)', (r) => r.bandwidth?.b],
  ['h, ineligible side', (r) => r.bandwidth?.hIneligible],
  ['h, eligible side', (r) => r.bandwidth?.hEligible],
  ['n ineligible side', (r) => r.n?.ineligible],
  ['n eligible side', (r) => r.n?.eligible],
  ['Effective n ineligible (weight > 0)', (r) => r.n?.usedIneligible],
  ['Effective n eligible (weight > 0)', (r) => r.n?.usedEligible],
  ['Left out by the donut', (r) => r.n?.droppedByDonut],
  ['Caveats', (r) => r.caveats.length],
  ['Deviations from the locked plan', (r) => r.deviationCount],
  ['Run', (r) => r.provenance.runId],
];

describe('technical annex', () => {
  let db: TestDatabase;
  let t: TestApp;
  let programId: number;
  let evaluator: SignedInAgent;
  const settings = defaultDesignSettings(
    DEMO_OUTCOMES.map((o) => o.key),
    DEMO_COVARIATES.map((c) => c.key),
  );

  const download = (agent: SignedInAgent, path: string) => agent.get(path).buffer(true).parse(binaryBody);
  const open = async (body: Buffer) => {
    const wb = new ExcelJS.Workbook();
    await wb.xlsx.load(body as unknown as ExcelJS.Buffer);
    return wb;
  };

  beforeAll(async () => {
    db = await createTestDatabase();
    programId = (await installDemoScenario(db.dataSource)).programId;
    t = buildTestApp(db);
    const design = await createDesign(db.dataSource, programId, { userId: null, label: 'Test analyst' }, { name: 'Main analysis plan', settings, primary: true });
    await storeAnalyzedResults(db.dataSource, {
      programId,
      designId: design.id,
      designVersionId: design.currentVersion.id,
      designVersion: design.currentVersion.version,
      settings,
      cohorts: demoCohortRows(PERIODS),
    });
    evaluator = await signIn(t, { role: 'evaluator', programId, displayName: 'Kofi Test-Evaluator' });
  });
  afterAll(async () => {
    await db?.drop();
  });

  it('streams a workbook with every sheet, named after the program and day', async () => {
    const res = await download(evaluator, `/api/programs/${programId}/annex`).expect(200);
    expect(res.headers['content-type']).toBe('application/vnd.openxmlformats-officedocument.spreadsheetml.sheet');
    expect(res.headers['content-disposition']).toMatch(/^attachment; filename="cutline-annex-winter-heating-credit-all-\d{8}\.xlsx"$/);
    expect(res.headers['cache-control']).toBe('no-store');
    const wb = await open(res.body as Buffer);
    expect(wb.worksheets.map((s) => s.name)).toEqual(SHEETS);
    const cover = wb.getWorksheet('Cover')!;
    const coverText = (label: string) => {
      for (let r = 1; r <= cover.rowCount; r++) if (cover.getCell(r, 1).value === label) return cover.getCell(r, 2).value;
      return undefined;
    };
    expect(coverText('Generated by')).toBe('Kofi Test-Evaluator');
    expect(coverText('Period covered')).toBe('2025-03 to 2025-06');
    expect(coverText('Design versions used by these results')).toBe('1');
    expect(String(coverText('Caution 3'))).toContain('not for judging or deciding about any individual');
  });

  it('puts in Summary, as numbers, exactly the figures the API answers for the same cohort and window', async () => {
    const res = await download(evaluator, `/api/programs/${programId}/annex`).expect(200);
    const summary = (await open(res.body as Buffer)).getWorksheet('Summary')!;
    expect(summary.views[0]).toMatchObject({ state: 'frozen', ySplit: 1, xSplit: 2 });
    expect(summary.autoFilter).toMatch(/^A1:[A-Z]+1$/);

    const fromApi = new Map<string, OutcomeResultDto>();
    for (const period of PERIODS) {
      const detail = (await evaluator.get(`/api/programs/${programId}/results/cohorts/${period}`).expect(200)).body as CohortDetailDto;
      for (const o of detail.outcomes) fromApi.set(`${o.scope.key}|${o.outcome.key}`, o);
    }
    for (const o of DEMO_OUTCOMES) {
      const trend = (await evaluator.get(`/api/programs/${programId}/results/trend?outcome=${o.key}`).expect(200)).body as CohortTrendDto;
      for (const w of trend.windows) fromApi.set(`${w.scope.key}|${w.outcome.key}`, w);
    }
    const rows = tableRows(summary);
    // 4 cohorts + last-3 + previous-3, two outcomes each.
    expect(rows).toHaveLength(12);
    expect(fromApi.size).toBe(12);
    let compared = 0;
    for (const row of rows) {
      const key = `${row.get('Scope')!.value}|${row.get('Outcome')!.value}`;
      const dto = fromApi.get(key);
      expect(dto, key).toBeDefined();
      for (const [header, read] of FIGURES) {
        const cell = row.get(header);
        expect(cell, header).toBeDefined();
        const expected = read(dto!);
        if (expected === null || expected === undefined) {
          expect(cell!.value, `${key} ${header}`).toBeNull();
          continue;
        }
        expect(cell!.type, `${key} ${header}`).toBe(ExcelJS.ValueType.Number);
        // Full double precision: the very same IEEE-754 value, not a rounded or printed one.
        expect(Object.is(cell!.value, expected), `${key} ${header}: ${String(cell!.value)} vs ${expected}`).toBe(true);
        compared++;
      }
      expect(row.get('Kernel')!.value).toBe('triangular');
      expect(row.get('Order p')!.value).toBe(1);
      expect(row.get('Variance estimator')!.value).toBe('hc3');
      if (dto!.scope.kind === 'cohort') expect(row.get('Cutoff (score)')!.value).toBe(dto!.scope.periods[0]!.cutoff);
    }
    expect(compared).toBeGreaterThan(12 * 30);
    // No number hides in a text cell anywhere in Summary.
    summary.eachRow((r, n) => {
      if (n === 1) return;
      r.eachCell((c) => {
        if (typeof c.value === 'string') expect(c.value.trim() === '' || Number.isNaN(Number(c.value)), `${c.address} "${c.value}"`).toBe(true);
      });
    });
  });

  it('lists the diagnostics, chart points and caveats of every cohort and pooled window', async () => {
    const res = await download(evaluator, `/api/programs/${programId}/annex`).expect(200);
    const wb = await open(res.body as Buffer);
    const bins = tableRows(wb.getWorksheet('Binned data')!);
    const detail = (await evaluator.get(`/api/programs/${programId}/results/cohorts/2025-04`).expect(200)).body as CohortDetailDto;
    const plotBins = bins.filter((b) => b.get('Scope')!.value === 'cohort:2025-04' && b.get('Outcome')!.value === 'shutoff_6m' && String(b.get('Chart')!.value).startsWith('plot bins'));
    const stored = detail.outcomes.find((o) => o.outcome.key === 'shutoff_6m')!.bins;
    expect(plotBins).toHaveLength(stored.length);
    plotBins.forEach((b, i) => {
      expect(b.get('Score low (score − cutoff)')!.value).toBe(stored[i]!.low);
      expect(b.get('Observations')!.value).toBe(stored[i]!.n);
      expect(b.get('Mean outcome')!.value).toBe(stored[i]!.outcomeMean);
    });
    // The balance block of Diagnostics: the stored balance rows of each outcome, as numbers.
    const diagnostics = wb.getWorksheet('Diagnostics')!;
    let balanceHeader = 0;
    diagnostics.eachRow((r, n) => {
      if (r.getCell(3).value === 'Covariate') balanceHeader = n;
    });
    expect(balanceHeader).toBeGreaterThan(0);
    const balance = tableRows(diagnostics, balanceHeader).filter((b) => b.get('Scope')!.value === 'cohort:2025-04');
    const apiBalance = detail.outcomes.flatMap((o) => ((o.diagnostics?.balance ?? []) as Array<{ covariate: string; jump: number; pAdjusted: number }>).map((b) => ({ outcome: o.outcome.key, ...b })));
    expect(apiBalance.length).toBeGreaterThan(0);
    expect(balance.map((b) => [b.get('Outcome')!.value, b.get('Covariate')!.value, b.get('Jump')!.value, b.get('Holm-adjusted p')!.value])).toEqual(apiBalance.map((b) => [b.outcome, b.covariate, b.jump, b.pAdjusted]));
    // Pooled windows carry their stored diagnostics too.
    expect(tableRows(diagnostics, balanceHeader).some((b) => String(b.get('Scope')!.value).startsWith('window:'))).toBe(true);
    const fits = bins.filter((b) => b.get('Scope')!.value === 'cohort:2025-04' && b.get('Chart')!.value === 'outcome, fitted line');
    expect(fits.length).toBeGreaterThan(0);
    const caveats = tableRows(wb.getWorksheet('Caveats')!);
    const apiCaveats = detail.outcomes.flatMap((o) => o.caveats.map((c) => `${o.outcome.key}|${c.code}|${c.message}`));
    const sheetCaveats = caveats.filter((c) => c.get('Scope')!.value === 'cohort:2025-04').map((c) => `${c.get('Outcome')!.value}|${c.get('Code')!.value}|${c.get('Message')!.value}`);
    expect(sheetCaveats).toEqual(apiCaveats);
    const method = wb.getWorksheet('Method notes')!;
    const text: string[] = [];
    method.eachRow((r) => text.push(String(r.getCell(1).value ?? '')));
    expect(text.join('\n')).toContain('Calonico, S., Cattaneo, M. D. & Titiunik, R. (2014)');
    expect(text.join('\n')).toMatch(/npm run --silent estimate -- --input cutline-deidentified-winter-heating-credit-2025-03\.csv --score score --cutoff 60 /);
  });

  it('gives one cohort’s annex from the cohort screen', async () => {
    const res = await download(evaluator, `/api/programs/${programId}/annex?period=2025-05`).expect(200);
    expect(res.headers['content-disposition']).toContain('cutline-annex-winter-heating-credit-2025-05-');
    const rows = tableRows((await open(res.body as Buffer)).getWorksheet('Summary')!);
    expect(rows.map((r) => `${r.get('Scope')!.value}|${r.get('Outcome')!.value}`)).toEqual(['cohort:2025-05|shutoff_6m', 'cohort:2025-05|arrears_months']);
    const missing = await evaluator.get(`/api/programs/${programId}/annex?period=2023-01`).expect(404);
    expect(missing.body.error.code).toBe('result_not_found');
    const bad = await evaluator.get(`/api/programs/${programId}/annex?period=May`).expect(400);
    expect(bad.body.error.code).toBe('validation_failed');
  });

  it('writes labels and values that begin with =, +, - or @ as literal text, never as formulas', async () => {
    const repo = db.dataSource.getRepository(OutcomeDefinition);
    await repo.update({ programId, key: 'shutoff_6m' }, { label: '=HYPERLINK("http://example.invalid","click")' });
    await repo.update({ programId, key: 'arrears_months' }, { unit: '+1+2' });
    const design = await db.dataSource.getRepository(EvaluationDesign).findOneByOrFail({ programId });
    await db.dataSource.getRepository(EvaluationDesign).update({ id: design.id }, { name: '@SUM(A1:A9)' });
    const version = await db.dataSource.getRepository(DesignVersion).findOneByOrFail({ designId: design.id, version: 1 });
    await db.dataSource.getRepository(DesignVersion).update({ id: version.id }, { settings: { ...version.settings, takeUp: { ...version.settings.takeUp, description: '-2+3 cmd|calc' } } });
    const person = await signIn(t, { role: 'evaluator', programId, displayName: '=cmd|"/c calc"!A1' });
    try {
      const res = await download(person, `/api/programs/${programId}/annex`).expect(200);
      const wb = await open(res.body as Buffer);
      const cells: ExcelJS.Cell[] = [];
      wb.eachSheet((s) => s.eachRow((r) => r.eachCell((c) => cells.push(c))));
      const find = (text: string) => cells.filter((c) => c.value === text);
      for (const text of ['=HYPERLINK("http://example.invalid","click")', '+1+2', '-2+3 cmd|calc', '=cmd|"/c calc"!A1']) {
        expect(find(text).length, text).toBeGreaterThan(0);
        for (const c of find(text)) expect(c.type, `${c.worksheet.name}!${c.address}`).toBe(ExcelJS.ValueType.String);
      }
      expect(cells.some((c) => typeof c.value === 'string' && c.value.includes('@SUM(A1:A9)'))).toBe(true);
      expect(cells.filter((c) => c.type === ExcelJS.ValueType.Formula)).toEqual([]);
      // And in the file itself: no sheet holds a single formula element.
      const zip = await JSZip.loadAsync(res.body as Buffer);
      const sheets = Object.keys(zip.files).filter((f) => /^xl\/worksheets\/sheet\d+\.xml$/.test(f));
      expect(sheets).toHaveLength(SHEETS.length);
      for (const f of sheets) expect(await zip.file(f)!.async('string')).not.toMatch(/<f[ >]/);
    } finally {
      await repo.update({ programId, key: 'shutoff_6m' }, { label: DEMO_OUTCOMES[0]!.label });
      await repo.update({ programId, key: 'arrears_months' }, { unit: DEMO_OUTCOMES[1]!.unit });
      await db.dataSource.getRepository(EvaluationDesign).update({ id: design.id }, { name: design.name });
      await db.dataSource.getRepository(DesignVersion).update({ id: version.id }, { settings: version.settings });
    }
  });

  it('refuses roles without permission and records every download in the audit trail', async () => {
    const before = await db.dataSource.getRepository(AuditEvent).countBy({ action: 'annex.download' });
    for (const role of ['manager', 'director'] as const) {
      const agent = await signIn(t, { role, programId });
      const res = await agent.get(`/api/programs/${programId}/annex`).expect(403);
      expect(res.body.error.code).toBe('forbidden');
    }
    const other = await db.dataSource.getRepository(Program).save(db.dataSource.getRepository(Program).create({ ...DEMO_PROGRAM, slug: 'other-program', name: 'Other program' }));
    const elsewhere = await signIn(t, { role: 'evaluator', programId: other.id });
    await elsewhere.get(`/api/programs/${programId}/annex`).expect(403);
    const nobody = await signIn(t, {});
    await nobody.get(`/api/programs/${programId}/annex`).expect(403);
    expect(await db.dataSource.getRepository(AuditEvent).countBy({ action: 'annex.download' })).toBe(before);

    for (const role of ['analyst', 'admin'] as const) {
      const agent = await signIn(t, { role, programId: role === 'admin' ? null : programId });
      await download(agent, `/api/programs/${programId}/annex?period=2025-04`).expect(200);
    }
    await download(evaluator, `/api/programs/${programId}/annex?period=2025-06`).expect(200);
    const events = await db.dataSource.getRepository(AuditEvent).find({ where: { action: 'annex.download' }, order: { id: 'DESC' }, take: 3 });
    expect(events).toHaveLength(3);
    expect(events[0]).toMatchObject({ actorUserId: evaluator.me.user.id, programId, subjectType: 'annex', subjectId: '2025-06' });
    expect(events[0]!.details).toMatchObject({ period: '2025-06', results: 2, designVersions: [1] });
  });
});
