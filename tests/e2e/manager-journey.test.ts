import { afterAll, beforeAll, describe, expect, it } from 'vitest';
import { installDemoScenario } from '@server/demo/install-demo';
import { AuditEvent } from '@server/entities/audit-event.entity';
import type { CohortDetailDto, CohortTrendDto, ResultsOverviewDto } from '@shared/api/results';
import { DEMO_WEAK_TAKE_UP_PERIOD } from '@shared/demo/heating-credit';
import { headline } from '@shared/results/headline';
import { formatJump, formatInterval, setDisplaySettings } from '@/lib/format';
import { summaryParagraph } from '@/features/trends/summary-paragraph';
import { launchBrowser, screenshotPath } from '../support/browser';
import { signInInBrowser } from '../support/browser-sign-in';
import { installDemoResults } from '../support/demo-results';
import { startTestIdp } from '../support/local-idp';
import { signIn } from '../support/sign-in';
import { createTestDatabase, type TestDatabase } from '../support/test-database';
import { startTestServer, type TestServer } from '../support/test-server';

/**
 * The manager's journey in Chromium: the programs overview, the trend dashboard (month by month
 * and pooled), one month in full, and acknowledging a caveat. Every figure checked on screen is
 * compared with the API's own answer, formatted by the client's formatter.
 */
