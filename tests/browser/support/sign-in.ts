/** Signs in through the sign-in page, as a person would. */
import type { Page } from 'playwright-core';

/** Opens `path` (which sends a signed-out browser to the sign-in page), signs in, and waits to land back on it. */
export async function signInThroughPage(page: Page, baseUrl: string, email: string, password: string, path = '/overview'): Promise<void> {
  await page.goto(`${baseUrl}${path}`, { waitUntil: 'networkidle' });
  await page.getByRole('heading', { level: 1, name: 'Sign in to Loadwright' }).waitFor();
  await page.getByLabel('E-mail address').fill(email);
  await page.getByLabel('Password', { exact: true }).fill(password);
  await page.getByRole('button', { name: 'Sign in', exact: true }).click();
  await page.waitForURL((url) => url.pathname === path, { timeout: 15_000 });
}
