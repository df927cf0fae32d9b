/**
 * The demo co-op's generated histories, exported as a long UTC file and a wide local-time file and
 * uploaded like a steward would: every reading lands at its instant, and the demo's declared defects
 * are found (gaps, the fdr-c2 spike, the fdr-s1 flat line, the fdr-n3 negative, the missing second
 * fall-back hour of fdr-c3), with no false spike alarm anywhere else.
 */
import { afterAll, beforeAll, describe, expect, it } from 'vitest';
import { generateDemo, seriesValues, type DemoData } from '../../fixtures/demo/generate';
import { demoScenario } from '../../fixtures/demo/scenario';
import { offsetMsAt } from '@loadwright/intake';
import { insertDemoCatalogue } from '../../libs/db/src/seed/insert-demo-catalogue';
import { createPeople, signIn, type SignedIn } from '../support/people';
import { startTestServer, type TestServer } from '../support/server';
import { confirm, postFile, waitForImport } from './upload-client';

let server: TestServer;
let steward: SignedIn;
let data: DemoData;
const zone = 'America/Chicago';

const longKeys = ['fdr-c2', 'fdr-s1', 'fdr-n3', 'fdr-n2', 'fdr-s4'];
const wideKeys = ['fdr-c3', 'zone-south', 'wx-upland'];

/** UTC long file: timestamp, series, value; missing readings are absent rows. */
function longCsv(): string {
  const lines = ['timestamp,series,value'];
  for (let i = 0; i < data.length; i++) {
    const ts = new Date(data.startMs + i * data.intervalMs).toISOString();
    for (const key of longKeys) {
      const value = seriesValues(data, key)[i]!;
      if (!Number.isNaN(value)) lines.push(`${ts},${key},${value}`);
    }
  }
  return `${lines.join('\n')}\n`;
}

/** Wide file in local wall-clock time without offsets, one column per series, empty cells for missing readings. */
function wideLocalCsv(): string {
  const lines = [`local time,${wideKeys.join(',')}`];
  for (let i = 0; i < data.length; i++) {
    const ms = data.startMs + i * data.intervalMs;
    const local = new Date(ms + offsetMsAt(zone, ms)).toISOString().slice(0, 16).replace('T', ' ');
    const cells = wideKeys.map((key) => seriesValues(data, key)[i]!).map((value) => (Number.isNaN(value) ? '' : String(value)));
    lines.push(`${local},${cells.join(',')}`);
  }
  return `${lines.join('\n')}\n`;
}

beforeAll(async () => {
  server = await startTestServer();
  const people = await createPeople(server.db);
  steward = await signIn(server.url, people.steward.email);
  await insertDemoCatalogue(server.db, demoScenario);
  data = generateDemo();
});
afterAll(() => server.close());

/** Every finding of the uploads, by series key and rule. */
async function findings(rule: string) {
  const { rows } = await server.pool.query(
    `select s.key, f.ts, f.detail from upload_findings f left join series s on s.id = f.series_id where f.rule = $1 order by s.key, f.ts`,
    [rule],
  );
  return rows.map((row) => ({ key: row.key as string, ts: row.ts ? (row.ts as Date).toISOString() : null, detail: row.detail }));
}

/** Uploads a file with the proposed mapping (and settings overrides) and waits for the import. */
async function importFile(name: string, content: string, settings: Record<string, unknown> = {}) {
  const posted = await postFile(server.url, steward, name, content);
  expect(posted.status).toBe(201);
  const { mapping, settings: proposed } = posted.body.proposal;
  expect((await confirm(server.url, steward, posted.body.upload.id, { mapping, settings: { ...proposed, ...settings } })).status).toBe(200);
  return { proposal: posted.body.proposal, done: await waitForImport(server.url, steward, posted.body.upload.id, 120_000) };
}

/** Values keep 12 significant digits (csv/parse-number.ts): the generator's 28062.899999999998 is stored as 28062.9. */
const meter = (v: number) => Number(v.toPrecision(12));

