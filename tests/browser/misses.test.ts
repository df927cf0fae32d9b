/**
 * A manager-like viewer in a real browser over the demo co-op with its seeded misses: open a miss from
 * the Overview, read why it missed, acknowledge it with a comment. Then an admin changes the refit hour
 * and a miss rule default in Settings and sees both in use (the nightly schedule moves; the rule
 * reads back). axe-core on each page; screenshots at 1440×900.
 */
import { mkdir } from 'node:fs/promises';
import { resolve } from 'node:path';
import type { MissDetail, MissRule, Role } from '@loadwright/contracts';
import type { Page } from 'playwright-core';
import { afterAll, beforeAll, describe, expect, it } from 'vitest';
import { demoScenario } from '../../fixtures/demo/scenario';
import { seedDemo } from '../../libs/db/src/seed/seed-demo';
import { addDemoMisses } from '../../scripts/demo-seed';
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
const pageErrors: string[] = [];

beforeAll(async () => {
  await mkdir(artifacts, { recursive: true });
  // The worker re-reads the refit hour every second here (60 s in production).
  process.env['REFIT_SCHEDULE_CHECK_SECONDS'] = '1';
  server = await startTestServer();
  await seedDemo(server.databaseUrl);
  await addDemoMisses(server.databaseUrl);
  browser = await launchBrowser();
  page = await browser.context.newPage();
  page.on('pageerror', (error) => pageErrors.push(error.message));
  page.on('console', (message) => {
    if (message.type() === 'error' && !message.text().startsWith('Failed to load resource')) pageErrors.push(message.text());
  });
}, 180_000);

afterAll(async () => {
  delete process.env['REFIT_SCHEDULE_CHECK_SECONDS'];
  await page?.close();
  await browser?.close();
  await server?.close();
});

async function expectAccessible(): Promise<void> {
  expect(blockingViolations(await findAccessibilityViolations(page))).toEqual([]);
}

async function api<T>(path: string): Promise<T> {
  const response = await page.request.get(`${server.url}${path}`);
  expect(response.ok(), `${path}: ${response.status()}`).toBe(true);
  return (await response.json()) as T;
}

describe('a viewer handles a miss', () => {
  it('opens a miss from the Overview, reads its cause and acknowledges it with a comment', async () => {
    const viewer = account('viewer');
    await signInThroughPage(page, server.url, viewer.email, password, '/overview');
    const card = page.getByRole('region', { name: 'Open misses' });
    await card.getByText('High', { exact: true }).waitFor();
    await card.getByRole('listitem').first().waitFor();
    await page.screenshot({ path: resolve(artifacts, 'overview-open-misses.png') });
    await expectAccessible();

    const worst = card.getByRole('listitem').first().getByRole('link');
    const seriesName = (await worst.textContent())!.trim();
    await worst.click();
    await page.waitForURL((url) => /^\/misses\/\d+$/.test(url.pathname));
    const id = Number(new URL(page.url()).pathname.split('/').pop());
    const heading = page.getByRole('heading', { level: 2, name: new RegExp(seriesName) });
    await heading.waitFor();

    const detail = await api<MissDetail>(`/api/misses/${id}`);
    expect(detail.cause).not.toBeNull();
    const cause = page.getByRole('region', { name: 'Why it missed' });
    await cause.getByText(detail.cause!).waitFor();
    expect(detail.state).toBe('open');
    await page.locator('lw-miss-chart svg path.actual').waitFor();
    expect(await page.locator('lw-miss-chart svg path.actual').getAttribute('d')).toMatch(/^M[\d.]+,[\d.]+L/);

    await page.getByRole('textbox', { name: 'Comment' }).fill('Cold front came in early; told the control room. Watching tonight.');
    await page.getByRole('button', { name: 'Acknowledge' }).click();
    await page.getByText('Miss acknowledged.').waitFor();
    await page.getByText('Cold front came in early; told the control room. Watching tonight.').waitFor();
    await page.screenshot({ path: resolve(artifacts, 'misses-acknowledged.png'), fullPage: true });
    await expectAccessible();
    const after = await api<MissDetail>(`/api/misses/${id}`);
    expect(after.state).toBe('acknowledged');
    expect(after.acknowledgedBy).toBe(viewer.displayName);
    // A viewer may acknowledge but not resolve.
    expect(await page.getByRole('button', { name: 'Resolve' }).count()).toBe(0);
  });
});

describe('an admin changes settings', () => {
  it('moves the refit hour and changes a rule default, and both are used', async () => {
    await browser.context.clearCookies();
    const admin = account('admin');
    await signInThroughPage(page, server.url, admin.email, password, '/settings');
    await page.getByRole('heading', { level: 1, name: 'Settings' }).waitFor();
    await page.getByRole('combobox', { name: 'Refit hour' }).click();
    await page.getByRole('option', { name: '04:00' }).click();
    await page.getByRole('button', { name: 'Save settings' }).click();
    await page.getByText('Settings saved. The refit schedule follows within a minute.').waitFor();

    const hours = page.getByLabel('Outside the band hours');
    await hours.fill('4');
    await page.getByRole('button', { name: 'Save Outside the band' }).click();
    await page.getByText('Outside the band: saved.').waitFor();
    await page.screenshot({ path: resolve(artifacts, 'settings.png'), fullPage: true });
    await expectAccessible();

    const rules = await api<MissRule[]>('/api/miss-rules');
    expect(rules.find((rule) => rule.scope === 'all' && rule.kind === 'outside_band')!.hours).toBe(4);
    // The worker moves the nightly schedule to 04:00 in the organisation's zone.
    let cron = '';
    for (let i = 0; i < 50 && cron !== '0 4 * * *'; i++) {
      await new Promise((r) => setTimeout(r, 200));
      const { rows } = await server.pool.query<{ cron: string; timezone: string }>(
        `select cron, timezone from pgboss.schedule where name = 'refit-nightly'`,
      );
      cron = rows[0]?.cron ?? '';
      if (cron === '0 4 * * *') expect(rows[0]!.timezone).toBe(demoScenario.organisation.timeZone);
    }
    expect(cron).toBe('0 4 * * *');
    expect(pageErrors).toEqual([]);
  });
});
