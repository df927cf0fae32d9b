/**
 * The file's interval is judged from steps spread through the whole file, not from its first rows:
 * a file whose first 80 rows come every 15 minutes but whose other 5,000 come hourly is read as
 * hourly, and the import reports the odd steps as one mixed-interval finding; a file that really
 * mixes intervals says so in its proposal. Through the real upload API and worker, rows checked.
 */
import { series } from '@loadwright/db';
import { afterAll, beforeAll, describe, expect, it } from 'vitest';
import { createPeople, signIn, type SignedIn } from '../support/people';
import { startTestServer, type TestServer } from '../support/server';
import { confirm, postFile, waitForImport } from './upload-client';

let server: TestServer;
let steward: SignedIn;

beforeAll(async () => {
  server = await startTestServer();
  steward = await signIn(server.url, (await createPeople(server.db)).steward.email);
  const feeder = { kind: 'load', level: 'feeder', unit: 'kW', intervalMinutes: 60, timeZone: 'UTC' } as const;
  await server.db.insert(series).values([
    { key: 'odd-start', name: 'Odd start', ...feeder },
    { key: 'half-and-half', name: 'Half and half', ...feeder },
  ]);
});
afterAll(() => server.close());

/** Rows of `count` readings `minutes` apart from `fromMs`, valued 500 + k / 10 from `k0`. */
function rows(fromMs: number, count: number, minutes: number, k0 = 0): string[] {
  return Array.from(
    { length: count },
    (_, k) => `${new Date(fromMs + k * minutes * 60_000).toISOString()},${(500 + (k0 + k) / 10).toFixed(1)}`,
  );
}

const start = Date.UTC(2024, 0, 1);

describe('a file whose first rows are irregular', () => {
  // 80 rows every 15 minutes (00:00 … 19:45), then 5,000 hourly rows from 20:00: about 150 kB.
  const file = ['timestamp,kW', ...rows(start, 80, 15), ...rows(start + 20 * 3_600_000, 5000, 60, 80)].join('\n') + '\n';

  it('is proposed as hourly, and the import stores the hourly readings and reports the 15-minute steps as one finding', async () => {
    const posted = await postFile(server.url, steward, 'odd-start.csv', file);
    expect(posted.status).toBe(201);
    // The first rows alone would say 15 minutes; the steps through the file say an hour.
    expect(posted.body.layout.intervalMinutes).toBe(60);
    expect(posted.body.layout.mixedIntervals).toEqual([]);
    expect(posted.body.proposal.settings.fileIntervalMinutes).toBeNull();
    const mapping = {
      layout: 'long',
      timestampColumn: 'timestamp',
      valueColumn: 'kW',
      seriesKeyColumn: null,
      seriesKey: 'odd-start',
    } as const;
    const id = posted.body.upload.id as number;
    expect((await confirm(server.url, steward, id, { mapping, settings: posted.body.proposal.settings })).status).toBe(200);
    const done = await waitForImport(server.url, steward, id);
    // 20 of the 80 quarter-hour rows fall on the hour; the other 60 are off the hourly grid.
    expect(done.upload).toMatchObject({ status: 'done', rowsTotal: 5080, rowsImported: 5020 });
    const stored = await server.pool.query(
      `select count(*)::int as n, min(ts) as first, max(ts) as last, sum(value)::float8 as total from observations where upload_id = $1 and value is not null`,
      [id],
    );
    // On-the-hour quarter-hour rows k = 0, 4, …, 76 (500 + k/10) and the hourly rows k = 80 … 5079.
    const expectedTotal =
      Array.from({ length: 20 }, (_, i) => 500 + (4 * i) / 10).reduce((a, b) => a + b, 0) +
      Array.from({ length: 5000 }, (_, i) => 500 + (80 + i) / 10).reduce((a, b) => a + b, 0);
    expect(stored.rows[0].n).toBe(5020);
    expect((stored.rows[0].first as Date).toISOString()).toBe('2024-01-01T00:00:00.000Z');
    expect((stored.rows[0].last as Date).toISOString()).toBe(new Date(start + (20 + 4999) * 3_600_000).toISOString());
    expect(stored.rows[0].total).toBeCloseTo(expectedTotal, 6);
    const findings = await server.pool.query(
      `select rule, source_row, detail from upload_findings where upload_id = $1 and rule = 'mixed_interval'`,
      [id],
    );
    // 80 steps of 15 minutes: 79 among the quarter-hour rows and 19:45 → 20:00; the first between rows 2 and 3.
    expect(findings.rows).toEqual([
      { rule: 'mixed_interval', source_row: 3, detail: { fileIntervalMinutes: 60, otherSteps: '15 min × 80', count: 80 } },
    ]);
    const offGrid = await server.pool.query(`select count(*)::int as n from upload_findings where upload_id = $1 and rule = 'off_grid'`, [
      id,
    ]);
    expect(offGrid.rows[0].n).toBe(60);
  });
});

describe('a file that mixes intervals', () => {
  // 3,000 hourly rows, 2,000 every 15 minutes, 3,000 hourly again: a quarter of the rows at the other interval, none in the first ones.
  const t0 = Date.UTC(2024, 5, 1);
  const file =
    ['timestamp,kW', ...rows(t0, 3000, 60), ...rows(t0 + 3000 * 3_600_000, 2000, 15), ...rows(t0 + 3500 * 3_600_000, 3000, 60)].join('\n') +
    '\n';

  it('says so in the proposal, with the share of each, rather than choosing quietly', async () => {
    const posted = await postFile(server.url, steward, 'half-and-half.csv', file);
    expect(posted.status).toBe(201);
    expect(posted.body.layout.intervalMinutes).toBe(60);
    const mixed = posted.body.layout.mixedIntervals as Array<{ minutes: number; share: number }>;
    expect(mixed.map((m) => m.minutes)).toEqual([15]);
    // 2,000 of 8,000 rows (all rows the same length): the sampled share lies near 0.25.
    expect(mixed[0]!.share).toBeGreaterThan(0.15);
    expect(mixed[0]!.share).toBeLessThan(0.35);
    expect(posted.body.proposal.notes).toContainEqual(
      expect.stringMatching(
        /^The file mixes intervals: most readings come one every hour, but every 15 minutes in \d+ % of the steps between them\. Loadwright reads it as one reading every hour, and the import reports each series' steps at other intervals; check the file's interval\.$/,
      ),
    );
  });
});
