/**
 * Uploads in a real browser against a real API, worker and the seeded demo co-op: a steward drops a
 * long-format CSV for a demo feeder (with a gap, a spike and a negative reading), confirms the
 * proposed mapping, watches the import's progress bar finish, reads the validation report and opens
 * the catalogue filtered to the feeder's zone; a binary file renamed .csv shows the server's message;
 * a viewer gets no upload action and no drop zone. Screenshots at 1440×900 are kept in tests/.artifacts.
 */
import { mkdir, mkdtemp, rm, writeFile } from 'node:fs/promises';
import { tmpdir } from 'node:os';
import { join, resolve } from 'node:path';
import type { Role, UploadDetail } from '@loadwright/contracts';
import type { Page } from 'playwright-core';
import { afterAll, beforeAll, describe, expect, it } from 'vitest';
import { demoScenario } from '../../fixtures/demo/scenario';
import { seedDemo } from '../../libs/db/src/seed/seed-demo';
import { type TestServer, startTestServer } from '../support/server';
import { blockingViolations, findAccessibilityViolations } from './support/accessibility';
import { type TestBrowser, launchBrowser } from './support/browser';
import { watchRequests } from './support/network-guard';
import { signInThroughPage } from './support/sign-in';
import { clockText } from '../../apps/web/src/app/refits/clock-text';

const artifacts = resolve(import.meta.dirname, '../.artifacts');
const password = demoScenario.demoPassword;
const account = (role: Role) => demoScenario.accounts.find((candidate) => candidate.role === role)!;

/** The feeder the file is for, its zone, and the day after the demo history ends (in the past, so no reading is "future"). */
const feeder = demoScenario.feeders[0]!;
const zone = demoScenario.zones.find((candidate) => candidate.key === feeder.zoneKey)!;
const firstHour = Date.parse(demoScenario.end) + 3_600_000;
const hour = 3_600_000;
/** Hours of the file: 10 and 11 are missing (a two-interval gap), 15 is a ×5 spike, 20 is negative. */
const gapHours = [10, 11];
const spikeHour = 15;
const negativeHour = 20;

/** A day of hourly load for the feeder, long format (timestamp, series key, value), UTC offsets. */
function feederDay(): string {
  const lines = ['timestamp,feeder,load_kw'];
  for (let h = 0; h < 24; h++) {
    if (gapHours.includes(h)) continue;
    const base = feeder.baseKw * (1 + 0.18 * Math.sin((2 * Math.PI * (h - 9)) / 24)) + 11 * Math.cos(1.7 * h);
    const value = h === spikeHour ? base * 5 : h === negativeHour ? -42 : base;
    lines.push(`${new Date(firstHour + h * hour).toISOString()},${feeder.key},${value.toFixed(1)}`);
  }
  return `${lines.join('\n')}\n`;
}

let browser: TestBrowser;
let server: TestServer;
let page: Page;
let requests: ReturnType<typeof watchRequests>;
let folder: string;

beforeAll(async () => {
  await mkdir(artifacts, { recursive: true });
  folder = await mkdtemp(join(tmpdir(), 'loadwright-upload-files-'));
  server = await startTestServer();
  await seedDemo(server.databaseUrl);
  browser = await launchBrowser();
  page = await browser.context.newPage();
  requests = watchRequests(page);
}, 180_000);

afterAll(async () => {
  await page?.close();
  await browser?.close();
  await server?.close();
  if (folder) await rm(folder, { recursive: true, force: true });
});

/** The Uploads page's file input (the drop zone's picker). */
const picker = () => page.locator('input[type=file]');

