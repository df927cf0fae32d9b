/**
 * The web shell in a real browser against a real API: sign-in first, navigation, live health on the
 * Overview, accessibility, bundled fonts and icons, and no request leaving the machine.
 */
import { mkdir } from 'node:fs/promises';
import { resolve } from 'node:path';
import { healthReportSchema, roleHas } from '@loadwright/contracts';
import type { Page } from 'playwright-core';
import { afterAll, beforeAll, describe, expect, it } from 'vitest';
import { createPeople, testPassword } from '../support/people';
import { PRODUCT_SECTIONS } from '../../apps/web/src/app/core/product-sections';
import { type TestServer, startTestServer } from '../support/server';
import { blockingViolations, findAccessibilityViolations } from './support/accessibility';
import { type TestBrowser, launchBrowser } from './support/browser';
import { readFonts } from './support/fonts';
import { watchRequests } from './support/network-guard';
import { signInThroughPage } from './support/sign-in';

const artifacts = resolve(import.meta.dirname, '../.artifacts');
/** What a planner's navigation lists: every section whose permission the planner role holds by the permission table. */
const plannerSections = PRODUCT_SECTIONS.filter((section) => roleHas('planner', section.permission)).map((section) => section.label);

let browser: TestBrowser;

beforeAll(async () => {
  await mkdir(artifacts, { recursive: true });
  browser = await launchBrowser();
});

afterAll(async () => {
  await browser?.close();
});

describe('web shell with the database and the worker running', () => {
  let server: TestServer;
  let page: Page;
  let requests: ReturnType<typeof watchRequests>;
  let planner: { email: string };

  beforeAll(async () => {
    server = await startTestServer();
    ({ planner } = await createPeople(server.db));
    await browser.context.clearCookies();
    page = await browser.context.newPage();
    requests = watchRequests(page);
  });

  afterAll(async () => {
    await page?.close();
    await server?.close();
  });

  it('sends someone not signed in to the sign-in page, with service health and the cautions', async () => {
    await page.goto(server.url, { waitUntil: 'networkidle' });
    const url = new URL(page.url());
    expect(url.pathname).toBe('/sign-in');
    expect(url.searchParams.get('returnUrl')).toBe('/overview');
    expect(await page.title()).toBe('Sign in · Loadwright');
    expect(await page.getByRole('navigation', { name: 'Sections' }).count()).toBe(0);
    await page.getByText('Service: All services working').waitFor({ timeout: 15_000 });
    expect(await page.getByRole('contentinfo').textContent()).toContain('Forecasts are decision support.');
  });

  it('opens on the Overview after signing in, with the navigation of the role and the cautions', async () => {
    await signInThroughPage(page, server.url, planner.email, testPassword);
    expect(await page.title()).toBe('Overview · Loadwright');
    await expect.poll(() => page.getByRole('heading', { level: 1 }).textContent()).toContain('Overview');
    const navigation = page.getByRole('navigation', { name: 'Sections' });
    for (const label of plannerSections) expect(await navigation.getByRole('link', { name: label, exact: true }).isVisible()).toBe(true);
    expect(await navigation.getByRole('link').count()).toBe(plannerSections.length);
    for (const label of ['People', 'API tokens', 'Audit log', 'Outbox']) expect(plannerSections).not.toContain(label);
    expect(await navigation.getByRole('link', { name: 'Overview' }).getAttribute('aria-current')).toBe('page');
    expect(await page.getByRole('link', { name: /^Your account:\s*Test planner\s*,\s*planner$/ }).isVisible()).toBe(true);
    expect(await page.getByRole('button', { name: 'Sign out' }).isVisible()).toBe(true);
    expect(await page.getByRole('contentinfo').textContent()).toContain('Forecasts are decision support.');
  });

  it('shows live health read from the API', async () => {
    const report = healthReportSchema.parse(await (await fetch(`${server.url}/api/health`)).json());
    expect(report.database.ok).toBe(true);
    const main = page.getByRole('main');
    await main.getByText('Database: connected').waitFor({ timeout: 15_000 });
    expect(await main.getByText(report.queue.ok ? 'Job queue: ready' : 'Job queue: unavailable').isVisible()).toBe(true);
    expect(await main.getByText(`API version ${report.version}`).isVisible()).toBe(true);
    expect(await main.getByText(/Last checked \d\d:\d\d:\d\d/).isVisible()).toBe(true);
    expect(requests.all.some((url) => url.endsWith('/api/health'))).toBe(true);
  });

  it('passes axe-core with no serious or critical violations', async () => {
    expect(blockingViolations(await findAccessibilityViolations(page))).toEqual([]);
  });

  it('renders text from the bundled font and icons from bundled SVG', async () => {
    const fonts = await readFonts(page);
    expect(fonts).toMatchObject({ textFontReady: true, bodyFamily: 'Source Sans 3' });
    expect(fonts.loadedFamilies).toEqual(expect.arrayContaining(['Source Sans 3']));
    // Icons are SVG drawn at 24 px, never a word standing in for a missing glyph.
    const icon = await page
      .getByRole('navigation')
      .locator('mat-icon')
      .first()
      .evaluate((element) => ({ width: element.getBoundingClientRect().width, svg: element.querySelector('svg path') !== null }));
    expect(icon).toEqual({ width: 24, svg: true });
    await page.screenshot({ path: resolve(artifacts, 'overview-wide.png') });
  });

  it('says plainly when the API cannot be reached, and recovers', async () => {
    await page.route('**/api/health', (route) => route.abort('connectionrefused'));
    await page.getByRole('button', { name: 'Check now' }).click();
    const status = page.getByRole('status');
    await status.getByText('API unreachable').waitFor({ timeout: 10_000 });
    expect(await status.textContent()).toContain('cannot be reached');
    expect(blockingViolations(await findAccessibilityViolations(page))).toEqual([]);
    await page.unroute('**/api/health');
    await page.getByRole('button', { name: 'Check now' }).click();
    await status.getByText('All services working').waitFor({ timeout: 10_000 });
  });

  it('stops polling health once the Overview is left', async () => {
    const healthCalls = () => requests.all.filter((url) => url.endsWith('/api/health')).length;
    // The account page is there for every role and reads no health.
    await page.getByRole('link', { name: /^Your account:/ }).click();
    await page.getByRole('heading', { level: 1, name: 'Your account' }).waitFor();
    const afterLeaving = healthCalls();
    await page.waitForTimeout(11_000);
    expect(healthCalls()).toBe(afterLeaving);
    expect(await page.title()).toBe('Your account · Loadwright');
  });

  it('opens the navigation from a menu button on a phone', async () => {
    await page.setViewportSize({ width: 390, height: 844 });
    await page.goto(`${server.url}/overview`, { waitUntil: 'networkidle' });
    await page.getByRole('main').getByText('Database: connected').waitFor({ timeout: 15_000 });
    await page.screenshot({ path: resolve(artifacts, 'overview-phone.png') });
    const menu = page.getByRole('button', { name: 'Open navigation' });
    expect(await menu.getAttribute('aria-expanded')).toBe('false');
    await menu.click();
    await page.getByRole('navigation', { name: 'Sections' }).getByRole('link', { name: 'Series' }).waitFor();
    await page.waitForTimeout(400); // let the drawer finish sliding in before the picture
    await page.screenshot({ path: resolve(artifacts, 'navigation-phone.png') });
    await page.getByRole('navigation', { name: 'Sections' }).getByRole('link', { name: 'Series' }).click();
    await page.getByRole('heading', { level: 1, name: 'Series' }).waitFor();
    expect(await page.getByRole('button', { name: 'Open navigation' }).getAttribute('aria-expanded')).toBe('false');
    expect(blockingViolations(await findAccessibilityViolations(page))).toEqual([]);
  });

  it('made no request that left 127.0.0.1', () => {
    expect(requests.all.length).toBeGreaterThan(5);
    // The bundled text font came from this server; icons are SVG inside the scripts, so no icon font is fetched at all.
    expect(requests.all.some((url) => url.includes('source-sans-3'))).toBe(true);
    expect(requests.all.filter((url) => url.includes('material-symbols'))).toEqual([]);
    expect(requests.offMachine).toEqual([]);
  });
});

