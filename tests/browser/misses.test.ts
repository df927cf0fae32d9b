/**
 * A manager-like viewer in a real browser over the demo co-op with its seeded misses: open a miss from
 * the Overview, read why it missed, acknowledge it with a comment, and read (never change) the rules.
 * A planner overrides a rule for one series in the Rules view (a refused value explained first) and
 * removes it again. Then an admin changes the refit hour and a miss rule default in Settings and sees
 * both in use: the nightly schedule moves, the Rules view shows the new default, and detection judges
 * by it. axe-core on each page; screenshots at 1440×900.
 */
import { mkdir } from 'node:fs/promises';
import { resolve } from 'node:path';
import type { MissDetail, MissRule, MissRulesInForce, Role } from '@loadwright/contracts';
import { detectMisses } from '@loadwright/misses';
import type { Page } from 'playwright-core';
import { afterAll, beforeAll, describe, expect, it } from 'vitest';
import { demoScenario } from '../../fixtures/demo/scenario';
import { seedDemo } from '../../libs/db/src/seed/seed-demo';
import { addDemoMisses } from '../../scripts/demo-seed';
import { type TestServer, startTestServer } from '../support/server';
import { blockingViolations, findAccessibilityViolations } from './support/accessibility';
import { type TestBrowser, launchBrowser } from './support/browser';
import { signInThroughPage } from './support/sign-in';
import { actuals, approvedForecast, eventsOf, loadSeries } from '../misses/support';

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

  it('reads the rules in force but is offered no way to change them', async () => {
    await page.getByRole('navigation', { name: 'Misses views' }).getByRole('link', { name: 'Rules' }).click();
    await page.getByRole('heading', { level: 2, name: 'Rules in force for every feeder' }).waitFor();
    await page.getByText('You can read these rules; planners and admins change them.').waitFor();
    expect(await page.getByRole('button', { name: /^(Override|Change|Remove)/ }).count()).toBe(0);
    await expectAccessible();
  });
});

