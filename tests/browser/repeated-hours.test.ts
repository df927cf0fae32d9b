/**
 * Repeated daylight-saving hours a file's order cannot place, in a real browser against a real API
 * and worker: the upload page asks which reading is daylight time, showing the readings, the steward
 * chooses and the import finishes with the choice; an upload awaiting a choice that the steward
 * cancels from the Uploads list shows plainly as cancelled. Screenshots at 1440×900 in tests/.artifacts.
 */
import { mkdir } from 'node:fs/promises';
import { resolve } from 'node:path';
import { series } from '@loadwright/db';
import type { Page } from 'playwright-core';
import { afterAll, beforeAll, describe, expect, it } from 'vitest';
import { confirm, postFile, waitForImport } from '../intake/upload-client';
import { createPeople, signIn, testPassword, type SignedIn } from '../support/people';
import { type TestServer, startTestServer } from '../support/server';
import { blockingViolations, findAccessibilityViolations } from './support/accessibility';
import { type TestBrowser, launchBrowser } from './support/browser';
import { signInThroughPage } from './support/sign-in';

const artifacts = resolve(import.meta.dirname, '../.artifacts');

let browser: TestBrowser;
let server: TestServer;
let page: Page;
let steward: SignedIn;
let stewardEmail: string;

/** A fall-back day (America/Chicago, 2025-11-02) of hourly local times with a single 01:00: order cannot place it. */
function fallBackDay(base: number): string {
  const lines = ['local time,kW'];
  for (let h = 0; h < 24; h++) lines.push(`2025-11-02 ${String(h).padStart(2, '0')}:00,${base + h}`);
  return `${lines.join('\n')}\n`;
}

/** Uploads and confirms a fall-back day; returns the upload's id once it awaits the choice. */
async function awaitingChoice(base: number): Promise<number> {
  const posted = await postFile(server.url, steward, `fall-back-${base}.csv`, fallBackDay(base));
  const id = posted.body.upload.id as number;
  const mapping = {
    layout: 'long',
    timestampColumn: 'local time',
    valueColumn: 'kW',
    seriesKeyColumn: null,
    seriesKey: 'tv-dst-1',
  } as const;
  const confirmed = await confirm(server.url, steward, id, {
    mapping,
    settings: { ...posted.body.proposal.settings, timeZone: 'America/Chicago' },
  });
  expect(confirmed.status, JSON.stringify(confirmed.body)).toBe(200);
  expect((await waitForImport(server.url, steward, id)).upload.status).toBe('awaiting_choice');
  return id;
}

beforeAll(async () => {
  await mkdir(artifacts, { recursive: true });
  server = await startTestServer();
  stewardEmail = (await createPeople(server.db)).steward.email;
  steward = await signIn(server.url, stewardEmail);
  await server.db.insert(series).values({
    key: 'tv-dst-1',
    name: 'Tallowmere DST feeder',
    kind: 'load',
    level: 'feeder',
    unit: 'kW',
    intervalMinutes: 60,
    timeZone: 'America/Chicago',
  });
  browser = await launchBrowser();
  page = await browser.context.newPage();
  await signInThroughPage(page, server.url, stewardEmail, testPassword, '/uploads');
}, 180_000);

afterAll(async () => {
  await page?.close();
  await browser?.close();
  await server?.close();
});

describe('a repeated hour the file cannot place', () => {
  it('asks which reading is daylight time, with the reading, and imports with the choice', async () => {
    const id = await awaitingChoice(700);
    await page.goto(`${server.url}/uploads/${id}`);
    await page.getByRole('heading', { level: 2, name: 'Which reading is daylight time?' }).waitFor();
    await page.getByText('Needs your choice').first().waitFor();
    await page.getByText('Row 3:').waitFor();
    expect(await page.getByText('Row 3:').textContent()).toContain('701 kW');
    const group = page.getByRole('radiogroup', { name: 'How to read 2025-11-02 01:00 of tv-dst-1' });
    expect(await group.getByRole('radio').count()).toBe(3);
    const importButton = page.getByRole('button', { name: 'Import with these choices' });
    expect(await importButton.isDisabled()).toBe(true);
    expect(blockingViolations(await findAccessibilityViolations(page))).toEqual([]);
    await page.screenshot({ path: resolve(artifacts, 'upload-repeated-hour-question.png'), fullPage: true });

    await group.getByRole('radio', { name: 'It is standard time (01:00 CST)' }).check();
    await importButton.click();
    await page.getByRole('heading', { level: 2, name: 'Import finished' }).waitFor({ timeout: 30_000 });
    await page.screenshot({ path: resolve(artifacts, 'upload-repeated-hour-done.png'), fullPage: true });
    // 01:00 CST on 2025-11-02 is 07:00Z; the reading keeps its value and the daylight-saving flag (128).
    const { rows } = await server.pool.query(
      `select value, quality from observations where upload_id = $1 and ts = '2025-11-02T07:00:00Z'`,
      [id],
    );
    expect(rows).toEqual([{ value: 701, quality: 128 }]);
  });

  it('shows an upload cancelled while awaiting its choice as cancelled, saying who cancelled it', async () => {
    const id = await awaitingChoice(900);
    await page.goto(`${server.url}/uploads`);
    const row = page.getByRole('row').filter({ hasText: 'fall-back-900.csv' });
    await row.getByRole('link', { name: 'Choose how to read its repeated hours' }).waitFor();
    await row.getByRole('button', { name: 'Cancel the import of fall-back-900.csv' }).click();
    await row.getByText('Cancelled', { exact: true }).waitFor();
    await row
      .getByText(/^Cancelled by Test steward while awaiting a choice for its repeated hours; nothing from this file was stored\.$/)
      .waitFor();
    await page.screenshot({ path: resolve(artifacts, 'uploads-cancelled.png') });
    await page.goto(`${server.url}/uploads/${id}`);
    await page.getByText('Import cancelled; nothing from this file was stored').waitFor();
    await page.screenshot({ path: resolve(artifacts, 'upload-cancelled.png') });
    const stored = await server.pool.query('select count(*)::int as n from observations where upload_id = $1', [id]);
    expect(stored.rows[0].n).toBe(0);
  });
});
