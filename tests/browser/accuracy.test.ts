/**
 * A planner in a real browser over the demo co-op, whose versions are scored when it is seeded: the
 * Overview's accuracy card names the series that miss most and links to them; the series page's
 * Accuracy section shows the figures, error by hours ahead, promised against achieved coverage with
 * the kind of band each version carries, the recent days and each version. axe-core on both pages;
 * screenshots at 1440×900.
 */
import { mkdir } from 'node:fs/promises';
import { resolve } from 'node:path';
import type { SeriesAccuracy } from '@loadwright/contracts';
import type { Page } from 'playwright-core';
import { afterAll, beforeAll, expect, it } from 'vitest';
import { demoScenario } from '../../fixtures/demo/scenario';
import { seedDemo } from '../../libs/db/src/seed/seed-demo';
import { addDemoAccuracy, addDemoMisses } from '../../scripts/demo-seed';
import { type TestServer, startTestServer } from '../support/server';
import { blockingViolations, findAccessibilityViolations } from './support/accessibility';
import { type TestBrowser, launchBrowser } from './support/browser';
import { signInThroughPage } from './support/sign-in';

const artifacts = process.env['LOADWRIGHT_SHOTS_DIR'] ?? resolve(import.meta.dirname, '../.artifacts');
const planner = demoScenario.accounts.find((account) => account.role === 'planner')!;

let browser: TestBrowser;
let server: TestServer;
let page: Page;
const pageErrors: string[] = [];

beforeAll(async () => {
  await mkdir(artifacts, { recursive: true });
  server = await startTestServer({ worker: false });
  await seedDemo(server.databaseUrl);
  await addDemoMisses(server.databaseUrl);
  await addDemoAccuracy(server.databaseUrl);
  browser = await launchBrowser();
  page = await browser.context.newPage();
  page.on('pageerror', (error) => pageErrors.push(error.message));
  page.on('console', (message) => {
    if (message.type() === 'error' && !message.text().startsWith('Failed to load resource')) pageErrors.push(message.text());
  });
}, 180_000);

afterAll(async () => {
  await page?.close();
  await browser?.close();
  await server?.close();
});

async function expectAccessible(): Promise<void> {
  expect(blockingViolations(await findAccessibilityViolations(page))).toEqual([]);
}

it('follows the Overview to the series that misses most and reads its accuracy and coverage', async () => {
  await signInThroughPage(page, server.url, planner.email, demoScenario.demoPassword, '/overview');
  const card = page.getByRole('region', { name: 'Forecast accuracy' });
  await card.getByText('the same hour last week', { exact: false }).first().waitFor();
  const worst = card.getByRole('listitem');
  expect(await worst.count()).toBeGreaterThanOrEqual(3);
  await page.screenshot({ path: resolve(artifacts, 'overview-forecast-accuracy.png') });
  await expectAccessible();

  const first = worst.first().getByRole('link');
  const name = (await first.textContent())!.trim();
  await first.click();
  await page.getByRole('heading', { level: 1, name }).waitFor();
  const section = page.getByRole('region', { name: 'Accuracy' });
  await section.getByText('Typical error (MAE)').waitFor();

  // The coverage chart is drawn and says what it shows.
  const coverage = section.getByRole('img', { name: /Share of actuals inside the 80 % and 95 % bands/ });
  await coverage.waitFor();
  const box = await coverage.boundingBox();
  expect(box!.width).toBeGreaterThan(200);
  expect(box!.height).toBeGreaterThan(150);
  await section.getByRole('img', { name: /Mean absolute error by hours ahead/ }).waitFor();
  await section.getByRole('img', { name: /Actual load against the forecast in force/ }).waitFor();

  // The kind of band each version carries, and how it covered, in words that match the served figures.
  const seriesId = Number(new URL(page.url()).pathname.split('/').at(-1));
  const report = (await (await page.request.get(`${server.url}/api/series/${seriesId}/accuracy`)).json()) as SeriesAccuracy;
  const kind = report.byBandKind[0]!;
  await section
    .getByRole('listitem')
    .filter({ hasText: `95 % band ${Math.round(kind.coverage95 * 100)} %` })
    .waitFor();
  const versions = section.getByRole('table', { name: 'By version, newest first' });
  for (const version of report.versions) {
    await versions
      .getByRole('row')
      .filter({ hasText: String(version.id) })
      .getByText(version.state)
      .waitFor();
  }
  await section.getByRole('table', { name: 'By kind of day' }).getByRole('rowheader', { name: 'Weekdays' }).waitFor();
  await expect(section.getByText('Forecasts are decision support').count()).resolves.toBe(1);

  await section.scrollIntoViewIfNeeded();
  await page.getByRole('heading', { level: 2, name: 'Accuracy' }).scrollIntoViewIfNeeded();
  await page.screenshot({ path: resolve(artifacts, 'series-accuracy.png') });
  await coverage.scrollIntoViewIfNeeded();
  await page.screenshot({ path: resolve(artifacts, 'series-accuracy-coverage.png') });
  await versions.scrollIntoViewIfNeeded();
  await page.screenshot({ path: resolve(artifacts, 'series-accuracy-versions.png') });
  await expectAccessible();

  // Another window reads again.
  await section.getByRole('radio', { name: '7 days', exact: true }).click();
  await section.getByText(/forecast hours\s+from/).waitFor();
  expect(pageErrors).toEqual([]);
}, 120_000);
