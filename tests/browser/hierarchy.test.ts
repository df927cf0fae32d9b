/**
 * Coherence and reconciliation in a real browser as a planner, over the seeded demo co-op: Kestrel Uplands
 * (zone-north, MW) with drafts that do not add up to its four feeders (kW); the coherence view says by how
 * much, a minimum-trace reconciliation makes them add up, the group approval preview says so, and approving
 * the group approves the coherent set. Screenshots of the view before and after at 1440×900.
 */
import { mkdir } from 'node:fs/promises';
import { resolve } from 'node:path';
import { type HierarchyCoherence, type Role } from '@loadwright/contracts';
import { series as seriesTable } from '@loadwright/db';
import type { Page } from 'playwright-core';
import { afterAll, beforeAll, describe, expect, it } from 'vitest';
import { demoScenario } from '../../fixtures/demo/scenario';
import { seedDemo } from '../../libs/db/src/seed/seed-demo';
import { writeDraftVersion } from '../forecasts/support/draft-versions';
import { signIn } from '../support/people';
import { type TestServer, startTestServer } from '../support/server';
import { blockingViolations, findAccessibilityViolations } from './support/accessibility';
import { type TestBrowser, launchBrowser } from './support/browser';
import { signInThroughPage } from './support/sign-in';

const artifacts = resolve(import.meta.dirname, '../.artifacts');
const password = demoScenario.demoPassword;
const account = (role: Role) => demoScenario.accounts.find((candidate) => candidate.role === role)!;
const origin = new Date(Date.parse(demoScenario.end) + 3_600_000);

let browser: TestBrowser;
let server: TestServer;
let page: Page;
let zoneId: number;
const pageErrors: string[] = [];

/** JSON from the API with a viewer's session. */
async function api<T>(path: string): Promise<T> {
  const viewer = await signIn(server.url, account('viewer').email, password);
  const response = await fetch(`${server.url}${path}`, { headers: { cookie: viewer.cookie.join('; ') } });
  if (!response.ok) throw new Error(`${path}: ${response.status} ${await response.text()}`);
  return (await response.json()) as T;
}

