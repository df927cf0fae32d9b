/**
 * One series' page in a real browser over the seeded demo co-op after a real refit: the history chart
 * over each range with quality flags as markers (a pushed negative reading), the fan chart
 * and daily peaks, an adjustment the server refuses with the reason on its field, one added and
 * removed again, model settings checked with the shared schema and saved, export links in the
 * series' zone and in UTC. Screenshot of the history at 1440×900.
 */
import { mkdir } from 'node:fs/promises';
import { resolve } from 'node:path';
import {
  type ForecastReview,
  type ModelSettings,
  type RefitRunDetail,
  type Role,
  type SeriesDetail,
  forecastExportPath,
} from '@loadwright/contracts';
import type { Page } from 'playwright-core';
import { afterAll, beforeAll, describe, expect, it } from 'vitest';
import { demoScenario } from '../../fixtures/demo/scenario';
import { seedDemo } from '../../libs/db/src/seed/seed-demo';
import { signIn } from '../support/people';
import { type TestServer, startTestServer } from '../support/server';
import { blockingViolations, findAccessibilityViolations } from './support/accessibility';
import { type TestBrowser, launchBrowser } from './support/browser';
import { signInThroughPage } from './support/sign-in';

const artifacts = resolve(import.meta.dirname, '../.artifacts');
const password = demoScenario.demoPassword;
const account = (role: Role) => demoScenario.accounts.find((candidate) => candidate.role === role)!;
/** A feeder of the demo co-op. */
const feeder = demoScenario.feeders.find((f) => f.key === 'fdr-c2')!;

let browser: TestBrowser;
let server: TestServer;
let page: Page;
let series: SeriesDetail;
const pageErrors: string[] = [];

/** JSON from the API with a planner's session. */
async function api<T>(path: string, init: RequestInit = {}): Promise<T> {
  const planner = await signIn(server.url, account('planner').email, password);
  const response = await fetch(`${server.url}${path}`, {
    ...init,
    headers: {
      cookie: planner.cookie.join('; '),
      'x-csrf-token': planner.csrf,
      'content-type': 'application/json',
      ...(init.headers ?? {}),
    },
  });
  if (!response.ok) throw new Error(`${path}: ${response.status} ${await response.text()}`);
  return (await response.json()) as T;
}

beforeAll(async () => {
  await mkdir(artifacts, { recursive: true });
  server = await startTestServer();
  await seedDemo(server.databaseUrl);
  series = await api<SeriesDetail>(`/api/series/${feeder.key}`);
  const run = await api<{ id: number }>('/api/refits', {
    method: 'POST',
    body: JSON.stringify({ scope: { kind: 'series', seriesIds: [series.id] } }),
  });
  const deadline = Date.now() + 120_000;
  while ((await api<RefitRunDetail>(`/api/refits/${run.id}`)).state !== 'finished') {
    if (Date.now() > deadline) throw new Error('the refit did not finish in 2 minutes');
    await new Promise((done) => setTimeout(done, 500));
  }
  // Another system pushes a reading with its sign flipped just after the history ends: validation flags it negative.
  const steward = await signIn(server.url, account('steward').email, password);
  const pushed = await fetch(`${server.url}/api/series/${feeder.key}/readings`, {
    method: 'POST',
    headers: { cookie: steward.cookie.join('; '), 'x-csrf-token': steward.csrf, 'content-type': 'application/json' },
    body: JSON.stringify({ readings: [{ ts: new Date(Date.parse(demoScenario.end) + 3_600_000).toISOString(), value: -35 }] }),
  });
  if (!pushed.ok) throw new Error(`push failed: ${pushed.status} ${await pushed.text()}`);
  browser = await launchBrowser();
  page = await browser.context.newPage();
  page.on('pageerror', (error) => pageErrors.push(error.message));
  await signInThroughPage(page, server.url, account('planner').email, password, `/series/${series.id}`);
}, 240_000);

afterAll(async () => {
  await page?.close();
  await browser?.close();
  await server?.close();
});

/** The sentence under the history chart. */
const historyNote = () => page.locator('lw-history-chart .chart-note').textContent();

