/**
 * A planner's morning in a real browser over the seeded demo co-op, with the real worker: start a refit
 * of a zone group from the Refits page and watch its progress bar stream to the end, open a series from
 * the run, see the fan chart and the model card, adjust a period with a reason, approve, export the
 * approved CSV, and see the approved version on the page. The Overview shows the run's outcome and the
 * next-week system peak. A viewer sees no refit, adjust or approve controls. axe-core on each page;
 * screenshots at 1440×900.
 */
import { mkdir, readFile } from 'node:fs/promises';
import { resolve } from 'node:path';
import type { ForecastReview, RefitRunDetail, Role } from '@loadwright/contracts';
import type { Page } from 'playwright-core';
import { afterAll, beforeAll, describe, expect, it } from 'vitest';
import { demoScenario } from '../../fixtures/demo/scenario';
import { seedDemo } from '../../libs/db/src/seed/seed-demo';
import { type TestServer, startTestServer } from '../support/server';
import { blockingViolations, findAccessibilityViolations } from './support/accessibility';
import { type TestBrowser, launchBrowser } from './support/browser';
import { signInThroughPage } from './support/sign-in';
import { clockText } from '../../apps/web/src/app/refits/clock-text';
import { zonedClock } from '../../apps/web/src/app/series-page/zoned-time';

const artifacts = resolve(import.meta.dirname, '../.artifacts');
const password = demoScenario.demoPassword;
const account = (role: Role) => demoScenario.accounts.find((candidate) => candidate.role === role)!;
const north = demoScenario.zones.find((zone) => zone.key === 'zone-north')!;
const northFeeders = demoScenario.feeders.filter((feeder) => feeder.zoneKey === north.key);

let browser: TestBrowser;
let server: TestServer;
let page: Page;
/** Uncaught errors in the page (a chart that throws draws nothing). */
const pageErrors: string[] = [];

beforeAll(async () => {
  await mkdir(artifacts, { recursive: true });
  server = await startTestServer();
  await seedDemo(server.databaseUrl);
  browser = await launchBrowser();
  page = await browser.context.newPage();
  page.on('pageerror', (error) => pageErrors.push(error.message));
  page.on('console', (message) => {
    // A signed-out first load answers 401 on the session check by design; anything else is a fault.
    if (message.type() === 'error' && !message.text().startsWith('Failed to load resource')) pageErrors.push(message.text());
  });
}, 180_000);

afterAll(async () => {
  await page?.close();
  await browser?.close();
  await server?.close();
});

/** Fails with the list when axe finds serious or critical problems. */
async function expectAccessible(): Promise<void> {
  expect(blockingViolations(await findAccessibilityViolations(page))).toEqual([]);
}

/** True when the chart's canvas has drawn something: enough non-transparent pixels. */
async function chartDrawn(selector: string): Promise<boolean> {
  return page
    .locator(selector)
    .first()
    .evaluate((canvas) => {
      const { width, height } = canvas as HTMLCanvasElement;
      const pixels = (canvas as HTMLCanvasElement).getContext('2d')!.getImageData(0, 0, width, height).data;
      let painted = 0;
      for (let i = 3; i < pixels.length; i += 4) if (pixels[i]! > 0) painted++;
      return painted > (width * height) / 50;
    });
}

/** Reads JSON through the page's own session. */
async function api<T>(path: string): Promise<T> {
  const response = await page.request.get(`${server.url}${path}`);
  expect(response.ok(), `${path}: ${response.status()}`).toBe(true);
  return (await response.json()) as T;
}

/** The zone group's run, started by the planner. */
let runId = 0;