describe('manager reads the dashboard and acknowledges a caveat', () => {
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
    setDisplaySettings(db.config.agency);
  });
  afterAll(async () => {
    await browser?.close();
    await server?.close();
    await idp?.close();
    await db?.drop();
  });

  it('shows the same figures as the API, on the overview, the dashboard and the month', async () => {
    const api = await signIn(server, { role: 'manager', programId });
    const overview: ResultsOverviewDto = (await api.get(`/api/programs/${programId}/results`).expect(200)).body;
    const trend: CohortTrendDto = (await api.get(`/api/programs/${programId}/results/trend?outcome=shutoff_6m`).expect(200)).body;
    const program = (await api.get(`/api/programs/${programId}`).expect(200)).body;

    const page = await browser.context.newPage();
    await signInInBrowser(page, server.url, { role: 'manager' });
    const first = overview.outcomes[0]!;
    const card = page.getByRole('list', { name: 'Programs' }).getByRole('listitem').first();
    await card.locator('[data-figure="effect"]').waitFor();
    expect(await card.locator('[data-figure="first-stage"]').textContent()).toBe(formatJump(headline(first.latest!.firstStage)!.estimate, { unit: 'share' }));
    expect(await card.locator('[data-figure="effect"]').textContent()).toBe(formatJump(headline(first.latest!.effect)!.estimate, first.outcome));
    await page.screenshot({ path: screenshotPath('programs-overview'), fullPage: true });

    await card.getByRole('link', { name: 'Open the trends' }).click();
    const summary = page.getByTestId('summary-paragraph');
    await summary.waitFor();
    const window6 = trend.windows.find((w) => w.scope.key === 'window:last-6')!;
    const expected = summaryParagraph({ words: { population: program.populationLabel ?? 'applicants', takeUpPhrase: program.takeUpPhrase ?? 'take part' }, outcome: trend.outcome, window: window6, points: trend.points });
    expect(await summary.textContent()).toBe(expected.text);
    await page.getByRole('table', { name: /month by month/ }).waitFor();
    await page.locator('svg').nth(3).waitFor();
    // The latest month's row: effect on participants as the API gives it.
    const latest = trend.points.at(-1)!;
    const row = page.getByRole('table', { name: /month by month/ }).getByRole('row').nth(1);
    expect(await row.textContent()).toContain(formatJump(latest.effect!.estimate, trend.outcome));
    expect(await row.textContent()).toContain(formatInterval(latest.effect!.ciLow, latest.effect!.ciHigh, trend.outcome));
    await page.screenshot({ path: screenshotPath('trend-dashboard'), fullPage: true });
    // Printed, the page keeps the figures, the summary and the caution, and drops the controls.
    await page.emulateMedia({ media: 'print' });
    expect(await page.getByRole('radio', { name: /Pooled months/ }).isVisible()).toBe(false);
    expect(await page.getByRole('complementary', { name: 'How to read these results' }).isVisible()).toBe(true);
    await page.screenshot({ path: screenshotPath('trend-dashboard-print'), fullPage: true });
    await page.emulateMedia({ media: 'screen' });

    await page.locator('label', { hasText: 'Pooled months' }).click();
    await page.getByRole('table', { name: /pooled months/ }).waitFor();
    await page.screenshot({ path: screenshotPath('trend-dashboard-pooled'), fullPage: true });

    // One month in full: the weak take-up month carries a caveat to acknowledge.
    await page.goto(`${server.url}/programs/${programId}/cohorts/${DEMO_WEAK_TAKE_UP_PERIOD}?outcome=shutoff_6m`);
    const detail: CohortDetailDto = (await api.get(`/api/programs/${programId}/results/cohorts/${DEMO_WEAK_TAKE_UP_PERIOD}`).expect(200)).body;
    const shutoff = detail.outcomes.find((o) => o.outcome.key === 'shutoff_6m')!;
    await page.locator('[data-figure="effect-estimate"]').waitFor();
    expect(await page.locator('[data-figure="effect-estimate"]').textContent()).toBe(formatJump(shutoff.effect?.conventional.estimate, shutoff.outcome));
    expect(await page.locator('[data-figure="fs-robust-ci"]').textContent()).toBe(formatInterval(shutoff.firstStage?.robust.ciLow, shutoff.firstStage?.robust.ciHigh, { unit: 'share' }));
    const caveats = page.getByRole('list', { name: 'Caveats' });
    expect(await caveats.textContent()).toContain(shutoff.caveats[0]!.message);
    await expect.poll(() => page.getByText('Drawing…').count()).toBe(0);
    await page.screenshot({ path: screenshotPath('cohort-detail'), fullPage: true });

    await caveats.getByRole('button', { name: 'Acknowledge this caveat' }).first().click();
    await page.getByLabel(/Your comment/).fill('Outreach lapsed this month; we read the effect with care.');
    await page.getByRole('button', { name: 'Acknowledge', exact: true }).click();
    await caveats.getByRole('list', { name: 'Acknowledgements' }).waitFor();
    expect(await caveats.getByRole('list', { name: 'Acknowledgements' }).textContent()).toContain('Outreach lapsed this month');
    await page.screenshot({ path: screenshotPath('cohort-detail-acknowledged'), fullPage: true });

    const after: CohortDetailDto = (await api.get(`/api/programs/${programId}/results/cohorts/${DEMO_WEAK_TAKE_UP_PERIOD}`).expect(200)).body;
    expect(after.outcomes.find((o) => o.outcome.key === 'shutoff_6m')!.acknowledgements).toHaveLength(1);
    expect(await db.dataSource.getRepository(AuditEvent).countBy({ action: 'caveat.acknowledge', programId })).toBe(1);
    await page.close();
  });

  it('is usable from the keyboard with a visible focus ring', async () => {
    await browser.context.clearCookies();
    const page = await browser.context.newPage();
    await signInInBrowser(page, server.url, { role: 'manager' });
    await page.goto(`${server.url}/programs/${programId}`);
    await page.getByTestId('summary-paragraph').waitFor();
    await page.keyboard.press('Tab');
    expect(await page.evaluate(() => document.activeElement?.textContent)).toBe('Skip to content');
    // The view choice is a radio group: focus it and move with the arrow keys.
    await page.getByRole('radio', { name: /Month by month/ }).focus();
    await page.keyboard.press('ArrowRight');
    await page.getByRole('table', { name: /pooled months/ }).waitFor();
    const outline = await page.evaluate(() => getComputedStyle(document.activeElement!.closest('label')!).outlineStyle);
    expect(outline).toBe('solid');
    await page.close();
  });

  it('a director sees the trends but no link into single months', async () => {
    await browser.context.clearCookies();
    const page = await browser.context.newPage();
    await signInInBrowser(page, server.url, { role: 'director' });
    await page.goto(`${server.url}/programs/${programId}`);
    await page.getByRole('table', { name: /month by month/ }).waitFor();
    expect(await page.getByRole('table', { name: /month by month/ }).getByRole('link').count()).toBe(0);
    await page.close();
  });
});
