import fs from 'node:fs';
import path from 'node:path';
import type { Page } from 'playwright-core';
import { afterAll, beforeAll, describe, expect, it } from 'vitest';
import { installDemoScenario } from '@server/demo/install-demo';
import { DEMO_PROGRAM, generateDemoCohort } from '@shared/demo/heating-credit';
import { fixtureDir, toCsv } from '../fixtures/extract-files';
import { launchBrowser, screenshotPath } from '../support/browser';
import { signInInBrowser } from '../support/browser-sign-in';
import { startTestIdp } from '../support/local-idp';
import { createTestDatabase, type TestDatabase } from '../support/test-database';
import { startTestServer, type TestServer } from '../support/test-server';

/**
 * An analyst's month in the browser: sign in, open the demo program's extracts, upload a CSV whose
 * columns Cutline has not seen (a regional office's export for November 2026), map the columns,
 * read the report, accept, and find the extract accepted in the list.
 */
describe('extract upload in Chromium', () => {
  let db: TestDatabase;
  let server: TestServer;
  let idp: Awaited<ReturnType<typeof startTestIdp>>;
  let browser: Awaited<ReturnType<typeof launchBrowser>>;
  let dir: string;
  let programId: number;
  const header = ['Case ref', 'Applied on', 'Office', 'Hardship index', 'Credit received', 'Shut-off within 6 months', 'Months in arrears', 'Household size', 'Arrears last year'];

  beforeAll(async () => {
    db = await createTestDatabase();
    programId = (await installDemoScenario(db.dataSource)).programId;
    idp = await startTestIdp();
    server = await startTestServer(db);
    browser = await launchBrowser();
    dir = fixtureDir();
  });
  afterAll(async () => {
    fs.rmSync(dir, { recursive: true, force: true });
    await browser?.close();
    await server?.close();
    await idp?.close();
    await db?.drop();
  });

  it('uploads a CSV, maps its columns, shows the report, accepts it, and lists it', async () => {
    const { households } = generateDemoCohort('2026-11');
    const rows = households.map((h) => ({
      [header[0]!]: h.caseNumber,
      [header[1]!]: h.applicationDate,
      [header[2]!]: h.office,
      [header[3]!]: h.score,
      [header[4]!]: h.takeUp ? 'Y' : 'N',
      [header[5]!]: h.shutoff_6m,
      [header[6]!]: h.arrears_months,
      [header[7]!]: h.household_size,
      [header[8]!]: h.prior_arrears,
    }));
    rows[3] = { ...rows[3]!, [header[3]!]: 'pending' };
    fs.writeFileSync(path.join(dir, 'north-office-2026-11.csv'), toCsv(rows, { header, delimiter: ';' }));

    const page = await browser.context.newPage();
    // A failing step leaves a picture of the page behind for the reader.
    try {
      await journey(page);
    } catch (err) {
      await page.screenshot({ path: screenshotPath('extracts-failure'), fullPage: true }).catch(() => undefined);
      throw err;
    }
    const [{ n }] = await db.dataSource.query("SELECT COUNT(*) AS n FROM extract WHERE program_id = ? AND period = '2026-11' AND status = 'accepted'", [programId]);
    expect(Number(n)).toBe(1);
  });

  async function journey(page: Page): Promise<void> {
    const households = generateDemoCohort('2026-11').households;
    const file = path.join(dir, 'north-office-2026-11.csv');
    await signInInBrowser(page, server.url, { role: 'analyst' });
    const card = page.getByRole('listitem').filter({ has: page.getByRole('heading', { name: DEMO_PROGRAM.name }) });
    await card.getByRole('link', { name: 'Monthly extracts' }).click();
    await page.getByRole('heading', { name: 'Monthly extracts' }).waitFor();
    // The 24 months of the demo scenario are listed (one page of 20 shown).
    await page.getByRole('navigation', { name: 'Extract pages' }).getByText('1–20 of 24').waitFor();

    await page.getByLabel('Extract file').setInputFiles(file);
    await page.getByLabel('Month the file covers').fill('2026-11');
    await page.screenshot({ path: screenshotPath('extracts-upload'), fullPage: true });
    await page.getByRole('button', { name: 'Upload' }).click();

    await page.getByRole('heading', { name: 'Column mapping' }).waitFor();
    await page.getByLabel('Data source').selectOption({ label: 'A new data source…' });
    await page.getByLabel('Name of the new data source').fill('North office export');
    await page.getByLabel('Subject identifier (pseudonymised on upload)').selectOption('Case ref');
    await page.getByLabel(/^Score/).selectOption('Hardship index');
    await page.getByLabel(/^Application date/).selectOption('Applied on');
    await page.getByLabel(/^Took part/).selectOption('Credit received');
    await page.getByLabel('Codes meaning "took part"').fill('Y');
    await page.getByLabel('Codes meaning "did not"').fill('N');
    await page.getByLabel(/^Cohort month/).selectOption({ label: 'Not in this file' });
    await page.getByLabel(/^Cluster/).selectOption('Office');
    await page.getByLabel('Outcome: Utility shut-off within 6 months').selectOption('Shut-off within 6 months');
    await page.getByLabel('Outcome: Months in arrears (next 6 months)').selectOption('Months in arrears');
    await page.getByLabel(/^Covariate: Household size/).selectOption('Household size');
    await page.getByLabel(/^Covariate: Months in arrears, prior year/).selectOption('Arrears last year');
    await page.screenshot({ path: screenshotPath('extracts-mapping'), fullPage: true });
    await page.getByRole('button', { name: 'Check the file with this mapping' }).click();

    const report = page.getByRole('region', { name: 'Validation report' });
    await report.getByText('Rows read').waitFor();
    await expect.poll(() => report.getByText(households.length.toLocaleString('en-US')).first().isVisible()).toBe(true);
    await report.getByRole('table', { name: 'Rejected rows' }).getByText('pending').waitFor();
    expect(await report.getByRole('link', { name: 'Download rejected.csv' }).getAttribute('href')).toMatch(/rejected\.csv$/);
    await page.screenshot({ path: screenshotPath('extracts-report'), fullPage: true });

    await page.getByRole('button', { name: 'Accept without the 1 rejected rows' }).click();
    await page.getByText('These rows are this month’s data.').waitFor();
    await page.screenshot({ path: screenshotPath('extracts-accepted'), fullPage: true });

    await page.getByRole('link', { name: /extracts$/ }).first().click();
    const first = page.getByRole('table', { name: 'Extracts of this program' }).getByRole('row').nth(1);
    await first.getByText('Nov 2026').waitFor();
    await first.getByText('Accepted').waitFor();
    expect(await first.getByText('north-office-2026-11.csv').isVisible()).toBe(true);
    await page.screenshot({ path: screenshotPath('extracts-list'), fullPage: true });
  }
});