describe('a planner overrides a rule for one series', () => {
  it('sees why a value is refused, adds the override, sees it in force, and removes it', async () => {
    await browser.context.clearCookies();
    const planner = account('planner');
    const feeder = demoScenario.feeders[0];
    await signInThroughPage(page, server.url, planner.email, password, '/misses/rules');
    await page.getByRole('heading', { level: 2, name: 'Rules in force for every feeder' }).waitFor();
    await page.getByRole('combobox', { name: 'Rules for' }).click();
    await page.getByRole('option', { name: `${feeder!.name} (${feeder!.key})` }).click();
    await page.getByRole('heading', { level: 2, name: `Rules in force for ${feeder!.name}` }).waitFor();

    await page.getByRole('button', { name: 'Override Outside the band' }).click();
    const form = page.getByRole('form', { name: `Outside the band override for ${feeder!.name}` });
    await form.getByLabel('Band %').fill('150');
    await form.getByRole('button', { name: 'Add override' }).click();
    await form.getByText('The band level must be from 1 to 99.').waitFor();
    await page.screenshot({ path: resolve(artifacts, 'miss-rules-refused.png'), fullPage: true });

    await form.getByLabel('Band %').fill('80');
    await form.getByLabel('Hours in a row').fill('2');
    await form.getByLabel('Recipients').fill('role:planner, control-room@tallowmere.example');
    await form.getByRole('button', { name: 'Add override' }).click();
    await page.getByText(`Outside the band for ${feeder!.name}: override added.`).waitFor();
    const row = page.getByRole('row', { name: /^Outside the band/ });
    await row.getByText("This series' own override").waitFor();
    await row.getByText('2 hours in a row; 80 % band; high severity; to role:planner, control-room@tallowmere.example').waitFor();
    await page.screenshot({ path: resolve(artifacts, 'miss-rules-override.png'), fullPage: true });
    await expectAccessible();

    const seriesId = (await api<{ items: { id: number; key: string }[] }>(`/api/series?q=${feeder!.key}`)).items.find(
      (s) => s.key === feeder!.key,
    )!.id;
    const view = await api<MissRulesInForce>(`/api/miss-rules/in-force?series=${seriesId}`);
    expect(view.kinds.find((k) => k.kind === 'outside_band')).toMatchObject({ source: 'series', inForce: { hours: 2, bandLevel: 80 } });

    await page.getByRole('button', { name: 'Remove the Outside the band override' }).click();
    await page.getByText('Override removed: Outside the band follows the group override or the default again.').waitFor();
    await row.getByText('Default (Settings)').waitFor();
  });

  it("reaches a series' rules from its page", async () => {
    const feeder = demoScenario.feeders[0];
    const seriesId = (await api<{ items: { id: number; key: string }[] }>(`/api/series?q=${feeder!.key}`)).items.find(
      (s) => s.key === feeder!.key,
    )!.id;
    await page.goto(`${server.url}/series/${seriesId}`);
    await page.getByRole('link', { name: 'Miss rules for this series' }).click();
    await page.getByRole('heading', { level: 2, name: `Rules in force for ${feeder!.name}` }).waitFor();
    expect(new URL(page.url()).searchParams.get('series')).toBe(String(seriesId));
  });

  it('reads the model card of a missed forecast, saying why it has no residual checks', async () => {
    const missed = (await api<{ id: number; seriesId: number }[]>('/api/misses'))[0]!;
    await page.goto(`${server.url}/series/${missed.seriesId}`);
    const card = page.locator('lw-model-card');
    await card.getByText('Seasonal naive (same hour last week)').waitFor({ timeout: 15_000 });
    expect(await card.getByTestId('no-residual-checks').textContent()).toContain('no model residuals to test');
    // σ² is in the square of the series' unit, as σ beside it is in the unit.
    expect(await card.locator('dt:text-is("Innovation variance σ²") + dd').textContent()).toMatch(
      /^\s*[\d,.]+ [kM]W² \(σ = [\d,.]+ [kM]W\)\s*$/,
    );
    expect(await page.getByText('This series has not been fitted yet.').count()).toBe(0);
    // The training window speaks the series' zone, as every other time on the page does.
    expect(await card.locator('dt:text-is("Training window") + dd').textContent()).toMatch(
      /^\s*\d+ \w{3} \d\d:\d\d C[SD]T – \d+ \w{3} \d\d:\d\d C[SD]T, [\d,]+ hours\s*$/,
    );
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
    // The Rules view shows the new default in force for every feeder.
    await page.goto(`${server.url}/misses/rules?level=feeder`);
    await page
      .getByRole('row', { name: /^Outside the band/ })
      .getByText(/4 hours in a row; 95 % band; high severity/)
      .waitFor();
    await page.screenshot({ path: resolve(artifacts, 'miss-rules-default.png'), fullPage: true });

    // Detection judges by it: a feeder 3 hours outside its band (±10 around 100) is no miss, the 4th hour makes one.
    const seriesId = await loadSeries(server.db, 'browser-default-rule');
    await approvedForecast(server.db, seriesId, '2026-10-31T05:00:00Z', 24);
    await actuals(server.db, seriesId, '2026-10-31T05:00:00Z', [125, 125, 125]);
    await detectMisses(server.db, seriesId, new Date('2026-10-31T08:00:00Z'));
    const bandDefault = rules.find((rule) => rule.scope === 'all' && rule.kind === 'outside_band')!.id;
    expect((await eventsOf(server.db, seriesId)).filter((e) => e.ruleId === bandDefault)).toEqual([]);
    await actuals(server.db, seriesId, '2026-10-31T08:00:00Z', [125]);
    await detectMisses(server.db, seriesId, new Date('2026-10-31T09:00:00Z'));
    const [event] = (await eventsOf(server.db, seriesId)).filter((e) => e.ruleId === bandDefault);
    expect(event!.periodEnd.getTime() - event!.periodStart.getTime()).toBe(4 * 3_600_000);
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
