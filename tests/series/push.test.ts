/** The push API: other systems send actuals as JSON with an API token; same rules and writer as uploads. */
import { and, eq } from 'drizzle-orm';
import { uploadMappingSchema, uploadSettingsSchema } from '@loadwright/contracts';
import { auditLog, observationRevisions, observations, series, uploads } from '@loadwright/db';
import request from 'supertest';
import { afterAll, beforeAll, describe, expect, it } from 'vitest';
import { seedDemo } from '../../libs/db/src/seed';
import { createPeople, signIn, type SignedIn } from '../support/people';
import { startTestServer, type TestServer } from '../support/server';
import { createTokens, type Tokens } from './support/tokens';

let server: TestServer;
let steward: SignedIn;
let viewer: SignedIn;
let tokens: Tokens;
const ids = new Map<string, number>();

beforeAll(async () => {
  server = await startTestServer({ worker: false });
  await seedDemo(server.databaseUrl);
  const people = await createPeople(server.db);
  steward = await signIn(server.url, people.steward.email);
  viewer = await signIn(server.url, people.viewer.email);
  tokens = await createTokens(server.db);
  for (const row of await server.db.select({ id: series.id, key: series.key }).from(series)) ids.set(row.key, row.id);
  for (const body of [
    {
      key: 'push-a',
      name: 'Pushed feeder A',
      kind: 'load',
      level: 'feeder',
      parentId: ids.get('zone-south'),
      unit: 'kW',
      intervalMinutes: 60,
      timeZone: 'America/Chicago',
    },
    {
      key: 'push-end',
      name: 'Pushed feeder, end-marked',
      kind: 'load',
      level: 'feeder',
      parentId: ids.get('zone-south'),
      unit: 'kW',
      intervalMinutes: 60,
      timeZone: 'America/Chicago',
      timestampsMark: 'end',
    },
    {
      key: 'push-spike',
      name: 'Copy of C2 Ferrule Market',
      kind: 'load',
      level: 'feeder',
      parentId: ids.get('zone-central'),
      unit: 'kW',
      intervalMinutes: 60,
      timeZone: 'America/Chicago',
    },
    { key: 'wx-push', name: 'Pushed station', kind: 'temperature', unit: 'degF', intervalMinutes: 60, timeZone: 'America/Chicago' },
  ]) {
    const response = await request(server.url)
      .post('/api/series')
      .set('Cookie', steward.cookie)
      .set('X-CSRF-Token', steward.csrf)
      .send(body);
    if (response.status !== 201) throw new Error(JSON.stringify(response.body));
    ids.set(body.key, response.body.id);
  }
});
afterAll(() => server.close());

/** Two days of hourly readings from 1 October 2026 00:00 UTC, with a gentle daily shape. */
const batch = Array.from({ length: 48 }, (_, h) => ({
  ts: new Date(Date.UTC(2026, 9, 1, h)).toISOString(),
  value: Math.round((1800 + 400 * Math.sin((2 * Math.PI * (h - 9)) / 24)) * 10) / 10,
}));

const push = (key: string, body: unknown, token = tokens.readWrite) =>
  request(server.url)
    .post(`/api/series/${key}/readings`)
    .set('Authorization', `Bearer ${token}`)
    .send(body as object);
const storedCount = async (key: string) =>
  (
    await server.db
      .select()
      .from(observations)
      .where(eq(observations.seriesId, ids.get(key)!))
  ).length;

describe('who may push', () => {
  it('refuses a read token and a viewer with 403 and stores nothing', async () => {
    const byReadToken = await push('push-a', { readings: batch }, tokens.read);
    expect(byReadToken.status).toBe(403);
    expect(byReadToken.body.detail).toBe('A read token does not have the "data.upload" permission. Ask an administrator if you need it.');
    const byViewer = await request(server.url)
      .post('/api/series/push-a/readings')
      .set('Cookie', viewer.cookie)
      .set('X-CSRF-Token', viewer.csrf)
      .send({ readings: batch });
    expect(byViewer.status).toBe(403);
    expect(await storedCount('push-a')).toBe(0);
  });
});

