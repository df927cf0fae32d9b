/**
 * Local-time files across the daylight-saving changes of 2026, in a zone with daylight saving
 * (America/Chicago: spring forward 2026-03-08 02:00 → 03:00, fall back 2026-11-01 02:00 → 01:00) and
 * one without (America/Phoenix, UTC−7 all year): the right UTC instants and the right findings. The
 * proposed policy, by-order, places the repeated hour by file order; when order cannot decide, the
 * import stores nothing and asks the steward (both readings shown), then goes on with the choice.
 * A 25-hour day in Phoenix refuses the file.
 */
import { existsSync } from 'node:fs';
import { series } from '@loadwright/db';
import request from 'supertest';
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
    { key: 'chicago-c', name: 'Chicago C', timeZone: 'America/Chicago', ...feeder },
    { key: 'chicago-d', name: 'Chicago D', timeZone: 'America/Chicago', ...feeder },
    { key: 'chicago-e', name: 'Chicago E', timeZone: 'America/Chicago', ...feeder },
    { key: 'chicago-f', name: 'Chicago F', timeZone: 'America/Chicago', ...feeder },
    { key: 'phoenix-a', name: 'Phoenix A', timeZone: 'America/Phoenix', ...feeder },
  ]);
});
afterAll(() => server.close());

/** A one-series local-time file: the given wall-clock times with values base, base + 1, … */
function localFile(day: string, hours: number[], base = 500): string {
  return `local time,kW\n${hours.map((h, i) => `${day} ${String(h).padStart(2, '0')}:00,${base + i}`).join('\n')}\n`;
}

/** Uploads a local-time file for one series, confirms it and waits for the import to end or to ask. */
async function uploadLocal(
  key: string,
  timeZone: string,
  content: string,
  repeatedHourPolicy: 'reject' | 'first-is-daylight' | 'by-order',
) {
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
  return waitForImport(server.url, steward, posted.body.upload.id);
}

/** The rows stored for a series from an upload, and the upload's findings. */
async function storedAndFound(key: string, uploadId: number) {
  const stored = await server.pool.query(
    `select o.ts, o.value, o.estimated, o.quality from observations o join series s on s.id = o.series_id where s.key = $1 and o.upload_id = $2 order by o.ts`,
    [key, uploadId],
  );
  const found = await server.pool.query(`select rule, ts, source_row, detail from upload_findings where upload_id = $1 order by id`, [
    uploadId,
  ]);
  return {
    rows: stored.rows.map((r) => ({ ts: (r.ts as Date).toISOString(), value: r.value, estimated: r.estimated, quality: r.quality })),
    findings: found.rows.map((r) => ({
      rule: r.rule,
      ts: r.ts ? (r.ts as Date).toISOString() : null,
      row: r.source_row,
      resolution: r.detail.resolution,
    })),
  };
}

/** Uploads a local-time file for one series and returns the stored rows and the findings. */
async function importLocal(
  key: string,
  timeZone: string,
  content: string,
  repeatedHourPolicy: 'reject' | 'first-is-daylight' | 'by-order',
) {
  const done = await uploadLocal(key, timeZone, content, repeatedHourPolicy);
  return { upload: done.upload, ...(await storedAndFound(key, done.upload.id)) };
}