describe('the series page', () => {
  it('shows the header with key, level, unit, time zone and the parent chain', async () => {
    await page.getByRole('heading', { level: 1, name: feeder.name }).waitFor();
    const facts = (await page.locator('header .facts').textContent()) ?? '';
    expect(facts).toContain(feeder.key);
    expect(facts).toContain('feeder');
    expect(facts).toContain(series.unit);
    expect(facts).toContain(`time zone ${series.timeZone}`);
    const crumbs = await page.getByRole('navigation', { name: 'Place in the hierarchy' }).getByRole('link').allTextContents();
    expect(crumbs).toEqual(['Series', ...series.parentChain.map((p) => p.name)]);
  });

  it('charts the history over each range, with the flagged reading marked', async () => {
    await expect.poll(historyNote, { timeout: 10_000 }).toContain('readings');
    await page.getByRole('radio', { name: 'Last 7 days' }).click();
    await expect.poll(historyNote).toMatch(/^\s*168 readings, each shown\./);
    const flagged = async () => ((await historyNote()) ?? '').replace(/\s+/g, ' ');
    expect(await flagged()).toMatch(/Flagged in this range: .*\b1 negative\b/);
    expect(await page.locator('lw-history-chart canvas').getAttribute('aria-label')).toContain('168 readings');
    await page.getByRole('radio', { name: 'All' }).click();
    await expect.poll(historyNote).toContain('shown as daily means (local days)');
    expect(await flagged()).toMatch(/Flagged in this range: .*\b1 negative\b/);
    await page.getByRole('radio', { name: 'Last 7 days' }).click();
    await expect.poll(historyNote).toContain('each shown');
    await page.locator('#history-heading').evaluate((heading) => heading.scrollIntoView({ block: 'start' }));
    await page.screenshot({ path: resolve(artifacts, 'series-history.png') });
    expect(pageErrors).toEqual([]);
  });

  it('lists the draft peaks by local day with time and zone', async () => {
    const review = await api<ForecastReview>(`/api/series/${series.id}/forecast`);
    const peaks = review.draft!.dailyPeaks;
    const rows = page.locator('table.peaks tbody tr');
    await expect.poll(() => rows.count()).toBe(peaks.length);
    const first = (await rows.first().textContent()) ?? '';
    expect(first).toContain(peaks[0]!.date);
    expect(first).toMatch(new RegExp(`${peaks[0]!.localTime} C[SD]T`));
  });

  it('puts the server refusal of an adjustment on its field, then adds one and removes it again', async () => {
    await page.getByRole('combobox', { name: 'Kind' }).click();
    await page.getByRole('option', { name: 'Scale (multiply)' }).click();
    await page.getByLabel('Factor').fill('0');
    await page.getByLabel('Reason').fill('Holiday: mill closed');
    await page.getByRole('button', { name: 'Add adjustment' }).click();
    await page.getByText('A scale factor must be greater than 0 (1.1 raises by 10 %)').waitFor();

    await page.getByLabel('Factor').fill('1.1');
    await page.getByRole('button', { name: 'Add adjustment' }).click();
    await page.getByText('“Holiday: mill closed”').waitFor();
    expect((await api<ForecastReview>(`/api/series/${series.id}/forecast`)).draft!.adjustments).toHaveLength(1);
    await page.getByRole('button', { name: 'Remove adjustment: Holiday: mill closed' }).click();
    await page.getByText('No adjustments to this version.').waitFor();
    expect((await api<ForecastReview>(`/api/series/${series.id}/forecast`)).draft!.adjustments).toHaveLength(0);
  });

  it('checks model settings with the shared rules and saves them', async () => {
    await page.getByRole('button', { name: 'Model settings' }).click();
    const dialog = page.getByRole('dialog');
    await dialog.getByLabel('AR order (empty: choose)').fill('30');
    await dialog.getByLabel('Largest AR order').fill('24');
    await dialog.getByRole('button', { name: 'Save settings' }).click();
    await dialog.getByText('The AR order must not exceed the largest AR order').waitFor();
    expect(blockingViolations(await findAccessibilityViolations(page))).toEqual([]);

    await dialog.getByLabel('AR order (empty: choose)').fill('3');
    await dialog.getByRole('combobox', { name: 'Method' }).click();
    await page.getByRole('option', { name: 'AR by conditional maximum likelihood' }).click();
    await dialog.getByRole('button', { name: 'Save settings' }).click();
    await page.getByText('Model settings saved: AR by conditional maximum likelihood.').waitFor();
    const saved = await api<ModelSettings>(`/api/series/${series.id}/model`);
    expect([saved.method, saved.arOrder, saved.maxArOrder]).toEqual(['cmle', 3, 24]);
  });

  it('links the approved CSV in the series zone or in UTC', async () => {
    const review = await api<ForecastReview>(`/api/series/${series.id}/forecast`);
    await api(`/api/forecast-versions/${review.draft!.id}/approve`, { method: 'POST' });
    await page.reload({ waitUntil: 'networkidle' });
    const link = page.getByRole('link', { name: 'Export approved CSV' });
    await link.waitFor();
    expect(await link.getAttribute('href')).toBe(forecastExportPath({ format: 'csv', seriesIds: [series.id], timeZone: series.timeZone }));
    await page.getByRole('radio', { name: 'UTC' }).click();
    await expect.poll(() => link.getAttribute('href')).toBe(forecastExportPath({ format: 'csv', seriesIds: [series.id] }));
    expect(blockingViolations(await findAccessibilityViolations(page))).toEqual([]);
    expect(pageErrors).toEqual([]);
  });

  it('fits the model and diagnostics cards on a 390 px phone', async () => {
    await page.setViewportSize({ width: 390, height: 844 });
    try {
      await page.reload({ waitUntil: 'networkidle' });
      const diagnostics = page.locator('section.card', { has: page.getByRole('heading', { name: 'Diagnostics' }) });
      await diagnostics.scrollIntoViewIfNeeded();
      const box = await diagnostics.boundingBox();
      expect(box).not.toBeNull();
      expect(box!.x).toBeGreaterThanOrEqual(0);
      expect(box!.x + box!.width).toBeLessThanOrEqual(390);
      // Nothing on the page forces sideways scrolling.
      expect(await page.evaluate(() => document.documentElement.scrollWidth)).toBeLessThanOrEqual(390);
      await diagnostics.screenshot({ path: resolve(artifacts, 'diagnostics-phone.png') });
    } finally {
      await page.setViewportSize({ width: 1440, height: 900 });
    }
  });
});