describe('pushing', () => {
  let firstUploadId: number;

  it('stores a read-write token batch, answers with counts, records an upload and audits it', async () => {
    const response = await push('push-a', { readings: batch });
    expect(response.status).toBe(200);
    expect(response.body).toMatchObject({
      key: 'push-a',
      alreadyImported: false,
      received: 48,
      inserted: 48,
      unchanged: 0,
      revised: 0,
      rejected: 0,
      findings: [],
    });
    firstUploadId = response.body.uploadId;
    expect(await storedCount('push-a')).toBe(48);
    const [upload] = await server.db.select().from(uploads).where(eq(uploads.id, firstUploadId));
    expect(upload).toMatchObject({ source: 'api', status: 'done', rowsTotal: 48, rowsImported: 48, fileName: 'API push to push-a' });
    expect(upload!.uploadedByTokenId).not.toBeNull();
    expect(uploadMappingSchema.parse(upload!.mapping)).toEqual({
      layout: 'long',
      timestampColumn: 'ts',
      valueColumn: 'value',
      seriesKeyColumn: null,
      seriesKey: 'push-a',
    });
    expect(uploadSettingsSchema.parse(upload!.settings)).toMatchObject({
      unit: 'kW',
      timeZone: 'America/Chicago',
      timestampsMark: 'start',
    });
    const audit = await server.db
      .select()
      .from(auditLog)
      .where(and(eq(auditLog.action, 'readings.pushed'), eq(auditLog.targetId, String(ids.get('push-a')))));
    expect(audit).toHaveLength(1);
    expect(audit[0]!.detail).toMatchObject({ key: 'push-a', uploadId: firstUploadId, inserted: 48 });
  });

  it('adds nothing when the same batch comes again, however its offsets are written', async () => {
    const again = await push('push-a', { readings: batch });
    expect(again.status).toBe(200);
    expect(again.body).toMatchObject({ alreadyImported: true, uploadId: firstUploadId, inserted: 0, unchanged: 48, revised: 0 });
    const chicago = batch.map((r) => ({
      ts: new Date(Date.parse(r.ts) - 6 * 3_600_000).toISOString().replace('Z', '-06:00').replace('.000', ''),
      value: r.value,
    }));
    expect(chicago[0]!.ts).toBe('2026-09-30T18:00:00-06:00');
    expect((await push('push-a', { readings: chicago })).body).toMatchObject({ alreadyImported: true, inserted: 0 });
    expect(await storedCount('push-a')).toBe(48);
    expect(await server.db.select().from(uploads).where(eq(uploads.fileName, 'API push to push-a'))).toHaveLength(1);
  });

  it('re-sends overlapping readings as unchanged and adds only the new ones', async () => {
    const next = [...batch.slice(24), { ts: '2026-10-03T00:00:00Z', value: 1500 }];
    const response = await push('push-a', { readings: next });
    expect(response.body).toMatchObject({ alreadyImported: false, received: 25, inserted: 1, unchanged: 24, revised: 0 });
    expect(await storedCount('push-a')).toBe(49);
  });

  it('makes a corrected value a new revision and keeps the old one', async () => {
    const corrected = batch.map((r, i) => (i === 10 ? { ...r, value: r.value + 250 } : r));
    const response = await push('push-a', { readings: corrected });
    expect(response.body).toMatchObject({ inserted: 0, unchanged: 47, revised: 1 });
    const [row] = await server.db
      .select()
      .from(observations)
      .where(and(eq(observations.seriesId, ids.get('push-a')!), eq(observations.ts, new Date(batch[10]!.ts))));
    expect(row).toMatchObject({ value: batch[10]!.value + 250, revision: 2, uploadId: response.body.uploadId });
    const kept = await server.db
      .select()
      .from(observationRevisions)
      .where(eq(observationRevisions.seriesId, ids.get('push-a')!));
    expect(kept).toHaveLength(1);
    expect(kept[0]).toMatchObject({
      value: batch[10]!.value,
      revision: 1,
      uploadId: firstUploadId,
      supersededByUploadId: response.body.uploadId,
    });
    const chart = await request(server.url)
      .get('/api/series/push-a/readings')
      .query({ from: batch[10]!.ts, to: batch[11]!.ts })
      .set('Authorization', `Bearer ${tokens.read}`);
    expect(chart.body.points).toEqual([expect.objectContaining({ ts: batch[10]!.ts, value: batch[10]!.value + 250 })]);
  });

  it('converts values sent in another unit of the same kind', async () => {
    const load = await push('push-a', { unit: 'MW', readings: [{ ts: '2026-10-05T00:00:00Z', value: 1.75 }] });
    expect(load.body.inserted).toBe(1);
    const [row] = await server.db
      .select()
      .from(observations)
      .where(and(eq(observations.seriesId, ids.get('push-a')!), eq(observations.ts, new Date('2026-10-05T00:00:00Z'))));
    expect(row!.value).toBeCloseTo(1750, 9);
    const temperature = await push('wx-push', { unit: 'degC', readings: [{ ts: '2026-10-05T00:00:00Z', value: 20 }] });
    expect(temperature.body.inserted).toBe(1);
    const [station] = await server.db
      .select()
      .from(observations)
      .where(eq(observations.seriesId, ids.get('wx-push')!));
    expect(station!.value).toBeCloseTo(68, 9);
    const wrongKind = await push('push-a', { unit: 'degF', readings: [{ ts: '2026-10-05T01:00:00Z', value: 50 }] });
    expect(wrongKind.status).toBe(400);
    expect(wrongKind.body.errors).toEqual([{ pointer: '/unit', detail: 'Use a load unit' }]);
  });

  it('stores interval starts: readings of an end-marked series move back one interval', async () => {
    await push('push-end', {
      readings: [
        { ts: '2026-10-01T01:00:00Z', value: 900 },
        { ts: '2026-10-01T02:00:00Z', value: 950 },
      ],
    });
    const rows = await server.db
      .select({ ts: observations.ts })
      .from(observations)
      .where(eq(observations.seriesId, ids.get('push-end')!))
      .orderBy(observations.ts);
    expect(rows.map((r) => r.ts.toISOString())).toEqual(['2026-10-01T00:00:00.000Z', '2026-10-01T01:00:00.000Z']);
  });
});