beforeAll(async () => {
  await mkdir(artifacts, { recursive: true });
  server = await startTestServer({ worker: false });
  await seedDemo(server.databaseUrl);
  const rows = await server.db.select({ id: seriesTable.id, key: seriesTable.key }).from(seriesTable);
  const id = (key: string) => rows.find((r) => r.key === key)!.id;
  zoneId = id('zone-north');
  // A daily cycle per feeder (kW) and a zone draft 6 % above their sum (MW): off by more than its 3.1 % losses.
  const shape = (ts: Date) => 1 + 0.25 * Math.sin((2 * Math.PI * (ts.getUTCHours() - 11)) / 24);
  const levels = { 'fdr-n1': 1500, 'fdr-n2': 1100, 'fdr-n3': 1300, 'fdr-n4': 2600 };
  for (const [key, level] of Object.entries(levels)) {
    await writeDraftVersion(server.db, {
      seriesId: id(key),
      origin,
      mean: (_, ts) => level * shape(ts),
      stdError: (i) => level * (0.03 + i / 5000),
    });
  }
  const total = Object.values(levels).reduce((a, b) => a + b, 0) / 1000;
  await writeDraftVersion(server.db, {
    seriesId: zoneId,
    origin,
    mean: (_, ts) => 1.06 * total * shape(ts),
    stdError: (i) => total * (0.025 + i / 6000),
  });
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

const verdict = () => page.getByTestId('coherence-verdict').textContent();

describe('the coherence view and reconciliation', () => {
  it('shows how far the zone’s draft is from the sum of its feeders', async () => {
    await page.getByRole('heading', { name: 'Does it add up?' }).waitFor();
    await expect.poll(verdict, { timeout: 15_000 }).toMatch(/Off by 5\.66 % on average/);
    // 1 − 1/1.06 = 5.66 % of the zone at every hour (the feeders' shape is the zone's).
    const coherence = await api<HierarchyCoherence>(`/api/series/${zoneId}/coherence`);
    expect(coherence.summary.meanAbsGapPercent).toBeCloseTo(100 * (1 - 1 / 1.06), 6);
    expect(await page.locator('lw-coherence-panel table tbody tr').count()).toBe(5);
    await page.locator('#coherence-heading').evaluate((heading) => heading.scrollIntoView({ block: 'start' }));
    await page.screenshot({ path: resolve(artifacts, 'hierarchy-coherence-before.png') });
    expect(blockingViolations(await findAccessibilityViolations(page))).toEqual([]);
  });

  it('says plainly, without an alarm, when nothing is approved to compare yet', async () => {
    await page.getByRole('radio', { name: 'Approved' }).click();
    await expect.poll(verdict, { timeout: 15_000 }).toMatch(/Nothing to compare yet: the sum needs forecasts of the same hours/);
    const shown = page.getByTestId('coherence-verdict');
    expect(await shown.getAttribute('class')).toContain('nothing-yet');
    expect(await shown.locator('mat-icon').getAttribute('data-mat-icon-name')).toBe('info');
    expect(await page.locator('lw-coherence-panel table').count()).toBe(0);
    // On a phone the verdict wraps; its icon keeps its 24 px.
    await page.setViewportSize({ width: 390, height: 844 });
    await expect.poll(() => shown.locator('mat-icon').evaluate((icon) => icon.getBoundingClientRect().width)).toBe(24);
    await page.locator('#coherence-heading').evaluate((heading) => heading.scrollIntoView({ block: 'start' }));
    await page.screenshot({ path: resolve(artifacts, 'hierarchy-coherence-nothing-yet-phone.png') });
    await page.setViewportSize({ width: 1440, height: 900 });
    await page.getByRole('radio', { name: 'Drafts' }).click();
    await expect.poll(verdict, { timeout: 15_000 }).toMatch(/Off by 5\.66 % on average/);
  });

  it('reconciles by minimum trace into drafts that add up at every hour', async () => {
    await page.getByRole('radio', { name: 'Minimum trace' }).click();
    await page.getByRole('button', { name: 'Reconcile the drafts' }).click();
    await page.getByRole('dialog').getByRole('button', { name: 'Reconcile' }).click();
    await expect.poll(verdict, { timeout: 20_000 }).toMatch(/Adds up at every hour — reconciled min-trace set #1/);
    const coherence = await api<HierarchyCoherence>(`/api/series/${zoneId}/coherence`);
    expect(coherence.summary.coherent).toBe(true);
    await page.locator('#coherence-heading').evaluate((heading) => heading.scrollIntoView({ block: 'start' }));
    await page.screenshot({ path: resolve(artifacts, 'hierarchy-coherence-after.png') });
  });

  it('previews the group as adding up and approves the coherent set together', async () => {
    await page.getByRole('button', { name: "Review the group's drafts" }).click();
    await expect.poll(() => page.getByTestId('group-coherence').textContent(), { timeout: 15_000 }).toMatch(/These drafts add up/);
    await page.locator('#group-approval-heading').evaluate((heading) => heading.scrollIntoView({ block: 'start' }));
    await page.screenshot({ path: resolve(artifacts, 'hierarchy-group-approval.png') });
    await page.getByRole('button', { name: 'Approve 5 drafts' }).click();
    await page.getByRole('dialog').getByRole('button', { name: 'Approve 5 drafts' }).click();
    await page.getByText('Approved 5 drafts of the group together.').waitFor({ timeout: 15_000 });
    await page.getByRole('radio', { name: 'Approved' }).click();
    await expect.poll(verdict, { timeout: 15_000 }).toMatch(/Adds up at every hour/);
    const approved = await api<HierarchyCoherence>(`/api/series/${zoneId}/coherence?state=approved`);
    expect(approved.summary.coherent).toBe(true);
    expect(approved.children.every((c) => c.versionId !== null)).toBe(true);
    expect(pageErrors).toEqual([]);
  });
});
