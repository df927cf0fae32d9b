/**
 * Local-time files across the daylight-saving changes of 2026, in a zone with daylight saving
 * (America/Chicago: spring forward 2026-03-08 02:00 → 03:00, fall back 2026-11-01 02:00 → 01:00) and
 * one without (America/Phoenix, UTC−7 all year): the right UTC instants and the right findings.
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
  const feeder = { kind: 'load', level: 'feeder', unit: 'kW', intervalMinutes: 60 } as const;
  await server.db.insert(series).values([
    { key: 'chicago-a', name: 'Chicago A', timeZone: 'America/Chicago', ...feeder },
    { key: 'chicago-b', name: 'Chicago B', timeZone: 'America/Chicago', ...feeder },
    { key: 'phoenix-a', name: 'Phoenix A', timeZone: 'America/Phoenix', ...feeder },
  ]);
});
afterAll(() => server.close());

/** A one-series local-time file: the given wall-clock times with values base, base + 1, … */
function localFile(day: string, hours: number[], base = 500): string {
  return `local time,kW\n${hours.map((h, i) => `${day} ${String(h).padStart(2, '0')}:00,${base + i}`).join('\n')}\n`;
}

/** Uploads a local-time file for one series and returns the stored rows and the findings. */
async function importLocal(key: string, timeZone: string, content: string, repeatedHourPolicy: 'reject' | 'first-is-daylight') {
  const posted = await postFile(server.url, steward, `${key}.csv`, content);
  expect(posted.status).toBe(201);
  const mapping = { layout: 'long', timestampColumn: 'local time', valueColumn: 'kW', seriesKeyColumn: null, seriesKey: key } as const;
  const settings = {
    unit: 'kW',
    timeZone,
    timestampsMark: 'start',
    repeatedHourPolicy,
    decimalSeparator: '.',
    estimateShortGaps: true,
  } as const;
  expect((await confirm(server.url, steward, posted.body.upload.id, { mapping, settings })).status).toBe(200);
  const done = await waitForImport(server.url, steward, posted.body.upload.id);
  expect(done.upload.status).toBe('done');
  const stored = await server.pool.query(
    `select o.ts, o.value, o.estimated, o.quality from observations o join series s on s.id = o.series_id where s.key = $1 and o.upload_id = $2 order by o.ts`,
    [key, posted.body.upload.id],
  );
  const found = await server.pool.query(`select rule, ts, source_row, detail from upload_findings where upload_id = $1 order by id`, [
    posted.body.upload.id,
  ]);
  return {
    upload: done.upload,
    rows: stored.rows.map((r) => ({ ts: (r.ts as Date).toISOString(), value: r.value, estimated: r.estimated, quality: r.quality })),
    findings: found.rows.map((r) => ({
      rule: r.rule,
      ts: r.ts ? (r.ts as Date).toISOString() : null,
      row: r.source_row,
      resolution: r.detail.resolution,
    })),
  };
}

const allHours = Array.from({ length: 24 }, (_, h) => h);
const utcHours = (fromIso: string, count: number) =>
  Array.from({ length: count }, (_, i) => new Date(Date.parse(fromIso) + i * 3_600_000).toISOString());

