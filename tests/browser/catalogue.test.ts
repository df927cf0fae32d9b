/**
 * The series catalogue in a real browser over the seeded demo co-op: filters (text, hierarchy, kind,
 * level) that live in the address bar, server-side sort and paging, reading counts by quality flag,
 * a row that opens its series; stewards add, edit and archive series with the shared schema's checks
 * and the server's field errors on the form; a viewer sees no edit actions. Screenshot at 1440×900.
 */
import { mkdir } from 'node:fs/promises';
import { resolve } from 'node:path';
import type { Role, SeriesDetail } from '@loadwright/contracts';
import type { Page } from 'playwright-core';
import { afterAll, beforeAll, describe, expect, it } from 'vitest';
import { qualitySentence } from '../../apps/web/src/app/series-catalogue/quality-counts';
import { demoScenario } from '../../fixtures/demo/scenario';
import { seedDemo } from '../../libs/db/src/seed/seed-demo';
import { type TestServer, startTestServer } from '../support/server';
import { blockingViolations, findAccessibilityViolations } from './support/accessibility';
import { type TestBrowser, launchBrowser } from './support/browser';
import { signIn } from '../support/people';
import { signInThroughPage } from './support/sign-in';

const artifacts = resolve(import.meta.dirname, '../.artifacts');
const password = demoScenario.demoPassword;
const account = (role: Role) => demoScenario.accounts.find((candidate) => candidate.role === role)!;
/** Every series the demo seeds: system, zones, feeders and weather stations. */
const allKeys = [
  demoScenario.system.key,
  ...demoScenario.zones.map((z) => z.key),
  ...demoScenario.feeders.map((f) => f.key),
  ...demoScenario.stations.map((s) => s.key),
];
const north = demoScenario.zones.find((z) => z.key === 'zone-north')!;
const northFeeders = demoScenario.feeders.filter((f) => f.zoneKey === north.key).map((f) => f.key);
/** The feeder another system pushes a negative reading to, just after the demo history ends. */
const pushedTo = 'fdr-c3';
const pushedAt = new Date(Date.parse(demoScenario.end) + 3_600_000).toISOString();

let browser: TestBrowser;
let server: TestServer;
let page: Page;

beforeAll(async () => {
  await mkdir(artifacts, { recursive: true });
  server = await startTestServer({ worker: false });
  await seedDemo(server.databaseUrl);
  // A reading pushed by another system with its sign flipped: validation flags it negative.
  const steward = await signIn(server.url, account('steward').email, password);
  const pushed = await fetch(`${server.url}/api/series/${pushedTo}/readings`, {
    method: 'POST',
    headers: { cookie: steward.cookie.join('; '), 'x-csrf-token': steward.csrf, 'content-type': 'application/json' },
    body: JSON.stringify({ readings: [{ ts: pushedAt, value: -35 }] }),
  });
  if (!pushed.ok) throw new Error(`push failed: ${pushed.status} ${await pushed.text()}`);
  browser = await launchBrowser();
  page = await browser.context.newPage();
}, 180_000);

afterAll(async () => {
  await page?.close();
  await browser?.close();
  await server?.close();
});

/** Keys of the rows shown, in order. */
const shownKeys = async () => (await page.locator('td.mat-column-key a').allTextContents()).map((key) => key.trim());

/** Waits until the table shows exactly `keys` (in any order unless `ordered`). */
async function expectRows(keys: string[], ordered = false): Promise<void> {
  await expect
    .poll(async () => (ordered ? shownKeys() : (await shownKeys()).sort()), { timeout: 10_000 })
    .toEqual(ordered ? keys : [...keys].sort());
}

/** The row of one series. */
const rowOf = (key: string) => page.getByRole('row').filter({ has: page.getByRole('link', { name: key, exact: true }) });