describe('validation of pushed readings', () => {
  it('reports findings with the position of the reading and rejects off-grid instants', async () => {
    const readings = [
      { ts: '2026-10-10T00:00:00Z', value: 1200 },
      { ts: '2026-10-10T01:00:00Z', value: -40 },
      { ts: '2026-10-10T01:30:00Z', value: 1180 },
      { ts: '2026-10-10T02:00:00Z', value: 1190 },
    ];
    const response = await push('push-a', { readings });
    expect(response.status).toBe(200);
    expect(response.body).toMatchObject({ received: 4, rejected: 1 });
    expect(response.body.findingCounts).toMatchObject({ negative: 1, off_grid: 1 });
    expect(response.body.findings).toContainEqual(
      expect.objectContaining({ rule: 'negative', ts: '2026-10-10T01:00:00.000Z', value: -40, position: 2 }),
    );
    expect(response.body.findings).toContainEqual(expect.objectContaining({ rule: 'off_grid', position: 3 }));
  });

  it('flags the demo spike once validation has seen it, and the chart shows the flag beside the raw value', async () => {
    // A week of fdr-c2 around its demo spike, pushed into a fresh series so validation judges it.
    const week = await server.pool.query<{ ts: Date; value: number }>(
      `select ts, value from observations where series_id = $1 and ts >= '2025-08-09T00:00Z' and ts < '2025-08-16T00:00Z' order by ts`,
      [ids.get('fdr-c2')],
    );
    const response = await push('push-spike', { readings: week.rows.map((r) => ({ ts: r.ts.toISOString(), value: r.value })) });
    expect(response.body).toMatchObject({ received: 168, inserted: 168 });
    expect(response.body.findingCounts.spike).toBeGreaterThanOrEqual(1);
    const chart = await request(server.url)
      .get('/api/series/push-spike/readings')
      .query({ from: '2025-08-12T00:00:00Z', to: '2025-08-13T00:00:00Z' })
      .set('Cookie', viewer.cookie);
    const spike = chart.body.points.find((p: { ts: string }) => p.ts === '2025-08-12T21:00:00.000Z');
    const raw = week.rows.find((r) => r.ts.toISOString() === '2025-08-12T21:00:00.000Z')!.value;
    expect(spike.value).toBe(raw);
    expect(spike.flags).toContain('spike');
    expect(chart.body.qualitySummary.spike).toBeGreaterThanOrEqual(1);
  });
});

