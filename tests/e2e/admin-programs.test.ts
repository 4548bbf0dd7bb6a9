import { afterAll, beforeAll, describe, expect, it } from 'vitest';
import { installDemoScenario } from '@server/demo/install-demo';
import type { ProgramDetailDto } from '@shared/api/programs';
import { launchBrowser, screenshotPath } from '../support/browser';
import { signInInBrowser } from '../support/browser-sign-in';
import { installDemoResults } from '../support/demo-results';
import { startTestIdp } from '../support/local-idp';
import { signIn } from '../support/sign-in';
import { createTestDatabase, type TestDatabase } from '../support/test-database';
import { startTestServer, type TestServer } from '../support/test-server';

/** The administrator's program screens in Chromium: change the cutoff schedule and outcomes, create a program. */
describe('administrator sets up programs', () => {
  let db: TestDatabase;
  let server: TestServer;
  let idp: Awaited<ReturnType<typeof startTestIdp>>;
  let browser: Awaited<ReturnType<typeof launchBrowser>>;
  let programId: number;

  beforeAll(async () => {
    db = await createTestDatabase();
    programId = (await installDemoScenario(db.dataSource)).programId;
    await installDemoResults(db.dataSource, programId);
    idp = await startTestIdp();
    server = await startTestServer(db);
    browser = await launchBrowser();
  });
  afterAll(async () => {
    await browser?.close();
    await server?.close();
    await idp?.close();
    await db?.drop();
  });

  it('adds a cutoff change and an outcome, then creates a program', async () => {
    const api = await signIn(server, { role: 'admin' });
    const page = await browser.context.newPage();
    await signInInBrowser(page, server.url, { role: 'admin' });
    await page.getByRole('navigation', { name: 'Main' }).getByRole('link', { name: 'Program settings' }).click();
    await page.getByRole('table', { name: 'Programs' }).getByRole('link', { name: 'Winter Heating Credit' }).click();

    const schedule = page.getByRole('form', { name: 'Cutoff schedule' });
    await schedule.getByRole('button', { name: 'Add a change' }).click();
    await schedule.getByLabel('From month (YYYY-MM)').last().fill('2027-01');
    await schedule.getByLabel(/^Cutoff/).last().fill('57');
    await schedule.getByRole('button', { name: 'Save the schedule' }).click();
    await schedule.getByText('Saved.').waitFor();

    const outcomes = page.getByRole('form', { name: 'Outcomes' });
    await outcomes.getByRole('button', { name: 'Add an outcome' }).click();
    await outcomes.getByLabel('Key').last().fill('moved_home');
    await outcomes.getByLabel('Label').last().fill('Moved home within 6 months');
    await outcomes.getByLabel('Unit').last().fill('share');
    await outcomes.getByLabel('Kind').last().selectOption('binary');
    await outcomes.getByRole('button', { name: 'Save outcomes' }).click();
    await outcomes.getByText('Saved.').waitFor();
    await page.screenshot({ path: screenshotPath('admin-program-settings'), fullPage: true });

    const detail: ProgramDetailDto = (await api.get(`/api/programs/${programId}`).expect(200)).body;
    expect(detail.cutoffSchedule.map((c) => [c.firstPeriod, c.cutoff])).toEqual([
      ['2024-11', 60],
      ['2025-11', 58],
      ['2027-01', 57],
    ]);
    expect(detail.outcomes.map((o) => o.key)).toEqual(['shutoff_6m', 'arrears_months', 'moved_home']);

    // Removing an outcome the design uses is refused with the server's plain reason.
    await outcomes.getByRole('button', { name: 'Remove outcome 2' }).click();
    await outcomes.getByRole('button', { name: 'Save outcomes' }).click();
    await outcomes.getByText(/still uses the outcome/).waitFor();

    await page.goto(`${server.url}/admin/programs/new`);
    const form = page.getByRole('form', { name: 'New program' });
    await form.getByLabel('Name', { exact: true }).fill('Summer Tutoring');
    await form.getByLabel(/^Short name/).fill('summer-tutoring');
    await form.getByLabel('What the score is called').fill('Reading placement score');
    await form.getByLabel('First month (YYYY-MM)').fill('2026-01');
    await form.getByLabel('Cutoff', { exact: true }).fill('40');
    await form.getByLabel('Outcome key').fill('reading_score');
    await form.getByLabel('Outcome label').fill('Reading score');
    await form.getByLabel('Outcome unit').fill('points');
    await form.getByRole('button', { name: 'Create the program' }).click();
    await page.getByRole('heading', { name: 'Summer Tutoring: settings' }).waitFor();
    await page.screenshot({ path: screenshotPath('admin-program-created'), fullPage: true });
    const list = (await api.get('/api/programs').expect(200)).body;
    expect(list.items.map((p: { slug: string }) => p.slug)).toContain('summer-tutoring');

    // Schedules: the demo director's summary, paused from the screen.
    await page.getByRole('navigation', { name: 'Main' }).getByRole('link', { name: 'Schedules' }).click();
    const table = page.getByRole('table', { name: 'Summary e-mail schedules' });
    await table.getByRole('button', { name: /^Pause the summary of/ }).first().click();
    await table.getByRole('button', { name: /^Resume the summary of/ }).first().waitFor();
    const schedules = (await api.get('/api/admin/schedules').expect(200)).body;
    expect(schedules.summaries[0].paused).toBe(true);
    await page.screenshot({ path: screenshotPath('admin-schedules'), fullPage: true });
  });
});