describe('a steward reads the catalogue', () => {
  it('lists every demo series by key, with unit, interval, time zone, latest reading and quality counts', async () => {
    await signInThroughPage(page, server.url, account('steward').email, password, '/series');
    await page.getByRole('heading', { level: 1, name: 'Series' }).waitFor();
    await expectRows([...allKeys].sort(), true);
    const row = rowOf(pushedTo);
    await expect.poll(() => row.locator('td.mat-column-quality').textContent(), { timeout: 15_000 }).toContain('1 negative');
    const counts = (await (await page.request.get(`${server.url}/api/series/${pushedTo}`)).json()) as SeriesDetail;
    expect(await row.locator('td.mat-column-quality .visually-hidden').textContent()).toBe(qualitySentence(counts.readings));
    const text = (await row.textContent()) ?? '';
    expect(text).toContain('feeder');
    expect(text).toContain('kW');
    expect(text).toContain('Hourly');
    expect(text).toContain(demoScenario.organisation.timeZone);
    // The latest reading, 1 Dec 2026 00:00 UTC, in the series' own zone and named: 30 Nov 18:00 CST (UTC−6).
    expect(text).toContain('Mon Nov 30 18:00 CST');
    await expect.poll(() => rowOf('sys').locator('td.mat-column-quality').textContent(), { timeout: 15_000 }).toMatch(/17,520\s*all clean/);
    expect(blockingViolations(await findAccessibilityViolations(page))).toEqual([]);
    await page.mouse.move(0, 0); // no row hover in the picture
    await page.screenshot({ path: resolve(artifacts, 'catalogue.png') });
  });

  it('filters to a zone and its feeders with the hierarchy filter, and keeps the filter in the address', async () => {
    await page.getByRole('combobox', { name: 'Part of the network' }).click();
    await page.getByRole('option', { name: new RegExp(north.name) }).click();
    await expectRows(northFeeders);
    expect(new URL(page.url()).searchParams.get('under')).toBe(north.key);
    await page.reload({ waitUntil: 'networkidle' });
    await expectRows(northFeeders);
  });

  it('searches key and name, and narrows by kind and level', async () => {
    await page.getByRole('button', { name: 'Clear filters' }).click();
    await page.getByLabel('Search key or name').fill('harrow');
    await expectRows(['fdr-n1', 'fdr-n2']);
    await page.getByRole('button', { name: 'Clear filters' }).click();
    await page.getByRole('combobox', { name: 'Kind' }).click();
    await page.getByRole('option', { name: 'Temperature' }).click();
    await expectRows(demoScenario.stations.map((s) => s.key));
    // The chosen option's panel closes with an animation; reopening before it is gone can catch its leaving options.
    await page.getByRole('listbox').waitFor({ state: 'detached' });
    await page.getByRole('combobox', { name: 'Kind' }).click();
    await page.getByRole('option', { name: 'Any kind' }).click();
    await page.getByRole('listbox').waitFor({ state: 'detached' });
    await page.getByRole('combobox', { name: 'Level' }).click();
    await page.getByRole('option', { name: 'zone', exact: true }).click();
    await expectRows(demoScenario.zones.map((z) => z.key));
    await page.getByRole('button', { name: 'Clear filters' }).click();
  });

  it('sorts by name on the server and pages through the catalogue', async () => {
    await expectRows([...allKeys].sort(), true);
    await page.getByRole('button', { name: 'Name', exact: true }).click();
    await page.getByRole('button', { name: 'Name', exact: true }).click();
    const byNameDesc = [demoScenario.system, ...demoScenario.zones, ...demoScenario.feeders, ...demoScenario.stations]
      .sort((a, b) => b.name.localeCompare(a.name, 'en', { sensitivity: 'base' }))
      .map((s) => s.key);
    await expect.poll(async () => (await shownKeys())[0], { timeout: 10_000 }).toBe(byNameDesc[0]);
    await page.locator('mat-paginator .mat-mdc-paginator-touch-target').click();
    await page.getByRole('option', { name: '10', exact: true }).click();
    await expect.poll(async () => (await shownKeys()).length).toBe(10);
    expect(await page.getByText(`1 – 10 of ${allKeys.length}`).count()).toBe(1);
    await page.getByRole('button', { name: 'Next page' }).click();
    await expect.poll(async () => (await shownKeys()).length).toBe(allKeys.length - 10);
    expect(new URL(page.url()).searchParams.get('page')).toBe('2');
  });

  it('opens a series from its row', async () => {
    await page.goto(`${server.url}/series`, { waitUntil: 'networkidle' });
    await expectRows([...allKeys].sort(), true);
    const href = await page.getByRole('link', { name: 'fdr-n1', exact: true }).getAttribute('href');
    expect(href).toMatch(/^\/series\/\d+$/);
    await rowOf('fdr-n1').locator('td.mat-column-name').click();
    await page.waitForURL((url) => url.pathname === href);
  });
});

