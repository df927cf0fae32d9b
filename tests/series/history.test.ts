/** The reading history behind the series page's chart, over the seeded demo's two years. */
import { series } from '@loadwright/db';
import request from 'supertest';
import { afterAll, beforeAll, describe, expect, it } from 'vitest';
import { seedDemo } from '../../libs/db/src/seed';
import { createPeople, signIn, type SignedIn } from '../support/people';
import { startTestServer, type TestServer } from '../support/server';
import { createTokens, type Tokens } from './support/tokens';

let server: TestServer;
let viewer: SignedIn;
let tokens: Tokens;
const ids = new Map<string, number>();

beforeAll(async () => {
  server = await startTestServer({ worker: false });
  await seedDemo(server.databaseUrl);
  viewer = await signIn(server.url, (await createPeople(server.db)).viewer.email);
  tokens = await createTokens(server.db);
  for (const row of await server.db.select({ id: series.id, key: series.key }).from(series)) ids.set(row.key, row.id);
});
afterAll(() => server.close());

type Point = { ts: string; value: number | null; estimated: number | null; quality: number; flags: string[] };
type Bucket = {
  ts: string;
  day: string | null;
  mean: number;
  min: number;
  max: number;
  meanUsed: number;
  count: number;
  estimatedCount: number;
  quality: number;
  flags: string[];
};

const history = (ref: string | number, query: Record<string, string>) =>
  request(server.url).get(`/api/series/${ref}/readings`).query(query).set('Cookie', viewer.cookie);

