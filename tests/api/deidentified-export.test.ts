import { spawnSync } from 'node:child_process';
import fs from 'node:fs';
import os from 'node:os';
import path from 'node:path';
import ExcelJS from 'exceljs';
import { afterAll, beforeAll, describe, expect, it } from 'vitest';
import { REPO_ROOT } from '@server/config/env';
import { CASE_MANAGEMENT_MAPPING, writeCaseManagementCsv } from '@server/demo/demo-files';
import { AuditEvent } from '@server/entities/audit-event.entity';
import { CovariateDefinition } from '@server/entities/covariate-definition.entity';
import { CutoffChange } from '@server/entities/cutoff-change.entity';
import { OutcomeDefinition } from '@server/entities/outcome-definition.entity';
import { Program } from '@server/entities/program.entity';
import { createLogger } from '@server/lib/logger';
import { observationCohortLoader } from '@server/services/observations.service';
import { engineAnalyzer } from '@server/services/recompute/engine-analyzer';
import { processRecomputeQueue } from '@server/services/recompute/run-recompute';
import { DEMO_COVARIATES, DEMO_CUTOFF_SCHEDULE, DEMO_OUTCOMES, DEMO_PROGRAM, generateDemoCohort } from '@shared/demo/heating-credit';
import { defaultDesignSettings, type DesignSettings } from '@shared/schemas/design';
import { acceptAndSettle, mapExtract, settledExtract, uploadExtract } from '../support/extracts';
import { binaryBody, tableRows } from '../support/read-workbook';
import { signIn, type SignedInAgent } from '../support/sign-in';
import { buildTestApp, type TestApp } from '../support/test-app';
import { createTestDatabase, type TestDatabase } from '../support/test-database';

/** Four months around the demo's cutoff change (60, then 58 from 2025-11), through the real ingest path. */
const PERIODS = ['2025-09', '2025-10', '2025-11', '2025-12'];

/**
 * Agreement between the workbook and the command line on the export: identity up to rounding. The
 * export lists applicants in value order, the recompute in file order, so sums are taken in another
 * order; through the data-driven bandwidth the figures then differ from the 11th significant digit
 * on (seen: relative 1e-12 to 1e-11 on these months). 1e-9 leaves room and is still far below
 * anything the Summary shows (4 decimals).
 */
const RELATIVE = 1e-9;
const close = (a: number, b: number) => Math.abs(a - b) <= RELATIVE * Math.max(1, Math.abs(a), Math.abs(b));

