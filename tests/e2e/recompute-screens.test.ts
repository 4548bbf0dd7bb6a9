import fs from 'node:fs';
import path from 'node:path';
import { afterAll, beforeAll, describe, it } from 'vitest';
import { directorSummaryJob } from '@jobs/director-summary.job';
import type { Config } from '@server/config/env';
import { installDemoScenario } from '@server/demo/install-demo';
import { startLocalSmtp, type LocalSmtp } from '@server/dev/local-smtp/local-smtp';
import { createLogger } from '@server/lib/logger';
import { recomputeWorker } from '@server/services/recompute/recompute-worker';
import { setRecomputeWaker } from '@server/services/recompute/wake';
import { DEMO_PROGRAM } from '@shared/demo/heating-credit';
import { launchBrowser, screenshotPath } from '../support/browser';
import { signInInBrowser } from '../support/browser-sign-in';
import { startTestIdp } from '../support/local-idp';
import { testRecomputeDeps } from '../support/recompute';
import { createTestDatabase, type TestDatabase } from '../support/test-database';
import { startTestServer, type TestServer } from '../support/test-server';

describe('designs, recompute runs, sent mail and summary settings in Chromium', () => {
  let db: TestDatabase;
  let server: TestServer;
  let smtp: LocalSmtp;
  let config: Config;
  let idp: Awaited<ReturnType<typeof startTestIdp>>;
  let browser: Awaited<ReturnType<typeof launchBrowser>>;
  let programId: number;
  const mailDir = path.join(process.env.CUTLINE_VAR_DIR ?? 'var/test', `mail-e2e-${process.pid}`);

  beforeAll(async () => {
    db = await createTestDatabase();
    smtp = await startLocalSmtp({ port: 0, mailDir });
    config = { ...db.config, mail: { ...db.config.mail, transport: { kind: 'local', port: smtp.port }, mailDir } };
    programId = (await installDemoScenario(db.dataSource, { config })).programId;
    const worker = recomputeWorker(testRecomputeDeps(db));
    setRecomputeWaker(db.dataSource, () => worker.wake());
    idp = await startTestIdp();
    server = await startTestServer({ ...db, config });
    browser = await launchBrowser();
  });
  afterAll(async () => {
    setRecomputeWaker(db.dataSource, null);
    await browser?.close();
    await server?.close();
    await idp?.close();
    await smtp?.close();
    fs.rmSync(mailDir, { recursive: true, force: true });
    await db?.drop();
  });

  it('lets the analyst create a design, recompute, watch the run finish, edit, lock and see the deviation', async () => {
    const page = await browser.context.newPage();
    await signInInBrowser(page, server.url, { role: 'analyst' });
    await page.getByRole('heading', { name: DEMO_PROGRAM.name }).waitFor();
    await page.getByRole('link', { name: 'Evaluation designs' }).click();
    await page.getByText('No evaluation design yet').waitFor();
    await page.getByRole('button', { name: 'New design' }).click();
    await page.getByRole('button', { name: 'Create design' }).click();
    await page.getByRole('heading', { name: 'Main analysis plan' }).waitFor();
    await page.getByText('primary: used for results').waitFor();
    await page.screenshot({ path: screenshotPath('design-created'), fullPage: true });

    await page.goto(`${server.url}/programs/${programId}/runs`);
    await page.getByRole('cell', { name: 'Done' }).first().waitFor({ timeout: 120_000 });
    await page.screenshot({ path: screenshotPath('runs-done'), fullPage: true });
    await page.getByRole('cell', { name: /Extract accepted|Design changed/ }).first().waitFor();

    await page.goto(`${server.url}/programs/${programId}/designs`);
    await page.getByRole('link', { name: 'Main analysis plan' }).click();
    await page.getByRole('button', { name: /Lock version 1/ }).click();
    await page.getByText(/Locked .* at version 1/).waitFor();
    await page.getByRole('button', { name: 'Edit (new version)' }).click();
    await page.locator('select[name="settings.kernel"]').selectOption('epanechnikov');
    await page.getByRole('button', { name: 'Save as a new version' }).click();
    await page.getByText('This design is locked: say why it changes.').waitFor();
    await page.getByLabel(/Reason for the change/).fill('Kernel chosen to match the agency’s published method.');
    await page.getByRole('button', { name: 'Save as a new version' }).click();
    await page.getByRole('heading', { name: 'Deviations from the locked plan' }).waitFor();
    await page.getByRole('cell', { name: '1 → 2' }).waitFor();
    await page.getByRole('heading', { name: 'Compare versions' }).waitFor();
    await page.getByRole('cell', { name: 'epanechnikov' }).waitFor();
    await page.screenshot({ path: screenshotPath('design-deviation'), fullPage: true });
  });

  it('lets a director change the summary schedule, and an administrator read the sent message', async () => {
    const page = await browser.context.newPage();
    await browser.context.clearCookies();
    await signInInBrowser(page, server.url, { role: 'director' });
    await page.getByRole('link', { name: 'My summary' }).click();
    await page.getByText(/Schedule: 07:00 on the first working day of each month/).waitFor();
    await page.locator('select[name="schedule.cadence"]').selectOption('weekly');
    await page.locator('select[name="schedule.weekday"]').selectOption('3');
    await page.getByRole('button', { name: 'Save' }).click();
    await page.getByText(/Schedule: 07:00 every Wednesday/).waitFor();
    await page.screenshot({ path: screenshotPath('summary-settings'), fullPage: true });

    // The summary job at the next Wednesday 07:00 in Chicago.
    const { nextSlot } = await import('@shared/domain/summary-schedule');
    const subs: Array<{ schedule: string | object }> = await db.dataSource.query('SELECT schedule FROM summary_subscription');
    const times = subs.map((s) => nextSlot(typeof s.schedule === 'string' ? JSON.parse(s.schedule) : s.schedule, new Date()).getTime());
    await directorSummaryJob.run({ dataSource: db.dataSource, config: server.ctx.config, logger: createLogger('silent'), now: () => new Date(Math.max(...times)) });

    await browser.context.clearCookies();
    await signInInBrowser(page, server.url, { role: 'admin' });
    await page.getByRole('link', { name: 'Sent mail' }).click();
    await page.getByRole('link', { name: /Cutline summary/ }).first().click();
    await page.getByRole('tab', { name: 'Plain text' }).click();
    await page.getByText('Read with care').waitFor();
    await page.getByRole('tab', { name: 'As the reader sees it' }).click();
    await page.screenshot({ path: screenshotPath('sent-mail-message'), fullPage: true });
  });
});
