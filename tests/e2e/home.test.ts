import { afterAll, beforeAll, describe, expect, it } from 'vitest';
import { installDemoScenario } from '@server/demo/install-demo';
import { listen } from '@server/http-server';
import { DEMO_PROGRAM } from '@shared/demo/heating-credit';
import { launchBrowser, screenshotPath } from '../support/browser';
import { buildTestApp } from '../support/test-app';
import { createTestDatabase, type TestDatabase } from '../support/test-database';

describe('home page in Chromium', () => {
  let db: TestDatabase;
  let http: Awaited<ReturnType<typeof listen>>;
  let browser: Awaited<ReturnType<typeof launchBrowser>>;

  beforeAll(async () => {
    db = await createTestDatabase();
    await installDemoScenario(db.dataSource);
    http = await listen(buildTestApp(db).app, 0);
    browser = await launchBrowser();
  });
  afterAll(async () => {
    await browser?.close();
    await http?.close();
    await db?.drop();
  });

  it('lists the demo program', async () => {
    const page = await browser.context.newPage();
    await page.goto(`http://127.0.0.1:${http.port}/`);
    const list = page.getByRole('list', { name: 'Programs' });
    const heading = list.getByRole('heading', { name: DEMO_PROGRAM.name });
    await heading.waitFor({ state: 'visible' });
    expect(await heading.textContent()).toBe(DEMO_PROGRAM.name);
    await page.screenshot({ path: screenshotPath('home'), fullPage: true });
  });
});
