/**
 * A weather station's forecasts in a real browser as a steward, over the seeded demo co-op: the Millrace Flats
 * station page lists the seven demo morning issues (192 hours each) and draws observed temperatures
 * beside the newest; the steward uploads a CSV file of two new issues in °C, sees its first rows and the guessed
 * columns, checks it (nothing stored yet), stores both (converted once to the station's °F), and finds them
 * listed as coming from the file. The same file again is answered with the earlier upload. Screenshots at 1440×900.
 */
import { mkdir } from 'node:fs/promises';
import { resolve } from 'node:path';
import type { Role } from '@loadwright/contracts';
import type { Page } from 'playwright-core';
import { afterAll, beforeAll, describe, expect, it } from 'vitest';
import { demoScenario } from '../../fixtures/demo/scenario';
import { seedDemo } from '../../libs/db/src/seed/seed-demo';
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
let stationId: number;
const pageErrors: string[] = [];
/** API calls the page made that were refused or not found (the signed-out session check aside). */
const failedCalls: string[] = [];

/** Two issues (6:00 local on 1 and 2 Dec 2026), 48 hours each from the next local midnight, alternating 20 and 0 °C. */
function forecastFile(): string {
  const lines = ['issued,valid,temp_c'];
  for (const day of ['2026-12-01', '2026-12-02']) {
    const start = Date.parse(`${day}T06:00:00Z`) + 24 * 3_600_000;
    for (let k = 0; k < 48; k++) lines.push(`${day} 06:00,${new Date(start + k * 3_600_000).toISOString()},${k % 2 === 0 ? 20 : 0}`);
  }
  return `${lines.join('\n')}\n`;
}

beforeAll(async () => {
  await mkdir(artifacts, { recursive: true });
  server = await startTestServer();
  await seedDemo(server.databaseUrl);
  const { rows } = await server.pool.query("select id from series where key = 'wx-lowland'");
  stationId = rows[0].id;
  browser = await launchBrowser();
  page = await browser.context.newPage();
  page.on('pageerror', (error) => pageErrors.push(error.message));
  page.on('response', (response) => {
    const path = new URL(response.url()).pathname;
    if (response.status() >= 400 && path.startsWith('/api/') && path !== '/api/auth/session')
      failedCalls.push(`${response.status()} ${path}`);
  });
  await signInThroughPage(page, server.url, account('steward').email, password, `/series/${stationId}`);
}, 120_000);

afterAll(async () => {
  await page?.close();
  await browser?.close();
  await server?.close();
});

