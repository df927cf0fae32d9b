/**
 * Handing approved forecasts on: CSV in UTC and in America/Chicago across the fall-back night, with
 * explicit interval columns, adjusted means and neutralised formulas; JSON for a group; who may export.
 */
import { forecastExportPath, forecastExportSchema } from '@loadwright/contracts';
import { series } from '@loadwright/db';
import { parse } from 'csv-parse/sync';
import { eq } from 'drizzle-orm';
import request from 'supertest';
import { afterAll, beforeAll, describe, expect, it } from 'vitest';
import { asBrowser, startForecastServer, type ForecastTestContext } from './support/forecast-server';
import { writeDraftVersion } from './support/draft-versions';

let t: ForecastTestContext;
let zoneVersion: number;
let feederVersion: number;
const formulaName = '=HYPERLINK("http://evil.example","Tallowmere Town")';
/** 00:00 CDT on Saturday 31 October 2026; 48 hours run through the repeated 01:00 of Sunday. */
const origin = new Date('2026-10-31T05:00:00Z');

type Row = Record<string, string>;
const csvRows = (text: string): Row[] => parse(text, { columns: true, skip_empty_lines: true });
const byToken = (path: string) => request(t.server.url).get(path).set('Authorization', `Bearer ${t.readToken}`).buffer(true);

beforeAll(async () => {
  t = await startForecastServer();
  const planner = asBrowser(t.server.url, t.planner);
  const zone = t.seriesId('zone-central');
  await t.server.db.update(series).set({ name: formulaName }).where(eq(series.id, zone));
  zoneVersion = await writeDraftVersion(t.server.db, { seriesId: zone, origin, hours: 48, mean: (i) => 50 + i, stdError: () => 1 });
  const adjusted = await planner.post(`/api/forecast-versions/${zoneVersion}/adjustments`, {
    from: '2026-11-01T06:00:00Z',
    to: '2026-11-01T08:00:00Z',
    kind: 'scale',
    amount: 1.2,
    reason: 'Mill night shift',
  });
  expect(adjusted.status).toBe(201);
  expect((await planner.post(`/api/forecast-versions/${zoneVersion}/approve`)).status).toBe(200);
  feederVersion = await writeDraftVersion(t.server.db, { seriesId: t.seriesId('fdr-c1'), origin, hours: 24, mean: () => -1.5 });
  expect((await planner.post(`/api/forecast-versions/${feederVersion}/approve`)).status).toBe(200);
  // A draft is never exported.
  await writeDraftVersion(t.server.db, { seriesId: t.seriesId('fdr-c2'), origin, hours: 24 });
});
afterAll(() => t.server.close());

