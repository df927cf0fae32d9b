/**
 * Temperature forecast issues uploaded as a CSV file by a steward: the file is received like any upload, read
 * as issues (issue time, valid hour, temperature columns) and checked before anything is stored; stored all or
 * nothing, converted once to the station's unit; the same bytes again answer with the earlier upload, an issue
 * time the station holds is refused with nothing stored, and a file with bad rows names them and stores nothing.
 * Demo co-op: wx-lowland (Millrace Flats) keeps °F; its demo issues end 30 Nov 2026, so these come later.
 */
import type { TemperatureForecastFileResult, TemperatureForecastIssueList } from '@loadwright/contracts';
import { apiTokens, temperatureForecasts, uploads } from '@loadwright/db';
import { eq } from 'drizzle-orm';
import request from 'supertest';
import { afterAll, beforeAll, describe, expect, it } from 'vitest';
import { newApiTokenSecret } from '../../apps/api/src/auth/api-token-secret';
import { seedDemo } from '../../libs/db/src/seed/seed-demo';
import { createPeople, signIn, type SignedIn } from '../support/people';
import { startTestServer, type TestServer } from '../support/server';
import { postFile } from './upload-client';

let server: TestServer;
let steward: SignedIn;
let viewer: SignedIn;
let station: number;

/** A forecast file: `issues` local issue times (America/Chicago), 48 valid hours each from the next local midnight. */
function forecastFile(issues: string[], value: (issue: number, k: number) => string = (_, k) => (k % 2 === 0 ? '20' : '0')): string {
  const lines = ['issued,valid,temp_c'];
  issues.forEach((issued, i) => {
    const day = issued.slice(0, 10);
    const start = Date.parse(`${day}T06:00:00Z`) + 24 * 3_600_000; // local midnight of the next day (CST = UTC−6)
    for (let k = 0; k < 48; k++) {
      const valid = new Date(start + k * 3_600_000).toISOString();
      lines.push(`${issued},${valid},${value(i, k)}`);
    }
  });
  return `${lines.join('\n')}\n`;
}

const mapping = {
  station: 'wx-lowland',
  issuedAtColumn: 'issued',
  validTimeColumn: 'valid',
  valueColumn: 'temp_c',
  unit: 'degC',
  timeZone: 'America/Chicago',
};

/** Reads a received upload as forecast issues. */
const readAsForecast = (session: SignedIn, id: number, body: object) =>
  request(server.url)
    .post(`/api/uploads/${id}/temperature-forecast`)
    .set('Cookie', session.cookie)
    .set('X-CSRF-Token', session.csrf)
    .send(body);

const storedRows = async () =>
  (await server.db.select().from(temperatureForecasts).where(eq(temperatureForecasts.seriesId, station))).length;

beforeAll(async () => {
  server = await startTestServer();
  await seedDemo(server.databaseUrl);
  const people = await createPeople(server.db, '-forecast-files');
  steward = await signIn(server.url, people.steward.email);
  viewer = await signIn(server.url, people.viewer.email);
  const { rows } = await server.pool.query("select id from series where key = 'wx-lowland'");
  station = rows[0].id;
}, 120_000);
afterAll(() => server?.close());