describe('limits and refusals', () => {
  it('takes the largest batch one request may carry (20,000 hourly readings with offsets) in one go', async () => {
    const start = Date.UTC(2022, 0, 1);
    const largest = Array.from({ length: 20_000 }, (_, i) => ({
      ts: new Date(start + i * 3_600_000 - 6 * 3_600_000).toISOString().replace('Z', '-06:00'),
      value: 1500 + 300 * Math.sin((2 * Math.PI * i) / 24) + (i % 7),
    }));
    const started = performance.now();
    const response = await push('push-a', { readings: largest });
    const elapsedMs = performance.now() - started;
    expect(response.status).toBe(200);
    expect(response.body).toMatchObject({ received: 20_000, inserted: 20_000, rejected: 0 });
    expect(elapsedMs).toBeLessThan(15_000);
  });

  it('refuses more readings than one request may carry, with the limit in the message', async () => {
    const tooMany = Array.from({ length: 20_001 }, (_, i) => ({
      ts: new Date(Date.UTC(2020, 0, 1) + i * 3_600_000).toISOString(),
      value: 1,
    }));
    const response = await push('push-a', { readings: tooMany });
    expect(response.status).toBe(400);
    expect(response.body.errors).toEqual([
      { pointer: '/readings', detail: 'Send at most 20000 readings per request; split larger batches' },
    ]);
  });

  it('refuses a body over the size limit with 413', async () => {
    const response = await push('push-a', { readings: [{ ts: '2026-10-01T00:00:00Z', value: 1 }], padding: 'x'.repeat(3 * 1024 * 1024) });
    expect(response.status).toBe(413);
  });

  it('refuses local times, empty batches and non-numbers, pointing at the reading', async () => {
    const local = await push('push-a', { readings: [{ ts: '2026-10-01T00:00:00', value: 1 }] });
    expect(local.status).toBe(400);
    expect(local.body.errors).toEqual([
      {
        pointer: '/readings/0/ts',
        detail: 'Give the time as ISO 8601 with an offset, e.g. 2026-01-15T14:00:00-06:00 or 2026-01-15T20:00:00Z',
      },
    ]);
    const empty = await push('push-a', { readings: [] });
    expect(empty.body.errors).toEqual([{ pointer: '/readings', detail: 'Send at least one reading' }]);
    const text = await push('push-a', { readings: [{ ts: '2026-10-01T00:00:00Z', value: '12' }] });
    expect(text.body.errors).toEqual([{ pointer: '/readings/0/value', detail: 'Give the value as a number' }]);
  });

  it('answers 404 for an unknown series and 409 for an archived one', async () => {
    const unknown = await push('fdr-zz', { readings: batch });
    expect(unknown.status).toBe(404);
    await request(server.url)
      .post(`/api/series/${ids.get('push-end')}/archive`)
      .set('Cookie', steward.cookie)
      .set('X-CSRF-Token', steward.csrf);
    const archived = await push('push-end', { readings: batch });
    expect(archived.status).toBe(409);
    expect(archived.body.detail).toBe('push-end is archived and takes no readings; restore it first.');
  });

  it('lets a steward push from the browser too', async () => {
    const response = await request(server.url)
      .post(`/api/series/${ids.get('push-a')}/readings`)
      .set('Cookie', steward.cookie)
      .set('X-CSRF-Token', steward.csrf)
      .send({ readings: [{ ts: '2026-10-20T00:00:00Z', value: 1000 }] });
    expect(response.status).toBe(200);
    expect(response.body.inserted).toBe(1);
  });
});
