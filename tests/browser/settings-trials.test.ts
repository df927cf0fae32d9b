/**
 * Try before switching, in a real browser over the seeded demo co-op with the real worker: a planner opens a
 * feeder, proposes other model settings in the settings form, watches the trial's progress bar move to the
 * end, reads the current and proposed settings side by side (errors, coverage, peaks at day-ahead and
 * week-ahead), and applies the proposal, which becomes the feeder's settings and queues a refit. A viewer
 * then sees what was tried, without the controls. axe-core on each state; screenshots at 1440×900.
 */
import { mkdir } from 'node:fs/promises';
import { resolve } from 'node:path';
import type { ModelSettings, Role, SeriesDetail, SettingsTrialList } from '@loadwright/contracts';
import pg from 'pg';
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
const feeder = demoScenario.feeders.find((f) => f.key === 'fdr-s4')!;

let browser: TestBrowser;
let server: TestServer;
let page: Page;
let series: SeriesDetail;
const pageErrors: string[] = [];

/** JSON from the API as `role`. */
async function api<T>(path: string, init: RequestInit = {}, role: Role = 'planner'): Promise<T> {
  const who = await signIn(server.url, account(role).email, password);
  const response = await fetch(`${server.url}${path}`, {
    ...init,
    headers: { cookie: who.cookie.join('; '), 'x-csrf-token': who.csrf, 'content-type': 'application/json' },
  });
  if (!response.ok) throw new Error(`${path}: ${response.status} ${await response.text()}`);
  return (await response.json()) as T;
}

/** Fails with the list when axe finds serious or critical problems. */
async function expectAccessible(): Promise<void> {
  expect(blockingViolations(await findAccessibilityViolations(page))).toEqual([]);
}

beforeAll(async () => {
  await mkdir(artifacts, { recursive: true });
  server = await startTestServer();
  await seedDemo(server.databaseUrl);
  series = await api<SeriesDetail>(`/api/series/${feeder.key}`);
  // The feeder's settings in force: the automatic choice on a 56-day window (short, so the 28 refits stay quick).
  const settings = await api<ModelSettings>(`/api/series/${series.id}/model`);
  const { seriesId: _s, temperatureSeries: _t, updatedAt: _u, updatedBy: _b, ...editable } = settings;
  await api(`/api/series/${series.id}/model`, { method: 'PUT', body: JSON.stringify({ ...editable, trainingWindowDays: 56 }) });
  browser = await launchBrowser();
  page = await browser.context.newPage();
  page.on('pageerror', (error) => pageErrors.push(error.message));
  page.on('console', (message) => {
    if (message.type() === 'error' && !message.text().startsWith('Failed to load resource')) pageErrors.push(message.text());
  });
}, 180_000);

afterAll(async () => {
  await page?.close();
  await browser?.close();
  await server?.close();
});