describe('a steward uploads a day of feeder readings', () => {
  let uploadId = 0;

  it('sends the file with a transfer progress bar and lands on the mapping step', async () => {
    await signInThroughPage(page, server.url, account('steward').email, password, '/uploads');
    await page.getByRole('heading', { level: 1, name: 'Uploads' }).waitFor();
    await page.getByRole('heading', { name: 'Drop a CSV file here' }).waitFor();
    const file = join(folder, `${feeder.key}-day.csv`);
    await writeFile(file, feederDay());
    const uploadContentTypes: string[] = [];
    page.on('request', (request) => {
      if (request.url().endsWith('/api/uploads') && request.method() === 'POST')
        uploadContentTypes.push(request.headers()['content-type'] ?? '');
    });
    await picker().setInputFiles(file);
    await page.waitForURL((url) => /^\/uploads\/\d+$/.test(url.pathname), { timeout: 15_000 });
    uploadId = Number(new URL(page.url()).pathname.split('/').at(-1));
    expect(uploadContentTypes[0]).toMatch(/^multipart\/form-data; boundary=/);
    await page.getByRole('heading', { level: 2, name: 'Column mapping' }).waitFor();
  });

  it('shows the first rows and the proposed mapping: timestamp, value and series key columns, kW, the feeder time zone', async () => {
    const preview = page.getByRole('region', { name: 'Preview of the first rows' });
    const headers = preview.getByRole('columnheader');
    expect(await headers.locator('.column-name').allTextContents()).toEqual(['timestamp', 'feeder', 'load_kw']);
    expect(await headers.locator('.role').allTextContents()).toEqual(['timestamp', 'series key', 'value']);
    expect(await preview.getByRole('row').count()).toBe(9);
    expect(await preview.getByRole('row').nth(1).textContent()).toContain(feeder.key);
    expect(await page.getByRole('combobox', { name: 'Timestamp column' }).textContent()).toContain('timestamp');
    expect(await page.getByRole('combobox', { name: 'Value column' }).textContent()).toContain('load_kw');
    expect(await page.getByRole('combobox', { name: 'Series key column' }).textContent()).toContain('feeder');
    expect(await page.getByRole('combobox', { name: 'Unit of the values' }).textContent()).toContain('kW (mean demand)');
    expect(await page.getByLabel('Time zone of local times').inputValue()).toBe(demoScenario.organisation.timeZone);
    expect(await page.getByRole('combobox', { name: 'Repeated hour when clocks fall back' }).textContent()).toContain(
      'By file order: first daylight, then standard time',
    );
    expect(blockingViolations(await findAccessibilityViolations(page))).toEqual([]);
    await page.screenshot({ path: resolve(artifacts, 'upload-preview.png') });
    await page.getByRole('heading', { level: 2, name: 'Column mapping' }).evaluate((heading) => heading.scrollIntoView({ block: 'start' }));
    await page.screenshot({ path: resolve(artifacts, 'upload-mapping.png') });
  });

  it('checks the mapping before sending it: one column cannot be both timestamp and value', async () => {
    await page.getByRole('combobox', { name: 'Value column' }).click();
    await page.getByRole('option', { name: 'timestamp', exact: true }).click();
    await page.getByRole('button', { name: 'Confirm and import' }).click();
    const alert = page.getByRole('alert');
    await alert.getByText('the timestamp, value and series key columns must be three different columns').waitFor();
    await page.getByRole('combobox', { name: 'Value column' }).click();
    await page.getByRole('option', { name: 'load_kw', exact: true }).click();
  });

  it('confirms, and the import progress bar runs to 100 %', async () => {
    const polls = () => requests.all.filter((url) => url.endsWith(`/api/uploads/${uploadId}`)).length;
    await page.getByRole('button', { name: 'Confirm and import' }).click();
    const bar = page.getByRole('progressbar', { name: 'Import progress' });
    await bar.waitFor({ timeout: 15_000 });
    await page.screenshot({ path: resolve(artifacts, 'upload-progress.png') });
    await page.getByRole('heading', { level: 2, name: 'Import finished' }).waitFor({ timeout: 30_000 });
    expect(await bar.getAttribute('aria-valuenow')).toBe('100');
    expect(await page.getByRole('status').filter({ hasText: 'rows read' }).textContent()).toMatch(/100 %\s*·\s*22\s*of\s*22\s*rows read/);
    // Polling stops once the import is done.
    const afterDone = polls();
    await page.waitForTimeout(2500);
    expect(polls()).toBe(afterDone);
  });

  it('reports the gap, the spike and the negative reading with examples, and offers the findings CSV', async () => {
    const detail = (await (await page.request.get(`${server.url}/api/uploads/${uploadId}`)).json()) as UploadDetail;
    const counts = Object.fromEntries(detail.report.counts.map((entry) => [entry.rule, entry.count]));
    expect(counts).toMatchObject({ gap: 1, spike: 1, negative: 1 });
    for (const heading of ['Gaps', 'Spikes', 'Negative values']) {
      const section = page.getByRole('region', { name: new RegExp(`${heading}$`) });
      await section.waitFor();
      expect(await section.getByRole('row').count()).toBeGreaterThan(1);
    }
    const spikeRow = page
      .getByRole('region', { name: /Spikes$/ })
      .getByRole('row')
      .nth(1);
    expect(await spikeRow.textContent()).toContain(feeder.key);
    // Finding times are in the organisation's zone, named in the column head.
    expect(await spikeRow.textContent()).toContain(
      clockText(new Date(firstHour + spikeHour * hour).toISOString(), demoScenario.organisation.timeZone, false),
    );
    expect(
      await page
        .getByRole('region', { name: /Spikes$/ })
        .getByRole('columnheader')
        .nth(1)
        .textContent(),
    ).toBe(`Interval start (${demoScenario.organisation.timeZone})`);
    const negativeRow = page
      .getByRole('region', { name: /Negative values$/ })
      .getByRole('row')
      .nth(1);
    expect(await negativeRow.textContent()).toContain('-42');
    expect(await page.getByRole('term').filter({ hasText: 'New readings stored' }).locator('xpath=..').textContent()).toContain(
      String(detail.upload.rowsImported),
    );
    const download = page.getByRole('link', { name: 'Download findings (CSV)' });
    expect(await download.getAttribute('href')).toBe(`/api/uploads/${uploadId}/report.csv`);
    const csv = await page.request.get(`${server.url}/api/uploads/${uploadId}/report.csv`);
    expect(csv.status()).toBe(200);
    expect(await csv.text()).toMatch(/^spike,/m);
    expect(blockingViolations(await findAccessibilityViolations(page))).toEqual([]);
    await page.screenshot({ path: resolve(artifacts, 'upload-report.png') });
  });

  it('links to the feeder and to the catalogue filtered to its zone', async () => {
    const touched = page.getByRole('region', { name: 'Series in this upload' });
    expect(await touched.getByRole('link', { name: new RegExp(feeder.key) }).getAttribute('href')).toMatch(/^\/series\/\d+$/);
    await touched.getByRole('link', { name: `Catalogue: ${zone.name}` }).click();
    await page.waitForURL((url) => url.pathname === '/series' && url.searchParams.get('under') === zone.key);
    await page.getByRole('heading', { level: 1, name: 'Series' }).waitFor();
    const feederKeys = demoScenario.feeders.filter((f) => f.zoneKey === zone.key).map((f) => f.key);
    await page.getByRole('link', { name: feederKeys[0]!, exact: true }).waitFor();
    const keys = await page.locator('td.mat-column-key a').allTextContents();
    expect(keys.map((k) => k.trim()).sort()).toEqual(feederKeys.sort());
  });

  it('lists the upload as imported on the Uploads page', async () => {
    await page.goto(`${server.url}/uploads`, { waitUntil: 'networkidle' });
    const row = page.getByRole('row', { name: new RegExp(`${feeder.key}-day\\.csv`) });
    await row.waitFor();
    expect(await row.textContent()).toContain('Imported');
  });

  it("shows the server's message for a binary file renamed .csv, and stores nothing from it", async () => {
    // Dropped this time, as a file dragged from the desktop would be.
    const dataTransfer = await page.evaluateHandle(
      (bytes) => {
        const transfer = new DataTransfer();
        transfer.items.add(new File([new Uint8Array(bytes)], 'meter-export.csv', { type: 'text/csv' }));
        return transfer;
      },
      [0x4c, 0x57, 0x01, 0x00, 0xff, 0x13, 0x37, 0x00, 0x42],
    );
    await page.getByRole('region', { name: 'Drop a CSV file here' }).dispatchEvent('drop', { dataTransfer });
    const alert = page.getByRole('alert').filter({ hasText: 'was not taken in' });
    await alert.waitFor({ timeout: 15_000 });
    expect(await alert.textContent()).toContain('meter-export.csv was not taken in');
    expect(await alert.textContent()).toContain('The file holds binary data (a zero byte at offset 3), not CSV text.');
    expect(new URL(page.url()).pathname).toBe('/uploads');
    const row = page.getByRole('row', { name: /meter-export\.csv/ });
    await row.waitFor();
    expect(await row.textContent()).toContain('Refused');
    expect(blockingViolations(await findAccessibilityViolations(page))).toEqual([]);
  });

  it('answers the same bytes again with the earlier upload', async () => {
    await picker().setInputFiles(join(folder, `${feeder.key}-day.csv`));
    const status = page.getByRole('status').filter({ hasText: `Already imported as upload ${uploadId}` });
    await status.waitFor({ timeout: 15_000 });
    expect(await status.getByRole('link', { name: `Open upload ${uploadId}` }).getAttribute('href')).toBe(`/uploads/${uploadId}`);
  });
});

