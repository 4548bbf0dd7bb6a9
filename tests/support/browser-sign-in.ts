import type { Page } from 'playwright-core';
import { demoPersonFor } from '@shared/demo/people';
import type { Role } from '@shared/schemas/roles';

/**
 * Signs in in the browser the way a person does: Cutline's sign-in page → the local identity
 * provider's page (`startTestIdp()` must be running) → pick the demo person → back in Cutline.
 * The demo people exist once `installDemoScenario` ran. Pass `email` to type someone else.
 */
export async function signInInBrowser(page: Page, appUrl: string, who: { role: Role } | { email: string; displayName?: string; groups?: string }): Promise<void> {
  await page.goto(`${appUrl}/`);
  await page.getByRole('link', { name: 'Sign in with your agency account' }).click();
  await page.getByRole('heading', { name: 'Who is signing in?' }).waitFor();
  if ('role' in who) {
    await page.getByRole('button', { name: new RegExp(demoPersonFor(who.role).displayName) }).click();
  } else {
    await page.getByLabel('E-mail address').fill(who.email);
    if (who.displayName) await page.getByLabel('Name (optional)').fill(who.displayName);
    if (who.groups) await page.getByLabel(/Groups/).fill(who.groups);
    await page.getByRole('button', { name: 'Sign in as this person' }).click();
  }
  await page.waitForURL((url) => url.origin === new URL(appUrl).origin && !url.pathname.startsWith('/auth/'));
}
