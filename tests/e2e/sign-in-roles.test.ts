import type { Page } from 'playwright-core';
import { afterAll, beforeAll, beforeEach, describe, expect, it } from 'vitest';
import { installDemoScenario } from '@server/demo/install-demo';
import { HttpSession } from '@server/entities/http-session.entity';
import { REUSE_READS_MS } from '@server/http/reused-reads';
import { DEMO_PROGRAM } from '@shared/demo/heating-credit';
import { DEMO_PEOPLE, demoPersonFor } from '@shared/demo/people';
import { ROLES } from '@shared/schemas/roles';
import { launchBrowser, screenshotPath } from '../support/browser';
import { signInInBrowser } from '../support/browser-sign-in';
import { startTestIdp } from '../support/local-idp';
import { createTestDatabase, type TestDatabase } from '../support/test-database';
import { startTestServer, type TestServer } from '../support/test-server';

/** Navigation only agency-wide administrators see; other features add their own items, so lists are not compared whole. */
const ADMIN_ONLY_NAV = ['People and roles', 'Audit trail'];

describe('signing in as each role in Chromium', () => {
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

  async function navItems(page: Page): Promise<string[]> {
    return (await page.getByRole('navigation', { name: 'Main' }).getByRole('link').allTextContents()).map((s) => s.trim());
  }

  async function openUserMenu(page: Page): Promise<void> {
    const menu = page.locator('header details');
    if ((await menu.getAttribute('open')) === null) await menu.locator('summary').click();
  }

  async function signOut(page: Page): Promise<void> {
    await openUserMenu(page);
    await page.getByRole('button', { name: 'Sign out' }).click();
    await page.getByText('You have signed out of Cutline.').waitFor();
  }

  // Each test starts signed out, whatever the one before it left behind.
  beforeEach(async () => {
    await browser.context.clearCookies();
  });

  it('shows the sign-in page to people who are not signed in, and the identity provider’s choice of people', async () => {
    const page = await browser.context.newPage();
    await page.goto(`${server.url}/admin/audit`);
    await page.getByRole('heading', { name: 'Sign in' }).waitFor();
    await page.screenshot({ path: screenshotPath('sign-in-page'), fullPage: true });
    await page.getByRole('link', { name: 'Sign in with your agency account' }).click();
    await page.getByRole('heading', { name: 'Who is signing in?' }).waitFor();
    const people = await page.getByRole('list', { name: 'Demo people' }).getByRole('button').count();
    expect(people).toBe(DEMO_PEOPLE.length);
    await page.screenshot({ path: screenshotPath('local-idp-picker'), fullPage: true });
    await page.close();
  });

  for (const role of ROLES) {
    it(`signs in as the ${role} and shows only what that role may use`, async () => {
      const person = demoPersonFor(role);
      const page = await browser.context.newPage();
      await signInInBrowser(page, server.url, { role });
      await page.getByRole('heading', { name: DEMO_PROGRAM.name }).waitFor();
      const nav = await navItems(page);
      expect(nav).toContain('Programs');
      for (const item of ADMIN_ONLY_NAV) expect(nav.includes(item), `${item} for the ${role}`).toBe(role === 'admin');
      await openUserMenu(page);
      expect(await page.locator('header details').textContent()).toContain(person.displayName);
      const roles = await page.getByRole('list', { name: 'Your roles' }).textContent();
      expect(roles).toContain(role === 'admin' ? 'Administrator · agency-wide' : DEMO_PROGRAM.name);
      await page.screenshot({ path: screenshotPath(`signed-in-${role}`), fullPage: true });
      if (role !== 'admin') {
        await page.goto(`${server.url}/admin/users`);
        await page.getByText('This page is for administrators').waitFor();
      }
      await signOut(page);
      await page.close();
    });
  }

  it('lets a person without roles in, with nothing to see yet', async () => {
    const page = await browser.context.newPage();
    await signInInBrowser(page, server.url, { email: 'newcomer@harrow-vale.example', displayName: 'Nell Newcomer' });
    await page.getByText('No programs yet').waitFor();
    expect((await navItems(page)).filter((item) => ADMIN_ONLY_NAV.includes(item))).toEqual([]);
    await page.screenshot({ path: screenshotPath('signed-in-no-roles'), fullPage: true });
    await signOut(page);
    await page.close();
  });

  it('lets the administrator grant and revoke a role and read it in the audit trail', async () => {
    const page = await browser.context.newPage();
    await signInInBrowser(page, server.url, { role: 'admin' });
    await page.getByRole('link', { name: 'People and roles' }).click();
    const table = page.getByRole('table', { name: 'People and their roles' });
    await table.waitFor();
    await page.screenshot({ path: screenshotPath('admin-people'), fullPage: true });
    await table.getByRole('link', { name: 'Nell Newcomer' }).click();
    await page.getByText('No roles yet').waitFor();
    await page.getByLabel('Role', { exact: true }).selectOption('evaluator');
    await page.getByLabel('Where', { exact: true }).selectOption({ label: DEMO_PROGRAM.name });
    await page.getByRole('button', { name: 'Grant role' }).click();
    const grants = page.getByRole('table', { name: 'Roles of Nell Newcomer' });
    await grants.getByText('Evaluator').waitFor();
    await page.screenshot({ path: screenshotPath('admin-grant-role'), fullPage: true });
    page.once('dialog', (d) => void d.accept());
    await grants.getByRole('button', { name: 'Revoke' }).click();
    await page.getByText('No roles yet').waitFor();

    await page.getByRole('link', { name: 'Audit trail' }).click();
    const trail = page.getByRole('table', { name: 'Audit events, newest first' });
    await trail.getByText('Role revoked').first().waitFor();
    expect(await trail.getByText('Role granted').count()).toBeGreaterThan(0);
    expect(await trail.getByText('Signed in').count()).toBeGreaterThan(0);
    await page.getByLabel('What', { exact: true }).selectOption({ label: 'Signed out' });
    // The previous page stays on screen while the filtered one loads: wait for it to change.
    await expect.poll(() => trail.getByText('Role granted').count()).toBe(0);
    expect(await trail.getByText('Signed out').count()).toBeGreaterThan(0);
    await page.getByRole('button', { name: 'Clear' }).click();
    await page.screenshot({ path: screenshotPath('admin-audit-trail'), fullPage: true });
    await page.close();
  });

  it('says so when the session has ended, and explains a refused sign-in', async () => {
    const page = await browser.context.newPage();
    await signInInBrowser(page, server.url, { role: 'director' });
    await page.getByRole('heading', { name: DEMO_PROGRAM.name }).waitFor();
    // Ended outside this app process (as by another instance): seen once its reuse of the session read is over.
    await db.dataSource.getRepository(HttpSession).createQueryBuilder().delete().execute();
    await new Promise((resolve) => setTimeout(resolve, REUSE_READS_MS + 100));
    await page.reload();
    await page.getByText('Your session has ended.').waitFor();
    await page.screenshot({ path: screenshotPath('session-ended'), fullPage: true });
    await page.goto(`${server.url}/sign-in?error=signature_invalid`);
    await page.getByText('was not signed correctly').waitFor();
    await page.screenshot({ path: screenshotPath('sign-in-refused'), fullPage: true });
    await page.close();
  });
});