describe('a Green Button file dropped on the Uploads page', () => {
  it('goes to the Green Button import: the steward picks the feeder and the usage lands there', async () => {
    await page.goto(`${server.url}/uploads`, { waitUntil: 'networkidle' });
    await picker().setInputFiles(resolve(import.meta.dirname, '../../fixtures/green-button/hourly-energy-wh.xml'));
    const card = page.getByRole('region', { name: 'Green Button file' });
    await card.waitFor({ timeout: 15_000 });
    expect(await card.textContent()).toContain('hourly-energy-wh.xml is a Green Button (ESPI) usage file, not CSV.');
    await card.getByRole('combobox', { name: 'Series of this file' }).click();
    await page.getByRole('option', { name: new RegExp(`^${feeder.key} ·`) }).click();
    expect(blockingViolations(await findAccessibilityViolations(page))).toEqual([]);
    await card.getByRole('button', { name: 'Import Green Button file' }).click();
    const done = card.getByRole('status');
    await done.waitFor({ timeout: 30_000 });
    // The fixture holds 47 hourly intervals in Wh (see libs/readings/src/green-button/parse-green-button.spec.ts).
    expect(await done.textContent()).toMatch(/47 intervals read \(Wh\)/);
    await page.screenshot({ path: resolve(artifacts, 'upload-green-button.png') });
    const row = page.getByRole('row', { name: /hourly-energy-wh|green_button/ });
    await row.first().waitFor({ timeout: 15_000 });
  });
});