describe('America/Chicago (daylight saving)', () => {
  it('spring forward: 02:00 does not exist, so that reading is dropped with a finding; the others land an hour apart', async () => {
    const result = await importLocal('chicago-a', 'America/Chicago', localFile('2026-03-08', allHours), 'reject');
    // 00:00 and 01:00 CST are 06:00Z and 07:00Z; 03:00 CDT is 08:00Z; 23:00 CDT is 04:00Z next day.
    expect(result.rows.map((r) => r.ts)).toEqual(utcHours('2026-03-08T06:00:00Z', 23));
    expect(result.rows.map((r) => r.value)).toEqual([500, 501, ...Array.from({ length: 21 }, (_, i) => 503 + i)]);
    expect(result.findings).toEqual([{ rule: 'dst_missing_hour', ts: null, row: 4, resolution: 'rejected' }]);
    expect(result.upload).toMatchObject({ rowsTotal: 24, rowsImported: 23, rowsRejected: 1 });
  });

  it('fall back, first-is-daylight: the first 01:00 is 06:00Z (CDT), the second 07:00Z (CST), both flagged', async () => {
    const hours = [0, 1, 1, ...allHours.slice(2)];
    const result = await importLocal('chicago-a', 'America/Chicago', localFile('2026-11-01', hours), 'first-is-daylight');
    expect(result.rows.map((r) => r.ts)).toEqual(utcHours('2026-11-01T05:00:00Z', 25));
    expect(result.rows.slice(0, 4)).toEqual([
      { ts: '2026-11-01T05:00:00.000Z', value: 500, estimated: null, quality: 0 },
      { ts: '2026-11-01T06:00:00.000Z', value: 501, estimated: null, quality: 128 },
      { ts: '2026-11-01T07:00:00.000Z', value: 502, estimated: null, quality: 128 },
      { ts: '2026-11-01T08:00:00.000Z', value: 503, estimated: null, quality: 0 },
    ]);
    expect(result.findings).toEqual([
      { rule: 'dst_repeated_hour', ts: '2026-11-01T06:00:00.000Z', row: 3, resolution: 'daylight (first occurrence)' },
      { rule: 'dst_repeated_hour', ts: '2026-11-01T07:00:00.000Z', row: 4, resolution: 'standard (second occurrence)' },
    ]);
  });

  it('fall back, reject: both 01:00 readings are dropped with findings and the two-hour hole is estimated and reported', async () => {
    const hours = [0, 1, 1, ...allHours.slice(2)];
    const result = await importLocal('chicago-b', 'America/Chicago', localFile('2026-11-01', hours, 600), 'reject');
    expect(result.rows.map((r) => r.ts)).toEqual(utcHours('2026-11-01T05:00:00Z', 25));
    // 00:00 CDT = 600 at 05:00Z and 02:00 CST = 603 at 08:00Z; the two hours between are linear estimates.
    expect(result.rows.slice(1, 3)).toEqual([
      { ts: '2026-11-01T06:00:00.000Z', value: null, estimated: 601, quality: 3 },
      { ts: '2026-11-01T07:00:00.000Z', value: null, estimated: 602, quality: 3 },
    ]);
    expect(result.findings.map((f) => `${f.rule} ${f.ts} ${f.row}`)).toEqual([
      'gap 2026-11-01T06:00:00.000Z null',
      'estimated 2026-11-01T06:00:00.000Z null',
      'estimated 2026-11-01T07:00:00.000Z null',
      'dst_repeated_hour null 3',
      'dst_repeated_hour null 4',
    ]);
  });
});

describe('America/Phoenix (no daylight saving)', () => {
  it('reads the spring-forward day as 24 ordinary hours at UTC−7', async () => {
    const result = await importLocal('phoenix-a', 'America/Phoenix', localFile('2026-03-08', allHours, 700), 'reject');
    expect(result.rows.map((r) => r.ts)).toEqual(utcHours('2026-03-08T07:00:00Z', 24));
    expect(result.findings).toEqual([]);
  });

  it('reads the fall-back day as 24 ordinary hours, and a repeated 01:00 is a duplicate, not a daylight-saving hour', async () => {
    const result = await importLocal(
      'phoenix-a',
      'America/Phoenix',
      localFile('2026-11-01', [0, 1, 1, ...allHours.slice(2)], 700),
      'reject',
    );
    expect(result.rows.map((r) => r.ts)).toEqual(utcHours('2026-11-01T07:00:00Z', 24));
    expect(result.rows[1]).toEqual({ ts: '2026-11-01T08:00:00.000Z', value: 701, estimated: null, quality: 64 });
    expect(result.findings).toEqual([{ rule: 'duplicate_conflict', ts: '2026-11-01T08:00:00.000Z', row: 4, resolution: 'first kept' }]);
  });
});
