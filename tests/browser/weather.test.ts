/**
 * Weather on the series page in a real browser as a planner, over the seeded demo co-op (which ships a week
 * of station forecasts issued each morning): after a real refit of Tallowmere Town (zone-central, linked to
 * Millrace Flats, °F) with a fixed CMLE model, the fan chart overlays the temperatures the forecast assumed
 * and says which forecast issue they came from; the model card names the issue too. The planner then asks how the
 * week moves if it runs 8 °F hotter: the scenario joins the fan chart and the table gives each day's peak change as
 * the API's re-run says (the arithmetic is checked by hand in tests/forecasts/temperature-scenarios.test.ts), with
 * the caution beside it. Screenshots at 1440×900.
 */
import { mkdir } from 'node:fs/promises';
import { resolve } from 'node:path';
import type { AssumedTemperatures, RefitRunDetail, Role, TemperatureScenarios } from '@loadwright/contracts';
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

let browser: TestBrowser;
let server: TestServer;
let page: Page;
let zoneId: number;
const pageErrors: string[] = [];

/** JSON from the API with a planner's session. */
async function api<T>(path: string, init: RequestInit = {}): Promise<T> {
  const planner = await signIn(server.url, account('planner').email, password);
  const response = await fetch(`${server.url}${path}`, {
    ...init,
    headers: { cookie: planner.cookie.join('; '), 'x-csrf-token': planner.csrf, 'content-type': 'application/json' },
  });
  if (!response.ok) throw new Error(`${path}: ${response.status} ${await response.text()}`);
  return (await response.json()) as T;
}

beforeAll(async () => {
  await mkdir(artifacts, { recursive: true });
  server = await startTestServer();
  await seedDemo(server.databaseUrl);
  zoneId = (await api<{ id: number }>('/api/series/zone-central')).id;
  // A fixed method, so the regression on degree-hours is part of the model whatever auto would pick.
  const settings = await api<Record<string, unknown>>(`/api/series/${zoneId}/model`);
  const { seriesId: _s, temperatureSeries: _t, updatedAt: _u, updatedBy: _b, ...editable } = settings;
  await api(`/api/series/${zoneId}/model`, { method: 'PUT', body: JSON.stringify({ ...editable, method: 'cmle', arOrder: 3 }) });
  const run = await api<{ id: number }>('/api/refits', {
    method: 'POST',
    body: JSON.stringify({ scope: { kind: 'series', seriesIds: [zoneId] } }),
  });
  const deadline = Date.now() + 120_000;
  while ((await api<RefitRunDetail>(`/api/refits/${run.id}`)).state !== 'finished') {
    if (Date.now() > deadline) throw new Error('the refit did not finish in 2 minutes');
    await new Promise((done) => setTimeout(done, 500));
  }
  browser = await launchBrowser();
  page = await browser.context.newPage();
  page.on('pageerror', (error) => pageErrors.push(error.message));
  await signInThroughPage(page, server.url, account('planner').email, password, `/series/${zoneId}`);
}, 240_000);

afterAll(async () => {
  await page?.close();
  await browser?.close();
  await server?.close();
});

describe('temperatures on the series page', () => {
  it('overlays the temperatures the forecast assumed and names the forecast issue', async () => {
    const assumed = await api<AssumedTemperatures>(`/api/series/${zoneId}/assumed-temperatures`);
    // The demo's last morning issue: 06:00 in America/Chicago on 30 Nov = 12:00 UTC.
    expect(assumed).toMatchObject({ used: true, issuedAt: '2026-11-30T12:00:00.000Z', station: { key: 'wx-lowland' } });
    expect(assumed.hours.filter((h) => h.source === 'forecast')).toHaveLength(168);
    const note = page.getByTestId('assumed-temperatures');
    await expect
      .poll(async () => ((await note.textContent()) ?? '').replace(/\s+/g, ' '), { timeout: 15_000 })
      .toMatch(/Temperatures assumed: Millrace Flats weather station, forecast issued .*30.*12:00 UTC/);
    await page.getByRole('heading', { name: 'Model card and diagnostics' }).waitFor();
    expect(await page.locator('lw-model-card').textContent()).toContain('forecast issued 2026-11-30 12:00 UTC (168 of 168 hours)');
    await page.locator('lw-forecast-chart').evaluate((chart) => chart.scrollIntoView({ block: 'center' }));
    await page.screenshot({ path: resolve(artifacts, 'weather-overlay.png') });
    expect(blockingViolations(await findAccessibilityViolations(page))).toEqual([]);
    expect(pageErrors).toEqual([]);
  });
});

describe('weather scenarios on the series page', () => {
  it('shows how the daily peaks move if the week runs 8 °F hotter, as a line on the fan chart and a table', async () => {
    const section = page.locator('lw-weather-scenarios');
    await section.getByRole('heading', { name: 'If the weather turns out otherwise' }).scrollIntoViewIfNeeded();
    await section.getByLabel('Degrees hotter or colder').click();
    await page.getByRole('option', { name: '8 °F' }).click();
    // Only the hotter line: leave the colder one out of the chart and the table.
    await section.getByRole('checkbox', { name: /8 °F colder/ }).uncheck();
    const table = section.locator('table.scenario-peaks');
    await expect.poll(async () => (await table.locator('thead').textContent()) ?? '', { timeout: 15_000 }).toContain('8 °F hotter');
    expect(await table.locator('thead').textContent()).not.toContain('colder');

    const scenarios = await api<TemperatureScenarios>(`/api/series/${zoneId}/temperature-scenarios?shift=8`);
    const hotter = scenarios.scenarios.find((scenario) => scenario.key === 'hotter')!;
    const firstDay = scenarios.base.dailyPeaks[0]!;
    const change = hotter.dailyPeaks[0]!.value - firstDay.value;
    expect(change).not.toBe(0);
    const magnitude = Math.abs(change).toLocaleString('en-GB', { minimumFractionDigits: 1, maximumFractionDigits: 1 });
    const firstRow = table.locator('tbody tr').first();
    expect(await firstRow.locator('th').textContent()).toContain(firstDay.date);
    expect(((await firstRow.locator('td').nth(1).textContent()) ?? '').trim()).toContain(`${change > 0 ? '+' : '−'}${magnitude} MW`);
    expect(await section.getByTestId('scenario-caution').textContent()).toContain('decision support for peak warnings');
    expect(await page.locator('lw-forecast-chart canvas').getAttribute('aria-label')).toContain('with 1 weather scenario lines');

    await page.locator('lw-forecast-chart').evaluate((chart) => chart.scrollIntoView({ block: 'start' }));
    await page.screenshot({ path: resolve(artifacts, 'weather-scenario-chart.png') });
    await section.evaluate((element) => element.scrollIntoView({ block: 'start' }));
    await page.screenshot({ path: resolve(artifacts, 'weather-scenario-peaks.png') });
    expect(blockingViolations(await findAccessibilityViolations(page))).toEqual([]);
    expect(pageErrors).toEqual([]);
  });
});