describe('a planner refits a zone and approves a feeder', () => {
  it('starts a refit of a zone group and watches the progress bar stream to the end', async () => {
    await signInThroughPage(page, server.url, account('planner').email, password, '/refits');
    await page.getByRole('heading', { level: 1, name: 'Refits' }).waitFor();
    await page.getByText('No refit has run yet').waitFor();
    await expectAccessible();

    await page.getByRole('combobox', { name: 'Group' }).click();
    await page.getByRole('option', { name: new RegExp(`^${north.name} \\(${north.key}, zone\\)`) }).click();
    await page.getByRole('button', { name: 'Refit now' }).click();

    const bar = page.getByRole('progressbar', { name: /^Run \d+ progress$/ }).first();
    await bar.waitFor();
    runId = Number(/Run (\d+)/.exec((await bar.getAttribute('aria-label'))!)![1]);
    // Sample the bar as a planner would watch it: it shows the run going, values only rise, and it ends at 100.
    const seen: number[] = [];
    let screenshot: 'none' | 'queued' | 'moving' = 'none';
    const deadline = Date.now() + 240_000;
    while (Date.now() < deadline) {
      const value = Number((await bar.getAttribute('aria-valuenow')) ?? '0');
      const state = (await page.locator(`tr[data-run="${runId}"] .state`).textContent()) ?? '';
      if (seen.at(-1) !== value) seen.push(value);
      // The screenshot shows the run in progress: part-way when the poll catches it there, else just started.
      if (!state.includes('Finished') && (screenshot === 'none' || (screenshot === 'queued' && value > 0))) {
        await page.screenshot({ path: resolve(artifacts, 'refits-running.png') });
        screenshot = value > 0 ? 'moving' : 'queued';
      }
      if (value === 100 && state.includes('Finished')) break;
      await page.waitForTimeout(200);
    }
    expect(seen.at(-1), `progress seen: ${seen.join(', ')}`).toBe(100);
    expect(seen[0]).toBeLessThan(100);
    expect([...seen].sort((a, b) => a - b)).toEqual(seen);
    expect(screenshot).not.toBe('none');

    const run = await api<RefitRunDetail>(`/api/refits/${runId}`);
    expect(run.state).toBe('finished');
    expect(run.series.map((s) => s.seriesKey).sort()).toEqual(expect.arrayContaining([north.key, ...northFeeders.map((f) => f.key)]));
    expect(run.counts.failed).toBe(0);
    // The per-series table shows each series done with its duration.
    for (const series of run.series) {
      const row = page.getByRole('row').filter({ has: page.getByRole('link', { name: series.seriesName, exact: true }) });
      await expect.poll(() => row.textContent(), { timeout: 5_000 }).toContain('done');
    }
    await expect
      .poll(() => page.locator('tr[data-run] .counts').first().textContent())
      .toBe(`${run.counts.total} of ${run.counts.total} done`);
    // The run's row names the zone it covered, never a bare id, and gives its times on the organisation's clock with the zone named.
    const runRow = await page.locator(`tr[data-run="${runId}"]`).textContent();
    expect(runRow).toContain(`${north.name} and everything below it`);
    expect(runRow).toContain(clockText(run.startedAt, demoScenario.organisation.timeZone));
    expect(runRow).toContain(clockText(run.finishedAt, demoScenario.organisation.timeZone));
    await page.screenshot({ path: resolve(artifacts, 'refits-finished.png') });
    await expectAccessible();
  }, 300_000);

  it('opens a feeder from the run, sees the fan chart and the model card', async () => {
    const feeder = northFeeders[0]!;
    await page.getByRole('link', { name: feeder.name, exact: true }).click();
    await page.getByRole('heading', { level: 1, name: feeder.name }).waitFor();
    await page.getByRole('img', { name: /^Forecast fan chart of/ }).waitFor();
    await page.getByText('Draft peak this week').waitFor();
    await page.getByRole('heading', { name: 'Model', exact: true }).waitFor();
    await expect
      .poll(() => page.locator('lw-model-card').textContent())
      .toMatch(/Ljung-Box over \d+ lags: Q = [\d.,]+, df = \d+, p-value =/);
    await page.waitForTimeout(500);
    expect(pageErrors).toEqual([]);
    await expect.poll(() => chartDrawn('lw-forecast-chart canvas')).toBe(true);
    await expect.poll(() => chartDrawn('lw-history-chart canvas')).toBe(true);
    await expect.poll(() => chartDrawn('lw-model-card canvas')).toBe(true);
    expect(pageErrors).toEqual([]);
    await page.evaluate(() => window.scrollTo(0, 0));
    await page.screenshot({ path: resolve(artifacts, 'series-forecast.png') });
    await page.locator('#model-section-heading').evaluate((heading) => heading.scrollIntoView({ block: 'start' }));
    await page.screenshot({ path: resolve(artifacts, 'series-model-card.png') });
    await expectAccessible();
  });

  it('adjusts a period with a reason, approves, exports the CSV and sees the approved version', async () => {
    const feeder = northFeeders[0]!;
    const seriesId = Number(new URL(page.url()).pathname.split('/').at(-1));
    const before = await api<ForecastReview>(`/api/series/${seriesId}/forecast`);
    const draft = before.draft!;
    expect(draft).not.toBeNull();

    // A shift of +50 kW over the version's first local day (the form starts there).
    await page.getByLabel(/^Amount/).fill('50');
    await page.getByLabel('Reason').fill('Sawmill restart after the outage, about 50 kW');
    await page.getByRole('button', { name: 'Add adjustment' }).click();
    await page.getByText('“Sawmill restart after the outage, about 50 kW”').waitFor();
    await page.getByRole('img', { name: /^Forecast fan chart of/ }).waitFor();
    const adjusted = await api<ForecastReview>(`/api/series/${seriesId}/forecast`);
    expect(adjusted.draft!.adjustments).toHaveLength(1);
    const covered = adjusted.draft!.points.filter((p) => p.adjusted !== null);
    expect(covered.length).toBe(24);
    for (const p of covered) expect(p.adjusted!.mean).toBeCloseTo(p.mean + 50, 6);
    await expect.poll(() => page.getByRole('img', { name: /^Forecast fan chart of/ }).isVisible()).toBe(true);
    expect(await page.locator('lw-forecast-chart').count()).toBe(1);

    await page.getByRole('button', { name: 'Approve draft' }).click();
    await page.getByRole('heading', { name: `Approve the draft of ${feeder.name}?` }).waitFor();
    await page.getByRole('dialog').getByRole('button', { name: 'Approve' }).click();
    await page.getByText(`Approved version ${draft.id}.`).waitFor();
    await expect.poll(() => page.locator('.version-line .badge').textContent()).toBe('approved');
    const versionsRow = page.getByRole('row').filter({ has: page.getByRole('rowheader', { name: String(draft.id), exact: true }) });
    await expect.poll(() => versionsRow.textContent()).toContain(account('planner').displayName);

    const downloadPromise = page.waitForEvent('download');
    await page.getByRole('link', { name: 'Export approved CSV' }).click();
    const download = await downloadPromise;
    const csv = await readFile((await download.path())!, 'utf8');
    const [header, ...rows] = csv.trim().split(/\r?\n/);
    expect(header).toBe(
      'series_id,series_key,series_name,level,unit,version_id,approved_at,interval_start,interval_end,time_zone,mean,model_mean,adjusted,lower_80,upper_80,lower_95,upper_95,stale',
    );
    expect(rows).toHaveLength(draft.points.length);
    expect(rows.filter((row) => row.includes(',true,'))).toHaveLength(24);
    expect(csv).toContain(feeder.key);
    expect(rows[0]).toContain(`,${before.series.timeZone},`);
    await page.screenshot({ path: resolve(artifacts, 'series-approved.png') });
    await expectAccessible();
  });

  it('reviews the rest of the zone side by side and approves it together', async () => {
    await page.getByRole('navigation', { name: 'Place in the hierarchy' }).getByRole('link', { name: north.name }).click();
    await page.getByRole('heading', { level: 1, name: north.name }).waitFor();
    await page.getByRole('button', { name: "Review the group's drafts" }).click();
    const zoneId = Number(new URL(page.url()).pathname.split('/').at(-1));
    const csrf = (await page.context().cookies()).find((cookie) => cookie.name === 'lw_csrf')!.value;
    const preview = (await (
      await page.request.post(`${server.url}/api/forecast-approvals/preview`, {
        data: { parentId: zoneId },
        headers: { 'X-CSRF-Token': csrf },
      })
    ).json()) as { versionIds: number[] };
    // The feeder approved above has no draft left; the zone and its other feeders wait.
    expect(preview.versionIds).toHaveLength(4);
    await page.getByRole('button', { name: 'Approve 4 drafts' }).waitFor();
    await page.locator('lw-group-approval').evaluate((panel) => panel.scrollIntoView({ block: 'start' }));
    await page.screenshot({ path: resolve(artifacts, 'group-approval.png') });
    await page.getByRole('button', { name: 'Approve 4 drafts' }).click();
    await page.getByRole('dialog').getByRole('button', { name: 'Approve 4 drafts' }).click();
    await page.getByText('Approved 4 drafts of the group together.').waitFor();
    for (const id of preview.versionIds) {
      const version = await api<{ version: { state: string } }>(`/api/forecast-versions/${id}`);
      expect(version.version.state).toBe('approved');
    }
    await expectAccessible();
  });

  it('shows the run and the next-week system peak on the Overview', async () => {
    // Refit the system series too (through the API, as a second planner action), so it has a draft.
    const systemId = (await api<{ items: { id: number }[] }>('/api/series?level=system&kind=load')).items[0]!.id;
    const csrf = (await page.context().cookies()).find((cookie) => cookie.name === 'lw_csrf')!.value;
    const started = await page.request.post(`${server.url}/api/refits`, {
      data: { scope: { kind: 'series', seriesIds: [systemId] } },
      headers: { 'X-CSRF-Token': csrf },
    });
    expect(started.status()).toBe(202);
    const systemRun = (await started.json()) as { id: number };
    await expect
      .poll(async () => (await api<RefitRunDetail>(`/api/refits/${systemRun.id}`)).state, { timeout: 120_000, interval: 500 })
      .toBe('finished');

    await page.goto(`${server.url}/overview`, { waitUntil: 'networkidle' });
    await page.getByText('Last run: Finished, all done').waitFor();
    await page.getByRole('heading', { name: 'Next-week system peak' }).waitFor();
    const review = await api<ForecastReview>(`/api/series/${systemId}/forecast`);
    // Only the hours still ahead count: a peak that already happened this week is no warning.
    const intervalMs = review.series.intervalMinutes * 60_000;
    const ahead = review.draft!.points.filter((p) => Date.parse(p.ts) + intervalMs > Date.now());
    const peak = ahead.reduce((best, p) => ((p.adjusted?.mean ?? p.mean) > (best.adjusted?.mean ?? best.mean) ? p : best));
    const when = zonedClock(peak.ts, review.series.timeZone);
    await expect.poll(() => page.locator('lw-system-peak').textContent()).toContain(when);
    const pastPeak = review.draft!.dailyPeaks.reduce((best, p) => (p.value > best.value ? p : best));
    if (Date.parse(pastPeak.ts) + intervalMs <= Date.now())
      expect(await page.locator('lw-system-peak').textContent()).not.toContain(zonedClock(pastPeak.ts, review.series.timeZone));
    expect(await page.locator('lw-system-peak').textContent()).toMatch(/Draft\s*[\d,]+\.\d MW/);
    await page.screenshot({ path: resolve(artifacts, 'overview-refits.png') });
    await expectAccessible();
  }, 150_000);
});

describe('a viewer', () => {
  it('sees runs and forecasts but no refit, adjust or approve controls', async () => {
    await page.context().clearCookies();
    await signInThroughPage(page, server.url, account('viewer').email, password, '/refits');
    await page.locator('tr[data-run]').first().waitFor();
    expect(await page.getByRole('button', { name: 'Refit now' }).count()).toBe(0);
    await page.getByRole('button', { name: `Series of run ${runId}` }).click();
    const feeder = northFeeders[0]!;
    await page.getByRole('link', { name: feeder.name, exact: true }).click();
    await page.getByRole('heading', { level: 1, name: feeder.name }).waitFor();
    await page.getByRole('img', { name: /^Forecast fan chart of/ }).waitFor();
    expect(await page.getByRole('button', { name: 'Add adjustment' }).count()).toBe(0);
    expect(await page.getByRole('button', { name: 'Approve draft' }).count()).toBe(0);
    expect(await page.getByRole('button', { name: 'Model settings' }).count()).toBe(0);
    await page.getByRole('link', { name: 'Export approved CSV' }).waitFor();
  });
});
