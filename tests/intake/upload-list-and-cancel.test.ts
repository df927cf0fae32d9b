/**
 * The upload list beyond its first page, UTF-8 file names as the browser sends them, and a steward
 * cancelling an import that is queued (before any worker takes it) or running (the worker notices,
 * rolls back and stores nothing).
 */
import { existsSync } from 'node:fs';
import { series } from '@loadwright/db';
import { createImportQueue } from '@loadwright/intake';
import type PgBoss from 'pg-boss';
import { pino } from 'pino';
import request from 'supertest';
import { afterAll, beforeAll, describe, expect, it } from 'vitest';
import { createBoss } from '../../jobs/boss';
import { registerQueues } from '../../jobs/queues';
import { createPeople, signIn, type SignedIn } from '../support/people';
import { startTestServer, type TestServer } from '../support/server';
import { confirm, postFile, waitForImport } from './upload-client';

let server: TestServer;
let steward: SignedIn;
let boss: PgBoss;

const mapping = {
  layout: 'long',
  timestampColumn: 'timestamp',
  valueColumn: 'load_kw',
  seriesKeyColumn: null,
  seriesKey: 'tv-f201',
} as const;
const settings = {
  unit: 'kW',
  timeZone: 'America/Chicago',
  timestampsMark: 'start',
  repeatedHourPolicy: 'by-order',
  decimalSeparator: '.',
  estimateShortGaps: true,
} as const;

/** `count` hourly readings of tv-f201 from `fromHour` hours after 2020-01-01T00:00Z. */
function hourly(count: number, fromHour = 0): string {
  const rows = ['timestamp,load_kw'];
  const start = Date.UTC(2020, 0, 1);
  for (let h = fromHour; h < fromHour + count; h++) rows.push(`${new Date(start + h * 3_600_000).toISOString()},${800 + (h % 97) / 10}`);
  return `${rows.join('\n')}\n`;
}

const storedFor = async (uploadId: number) =>
  (await server.pool.query(`select count(*)::int as n from observations where upload_id = $1`, [uploadId])).rows[0].n as number;

beforeAll(async () => {
  // No worker at first: a confirmed upload stays queued until the test starts one.
  server = await startTestServer({ worker: false });
  steward = await signIn(server.url, (await createPeople(server.db)).steward.email);
  await server.db.insert(series).values({
    key: 'tv-f201',
    name: 'Tallowmere F201',
    kind: 'load',
    level: 'feeder',
    unit: 'kW',
    intervalMinutes: 60,
    timeZone: 'America/Chicago',
  });
  boss = createBoss(server.databaseUrl, { supervise: false });
  boss.on('error', () => undefined);
  await boss.start();
  await createImportQueue(boss);
});
afterAll(async () => {
  await boss.stop({ wait: true, timeout: 5_000 });
  await server.close();
});

describe('upload names and pages', () => {
  it('keeps a UTF-8 file name as the steward wrote it', async () => {
    const posted = await postFile(server.url, steward, 'Zähler-Süd.csv', hourly(3, 0));
    expect(posted.status).toBe(201);
    expect(posted.body.upload.fileName).toBe('Zähler-Süd.csv');
    const list = await request(server.url).get('/api/uploads').set('Cookie', steward.cookie);
    expect(list.body.items.map((u: { fileName: string }) => u.fileName)).toContain('Zähler-Süd.csv');
  });

  it('pages beyond the newest 20', async () => {
    for (let k = 1; k <= 24; k++) expect((await postFile(server.url, steward, `day-${k}.csv`, hourly(2, k * 10))).status).toBe(201);
    const first = await request(server.url).get('/api/uploads').query({ limit: 20, offset: 0 }).set('Cookie', steward.cookie);
    const second = await request(server.url).get('/api/uploads').query({ limit: 20, offset: 20 }).set('Cookie', steward.cookie);
    // 1 + 24 uploads: 20 on the first page, 5 on the second, none twice.
    expect(first.body.total).toBe(25);
    expect(first.body.items).toHaveLength(20);
    expect(second.body.items).toHaveLength(5);
    const ids = [...first.body.items, ...second.body.items].map((u: { id: number }) => u.id);
    expect(new Set(ids).size).toBe(25);
    expect(second.body.items.at(-1).fileName).toBe('Zähler-Süd.csv');
  });
});

