import { afterAll, beforeAll, describe, expect, it } from 'vitest';
import { installDemoScenario } from '@server/demo/install-demo';
import { DEMO_PROGRAM } from '@shared/demo/heating-credit';
import { launchBrowser, screenshotPath } from '../support/browser';
import { signInInBrowser } from '../support/browser-sign-in';
import { startTestIdp } from '../support/local-idp';
import { createTestDatabase, type TestDatabase } from '../support/test-database';
import { startTestServer, type TestServer } from '../support/test-server';

describe('home page in Chromium', () => {
  let db: TestDatabase;
  let server: TestServer;
  let idp: Awaited<ReturnType<typeof startTestIdp>>;
  let browser: Awaited<ReturnType<typeof launchBrowser>>;

  beforeAll(async () => {
    db = await createTestDatabase();
    await installDemoScenario(db.dataSource);
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

  it('lists the demo program after signing in', async () => {
    const page = await browser.context.newPage();
    await signInInBrowser(page, server.url, { role: 'manager' });
    const list = page.getByRole('list', { name: 'Programs' });
    const heading = list.getByRole('heading', { name: DEMO_PROGRAM.name });
    await heading.waitFor({ state: 'visible' });
    expect(await heading.textContent()).toBe(DEMO_PROGRAM.name);
    await page.screenshot({ path: screenshotPath('home'), fullPage: true });
  });
});