/** Answers the repeated hours an upload asks about. */
function choose(uploadId: number, choices: Array<{ seriesKey: string; local: string; choice: string }>) {
  return request(server.url)
    .post(`/api/uploads/${uploadId}/repeated-hours`)
    .set('Cookie', steward.cookie)
    .set('X-CSRF-Token', steward.csrf)
    .send({ choices });
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
      { rule: 'dst_resolved', ts: '2026-11-01T06:00:00.000Z', row: 3, resolution: 'daylight (first occurrence)' },
      { rule: 'dst_resolved', ts: '2026-11-01T07:00:00.000Z', row: 4, resolution: 'standard (second occurrence)' },
    ]);
  });

  it('fall back, by-order (the proposal): a file in time order places the first 01:00 as CDT and the second as CST, as information', async () => {
    const hours = [0, 1, 1, ...allHours.slice(2)];
    const result = await importLocal('chicago-c', 'America/Chicago', localFile('2026-11-01', hours, 800), 'by-order');
    expect(result.upload.status).toBe('done');
    // 00:00 CDT = 05:00Z; 01:00 CDT = 06:00Z; 01:00 CST = 07:00Z; 02:00 CST = 08:00Z … 23:00 CST = 05:00Z next day.
    expect(result.rows.map((r) => r.ts)).toEqual(utcHours('2026-11-01T05:00:00Z', 25));
    expect(result.rows.map((r) => r.value)).toEqual(Array.from({ length: 25 }, (_, i) => 800 + i));
    expect(result.rows.map((r) => r.quality).slice(0, 4)).toEqual([0, 128, 128, 0]);
    expect(result.findings).toEqual([
      { rule: 'dst_resolved', ts: '2026-11-01T06:00:00.000Z', row: 3, resolution: 'daylight time (first in the file)' },
      { rule: 'dst_resolved', ts: '2026-11-01T07:00:00.000Z', row: 4, resolution: 'standard time (second in the file)' },
    ]);
    const report = await server.pool.query(
      `select count(*)::int as n from upload_findings where upload_id = $1 and rule = 'dst_repeated_hour'`,
      [result.upload.id],
    );
    expect(report.rows[0].n).toBe(0);
  });

  it('fall back, by-order: one 01:00 alone cannot be placed, so the import stores nothing and asks; "standard time" places it at 07:00Z', async () => {
    // 00:00 CDT (05:00Z) = 900, 01:00 (which one?) = 901, 02:00 CST (08:00Z) = 902 …
    const asked = await uploadLocal('chicago-d', 'America/Chicago', localFile('2026-11-01', allHours, 900), 'by-order');
    expect(asked.upload).toMatchObject({ status: 'awaiting_choice', rowsTotal: 24, rowsImported: 0 });
    expect(asked.repeatedHours).toEqual([
      {
        seriesKey: 'chicago-d',
        local: '2026-11-01 01:00',
        timeZone: 'America/Chicago',
        reason: 'single-reading',
        // 01:00 CDT = 06:00Z, 01:00 CST = 07:00Z.
        daylightStart: '2026-11-01T06:00:00.000Z',
        standardStart: '2026-11-01T07:00:00.000Z',
        readings: [{ sourceRow: 3, value: 901 }],
        unit: 'kW',
      },
    ]);
    const id = asked.upload.id;
    expect(await storedAndFound('chicago-d', id)).toEqual({ rows: [], findings: [] });

    const chosen = await choose(id, [{ seriesKey: 'chicago-d', local: '2026-11-01 01:00', choice: 'second-is-daylight' }]);
    expect(chosen.status, JSON.stringify(chosen.body)).toBe(200);
    expect(chosen.body.status).toBe('queued');
    const done = await waitForImport(server.url, steward, id);
    expect(done.upload).toMatchObject({ status: 'done', rowsTotal: 24, rowsRejected: 0 });
    expect(done.repeatedHours).toEqual([]);
    const result = await storedAndFound('chicago-d', id);
    expect(result.rows.slice(0, 4)).toEqual([
      { ts: '2026-11-01T05:00:00.000Z', value: 900, estimated: null, quality: 0 },
      // One hour missing between 900 at 05:00Z and 901 at 07:00Z: linear, 900.5.
      { ts: '2026-11-01T06:00:00.000Z', value: null, estimated: 900.5, quality: 3 },
      { ts: '2026-11-01T07:00:00.000Z', value: 901, estimated: null, quality: 128 },
      { ts: '2026-11-01T08:00:00.000Z', value: 902, estimated: null, quality: 0 },
    ]);
    expect(result.findings.find((f) => f.rule === 'dst_resolved')).toEqual({
      rule: 'dst_resolved',
      ts: '2026-11-01T07:00:00.000Z',
      row: 3,
      resolution: 'standard time (as the steward chose)',
    });
    const audit = await server.pool.query(`select detail from audit_log where action = 'upload.repeated-hours-chosen' and target_id = $1`, [
      String(id),
    ]);
    expect(audit.rows).toEqual([{ detail: { choices: ['chicago-d 2026-11-01 01:00: second-is-daylight'] } }]);
  });

  it('fall back, by-order: rows in reverse time order cannot say which 01:00 is which; the steward says the first is daylight time', async () => {
    const hours = [0, 1, 1, ...allHours.slice(2)].reverse();
    const asked = await uploadLocal('chicago-e', 'America/Chicago', localFile('2026-11-01', hours, 1000), 'by-order');
    expect(asked.upload.status).toBe('awaiting_choice');
    // Reversed: row 2 is 23:00 (1000) … rows 24 and 25 are the two 01:00 readings (1022, 1023), row 26 is 00:00.
    expect(asked.repeatedHours).toEqual([
      expect.objectContaining({
        local: '2026-11-01 01:00',
        reason: 'rows-out-of-order',
        readings: [
          { sourceRow: 24, value: 1022 },
          { sourceRow: 25, value: 1023 },
        ],
      }),
    ]);
    const chosen = await choose(asked.upload.id, [{ seriesKey: 'CHICAGO-E', local: '2026-11-01 01:00', choice: 'first-is-daylight' }]);
    expect(chosen.status, JSON.stringify(chosen.body)).toBe(200);
    const done = await waitForImport(server.url, steward, asked.upload.id);
    expect(done.upload).toMatchObject({ status: 'done', rowsTotal: 25, rowsImported: 25, rowsRejected: 0 });
    const result = await storedAndFound('chicago-e', asked.upload.id);
    expect(result.rows.map((r) => r.ts)).toEqual(utcHours('2026-11-01T05:00:00Z', 25));
    expect(result.rows.slice(0, 4).map((r) => [r.ts, r.value, r.quality])).toEqual([
      ['2026-11-01T05:00:00.000Z', 1024, 0],
      ['2026-11-01T06:00:00.000Z', 1022, 128],
      ['2026-11-01T07:00:00.000Z', 1023, 128],
      ['2026-11-01T08:00:00.000Z', 1021, 0],
    ]);
    expect(result.findings.filter((f) => f.rule === 'dst_resolved').map((f) => f.resolution)).toEqual([
      'daylight time (first in the file, as the steward chose)',
      'standard time (second in the file, as the steward chose)',
    ]);
  });

  it('asks again for nothing it did not list, refuses a missing or unknown hour and changes nothing; "drop" drops both with the reason', async () => {
    const hours = [0, 1, 1, ...allHours.slice(2)].reverse();
    const asked = await uploadLocal('chicago-f', 'America/Chicago', localFile('2026-11-01', hours, 1100), 'by-order');
    const id = asked.upload.id;
    expect(asked.upload.status).toBe('awaiting_choice');
    const unknown = await choose(id, [{ seriesKey: 'chicago-f', local: '2026-11-01 02:00', choice: 'drop' }]);
    expect(unknown.status).toBe(400);
    expect(unknown.body.detail).toBe(
      'Series "chicago-f" has no repeated hour at 2026-11-01 02:00 to choose for; choose only for the hours the upload lists.',
    );
    const twice = await choose(id, [
      { seriesKey: 'chicago-f', local: '2026-11-01 01:00', choice: 'drop' },
      { seriesKey: 'chicago-f', local: '2026-11-01 01:00', choice: 'first-is-daylight' },
    ]);
    expect(twice.status).toBe(400);
    expect(twice.body.detail).toBe('2026-11-01 01:00 of series "chicago-f" is chosen twice; choose once for each hour.');
    const empty = await choose(id, []);
    expect(empty.status).toBe(400);
    const still = await request(server.url).get(`/api/uploads/${id}`).set('Cookie', steward.cookie);
    expect(still.body.upload.status).toBe('awaiting_choice');
    expect(still.body.repeatedHours).toHaveLength(1);

    expect((await choose(id, [{ seriesKey: 'chicago-f', local: '2026-11-01 01:00', choice: 'drop' }])).status).toBe(200);
    const done = await waitForImport(server.url, steward, id);
    expect(done.upload).toMatchObject({ status: 'done', rowsTotal: 25, rowsRejected: 2 });
    const result = await storedAndFound('chicago-f', id);
    expect(result.findings.filter((f) => f.rule === 'dst_repeated_hour')).toEqual([
      { rule: 'dst_repeated_hour', ts: null, row: 24, resolution: 'dropped, as the steward chose' },
      { rule: 'dst_repeated_hour', ts: null, row: 25, resolution: 'dropped, as the steward chose' },
    ]);
    // Both 01:00 hours are a two-hour hole between 00:00 CDT (1124) and 02:00 CST (1121), estimated.
    expect(result.rows.slice(1, 3).map((r) => [r.ts, r.value, r.estimated])).toEqual([
      ['2026-11-01T06:00:00.000Z', null, 1123],
      ['2026-11-01T07:00:00.000Z', null, 1122],
    ]);
    const again = await choose(id, [{ seriesKey: 'chicago-f', local: '2026-11-01 01:00', choice: 'drop' }]);
    expect(again.status).toBe(409);
    expect(again.body.detail).toBe(`Upload ${id} is done; only an upload awaiting a choice takes one.`);
  });

  it('a steward may cancel an upload awaiting a choice: its file goes and nothing is stored', async () => {
    const asked = await uploadLocal('chicago-d', 'America/Chicago', localFile('2026-11-01', allHours, 1300), 'by-order');
    const id = asked.upload.id;
    expect(asked.upload.status).toBe('awaiting_choice');
    const path = (await server.pool.query('select storage_path from uploads where id = $1', [id])).rows[0].storage_path as string;
    expect(existsSync(path)).toBe(true);
    const cancelled = await request(server.url)
      .post(`/api/uploads/${id}/cancel`)
      .set('Cookie', steward.cookie)
      .set('X-CSRF-Token', steward.csrf);
    expect(cancelled.status).toBe(200);
    expect(cancelled.body).toMatchObject({
      status: 'cancelled',
      error: expect.stringMatching(/^Cancelled by .+ while awaiting a choice for its repeated hours; nothing from this file was stored\.$/),
    });
    expect(existsSync(path)).toBe(false);
    expect((await storedAndFound('chicago-d', id)).rows).toEqual([]);
    const late = await choose(id, [{ seriesKey: 'chicago-d', local: '2026-11-01 01:00', choice: 'drop' }]);
    expect(late.status).toBe(409);
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

  it('refuses a fall-back day of 25 hourly rows: the file was written in a zone with daylight saving, not in Phoenix', async () => {
    const result = await importLocal(
      'phoenix-a',
      'America/Phoenix',
      localFile('2026-11-01', [0, 1, 1, ...allHours.slice(2)], 700),
      'by-order',
    );
    expect(result.upload).toMatchObject({
      status: 'failed',
      error:
        'Series "phoenix-a" has 25 hours of readings on 2026-11-01 (from row 2), as a day has when clocks fall back, but America/Phoenix keeps one UTC offset all year: the file\'s times were written in a zone with daylight saving. Choose the zone the file was written in and upload it again.',
    });
    expect(result.rows).toEqual([]);
    expect(result.findings).toEqual([]);
  });

  it('still reads a single repeated 01:00 on an ordinary day as a duplicate, the first kept', async () => {
    const result = await importLocal('phoenix-a', 'America/Phoenix', localFile('2026-11-03', [0, 1, 1, 2], 750), 'by-order');
    expect(result.upload.status).toBe('done');
    // 2026-11-03 00:00 MST = 07:00Z.
    expect(result.rows.map((r) => [r.ts, r.value, r.quality])).toEqual([
      ['2026-11-03T07:00:00.000Z', 750, 0],
      ['2026-11-03T08:00:00.000Z', 751, 64],
      ['2026-11-03T09:00:00.000Z', 753, 0],
    ]);
    expect(result.findings).toEqual([{ rule: 'duplicate_conflict', ts: '2026-11-03T08:00:00.000Z', row: 4, resolution: 'first kept' }]);
  });
});