describe('the de-identified export and reproducing the annex from it', () => {
  let db: TestDatabase;
  let t: TestApp;
  let programId: number;
  let analyst: SignedInAgent;
  let evaluator: SignedInAgent;
  const dir = fs.mkdtempSync(path.join(os.tmpdir(), 'cutline-export-'));

  const download = (agent: SignedInAgent, p: string) => agent.get(p).buffer(true).parse(binaryBody);
  const recompute = async () => {
    const deps = { dataSource: db.dataSource, config: db.config, logger: createLogger('silent'), analyzer: engineAnalyzer, loadCohorts: observationCohortLoader, now: () => new Date(), retryBaseMs: 30_000 };
    for (const report of await processRecomputeQueue(deps)) expect(report.outcome, `run ${report.runId}`).toMatch(/succeeded|up-to-date/);
  };
  const annex = async () => {
    const res = await download(evaluator, `/api/programs/${programId}/annex`).expect(200);
    const wb = new ExcelJS.Workbook();
    await wb.xlsx.load(res.body as ExcelJS.Buffer);
    return wb;
  };

  beforeAll(async () => {
    db = await createTestDatabase();
    t = buildTestApp(db);
    const program = await db.dataSource.getRepository(Program).save(db.dataSource.getRepository(Program).create({ ...DEMO_PROGRAM, slug: 'heating-credit-export' }));
    programId = program.id;
    await db.dataSource.getRepository(CutoffChange).insert(DEMO_CUTOFF_SCHEDULE.map((c) => ({ ...c, programId })));
    await db.dataSource.getRepository(OutcomeDefinition).insert(DEMO_OUTCOMES.map((o, i) => ({ ...o, programId, position: i + 1 })));
    await db.dataSource.getRepository(CovariateDefinition).insert(DEMO_COVARIATES.map((c, i) => ({ ...c, programId, position: i + 1 })));
    analyst = await signIn(t, { role: 'analyst', programId });
    evaluator = await signIn(t, { role: 'evaluator', programId, displayName: 'Test Evaluator' });
    let sourceId: number | undefined;
    for (const period of PERIODS) {
      const file = path.join(dir, `case-management-${period}.csv`);
      writeCaseManagementCsv(file, period);
      const uploaded = await uploadExtract(analyst, { programId, period, content: fs.readFileSync(file), fileName: path.basename(file), ...(sourceId ? { sourceId } : {}) });
      // The first month is mapped by hand; the saved mapping then recognises the others.
      const mapped = sourceId ? await settledExtract(analyst, programId, uploaded.extract.id) : await mapExtract(analyst, programId, uploaded.extract.id, CASE_MANAGEMENT_MAPPING, { newSourceName: 'Case-management export' });
      sourceId ??= mapped.source?.id;
      const accepted = await acceptAndSettle(analyst, programId, uploaded.extract.id);
      expect(accepted.status).toBe('accepted');
    }
    const settings = defaultDesignSettings(DEMO_OUTCOMES.map((o) => o.key), DEMO_COVARIATES.map((c) => c.key));
    await analyst.post(`/api/programs/${programId}/designs`).send({ name: 'Main analysis plan', settings }).expect(201);
    await recompute();
  });
  afterAll(async () => {
    fs.rmSync(dir, { recursive: true, force: true });
    await db?.drop();
  });

  it('writes one row per applicant with the documented columns and nothing that identifies anyone', async () => {
    const res = await download(evaluator, `/api/programs/${programId}/exports/deidentified?from=2025-10&to=2025-10`).expect(200);
    expect(res.headers['content-type']).toBe('text/csv; charset=utf-8');
    expect(res.headers['content-disposition']).toBe('attachment; filename="cutline-deidentified-heating-credit-export-2025-10.csv"');
    const text = (res.body as Buffer).toString('utf8');
    const [header, ...rows] = text.trimEnd().split('\n');
    expect(header).toBe('period,cutoff,score,score_centred,take_up,shutoff_6m,arrears_months,household_size,prior_arrears');
    const households = generateDemoCohort('2025-10').households;
    expect(rows).toHaveLength(households.length);
    // No case number, no application date, no office, in any form.
    for (const h of households.slice(0, 50)) expect(text).not.toContain(h.caseNumber);
    expect(text).not.toMatch(/HV-\d|\d{4}-\d{2}-\d{2}|north|river|market|hillside|station|orchard/);
    // In value order (score first), so the uploaded file's order cannot be read back.
    const scores = rows.map((r) => Number(r.split(',')[2]));
    expect(scores).toEqual([...scores].sort((a, b) => a - b));
    expect(scores).not.toEqual(households.map((h) => h.score));
    // The same applicants and values, as a multiset.
    const key = (v: Array<number | string>) => v.join(',');
    const expected = households.map((h) => key(['2025-10', 60, h.score, h.score - 60, h.takeUp, h.shutoff_6m, h.arrears_months, h.household_size, h.prior_arrears])).sort();
    expect([...rows].sort()).toEqual(expected);

    const audit = await db.dataSource.getRepository(AuditEvent).findOneOrFail({ where: { action: 'export.download', programId }, order: { id: 'DESC' } });
    expect(audit).toMatchObject({ actorUserId: evaluator.me.user.id, subjectType: 'deidentified-export', subjectId: '2025-10..2025-10' });
    expect(audit.details).toMatchObject({ from: '2025-10', to: '2025-10', cohorts: 1, rows: households.length });
  });

  it('reproduces a cohort’s estimate and robust interval with the command line and the design on the Cover sheet', async () => {
    const wb = await annex();
    const settings = coverSettings(wb.getWorksheet('Cover')!);
    expect(settings).toMatchObject({ kernel: 'triangular', order: 1, bandwidthRule: 'mse', variance: 'hc3', level: 0.95, donutRadius: 0 });
    const row = summaryRow(wb, 'cohort:2025-10', 'shutoff_6m');
    const file = await saveExport('2025-10', '2025-10');
    const args = ['--input', file, '--score', 'score', '--cutoff', String(row.get('Cutoff (score)')!.value), '--eligible', 'at-or-above', '--outcome', 'shutoff_6m', '--takeup', 'take_up', ...designFlags(settings)];
    // The command in the Summary row is exactly this one (with the file name the export is saved under).
    expect(String(row.get('Reproduce with (from the de-identified export)')!.value)).toBe(`npm run --silent estimate -- ${args.join(' ').replace(file, path.basename(file))}`);
    expectSameFigures(row, runEstimate(args));
  });

  it('reproduces a pooled window across the cutoff change on the centred score', async () => {
    const wb = await annex();
    const row = summaryRow(wb, 'window:last-3', 'arrears_months');
    expect([row.get('Lowest cutoff pooled')!.value, row.get('Highest cutoff pooled')!.value]).toEqual([58, 60]);
    const command = String(row.get('Reproduce with (from the de-identified export)')!.value);
    expect(command).toContain('--input cutline-deidentified-heating-credit-export-2025-10-to-2025-12.csv --score score_centred --cutoff 0 ');
    const file = await saveExport('2025-10', '2025-12');
    expectSameFigures(row, runEstimate(commandArgs(command, file)));
  });

  it('reproduces clustered standard errors and a donut after the design changes', async () => {
    const [design] = (await analyst.get(`/api/programs/${programId}/designs`).expect(200)).body.items;
    const changed: DesignSettings = { ...design.currentVersion.settings, variance: 'hc1', cluster: 'cluster-column', donutRadius: 0.3, kernel: 'epanechnikov' };
    await analyst.post(`/api/programs/${programId}/designs/${design.id}/versions`).send({ settings: changed }).expect(201);
    await recompute();
    const wb = await annex();
    expect(coverSettings(wb.getWorksheet('Cover')!, 2)).toMatchObject({ variance: 'hc1', kernel: 'epanechnikov', donutRadius: 0.3 });
    const row = summaryRow(wb, 'cohort:2025-11', 'shutoff_6m');
    expect(row.get('Design version')!.value).toBe(2);
    const command = String(row.get('Reproduce with (from the de-identified export)')!.value);
    expect(command).toContain('--variance hc1 --level 0.95 --missing skip --cluster cluster --donut 0.3');
    const file = await saveExport('2025-11', '2025-11');
    expect(fs.readFileSync(file, 'utf8').split('\n')[0]!.endsWith(',cluster')).toBe(true);
    const out = runEstimate(commandArgs(command, file));
    expectSameFigures(row, out);
    expect(out.n.clusters).toBe(row.get('Clusters')!.value);
    expect(out.input.droppedByDonut).toBe(row.get('Left out by the donut')!.value);

    // The Data dictionary names the extract's columns behind each export column, and what is never exported.
    const dictionary = wb.getWorksheet('Data dictionary')!;
    let mappingHeader = 0;
    dictionary.eachRow((r, n) => {
      if (r.getCell(1).value === 'Cohort') mappingHeader = n;
    });
    const mappings = tableRows(dictionary, mappingHeader);
    expect(mappings.map((m) => m.get('Cohort')!.value)).toEqual(PERIODS);
    expect(mappings[0]!.get('score')!.value).toBe('hardship_index');
    expect(mappings[0]!.get('cluster')!.value).toBe('office');
    expect(mappings[0]!.get('Not exported')!.value).toBe('case_number, application_date');
  });

  it('lets only evaluators download it, and refuses an empty range in plain words', async () => {
    const before = await db.dataSource.getRepository(AuditEvent).countBy({ action: 'export.download' });
    for (const role of ['admin', 'analyst', 'manager', 'director'] as const) {
      const agent = await signIn(t, { role, programId: role === 'admin' ? null : programId });
      expect((await agent.get(`/api/programs/${programId}/exports/deidentified`).expect(403)).body.error.code).toBe('forbidden');
    }
    const empty = await evaluator.get(`/api/programs/${programId}/exports/deidentified?from=2024-01&to=2024-03`).expect(404);
    expect(empty.body.error).toMatchObject({ code: 'export_no_observations' });
    expect(empty.body.error.message).toContain('2024-01 to 2024-03');
    const half = await evaluator.get(`/api/programs/${programId}/exports/deidentified?from=2025-10`).expect(400);
    expect(half.body.error.code).toBe('validation_failed');
    expect(await db.dataSource.getRepository(AuditEvent).countBy({ action: 'export.download' })).toBe(before);
    const all = await download(evaluator, `/api/programs/${programId}/exports/deidentified`).expect(200);
    expect(all.headers['content-disposition']).toContain('heating-credit-export-2025-09-to-2025-12.csv');
  });

  /** Saves the export of a range under the file name the annex's commands use. */
  async function saveExport(from: string, to: string): Promise<string> {
    const res = await download(evaluator, `/api/programs/${programId}/exports/deidentified?from=${from}&to=${to}`).expect(200);
    const name = /filename="([^"]+)"/.exec(String(res.headers['content-disposition']))![1]!;
    const file = path.join(dir, name);
    fs.writeFileSync(file, res.body as Buffer);
    return file;
  }
});