describe('a steward changes the catalogue', () => {
  it("checks a new series with the shared schema, then shows the server's refusal on the key field", async () => {
    await page.goto(`${server.url}/series`, { waitUntil: 'networkidle' });
    await page.getByRole('button', { name: 'New series' }).click();
    const dialog = page.getByRole('dialog', { name: 'New series' });
    await dialog.getByLabel('Key').fill('9-bad key');
    await dialog.getByRole('button', { name: 'Add series' }).click();
    await dialog.getByText('Use lower-case letters a–z, digits 0–9 and hyphens, starting with a letter').waitFor();
    await dialog.getByText('Enter a name').waitFor();
    await dialog.getByLabel('Key').fill('fdr-n1');
    await dialog.getByLabel('Name').fill('A second N1');
    await dialog.getByRole('button', { name: 'Add series' }).click();
    await dialog.getByText('Already used by N1 Harrow Pike East').waitFor();
    // Let the field messages finish fading in: axe measures the contrast of the colours on screen.
    await page.waitForTimeout(400);
    expect(blockingViolations(await findAccessibilityViolations(page))).toEqual([]);
  });

  it('adds a feeder under a zone, and it appears under that zone', async () => {
    const dialog = page.getByRole('dialog', { name: 'New series' });
    await dialog.getByLabel('Key').fill('fdr-n5');
    await dialog.getByLabel('Name').fill('N5 Kestrel Ridge Road');
    await dialog.getByRole('combobox', { name: 'Part of' }).click();
    await page.getByRole('option', { name: new RegExp(`^\\s*${north.key} ·`) }).click();
    await dialog.getByRole('button', { name: 'Add series' }).click();
    await page.getByRole('status').getByText('fdr-n5 is added to the catalogue.').waitFor();
    await page.goto(`${server.url}/series?under=${north.key}`, { waitUntil: 'networkidle' });
    await expectRows([...northFeeders, 'fdr-n5']);
  });

  it('edits a series, then archives and restores it', async () => {
    await rowOf('fdr-n5').getByRole('button', { name: 'Edit fdr-n5' }).click();
    const dialog = page.getByRole('dialog', { name: 'Edit fdr-n5' });
    await dialog.getByLabel('Description').fill('Built 2026');
    await dialog.getByRole('button', { name: 'Save changes' }).click();
    await page.getByRole('status').getByText('fdr-n5 is saved.').waitFor();
    await rowOf('fdr-n5').getByRole('button', { name: 'Archive fdr-n5' }).click();
    await page.getByRole('dialog', { name: 'Archive fdr-n5?' }).getByRole('button', { name: 'Archive' }).click();
    await page.getByRole('status').getByText('fdr-n5 is archived.').waitFor();
    await expectRows(northFeeders);
    await page.getByRole('combobox', { name: 'Show' }).click();
    await page.getByRole('option', { name: 'Archived only' }).click();
    await expectRows(['fdr-n5']);
    await rowOf('fdr-n5').getByRole('button', { name: 'Restore fdr-n5' }).click();
    await page.getByRole('status').getByText('fdr-n5 is restored.').waitFor();
    await expectRows([]);
  });
});

describe('a viewer reads the catalogue', () => {
  it('sees the table but no way to add, edit or archive', async () => {
    await browser.context.clearCookies();
    await signInThroughPage(page, server.url, account('viewer').email, password, '/series');
    await expectRows([...allKeys, 'fdr-n5'].sort(), true);
    expect(await page.getByRole('button', { name: 'New series' }).count()).toBe(0);
    expect(await page.getByRole('button', { name: /^(Edit|Archive) / }).count()).toBe(0);
    expect(blockingViolations(await findAccessibilityViolations(page))).toEqual([]);
  });
});