describe('GET /api/exports/forecasts.csv', () => {
  it('streams one series in UTC with interval and time zone columns, to a read token', async () => {
    const response = await byToken(`/api/exports/forecasts.csv?series=${t.seriesId('zone-central')}`);
    expect(response.status).toBe(200);
    expect(response.headers['content-type']).toBe('text/csv; charset=utf-8; header=present');
    expect(response.headers['content-disposition']).toMatch(/^attachment; filename="forecasts-zone-central-\d{8}\.csv"$/);
    // Streamed: chunked, with no length known up front.
    expect(response.headers['transfer-encoding']).toBe('chunked');
    expect(response.headers['content-length']).toBeUndefined();
    const text = response.text;
    expect(text.split('\r\n')[0]).toBe(
      'series_id,series_key,series_name,level,unit,version_id,approved_at,interval_start,interval_end,time_zone,mean,model_mean,adjusted,lower_80,upper_80,lower_95,upper_95,stale',
    );
    const rows = csvRows(text);
    expect(rows).toHaveLength(48);
    expect(rows[0]).toMatchObject({
      series_key: 'zone-central',
      unit: 'MW',
      level: 'zone',
      version_id: String(zoneVersion),
      interval_start: '2026-10-31T05:00:00Z',
      interval_end: '2026-10-31T06:00:00Z',
      time_zone: 'UTC',
      mean: '50',
      model_mean: '50',
      adjusted: 'false',
    });
    expect(Number(rows[0]!.lower_95)).toBeCloseTo(50 - 1.959964, 4);
    expect(rows[47]).toMatchObject({ interval_start: '2026-11-02T04:00:00Z', interval_end: '2026-11-02T05:00:00Z' });
  });

  it('neutralises a series name that a spreadsheet would run as a formula', async () => {
    const response = await byToken(`/api/exports/forecasts.csv?series=${t.seriesId('zone-central')}`);
    const rows = csvRows(response.text);
    expect(rows[0]!.series_name).toBe(`'${formulaName}`);
    expect(response.text).toContain(`"'=HYPERLINK(""http://evil.example"",""Tallowmere Town"")"`);
    expect(response.text).not.toMatch(/(^|,)=HYPERLINK/m);
  });

  it('uses the adjusted mean where a planner adjusted, with the model mean beside it', async () => {
    const rows = csvRows((await byToken(`/api/exports/forecasts.csv?series=${t.seriesId('zone-central')}`)).text);
    const sixZ = rows.find((row) => row.interval_start === '2026-11-01T06:00:00Z')!;
    // Hour 25 of the version: model mean 75, scaled by 1.2.
    expect(sixZ).toMatchObject({ model_mean: '75', mean: '90', adjusted: 'true' });
    expect(Number(sixZ.upper_80)).toBeCloseTo((75 + 1.281552) * 1.2, 4);
    expect(rows.filter((row) => row.adjusted === 'true')).toHaveLength(2);
  });

  it('writes local times with their offsets in America/Chicago, telling the two 01:00s apart', async () => {
    const response = await byToken(`/api/exports/forecasts.csv?series=${t.seriesId('zone-central')}&tz=America/Chicago`);
    const rows = csvRows(response.text);
    expect(rows).toHaveLength(48);
    expect(rows.every((row) => row.time_zone === 'America/Chicago')).toBe(true);
    expect(rows[0]).toMatchObject({ interval_start: '2026-10-31T00:00:00-05:00', interval_end: '2026-10-31T01:00:00-05:00' });
    const sunday = rows.filter((row) => row.interval_start.startsWith('2026-11-01'));
    // The horizon ends at 23:00 CST, so Sunday has 24 of its 25 hours here, the repeated 01:00 twice.
    expect(sunday).toHaveLength(24);
    expect(sunday.slice(0, 3).map((row) => [row.interval_start, row.interval_end])).toEqual([
      ['2026-11-01T00:00:00-05:00', '2026-11-01T01:00:00-05:00'],
      ['2026-11-01T01:00:00-05:00', '2026-11-01T01:00:00-06:00'],
      ['2026-11-01T01:00:00-06:00', '2026-11-01T02:00:00-06:00'],
    ]);
    // Same instants as the UTC export: only the way they are written differs.
    const utc = csvRows((await byToken(`/api/exports/forecasts.csv?series=${t.seriesId('zone-central')}`)).text);
    expect(rows.map((row) => Date.parse(row.interval_start!))).toEqual(utc.map((row) => Date.parse(row.interval_start!)));
    expect(rows.map((row) => row.mean)).toEqual(utc.map((row) => row.mean));
  });

  it('exports a group (parent and descendants) with only the chosen levels, negative means as numbers', async () => {
    const path = forecastExportPath({ format: 'csv', parentId: t.seriesId('zone-central'), levels: [95] });
    expect(path).toBe(`/api/exports/forecasts.csv?parent=${t.seriesId('zone-central')}&levels=95`);
    const response = await byToken(path);
    expect(response.status).toBe(200);
    expect(response.text.split('\r\n')[0]).toMatch(/,adjusted,lower_95,upper_95,stale$/);
    const rows = csvRows(response.text);
    expect(new Set(rows.map((row) => row.series_key))).toEqual(new Set(['zone-central', 'fdr-c1']));
    expect(rows).toHaveLength(48 + 24);
    expect(rows.find((row) => row.series_key === 'fdr-c1')).toMatchObject({ mean: '-1.5', unit: 'kW' });
  });

  it('exports the whole system when no series or parent is given, or only some hierarchy levels of it', async () => {
    const rows = csvRows((await byToken('/api/exports/forecasts.csv')).text);
    expect(new Set(rows.map((row) => row.version_id))).toEqual(new Set([String(zoneVersion), String(feederVersion)]));
    const zones = csvRows((await byToken(forecastExportPath({ format: 'csv', seriesLevels: ['zone', 'system'] }))).text);
    expect(new Set(zones.map((row) => row.series_key))).toEqual(new Set(['zone-central']));
    expect((await byToken('/api/exports/forecasts.csv?seriesLevels=district')).status).toBe(400);
  });

  it('refuses an unknown time zone or level (400) and unknown series (404)', async () => {
    const zone = await byToken('/api/exports/forecasts.csv?tz=Mars/Olympus');
    expect(zone.status).toBe(400);
    expect(zone.body.errors[0]).toMatchObject({ pointer: '/query/tz' });
    expect((await byToken('/api/exports/forecasts.csv?levels=90')).status).toBe(400);
    expect((await byToken('/api/exports/forecasts.csv?series=999999')).status).toBe(404);
    expect((await byToken('/api/exports/forecasts.csv?parent=999999')).status).toBe(404);
  });

  it('is for readers: a viewer session may export, nobody unidentified may', async () => {
    const viewer = await asBrowser(t.server.url, t.viewer).get(`/api/exports/forecasts.csv?series=${t.seriesId('fdr-c1')}`);
    expect(viewer.status).toBe(200);
    expect(csvRows(viewer.text)).toHaveLength(24);
    expect((await request(t.server.url).get('/api/exports/forecasts.csv')).status).toBe(401);
  });
});

describe('GET /api/exports/forecasts (JSON)', () => {
  it('hands a group on in the chosen zone, listing series without an approved forecast', async () => {
    const response = await byToken(
      forecastExportPath({ format: 'json', parentId: t.seriesId('zone-central'), timeZone: 'America/Chicago' }),
    );
    expect(response.status).toBe(200);
    expect(response.headers['content-type']).toBe('application/json; charset=utf-8');
    const body = forecastExportSchema.parse(JSON.parse(response.text));
    expect(body).toMatchObject({ timeZone: 'America/Chicago', levels: [80, 95] });
    expect(body.intervalConvention).toContain('[interval_start, interval_end)');
    expect(body.series.map((s) => s.key)).toEqual(['zone-central', 'fdr-c1'].sort((a, b) => t.seriesId(a) - t.seriesId(b)));
    const zone = body.series.find((s) => s.key === 'zone-central')!;
    expect(zone).toMatchObject({ name: formulaName, versionId: zoneVersion, intervalMinutes: 60 });
    expect(zone.points[26]).toMatchObject({ intervalStart: '2026-11-01T01:00:00-06:00', modelMean: 76, adjusted: true });
    expect(zone.points[26]!.mean).toBeCloseTo(76 * 1.2, 10);
    expect(body.withoutApproved.map((s) => s.key).sort()).toEqual(['fdr-c2', 'fdr-c3', 'fdr-c4']);
  });
});
