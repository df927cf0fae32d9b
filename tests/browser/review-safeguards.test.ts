/**
 * Review that cannot mislead, in a real browser: a stale draft is called stale on its series page
 * and left out of a group approval until the planner includes it; the adjustment form asks before a
 * change beyond a plausible one, refuses load below zero on the amount field, and shows no message
 * that does not apply. Screenshots of the stale warning and the group preview.
 */
import { mkdir } from 'node:fs/promises';
import { resolve } from 'node:path';
import type { Role } from '@loadwright/contracts';
import { forecastAdjustments, series as seriesTable } from '@loadwright/db';
import { eq } from 'drizzle-orm';
import type { Page } from 'playwright-core';
import { afterAll, beforeAll, describe, expect, it } from 'vitest';
import { demoScenario } from '../../fixtures/demo/scenario';
import { seedDemo } from '../../libs/db/src/seed/seed-demo';
import { writeDraftVersion } from '../forecasts/support/draft-versions';
import { type TestServer, startTestServer } from '../support/server';
import { blockingViolations, findAccessibilityViolations } from './support/accessibility';
import { type TestBrowser, launchBrowser } from './support/browser';
import { signInThroughPage } from './support/sign-in';

const artifacts = resolve(import.meta.dirname, '../.artifacts');
const account = (role: Role) => demoScenario.accounts.find((candidate) => candidate.role === role)!;
const hourMs = 3_600_000;

let browser: TestBrowser;
let server: TestServer;
let page: Page;
const ids = new Map<string, number>();
let freshDraft: number;

beforeAll(async () => {
  await mkdir(artifacts, { recursive: true });
  server = await startTestServer({ worker: false });
  await seedDemo(server.databaseUrl);
  for (const row of await server.db.select({ id: seriesTable.id, key: seriesTable.key }).from(seriesTable)) ids.set(row.key, row.id);
  // N1's draft has 150 of its 168 hours behind it; N2's starts at the next hour, a flat 100 kW.
  await writeDraftVersion(server.db, { seriesId: ids.get('fdr-n1')!, origin: new Date(Date.now() - 150 * hourMs) });
  freshDraft = await writeDraftVersion(server.db, {
    seriesId: ids.get('fdr-n2')!,
    origin: new Date(Math.ceil(Date.now() / hourMs) * hourMs),
  });
  browser = await launchBrowser();
  page = await browser.context.newPage();
  await signInThroughPage(page, server.url, account('planner').email, demoScenario.demoPassword, `/series/${ids.get('fdr-n1')}`);
}, 240_000);

afterAll(async () => {
  await page?.close();
  await browser?.close();
  await server?.close();
});

describe('a stale draft', () => {
  it('is called stale on its series page, with the hours that have passed', async () => {
    const warning = page.locator('.stale-draft');
    await warning.waitFor({ timeout: 20_000 });
    // 168 − 17 whole hours still ahead = 151 behind.
    expect(await warning.textContent()).toMatch(/This draft is stale: 151 of its 168 hours have passed\s+\(17 still ahead\)/);
    await page.screenshot({ path: resolve(artifacts, 'stale-draft-warning.png') });
  });

  it('is left out of the group approval until the planner includes it', async () => {
    await page.goto(`${server.url}/series/${ids.get('zone-north')}`, { waitUntil: 'networkidle' });
    await page.getByRole('button', { name: "Review the group's drafts" }).click();
    const notice = page.locator('.stale-drafts');
    await notice.waitFor();
    expect(await notice.textContent()).toContain('1 draft is stale: most of its hours have passed.');
    expect(await page.locator('tr', { hasText: 'N1 Harrow Pike East' }).textContent()).toContain('stale: only 17 h ahead');
    expect(await page.getByRole('button', { name: /^Approve \d+ drafts$/ }).textContent()).toContain('Approve 1 drafts');
    await page.getByRole('checkbox', { name: 'Include the stale drafts' }).check();
    // The preview is asked again with the stale drafts included; the button follows its answer.
    await expect
      .poll(async () => await page.getByRole('button', { name: /^Approve \d+ drafts$/ }).textContent())
      .toContain('Approve 2 drafts');
    expect(blockingViolations(await findAccessibilityViolations(page))).toEqual([]);
    await page.screenshot({ path: resolve(artifacts, 'group-approval-stale.png'), fullPage: true });
  });
});

describe('the adjustment form', () => {
  const amountField = () => page.getByLabel(/^Amount \(/);
  const reasonField = () => page.getByLabel('Reason');
  const addButton = () => page.getByRole('button', { name: 'Add adjustment' });
  const storedAdjustments = async () =>
    (await server.db.select().from(forecastAdjustments).where(eq(forecastAdjustments.versionId, freshDraft))).length;

  beforeAll(async () => {
    await page.goto(`${server.url}/series/${ids.get('fdr-n2')}`, { waitUntil: 'networkidle' });
    await addButton().waitFor();
  });

  it('shows no message before one applies', async () => {
    expect(await page.locator('lw-adjustments-panel mat-error').count()).toBe(0);
    expect(await page.locator('lw-adjustments-panel [role=alert]').count()).toBe(0);
  });

  it('refuses a shift that takes the load below zero, on the amount field', async () => {
    await amountField().fill('-9000');
    await reasonField().fill('Plant trip at the quarry');
    await addButton().click();
    const error = page.locator('lw-adjustments-panel mat-error', { hasText: 'below zero' });
    await error.waitFor();
    expect(await error.textContent()).toContain('This would take the load below zero (to -8,900 at the lowest hour)');
    expect(await storedAdjustments()).toBe(0);
  });

  it('asks before a change beyond a plausible one, then adds it once confirmed, leaving the form without messages', async () => {
    await amountField().fill('-60');
    await addButton().click();
    const question = page.locator('lw-adjustments-panel .confirm');
    await question.waitFor();
    expect(await question.textContent()).toContain('This changes the forecast by up to 60 % of its value');
    expect(await storedAdjustments()).toBe(0);
    await page.screenshot({ path: resolve(artifacts, 'adjustment-confirmation.png') });
    await page.getByRole('checkbox', { name: 'Confirm a change of up to 60 % of the forecast' }).check();
    await addButton().click();
    await page.getByText('“Plant trip at the quarry”').waitFor();
    expect(await storedAdjustments()).toBe(1);
    // The emptied reason and amount fields show no "give a reason" or "give an amount" message.
    expect(await page.locator('lw-adjustments-panel mat-error').count()).toBe(0);
    expect(await page.locator('lw-adjustments-panel .confirm').count()).toBe(0);
  });

  it('drops the question when the amount changes', async () => {
    await amountField().fill('-30');
    await reasonField().fill('A second outage on the same feeder');
    await addButton().click();
    // 100 − 60 = 40; −30 on 40 is 75 %: asked again.
    await page.locator('lw-adjustments-panel .confirm').waitFor();
    await amountField().fill('-10');
    expect(await page.locator('lw-adjustments-panel .confirm').count()).toBe(0);
  });
});