describe('the station page as a steward', () => {
  it('lists every forecast issue with where it came from and draws the newest beside the observed temperatures', async () => {
    const section = page.locator('lw-station-forecasts');
    await section.getByRole('heading', { name: 'Temperature forecasts' }).waitFor();
    const rows = section.locator('table.issues tbody tr');
    await expect.poll(() => rows.count(), { timeout: 15_000 }).toBe(7);
    expect(await rows.first().textContent()).toContain('192 hours');
    expect(await rows.first().locator('button').getAttribute('aria-pressed')).toBe('true');
    await section.locator('lw-station-chart canvas').waitFor();
    expect(await section.locator('lw-station-chart canvas').getAttribute('aria-label')).toMatch(
      /observed hours and the 192 hours of the forecast issued/,
    );
    await section.evaluate((element) => element.scrollIntoView({ block: 'start' }));
    await page.screenshot({ path: resolve(artifacts, 'station-forecasts.png') });
    expect(blockingViolations(await findAccessibilityViolations(page))).toEqual([]);
    // A station has no model, fit or assumed temperatures: the page does not ask for them.
    expect(failedCalls).toEqual([]);
  });

  it('checks an uploaded forecast file before storing anything, then stores both issues converted to °F', async () => {
    const section = page.locator('lw-station-forecasts');
    await section
      .getByLabel('Forecast file (CSV)')
      .setInputFiles({ name: 'millrace-dec.csv', mimeType: 'text/csv', buffer: Buffer.from(forecastFile()) });
    await section.getByRole('table', { name: /First rows of millrace-dec\.csv/ }).waitFor();
    // The columns were guessed from the header; °C from "temp_c".
    expect(await section.getByLabel('Issue time column').textContent()).toContain('issued');
    expect(await section.getByLabel('Valid hour column').textContent()).toContain('valid');
    expect(await section.getByLabel('Temperature column').textContent()).toContain('temp_c');
    expect(await section.getByLabel('Unit of the file').textContent()).toContain('°C');
    await section.getByRole('button', { name: 'Check the file' }).click();
    const verdict = section.getByTestId('forecast-check');
    await verdict.waitFor();
    expect(await verdict.textContent()).toContain('2 issues with 96 valid hours for Millrace Flats weather station, ready to store.');
    expect(await section.getByRole('table', { name: /Issues in the file/ }).textContent()).toContain('32.0 to 68.0 °F (converted)');
    const { rows } = await server.pool.query('select count(*)::int as n from temperature_forecasts where series_id = $1', [stationId]);
    expect(rows[0].n).toBe(7 * 192);
    await section.evaluate((element) => element.scrollIntoView({ block: 'start' }));
    await page.screenshot({ path: resolve(artifacts, 'station-forecast-check.png') });

    await section.getByRole('button', { name: 'Store 2 issues' }).click();
    await expect
      .poll(async () => (await section.getByRole('status').first().textContent()) ?? '', { timeout: 15_000 })
      .toContain('Stored 2 issues with 96 valid hours for Millrace Flats weather station, converted from °C.');
    const issueRows = section.locator('table.issues tbody tr');
    await expect.poll(() => issueRows.count(), { timeout: 15_000 }).toBe(9);
    expect(await issueRows.first().textContent()).toMatch(/file millrace-dec\.csv \(upload \d+\) by Tomas Reede/);
    expect(await issueRows.first().textContent()).toContain('48 hours');
    const stored = await server.pool.query('select count(*)::int as n from temperature_forecasts where series_id = $1', [stationId]);
    expect(stored.rows[0].n).toBe(7 * 192 + 96);
    await section.locator('lw-station-chart canvas').waitFor();
    await page.screenshot({ path: resolve(artifacts, 'station-forecast-stored.png') });
    expect(blockingViolations(await findAccessibilityViolations(page))).toEqual([]);
  });

  it('names the row a file cannot store, offers no store, and the steward discards it', async () => {
    const section = page.locator('lw-station-forecasts');
    const lines = [
      'issued,valid,temp_c',
      ...Array.from(
        { length: 24 },
        (_, k) => `2026-12-04 06:00,${new Date(Date.parse('2026-12-05T06:00:00Z') + k * 3_600_000).toISOString()},${k === 2 ? 400 : 5}`,
      ),
    ];
    await section
      .getByLabel('Forecast file (CSV)')
      .setInputFiles({ name: 'hot-typo.csv', mimeType: 'text/csv', buffer: Buffer.from(`${lines.join('\n')}\n`) });
    await section.getByRole('table', { name: /First rows of hot-typo\.csv/ }).waitFor();
    await section.getByRole('button', { name: 'Check the file' }).click();
    const verdict = section.getByTestId('forecast-check');
    await verdict.waitFor();
    expect(await verdict.textContent()).toContain(
      '1 issue with 24 valid hours for Millrace Flats weather station; 1 problem stops the file from being stored.',
    );
    // Row 1 is the header: the third hour is on row 4.
    expect(await section.locator('ul.problems').textContent()).toContain(
      'Row 4, temp_c: 400 °C is outside plausible air temperatures (-70 to 60 °C). Is the unit right?',
    );
    expect(await section.getByRole('button', { name: /^Store/ }).count()).toBe(0);
    await page.screenshot({ path: resolve(artifacts, 'station-forecast-problem.png') });
    await section.getByRole('button', { name: 'Discard the file' }).click();
    await expect
      .poll(
        async () =>
          (await section
            .locator('lw-forecast-upload')
            .getByRole('status')
            .textContent()
            .catch(() => '')) ?? '',
        { timeout: 15_000 },
      )
      .toBe('Discarded hot-typo.csv; nothing was stored.');
    const { rows } = await server.pool.query('select count(*)::int as n from temperature_forecasts where series_id = $1', [stationId]);
    expect(rows[0].n).toBe(7 * 192 + 96);
  });

  it('answers the same file again with the earlier upload and stores nothing more', async () => {
    const section = page.locator('lw-station-forecasts');
    await section
      .getByLabel('Forecast file (CSV)')
      .setInputFiles({ name: 'millrace-dec.csv', mimeType: 'text/csv', buffer: Buffer.from(forecastFile()) });
    await expect
      .poll(
        async () =>
          (await section
            .locator('lw-forecast-upload')
            .getByRole('status')
            .textContent()
            .catch(() => '')) ?? '',
        { timeout: 15_000 },
      )
      .toMatch(/^Already imported as upload \d+; nothing was added\.$/);
    const { rows } = await server.pool.query('select count(*)::int as n from temperature_forecasts where series_id = $1', [stationId]);
    expect(rows[0].n).toBe(7 * 192 + 96);
    expect(pageErrors).toEqual([]);
  });
});