/** The design settings as the Cover sheet records them, from the column of design version `version`. */
function coverSettings(cover: ExcelJS.Worksheet, version = 1): Record<string, unknown> {
  const rows = new Map<string, unknown>();
  let column = 0;
  cover.eachRow((r) => {
    const label = r.getCell(1).value;
    if (label === 'Setting') {
      r.eachCell((c, n) => {
        if (String(c.value).startsWith(`Version ${version} `)) column = n;
      });
    } else if (column > 0 && typeof label === 'string') rows.set(label, r.getCell(column).value);
  });
  expect(column, `version ${version} on the Cover sheet`).toBeGreaterThan(0);
  return {
    kernel: rows.get('Kernel'),
    order: rows.get('Local polynomial order p'),
    bandwidthRule: rows.get('Bandwidth rule'),
    bandwidthValue: rows.get('Fixed bandwidth (score)') ?? null,
    variance: rows.get('Variance estimator'),
    cluster: rows.get('Clustered by') === 'none' ? 'none' : 'cluster-column',
    level: rows.get('Confidence level'),
    donutRadius: rows.get('Donut radius (score)'),
  };
}

/** The command's flags for a design, from the Cover sheet's record of it. */
function designFlags(s: Record<string, unknown>): string[] {
  const flags = ['--kernel', String(s.kernel), '--order', String(s.order)];
  flags.push(...(s.bandwidthRule === 'fixed' ? ['--bandwidth', String(s.bandwidthValue)] : ['--bandwidth-rule', String(s.bandwidthRule)]));
  flags.push('--variance', String(s.variance), '--level', String(s.level), '--missing', 'skip');
  if (s.cluster === 'cluster-column') flags.push('--cluster', 'cluster');
  if (Number(s.donutRadius) > 0) flags.push('--donut', String(s.donutRadius));
  return flags;
}