describe('reading history', () => {
  it('returns each reading of a day with raw value, estimate and flags as stored (the demo spike on fdr-c2)', async () => {
    const response = await history('fdr-c2', { from: '2025-08-12T00:00:00Z', to: '2025-08-13T00:00:00Z' });
    expect(response.status).toBe(200);
    expect(response.body).toMatchObject({
      key: 'fdr-c2',
      unit: 'kW',
      resolution: 'interval',
      readingCount: 24,
      from: '2025-08-12T00:00:00.000Z',
      to: '2025-08-13T00:00:00.000Z',
    });
    const points = response.body.points as Point[];
    expect(points).toHaveLength(24);
    const spike = points.find((p) => p.ts === '2025-08-12T21:00:00.000Z')!;
    const neighbours = points.filter((p) => p.ts === '2025-08-12T20:00:00.000Z' || p.ts === '2025-08-12T22:00:00.000Z');
    // The demo multiplies this one reading by 4.5: the raw value is never replaced.
    expect(spike.value! / neighbours[0]!.value!).toBeGreaterThan(3);
    // Flags are what the store holds for each reading (none until validation has looked at the seeded history).
    const stored = await server.pool.query<{ ms: number; value: number; quality: number; estimated: number | null }>(
      `select extract(epoch from ts)::float8 * 1000 as ms, value, quality, estimated from observations where series_id = $1 and ts >= '2025-08-12T00:00Z' and ts < '2025-08-13T00:00Z' order by ts`,
      [ids.get('fdr-c2')],
    );
    expect(points.map((p) => [Date.parse(p.ts), p.value, p.estimated, p.quality])).toEqual(
      stored.rows.map((r) => [r.ms, r.value, r.estimated, r.quality]),
    );
    expect(response.body.qualitySummary.spike).toBe(stored.rows.filter((r) => (r.quality & 4) !== 0).length);
  });

  it('shows the demo gap as absent readings', async () => {
    const response = await history(ids.get('fdr-n2')!, {
      from: '2025-04-15T00:00:00Z',
      to: '2025-04-16T00:00:00Z',
      resolution: 'interval',
    });
    const times = (response.body.points as Point[]).map((p) => p.ts.slice(11, 13));
    expect(times).toHaveLength(21);
    expect(times).not.toContain('14');
    expect(times).not.toContain('16');
    expect(times).toContain('17');
  });

  it('aggregates two years by local day in the series time zone, with 23- and 25-hour days at the clock changes', async () => {
    const started = performance.now();
    const response = await history('fdr-n1', { from: '2024-12-01T06:00:00Z', to: '2026-12-01T06:00:00Z' })
      .set('Authorization', `Bearer ${tokens.read}`)
      .set('Cookie', '');
    const elapsedMs = performance.now() - started;
    expect(response.status).toBe(200);
    expect(response.body.resolution).toBe('day');
    const buckets = response.body.buckets as Bucket[];
    expect(buckets).toHaveLength(730);
    expect(buckets[0]).toMatchObject({ day: '2024-12-01', ts: '2024-12-01T06:00:00.000Z', count: 24 });
    // Summer days start at 05:00 UTC (CDT, UTC−5).
    expect(buckets.find((b) => b.day === '2025-07-04')!.ts).toBe('2025-07-04T05:00:00.000Z');
    expect(buckets.find((b) => b.day === '2025-03-09')!.count).toBe(23);
    expect(buckets.find((b) => b.day === '2025-11-02')!.count).toBe(25);
    // The demo ends at 23:00 UTC on 30 November 2026, 17:00 local: 18 hours of the last day.
    expect(buckets.at(-1)).toMatchObject({ day: '2026-11-30', count: 18 });
    expect(response.body.readingCount).toBe(730 * 24 - 6);
    expect(elapsedMs).toBeLessThan(2000);

    // One day's aggregate equals what its hourly readings give.
    const day = buckets.find((b) => b.day === '2026-01-15')!;
    const hours = (await history('fdr-n1', { from: day.ts, to: '2026-01-16T06:00:00Z' })).body.points as Point[];
    const values = hours.map((p) => p.value!);
    expect(hours).toHaveLength(24);
    expect(day.mean).toBeCloseTo(values.reduce((a, b) => a + b, 0) / values.length, 9);
    expect(day.min).toBe(Math.min(...values));
    expect(day.max).toBe(Math.max(...values));
    expect(day.meanUsed).toBeCloseTo(day.mean, 9);
  });

  it('ORs the flags of a day and counts each flag over the range', async () => {
    const id = ids.get('fdr-s1')!;
    // Mark readings of one day the way validation marks them: a spike with its estimated replacement, a flat line.
    await server.pool.query(
      `update observations set quality = quality | 4 | 1, estimated = value / 2 where series_id = $1 and ts = '2026-02-03T07:00Z'`,
      [id],
    );
    await server.pool.query(`update observations set quality = quality | 8 where series_id = $1 and ts = '2026-02-03T08:00Z'`, [id]);
    const response = await history('fdr-s1', { from: '2025-12-01T06:00:00Z', to: '2026-03-01T06:00:00Z' });
    expect(response.body.resolution).toBe('day');
    const flagged = (response.body.buckets as Bucket[]).filter((b) => b.quality !== 0);
    expect(flagged).toHaveLength(1);
    expect(flagged[0]).toMatchObject({ day: '2026-02-03', flags: ['estimated', 'spike', 'flatLine'], estimatedCount: 1 });
    expect(flagged[0]!.meanUsed).toBeLessThan(flagged[0]!.mean);
    expect(response.body.qualitySummary).toMatchObject({ estimated: 1, spike: 1, flatLine: 1, negative: 0 });
  });

  it('picks hourly buckets for long ranges of sub-hourly series and interval points for short ones', async () => {
    const short = await history('fdr-n1', {});
    // Default: the last 30 days up to just after the newest reading.
    expect(short.body).toMatchObject({
      resolution: 'interval',
      to: '2026-12-01T00:00:00.000Z',
      from: '2026-11-01T00:00:00.000Z',
      readingCount: 30 * 24,
    });
    const hourly = await history('fdr-n1', { from: '2026-11-29T00:00:00Z', to: '2026-11-30T00:00:00Z', resolution: 'hour' });
    expect(hourly.body.resolution).toBe('hour');
    expect(hourly.body.buckets).toHaveLength(24);
    expect((hourly.body.buckets as Bucket[]).every((b) => b.count === 1 && b.day === null && b.min === b.max)).toBe(true);
  });

  it('answers 400 for a reversed or endless range and 404 for an unknown series', async () => {
    const reversed = await history('fdr-n1', { from: '2026-01-02T00:00:00Z', to: '2026-01-01T00:00:00Z' });
    expect(reversed.status).toBe(400);
    expect(reversed.body.errors).toEqual([{ pointer: '/query/from', detail: '`from` must be before `to`' }]);
    const noOffset = await history('fdr-n1', { from: '2026-01-01T00:00:00' });
    expect(noOffset.status).toBe(400);
    const tooMuch = await history('fdr-n1', { from: '2000-01-01T00:00:00Z', to: '2026-01-01T00:00:00Z' });
    expect(tooMuch.status).toBe(400);
    const missing = await history('fdr-zz', {});
    expect(missing.status).toBe(404);
    expect(missing.body.detail).toBe('No series "fdr-zz".');
  });
});