describe('demo histories', () => {
  it('imports the long UTC export and finds the spike, the flat line, the negative and the gaps', async () => {
    const { proposal, done } = await importFile('demo-long.csv', longCsv());
    expect(proposal.mapping).toEqual({
      layout: 'long',
      timestampColumn: 'timestamp',
      valueColumn: 'value',
      seriesKeyColumn: 'series',
      seriesKey: null,
    });
    const readings = longKeys.reduce((sum, key) => sum + seriesValues(data, key).filter((v) => !Number.isNaN(v)).length, 0);
    // The 3-hour gap of fdr-n2 is estimated (3 rows); the 5-hour gap of fdr-s4 is only reported.
    expect(done.upload).toMatchObject({ status: 'done', rowsTotal: readings, rowsImported: readings + 3, rowsRejected: 0, error: null });

    expect(await findings('spike')).toEqual([
      {
        key: 'fdr-c2',
        ts: '2025-08-12T21:00:00.000Z',
        detail: expect.objectContaining({ method: 'Hampel identifier against the daily and weekly shape' }),
      },
    ]);
    const flat = await findings('flat_line');
    // One finding for the whole run of 10 identical hours, not one per reading.
    expect(flat).toEqual([
      {
        key: 'fdr-s1',
        ts: '2026-02-03T05:00:00.000Z',
        detail: { runIntervals: 10, runHours: 10, until: '2026-02-03T14:00:00.000Z', limitIntervals: 6 },
      },
    ]);
    expect(await findings('negative')).toEqual([{ key: 'fdr-n3', ts: '2025-10-07T16:00:00.000Z', detail: {} }]);
    expect(await findings('gap')).toEqual([
      { key: 'fdr-n2', ts: '2025-04-15T14:00:00.000Z', detail: { intervals: 3, until: '2025-04-15T16:00:00.000Z', estimated: true } },
      { key: 'fdr-s4', ts: '2026-07-09T02:00:00.000Z', detail: { intervals: 5, until: '2026-07-09T06:00:00.000Z', estimated: false } },
    ]);
    const spikeRow = await server.pool.query(
      `select o.value, o.estimated, o.quality from observations o join series s on s.id = o.series_id where s.key = 'fdr-c2' and o.ts = '2025-08-12T21:00:00Z'`,
    );
    const raw = seriesValues(data, 'fdr-c2');
    const at = (Date.parse('2025-08-12T21:00:00Z') - data.startMs) / data.intervalMs;
    expect(spikeRow.rows[0]).toEqual({
      value: meter(raw[at]!),
      estimated: Math.round(((meter(raw[at - 1]!) + meter(raw[at + 1]!)) / 2) * 1e6) / 1e6,
      quality: 1 | 4,
    });
  });

  it('imports the wide local-time export with repeated fall-back hours resolved and the lost second 01:00 of fdr-c3 found', async () => {
    const { proposal, done } = await importFile('demo-wide-local.csv', wideLocalCsv(), { repeatedHourPolicy: 'first-is-daylight' });
    expect(proposal.mapping).toEqual({
      layout: 'wide',
      timestampColumn: 'local time',
      seriesColumns: [
        { column: 'fdr-c3', seriesKey: 'fdr-c3', unit: 'kW' },
        { column: 'zone-south', seriesKey: 'zone-south', unit: 'MW' },
        { column: 'wx-upland', seriesKey: 'wx-upland', unit: 'degF' },
      ],
    });
    expect(proposal.settings).toMatchObject({ timeZone: zone, repeatedHourPolicy: 'by-order' });
    expect(done.upload.status).toBe('done');

    // Every stored raw reading sits at its generated UTC instant with its generated value.
    for (const key of wideKeys) {
      const { rows } = await server.pool.query(
        `select extract(epoch from o.ts) * 1000 as ms, o.value from observations o join series s on s.id = o.series_id where s.key = $1 and o.value is not null order by o.ts`,
        [key],
      );
      const values = seriesValues(data, key);
      const expected = [...values.entries()]
        .filter(([, v]) => !Number.isNaN(v))
        .map(([i, v]) => ({ ms: data.startMs + i * data.intervalMs, value: meter(v) }));
      expect(rows.map((r) => ({ ms: Number(r.ms), value: r.value }))).toEqual(expected);
    }
    const gaps = (await findings('gap')).filter((f) => wideKeys.includes(f.key));
    expect(gaps).toEqual([
      { key: 'fdr-c3', ts: '2025-11-02T07:00:00.000Z', detail: { intervals: 1, until: '2025-11-02T07:00:00.000Z', estimated: true } },
      { key: 'wx-upland', ts: '2025-06-22T03:00:00.000Z', detail: { intervals: 4, until: '2025-06-22T06:00:00.000Z', estimated: false } },
      { key: 'zone-south', ts: '2026-01-20T08:00:00.000Z', detail: { intervals: 2, until: '2026-01-20T09:00:00.000Z', estimated: true } },
    ]);
    // Two fall-back nights: 01:00 twice for each series, except fdr-c3's lost second hour in 2025.
    const repeated = await findings('dst_resolved');
    expect(repeated.map((f) => `${f.key} ${f.ts} ${String(f.detail.resolution).split(' ')[0]}`)).toEqual([
      'fdr-c3 2025-11-02T06:00:00.000Z daylight',
      'fdr-c3 2026-11-01T06:00:00.000Z daylight',
      'fdr-c3 2026-11-01T07:00:00.000Z standard',
      'wx-upland 2025-11-02T06:00:00.000Z daylight',
      'wx-upland 2025-11-02T07:00:00.000Z standard',
      'wx-upland 2026-11-01T06:00:00.000Z daylight',
      'wx-upland 2026-11-01T07:00:00.000Z standard',
      'zone-south 2025-11-02T06:00:00.000Z daylight',
      'zone-south 2025-11-02T07:00:00.000Z standard',
      'zone-south 2026-11-01T06:00:00.000Z daylight',
      'zone-south 2026-11-01T07:00:00.000Z standard',
    ]);
    expect((await findings('spike')).filter((f) => wideKeys.includes(f.key))).toEqual([]);
  });
});