describe('a large file on a slow connection', () => {
  it("shows how much of the file has gone, then the server's answer", async () => {
    const cdp = await page.context().newCDPSession(page);
    await cdp.send('Network.emulateNetworkConditions', {
      offline: false,
      latency: 20,
      downloadThroughput: -1,
      uploadThroughput: 96 * 1024,
    });
    const file = join(folder, 'readings-one-column.csv');
    // 300 kB of one column: Loadwright refuses it for its single column once it has arrived.
    await writeFile(file, `reading\n${'1234.5\n'.repeat(43_000)}`);
    await picker().setInputFiles(file);
    const seen = await page.waitForFunction(
      () => {
        const bar = document.querySelector('mat-progress-bar[aria-label="File transfer"]');
        const value = Number(bar?.getAttribute('aria-valuenow'));
        return value > 0 && value < 100 ? value : null;
      },
      undefined,
      { timeout: 15_000, polling: 50 },
    );
    expect(await seen.jsonValue()).toBeGreaterThan(0);
    expect(await page.getByRole('status').filter({ hasText: 'Sending…' }).textContent()).toMatch(
      /readings-one-column\.csv\s*Sending… \d+ % of 294 kB/,
    );
    await page.screenshot({ path: resolve(artifacts, 'upload-transfer.png') });
    const alert = page.getByRole('alert').filter({ hasText: 'readings-one-column.csv was not taken in' });
    await alert.waitFor({ timeout: 30_000 });
    expect(await alert.textContent()).toContain('Row 1 has a single column');
    await cdp.send('Network.emulateNetworkConditions', { offline: false, latency: 0, downloadThroughput: -1, uploadThroughput: -1 });
    await cdp.detach();
  });
});

describe('a viewer', () => {
  it('has no Uploads section, no drop zone at its address, and no upload request is made', async () => {
    await browser.context.clearCookies();
    await signInThroughPage(page, server.url, account('viewer').email, password);
    const navigation = page.getByRole('navigation', { name: 'Sections' });
    await navigation.getByRole('link', { name: 'Series', exact: true }).waitFor();
    expect(await navigation.getByRole('link', { name: 'Uploads', exact: true }).count()).toBe(0);
    const before = requests.all.filter((url) => url.includes('/api/uploads')).length;
    await page.goto(`${server.url}/uploads`, { waitUntil: 'networkidle' });
    await page.getByRole('heading', { level: 1, name: 'Not allowed for your role' }).waitFor();
    expect(await page.getByRole('alert').textContent()).toContain('Uploads is not available to your role (viewer)');
    expect(await page.getByRole('button', { name: 'Choose a CSV file' }).count()).toBe(0);
    expect(await picker().count()).toBe(0);
    expect(requests.all.filter((url) => url.includes('/api/uploads')).length).toBe(before);
  });

  it('made no request that left 127.0.0.1', () => {
    expect(requests.offMachine).toEqual([]);
  });
});