describe('web shell with no job queue installed', () => {
  let server: TestServer;
  let page: Page;

  let viewer: { email: string };

  beforeAll(async () => {
    // No worker has started, so pg-boss never installed its schema and no heartbeat exists: the API answers 503 "degraded".
    server = await startTestServer({ worker: false });
    ({ viewer } = await createPeople(server.db));
    await browser.context.clearCookies();
    page = await browser.context.newPage();
  });

  afterAll(async () => {
    await page?.close();
    await server?.close();
  });

  it('shows a degraded service and names the job queue and the worker as the parts not working', async () => {
    const answer = await fetch(`${server.url}/api/health`);
    expect(answer.status).toBe(503);
    const requests = watchRequests(page);
    await page.setViewportSize({ width: 1440, height: 900 });
    await signInThroughPage(page, server.url, viewer.email, testPassword);
    const status = page.getByRole('status');
    await status.getByText('Service degraded').waitFor({ timeout: 15_000 });
    expect(await status.textContent()).toContain('The job queue and the worker are not working.');
    const main = page.getByRole('main');
    expect(await main.getByText('Job queue: unavailable').isVisible()).toBe(true);
    expect(await main.getByText('Workers: none running').isVisible()).toBe(true);
    expect(await main.getByText('Database: connected').isVisible()).toBe(true);
    expect(blockingViolations(await findAccessibilityViolations(page))).toEqual([]);
    await page.screenshot({ path: resolve(artifacts, 'overview-degraded.png') });
    expect(requests.offMachine).toEqual([]);
  });
});