function summaryRow(wb: ExcelJS.Workbook, scope: string, outcome: string): Map<string, ExcelJS.Cell> {
  const row = tableRows(wb.getWorksheet('Summary')!).find((r) => r.get('Scope')!.value === scope && r.get('Outcome')!.value === outcome);
  expect(row, `${scope} ${outcome}`).toBeDefined();
  return row!;
}

/** The arguments of a Summary command, with the export saved at `file`. */
function commandArgs(command: string, file: string): string[] {
  const args = command.replace(/^npm run --silent estimate -- /, '').split(' ');
  args[args.indexOf('--input') + 1] = file;
  return args;
}

interface EstimateOutput {
  input: { droppedByDonut: number };
  n: { usedIneligible: number; usedEligible: number; clusters: number | null };
  bandwidth: { h: number; b: number };
  firstStage: { jump: number; se: number; f: number };
  itt: { jump: number };
  effect: { estimate: number; se: number; robust: { estimate: number; se: number; ciLow: number; ciHigh: number; p: number } };
}

/** Runs the command line exactly as an evaluator would: `npm run --silent estimate -- …` in the repository. */
function runEstimate(args: string[]): EstimateOutput {
  const run = spawnSync('npm', ['run', '--silent', 'estimate', '--', ...args], { cwd: REPO_ROOT, encoding: 'utf8' });
  expect(run.stderr).toBe('');
  expect(run.status).toBe(0);
  return JSON.parse(run.stdout) as EstimateOutput;
}

function expectSameFigures(row: Map<string, ExcelJS.Cell>, out: EstimateOutput): void {
  const pairs: Array<[string, number]> = [
    ['Complier effect (conventional)', out.effect.estimate],
    ['Complier effect SE (conventional)', out.effect.se],
    ['Complier effect robust bias-corrected', out.effect.robust.estimate],
    ['Complier effect robust SE', out.effect.robust.se],
    ['Complier effect robust CI low', out.effect.robust.ciLow],
    ['Complier effect robust CI high', out.effect.robust.ciHigh],
    ['Complier effect robust p', out.effect.robust.p],
    ['Take-up jump (first stage)', out.firstStage.jump],
    ['First-stage F', out.firstStage.f],
    ['ITT jump', out.itt.jump],
    ['Bandwidth h (score)', out.bandwidth.h],
    ['Bias bandwidth b (score)', out.bandwidth.b],
  ];
  for (const [header, value] of pairs) {
    const cell = row.get(header)!;
    expect(cell.type, header).toBe(ExcelJS.ValueType.Number);
    expect(close(cell.value as number, value), `${header}: workbook ${String(cell.value)}, command line ${value}`).toBe(true);
  }
  expect(row.get('Effective n ineligible (weight > 0)')!.value).toBe(out.n.usedIneligible);
  expect(row.get('Effective n eligible (weight > 0)')!.value).toBe(out.n.usedEligible);
}