describe('cancelling an import', () => {
  it('cancels a queued import: it ends cancelled with who cancelled it, its file goes, and the job stores nothing', async () => {
    const posted = await postFile(server.url, steward, 'queued.csv', hourly(48, 5000));
    const id = posted.body.upload.id as number;
    const path = (await server.pool.query('select storage_path from uploads where id = $1', [id])).rows[0].storage_path as string;
    expect((await confirm(server.url, steward, id, { mapping, settings })).body.status).toBe('queued');

    const cancelled = await request(server.url)
      .post(`/api/uploads/${id}/cancel`)
      .set('Cookie', steward.cookie)
      .set('X-CSRF-Token', steward.csrf);
    expect(cancelled.status).toBe(200);
    expect(cancelled.body).toMatchObject({
      status: 'cancelled',
      error: expect.stringMatching(/^Cancelled by .+ while waiting to be imported; nothing from this file was stored\.$/),
    });
    expect(existsSync(path)).toBe(false);
    const again = await request(server.url)
      .post(`/api/uploads/${id}/cancel`)
      .set('Cookie', steward.cookie)
      .set('X-CSRF-Token', steward.csrf);
    expect(again.status).toBe(409);
    expect(again.body.detail).toBe(
      `Upload ${id} is cancelled; only an import that is queued, running or awaiting a choice can be cancelled.`,
    );

    // A worker now takes the job, finds the upload cancelled and leaves it so.
    await registerQueues(boss, { logger: pino({ level: 'silent' }), concurrency: 1, databaseUrl: server.databaseUrl });
    const audit = await server.pool.query(`select action from audit_log where target_id = $1 and target_type = 'upload' order by id`, [
      String(id),
    ]);
    expect(audit.rows.map((r) => r.action)).toContain('upload.cancelled');
    const jobState = async () =>
      (await server.pool.query(`select state from pgboss.job where name = 'import-upload' and (data->>'uploadId')::int = $1`, [id])).rows[0]
        ?.state as string | undefined;
    const until = Date.now() + 30_000;
    while ((await jobState()) !== 'completed' && Date.now() < until) await new Promise((resolve) => setTimeout(resolve, 100));
    expect(await jobState()).toBe('completed');
    expect((await waitForImport(server.url, steward, id)).upload.status).toBe('cancelled');
    expect(await storedFor(id)).toBe(0);
  });

  it('cancels a running import: the worker rolls back and stores nothing', async () => {
    // 300,000 hourly rows (about 34 years): long enough to be caught while importing.
    const posted = await postFile(server.url, steward, 'long-history.csv', hourly(300_000, 10_000));
    const id = posted.body.upload.id as number;
    const path = (await server.pool.query('select storage_path from uploads where id = $1', [id])).rows[0].storage_path as string;
    expect((await confirm(server.url, steward, id, { mapping, settings })).status).toBe(200);
    const until = Date.now() + 60_000;
    while ((await server.pool.query('select status from uploads where id = $1', [id])).rows[0].status === 'queued' && Date.now() < until)
      await new Promise((resolve) => setTimeout(resolve, 25));
    const cancelled = await request(server.url)
      .post(`/api/uploads/${id}/cancel`)
      .set('Cookie', steward.cookie)
      .set('X-CSRF-Token', steward.csrf);
    expect(cancelled.status).toBe(200);
    expect(cancelled.body.error).toMatch(/^Cancelled by .+ while importing; nothing from this file was stored\.$/);
    // The worker deletes the file once it has noticed and rolled back.
    while (existsSync(path) && Date.now() < until) await new Promise((resolve) => setTimeout(resolve, 100));
    expect(existsSync(path)).toBe(false);
    const detail = await waitForImport(server.url, steward, id);
    expect(detail.upload).toMatchObject({ status: 'cancelled', error: cancelled.body.error });
    expect(await storedFor(id)).toBe(0);
  });

  it('refuses to cancel an upload that awaits its mapping, pointing to discard', async () => {
    const posted = await postFile(server.url, steward, 'waiting.csv', hourly(2, 900_000));
    const id = posted.body.upload.id as number;
    const response = await request(server.url)
      .post(`/api/uploads/${id}/cancel`)
      .set('Cookie', steward.cookie)
      .set('X-CSRF-Token', steward.csrf);
    expect(response.status).toBe(409);
    expect(response.body.detail).toBe(`Upload ${id} awaits its mapping; discard it instead.`);
  });
});
