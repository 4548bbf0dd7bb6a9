import fs from 'node:fs';
import os from 'node:os';
import path from 'node:path';
import ExcelJS from 'exceljs';
import { afterAll, beforeAll, describe, expect, it } from 'vitest';
import { installDemoScenario } from '@server/demo/install-demo';
import { AuditEvent } from '@server/entities/audit-event.entity';
import { createDesign } from '@server/services/designs.service';
import { DEMO_COVARIATES, DEMO_OUTCOMES, generateDemoCohort } from '@shared/demo/heating-credit';
import { defaultDesignSettings } from '@shared/schemas/design';
import { demoCohortRows } from '../fixtures/demo-cohort-rows';
import { launchBrowser, screenshotPath } from '../support/browser';
import { signInInBrowser } from '../support/browser-sign-in';
import { startTestIdp } from '../support/local-idp';
import { storeAnalyzedResults } from '../support/stored-results';
import { createTestDatabase, type TestDatabase } from '../support/test-database';
import { startTestServer, type TestServer } from '../support/test-server';

/** The evaluator downloads the technical annex from the program screen and from one month, and a month's de-identified rows, in Chromium. */
describe('evaluator downloads the technical annex', () => {
  let db: TestDatabase;
  let server: TestServer;
  let idp: Awaited<ReturnType<typeof startTestIdp>>;
  let browser: Awaited<ReturnType<typeof launchBrowser>>;
  let programId: number;
  const saved = fs.mkdtempSync(path.join(os.tmpdir(), 'cutline-annex-download-'));

  beforeAll(async () => {
    db = await createTestDatabase();
    programId = (await installDemoScenario(db.dataSource)).programId;
    const settings = defaultDesignSettings(DEMO_OUTCOMES.map((o) => o.key), DEMO_COVARIATES.map((c) => c.key));
    const design = await createDesign(db.dataSource, programId, { userId: null, label: 'Test analyst' }, { name: 'Main analysis plan', settings, primary: true });
    await storeAnalyzedResults(db.dataSource, { programId, designId: design.id, designVersionId: design.currentVersion.id, designVersion: 1, settings, cohorts: demoCohortRows(['2026-08', '2026-09', '2026-10']) });
    idp = await startTestIdp();
    server = await startTestServer(db);
    browser = await launchBrowser();
  });
  afterAll(async () => {
    await browser?.close();
    await server?.close();
    await idp?.close();
    await db?.drop();
    fs.rmSync(saved, { recursive: true, force: true });
  });

  const summaryScopes = async (file: string) => {
    const wb = new ExcelJS.Workbook();
    await wb.xlsx.readFile(file);
    const sheet = wb.getWorksheet('Summary')!;
    const scopes: string[] = [];
    sheet.eachRow((r, n) => {
      if (n > 1) scopes.push(String(r.getCell(1).value));
    });
    return scopes;
  };

  it('saves the whole program’s workbook, then one month’s, each recorded in the audit trail', async () => {
    const page = await browser.context.newPage();
    await signInInBrowser(page, server.url, { role: 'evaluator' });
    await page.goto(`${server.url}/programs/${programId}`);
    const button = page.getByRole('button', { name: 'Technical annex, all months (Excel)' });
    await button.waitFor();
    await page.screenshot({ path: screenshotPath('annex-program-button') });
    const [download] = await Promise.all([page.waitForEvent('download'), button.click()]);
    expect(download.suggestedFilename()).toMatch(/^cutline-annex-winter-heating-credit-all-\d{8}\.xlsx$/);
    const file = path.join(saved, download.suggestedFilename());
    await download.saveAs(file);
    // 3 months and the last-3 window, two outcomes each.
    expect(await summaryScopes(file)).toHaveLength(8);
    await page.getByRole('status').filter({ hasText: `Saved ${download.suggestedFilename()}.` }).waitFor();

    await page.goto(`${server.url}/programs/${programId}/cohorts/2026-09`);
    const monthButton = page.getByRole('button', { name: 'Technical annex for this month (Excel)' });
    await monthButton.waitFor();
    const [month] = await Promise.all([page.waitForEvent('download'), monthButton.click()]);
    expect(month.suggestedFilename()).toContain('-2026-09-');
    const monthFile = path.join(saved, month.suggestedFilename());
    await month.saveAs(monthFile);
    expect(await summaryScopes(monthFile)).toEqual(['cohort:2026-09', 'cohort:2026-09']);
    await page.screenshot({ path: screenshotPath('annex-month-saved') });
    expect(await db.dataSource.getRepository(AuditEvent).countBy({ action: 'annex.download', programId })).toBe(2);

    // The month's de-identified rows, for reproducing its figures.
    const exportButton = page.getByRole('button', { name: 'De-identified data, this month (CSV, download recorded)' });
    const [rows] = await Promise.all([page.waitForEvent('download'), exportButton.click()]);
    expect(rows.suggestedFilename()).toBe('cutline-deidentified-winter-heating-credit-2026-09.csv');
    const csv = path.join(saved, rows.suggestedFilename());
    await rows.saveAs(csv);
    const lines = fs.readFileSync(csv, 'utf8').trimEnd().split('\n');
    expect(lines[0]).toBe('period,cutoff,score,score_centred,take_up,shutoff_6m,arrears_months,household_size,prior_arrears');
    expect(lines).toHaveLength(generateDemoCohort('2026-09').households.length + 1);
    expect(await db.dataSource.getRepository(AuditEvent).countBy({ action: 'export.download', programId })).toBe(1);
    await page.getByRole('status').filter({ hasText: `Saved ${rows.suggestedFilename()}.` }).waitFor();
    await page.screenshot({ path: screenshotPath('deidentified-month-saved') });
    await page.close();
  });

  it('shows a manager no annex button', async () => {
    await browser.context.clearCookies();
    const page = await browser.context.newPage();
    await signInInBrowser(page, server.url, { role: 'manager' });
    await page.goto(`${server.url}/programs/${programId}/cohorts/2026-09`);
    await page.getByRole('button', { name: 'Print this month' }).waitFor();
    expect(await page.getByRole('button', { name: /Technical annex|De-identified/ }).count()).toBe(0);
    await page.close();
  });
});