describe('a planner tries other settings on a feeder and applies them', () => {
  let trialId = 0;

  it('proposes settings in the settings form and watches the trial run to the end', async () => {
    await signInThroughPage(page, server.url, account('planner').email, password, `/series/${series.id}`);
    const heading = page.getByRole('heading', { level: 2, name: 'Settings trials' });
    await heading.scrollIntoViewIfNeeded();
    await page.getByText('No settings have been tried on this series yet.').waitFor();
    await expectAccessible();

    await page.getByRole('button', { name: 'Try other settings' }).click();
    const dialog = page.getByRole('dialog');
    await dialog.getByRole('heading', { name: 'Try other settings' }).waitFor();
    await dialog.getByRole('combobox', { name: 'Method' }).click();
    await page.getByRole('option', { name: 'AR by Yule-Walker' }).click();
    await dialog.getByLabel('Training window (days)').fill('42');
    await dialog.getByRole('button', { name: 'Start trial' }).click();
    await dialog.waitFor({ state: 'detached' });

    const bar = page.getByRole('progressbar', { name: /^Trial \d+ progress$/ });
    await bar.waitFor();
    trialId = Number(/Trial (\d+)/.exec((await bar.getAttribute('aria-label'))!)![1]);
    await page.getByText(`Trial ${trialId} started: 28 refits, current and proposed settings at each origin.`).waitFor();
    const deadline = Date.now() + 240_000;
    // Hold the trial part-way, however fast the machine: once the worker has counted a refit, a row lock makes its
    // next count wait, so the bar must show a value strictly between 0 and 100 until the lock is let go.
    const holder = new pg.Client({ connectionString: server.databaseUrl });
    await holder.connect();
    try {
      for (;;) {
        const { rows } = await holder.query<{ fits_done: number }>('select fits_done from settings_trials where id = $1', [trialId]);
        if (rows[0]!.fits_done >= 1) break;
        if (Date.now() > deadline) throw new Error('The trial counted no refit.');
        await new Promise((done) => setTimeout(done, 20));
      }
      await holder.query('begin');
      const held = await holder.query<{ fits_done: number; fits_total: number }>(
        'select fits_done, fits_total from settings_trials where id = $1 for update',
        [trialId],
      );
      expect(held.rows[0]!.fits_done).toBeLessThan(held.rows[0]!.fits_total);
      const part = Math.round((100 * held.rows[0]!.fits_done) / held.rows[0]!.fits_total);
      await expect.poll(async () => Number(await bar.getAttribute('aria-valuenow')), { timeout: 30_000 }).toBe(part);
      expect(part > 0 && part < 100).toBe(true);
      await bar.scrollIntoViewIfNeeded();
      await page.screenshot({ path: resolve(artifacts, 'settings-trial-running.png') });
      await holder.query('commit');
    } finally {
      await holder.end();
    }
    // Sample the bar as a planner would: values only rise, and the trial ends with its row showing the outcome.
    const seen: number[] = [];
    const row = page.locator(`tr[data-trial="${trialId}"]`);
    while (Date.now() < deadline) {
      if ((await bar.count()) === 0) break;
      const value = Number((await bar.getAttribute('aria-valuenow').catch(() => null)) ?? seen.at(-1) ?? 0);
      if (seen.at(-1) !== value) seen.push(value);
      await page.waitForTimeout(150);
    }
    await row.locator('td.state', { hasText: /^\s*Day-ahead MAPE [\d.]+ % → [\d.]+ %\s*$/ }).waitFor();
    expect(
      [...seen].sort((a, b) => a - b),
      `progress seen: ${seen.join(', ')}`,
    ).toEqual(seen);
    await expect(row.locator('.changes').textContent()).resolves.toContain(
      'Method: Automatic choice → AR by Yule-Walker; Training window: 56 days → 42 days',
    );
  }, 300_000);

  it('shows both sides side by side with the numbers the trial stored', async () => {
    const { trials } = await api<SettingsTrialList>(`/api/series/${series.id}/settings-trials`);
    const trial = trials.find((t) => t.id === trialId)!;
    expect(trial.state).toBe('finished');
    const comparison = page.getByRole('region', { name: `Trial ${trialId}: current and proposed settings side by side` });
    await comparison.waitFor();
    const day = comparison.locator('table[data-horizon="day"]');
    const week = comparison.locator('table[data-horizon="week"]');
    expect(await day.locator('caption').textContent()).toMatch(
      /Day-ahead \(the first 24 hours from each origin\): proposed better on \d of 8 measures, worse on \d/,
    );
    const cells = async (table: typeof day, measure: string) =>
      (await table.locator(`tr[data-measure="${measure}"] td`).allTextContents()).map((text) => text.trim());
    const kw = (value: number) => `${value.toLocaleString('en-GB', { minimumFractionDigits: 2, maximumFractionDigits: 2 })} kW`;
    const pct = (value: number, digits: number) => `${value.toFixed(digits)} %`;
    const { current, proposed } = trial.results!;
    expect((await cells(day, 'MAE')).slice(0, 2)).toEqual([kw(current.dayAhead.mae), kw(proposed.dayAhead.mae)]);
    expect((await cells(day, 'MAPE')).slice(0, 2)).toEqual([pct(current.dayAhead.mape!, 2), pct(proposed.dayAhead.mape!, 2)]);
    expect((await cells(week, '95 % band coverage')).slice(0, 2)).toEqual([
      pct(current.weekAhead.coverage95, 1),
      pct(proposed.weekAhead.coverage95, 1),
    ]);
    expect((await cells(week, 'Daily peak error')).slice(0, 2)).toEqual([
      kw(current.weekAhead.peakError!),
      kw(proposed.weekAhead.peakError!),
    ]);
    const verdict = (await cells(day, 'MAE'))[2];
    expect(verdict).toBe(
      proposed.dayAhead.mae < current.dayAhead.mae
        ? 'Proposed better'
        : proposed.dayAhead.mae > current.dayAhead.mae
          ? 'Proposed worse'
          : 'Same',
    );
    await comparison.getByText('A backtest shows how settings would have done over these weeks, not how they will do next.').waitFor();
    await expectAccessible();
    await comparison.scrollIntoViewIfNeeded();
    await page.screenshot({ path: resolve(artifacts, 'settings-trial-comparison.png'), fullPage: false });
  });

  it('applies the proposal: the feeder is modelled with it and a refit is queued', async () => {
    await page.getByRole('button', { name: 'Apply these settings' }).click();
    const confirm = page.getByRole('dialog');
    await confirm.getByRole('heading', { name: `Apply the settings of trial ${trialId}?` }).waitFor();
    await confirm.getByRole('button', { name: 'Apply these settings' }).click();
    await page.getByText(new RegExp(`^Applied the settings of trial ${trialId}\\. Refit run \\d+ is queued with them\\.$`)).waitFor();
    await page
      .getByTestId('trial-applied')
      .getByText(`by ${account('planner').displayName}.`, { exact: false })
      .waitFor();
    expect(await page.getByRole('button', { name: 'Apply these settings' }).count()).toBe(0);
    const settings = await api<ModelSettings>(`/api/series/${series.id}/model`, {}, 'viewer');
    expect(settings).toMatchObject({ method: 'yule-walker', trainingWindowDays: 42, updatedBy: account('planner').displayName });
    await page.getByTestId('trial-applied').scrollIntoViewIfNeeded();
    await page.screenshot({ path: resolve(artifacts, 'settings-trial-applied.png') });
    expect(pageErrors).toEqual([]);
  });

  it('lets a viewer read what was tried, without the controls', async () => {
    await page.context().clearCookies();
    await signInThroughPage(page, server.url, account('viewer').email, password, `/series/${series.id}`);
    await page.locator(`tr[data-trial="${trialId}"]`).getByText('applied').waitFor();
    await page.getByRole('region', { name: `Trial ${trialId}: current and proposed settings side by side` }).waitFor();
    expect(await page.getByRole('button', { name: 'Try other settings' }).count()).toBe(0);
    expect(await page.getByRole('button', { name: 'Apply these settings' }).count()).toBe(0);
    await expectAccessible();
  });
});