describe('a steward uploads a file of forecast issues', () => {
  let uploadId: number;
  const file = forecastFile(['2026-12-01 06:00', '2026-12-02 06:00']);

  it('checks the file first: two issues of 48 hours, times read in the station zone, nothing stored yet', async () => {
    const before = await storedRows();
    const posted = await postFile(server.url, steward, 'millrace-forecast.csv', file);
    expect(posted.status).toBe(201);
    uploadId = posted.body.upload.id;
    const checked = await readAsForecast(steward, uploadId, { ...mapping, checkOnly: true });
    expect(checked.status, JSON.stringify(checked.body)).toBe(200);
    const result = checked.body as TemperatureForecastFileResult;
    expect(result).toMatchObject({
      stored: false,
      rows: 96,
      problems: [],
      message: '2 issues with 96 valid hours for Millrace Flats weather station, ready to store.',
    });
    // 06:00 in Chicago in December (CST, UTC−6) is 12:00 UTC.
    expect(result.issues.map((i) => [i.issuedAt, i.hours, i.alreadyStored])).toEqual([
      ['2026-12-01T12:00:00.000Z', 48, false],
      ['2026-12-02T12:00:00.000Z', 48, false],
    ]);
    // °F = °C × 9/5 + 32: 0 → 32, 20 → 68.
    expect(result.issues[0]).toMatchObject({ unit: 'degF', converted: true, min: 32, max: 68 });
    expect(await storedRows()).toBe(before);
    const [row] = await server.db.select({ status: uploads.status }).from(uploads).where(eq(uploads.id, uploadId));
    expect(row!.status).toBe('received');
  });

  it('stores both issues, converted once to °F, and ends the upload done', async () => {
    const before = await storedRows();
    const stored = await readAsForecast(steward, uploadId, mapping);
    expect(stored.status, JSON.stringify(stored.body)).toBe(200);
    expect(stored.body).toMatchObject({
      stored: true,
      message: 'Stored 2 issues with 96 valid hours for Millrace Flats weather station, converted from °C.',
    });
    expect(await storedRows()).toBe(before + 96);
    const rows = await server.db.select().from(temperatureForecasts).where(eq(temperatureForecasts.uploadId, uploadId));
    expect(new Set(rows.map((r) => r.value))).toEqual(new Set([32, 68]));
    const [upload] = await server.db.select().from(uploads).where(eq(uploads.id, uploadId));
    expect(upload).toMatchObject({ status: 'done', content: 'temperature_forecast', rowsTotal: 96, rowsImported: 96, storagePath: null });
    const list = (await request(server.url).get('/api/series/wx-lowland/temperature-forecasts').set('Cookie', viewer.cookie))
      .body as TemperatureForecastIssueList;
    expect(list.issues[0]).toMatchObject({
      issuedAt: '2026-12-02T12:00:00.000Z',
      hours: 48,
      uploadId,
      source: `file millrace-forecast.csv (upload ${uploadId}) by Test steward`,
    });
    const hours = await request(server.url)
      .get('/api/series/wx-lowland/temperature-forecast-hours?issuedAt=2026-12-01T12:00:00Z')
      .set('Cookie', viewer.cookie);
    expect(hours.body.hours).toHaveLength(48);
    expect(hours.body.hours[0]).toEqual({ ts: '2026-12-02T06:00:00.000Z', value: 68 });
  });

  it('answers the same bytes again with the earlier upload, adding nothing', async () => {
    const before = await storedRows();
    const again = await postFile(server.url, steward, 'millrace-forecast-copy.csv', file);
    expect(again.status).toBe(200);
    expect(again.body).toMatchObject({ duplicateOf: uploadId, message: `Already imported as upload ${uploadId}; nothing was added.` });
    expect(await storedRows()).toBe(before);
  });

  it('refuses a file that repeats a stored issue time, storing none of its issues', async () => {
    const before = await storedRows();
    const posted = await postFile(
      server.url,
      steward,
      'second.csv',
      forecastFile(['2026-12-02 06:00', '2026-12-03 06:00'], () => '5'),
    );
    const checked = await readAsForecast(steward, posted.body.upload.id, { ...mapping, checkOnly: true });
    expect(checked.body.issues.map((i: { alreadyStored: boolean }) => i.alreadyStored)).toEqual([true, false]);
    const refused = await readAsForecast(steward, posted.body.upload.id, mapping);
    expect(refused.status).toBe(409);
    expect(refused.body.detail).toBe(
      'wx-lowland already holds a forecast issued at 2026-12-02T12:00:00.000Z; issues are kept as issued and never overwritten. Nothing from this file was stored.',
    );
    expect(await storedRows()).toBe(before);
  });

  it('names the rows that cannot be stored and stores nothing from the file', async () => {
    const before = await storedRows();
    const bad = forecastFile(['2026-12-04 06:00'], (_, k) => (k === 2 ? '400' : k === 5 ? 'warm' : '3'));
    const posted = await postFile(server.url, steward, 'bad.csv', bad);
    const checked = (await readAsForecast(steward, posted.body.upload.id, { ...mapping, checkOnly: true }))
      .body as TemperatureForecastFileResult;
    // Row 1 is the header: hour k is on row k + 2.
    expect(checked.problems).toEqual([
      'Row 7, temp_c: "warm" is not a temperature.',
      'Row 4, temp_c: 400 °C is outside plausible air temperatures (-70 to 60 °C). Is the unit right?',
    ]);
    const refused = await readAsForecast(steward, posted.body.upload.id, mapping);
    expect(refused.status).toBe(400);
    expect(refused.body.detail).toMatch(/^2 problems stop the file from being stored; nothing was stored\./);
    expect(await storedRows()).toBe(before);
    const missing = await readAsForecast(steward, posted.body.upload.id, { ...mapping, valueColumn: 'temperature' });
    expect(missing.status).toBe(400);
    expect(missing.body.detail).toBe('The file has no column "temperature"; choose one of issued, valid, temp_c.');
  });

  it('is for stewards and admins: a viewer is refused and nothing is stored', async () => {
    const posted = await postFile(server.url, steward, 'viewer.csv', forecastFile(['2026-12-05 06:00']));
    const before = await storedRows();
    expect((await readAsForecast(viewer, posted.body.upload.id, mapping)).status).toBe(403);
    expect(await storedRows()).toBe(before);
  });
});

describe('a pushed issue', () => {
  it('is listed as pushed through the API by its token', async () => {
    const people = await createPeople(server.db, '-forecast-push');
    const { token, prefix, hash } = newApiTokenSecret();
    await server.db
      .insert(apiTokens)
      .values({ name: 'weather feed', prefix, secretHash: hash, scope: 'read-write', createdById: people.admin.id });
    const pushed = await request(server.url)
      .post('/api/series/wx-lowland/temperature-forecasts')
      .set('Authorization', `Bearer ${token}`)
      .send({ issuedAt: '2026-12-06T12:00:00Z', unit: 'degF', hours: [{ ts: '2026-12-07T00:00:00Z', value: 40 }] });
    expect(pushed.status).toBe(201);
    const list = (await request(server.url).get('/api/series/wx-lowland/temperature-forecasts').set('Cookie', viewer.cookie))
      .body as TemperatureForecastIssueList;
    expect(list.issues[0]).toMatchObject({
      issuedAt: '2026-12-06T12:00:00.000Z',
      source: 'pushed through the API by token "weather feed"',
    });
    expect(list.issues.at(-1)!.source).toBe('sender not recorded');
  });
});
