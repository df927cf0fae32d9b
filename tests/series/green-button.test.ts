/** Green Button (ESPI) interval usage files imported through the API into load series. */
import { readFileSync } from 'node:fs';
import { resolve } from 'node:path';
import { eq } from 'drizzle-orm';
import { uploadMappingSchema, uploadSettingsSchema } from '@loadwright/contracts';
import { auditLog, observations, series, uploads } from '@loadwright/db';
import request from 'supertest';
import { afterAll, beforeAll, describe, expect, it } from 'vitest';
import { createPeople, signIn, type SignedIn } from '../support/people';
import { startTestServer, type TestServer } from '../support/server';
import { createTokens, type Tokens } from './support/tokens';

let server: TestServer;
let steward: SignedIn;
let tokens: Tokens;
const ids = new Map<string, number>();

const fixture = (name: string) => readFileSync(resolve(import.meta.dirname, '../../fixtures/green-button', name), 'utf8');

beforeAll(async () => {
  server = await startTestServer({ worker: false });
  steward = await signIn(server.url, (await createPeople(server.db)).steward.email);
  tokens = await createTokens(server.db);
  const [system] = await server.db
    .insert(series)
    .values({
      key: 'gb-sys',
      name: 'Green Button system',
      kind: 'load',
      level: 'system',
      unit: 'MW',
      intervalMinutes: 60,
      timeZone: 'America/Chicago',
    })
    .returning({ id: series.id });
  for (const body of [
    { key: 'gb-pump', name: 'Pump house', level: 'feeder', unit: 'kW', intervalMinutes: 60 },
    { key: 'gb-quarter', name: 'Pump house, 15-minute', level: 'feeder', unit: 'kW', intervalMinutes: 15 },
    { key: 'gb-substation', name: 'Substation demand', level: 'substation', unit: 'MW', intervalMinutes: 60 },
    { key: 'gb-empty', name: 'Never filled', level: 'feeder', unit: 'kW', intervalMinutes: 60 },
  ]) {
    const response = await request(server.url)
      .post('/api/series')
      .set('Cookie', steward.cookie)
      .set('X-CSRF-Token', steward.csrf)
      .send({ ...body, kind: 'load', parentId: system!.id, timeZone: 'America/Chicago' });
    if (response.status !== 201) throw new Error(JSON.stringify(response.body));
    ids.set(body.key, response.body.id);
  }
});
afterAll(() => server.close());

const importFile = (key: string, xml: string, contentType = 'application/atom+xml', token = tokens.readWrite) =>
  request(server.url)
    .post(`/api/series/${key}/green-button`)
    .set('Authorization', `Bearer ${token}`)
    .set('Content-Type', contentType)
    .send(xml);
const stored = (key: string) =>
  server.db
    .select()
    .from(observations)
    .where(eq(observations.seriesId, ids.get(key)!))
    .orderBy(observations.ts);

describe('Green Button import', () => {
  it('stores hourly Wh as mean kW at the right UTC instants across the spring-forward weekend, recording local time parameters', async () => {
    const response = await importFile('gb-pump', fixture('hourly-energy-wh.xml'));
    expect(response.status).toBe(200);
    expect(response.body).toMatchObject({
      key: 'gb-pump',
      alreadyImported: false,
      received: 47,
      inserted: 47,
      readingType: { uom: 72, uomName: 'Wh', powerOfTenMultiplier: 0, intervalLengthSeconds: 3600, accumulationBehaviour: 4 },
      localTime: { tzOffsetSeconds: -21600, dstOffsetSeconds: 3600, dstStartRule: '360E2000', dstEndRule: 'B40E2000' },
      firstIntervalStart: '2026-03-07T06:00:00.000Z',
      lastIntervalStart: '2026-03-09T04:00:00.000Z',
    });
    const rows = await stored('gb-pump');
    expect(rows).toHaveLength(47);
    // 1,180 Wh over one hour is a mean demand of 1.18 kW.
    expect(rows[0]).toMatchObject({ ts: new Date('2026-03-07T06:00:00Z') });
    expect(rows[0]!.value).toBeCloseTo(1.18, 12);
    expect(rows[24]!.ts.toISOString()).toBe('2026-03-08T06:00:00.000Z');
    expect(rows[24]!.value).toBeCloseTo(1.217, 12);
    expect(rows.at(-1)!.value).toBeCloseTo(1.692, 12);
    // Hourly steps in UTC without a hole or a repeat, though local clocks skipped 02:00 on the Sunday.
    expect(rows.every((r, i) => i === 0 || r.ts.getTime() - rows[i - 1]!.ts.getTime() === 3_600_000)).toBe(true);

    const [upload] = await server.db.select().from(uploads).where(eq(uploads.id, response.body.uploadId));
    expect(upload).toMatchObject({ source: 'green_button', status: 'done', rowsImported: 47 });
    expect(upload!.settings).toMatchObject({
      greenButton: { localTime: { tzOffsetSeconds: -21600, dstOffsetSeconds: 3600 }, usagePoint: 'Pump house meter' },
    });
    // The upload list reads mapping and settings with the file-upload shapes.
    expect(uploadMappingSchema.parse(upload!.mapping)).toMatchObject({ layout: 'long', seriesKey: 'gb-pump' });
    expect(uploadSettingsSchema.parse(upload!.settings)).toMatchObject({
      unit: 'kW',
      timeZone: 'America/Chicago',
      timestampsMark: 'start',
    });
    const audit = await server.db.select().from(auditLog).where(eq(auditLog.action, 'greenButton.imported'));
    expect(audit).toHaveLength(1);

    // The chart reads them back by local day: 24 hours on Saturday, 23 on the spring-forward Sunday.
    const chart = await request(server.url)
      .get('/api/series/gb-pump/readings')
      .query({ from: '2026-03-07T06:00:00Z', to: '2026-03-09T05:00:00Z', resolution: 'day' })
      .set('Authorization', `Bearer ${tokens.read}`);
    expect(chart.body.buckets.map((b: { day: string; count: number }) => [b.day, b.count])).toEqual([
      ['2026-03-07', 24],
      ['2026-03-08', 23],
    ]);
  });

  it('applies the power-of-ten multiplier: 15-minute mWh becomes kW', async () => {
    const response = await importFile('gb-quarter', fixture('fifteen-minute-milliwatt-hours.xml'), 'application/xml');
    expect(response.status).toBe(200);
    expect(response.body).toMatchObject({ inserted: 8, readingType: { powerOfTenMultiplier: -3, intervalLengthSeconds: 900 } });
    const rows = await stored('gb-quarter');
    // 381,250 mWh = 381.25 Wh in a quarter hour: 1,525 W mean demand.
    expect(rows.map((r) => r.ts.toISOString().slice(11, 16))).toEqual([
      '14:00',
      '14:15',
      '14:30',
      '14:45',
      '15:00',
      '15:15',
      '15:30',
      '15:45',
    ]);
    const expected = [1.525, 1.61, 1.66, 1.595, 1.51, 1.44, 1.41, 1.399996];
    rows.forEach((row, i) => expect(row.value).toBeCloseTo(expected[i]!, 12));
  });

  it('takes demand in W with a kilo multiplier into a MW series', async () => {
    const response = await importFile('gb-substation', fixture('hourly-demand-kilowatts.xml'));
    expect(response.status).toBe(200);
    expect(response.body.localTime).toBeNull();
    const values = (await stored('gb-substation')).map((r) => r.value!);
    [1.523, 1.587, 1.644, 1.702, 1.688, 1.61].forEach((v, i) => expect(values[i]).toBeCloseTo(v, 12));
  });

  it('adds nothing for the same file twice', async () => {
    const again = await importFile('gb-pump', fixture('hourly-energy-wh.xml'));
    expect(again.status).toBe(200);
    expect(again.body).toMatchObject({ alreadyImported: true, inserted: 0, unchanged: 47 });
    expect(await stored('gb-pump')).toHaveLength(47);
  });

  it.each([
    ['malformed XML', 'malformed-truncated.xml', /^The file is not well-formed XML: .+ \(line \d+, column \d+\)\.$/],
    [
      'an unknown unit',
      'unknown-unit-therms.xml',
      /^ReadingType uom 169 is not a unit Loadwright imports; use 72 \(Wh, energy per interval\) or 38 \(W, demand\)\.$/,
    ],
    ['register reads', 'cumulative-register.xml', /accumulationBehaviour 3 is cumulative \(register reads\), not usage per interval/],
    [
      'intervals of another length',
      'fifteen-minute-milliwatt-hours.xml',
      /intervals are 900 s \(15 minutes\) long, starting 2026-06-15T14:00:00.000Z; gb-empty takes 60-minute readings/,
    ],
  ])('refuses %s with a clear message and stores no row and no upload', async (_case, file, message) => {
    const uploadsBefore = (await server.db.select().from(uploads)).length;
    const response = await importFile('gb-empty', fixture(file));
    expect(response.status).toBe(400);
    expect(response.body.type).toBe('/problems/invalid-input');
    expect(response.body.detail).toMatch(message);
    expect(await stored('gb-empty')).toHaveLength(0);
    expect(await server.db.select().from(uploads)).toHaveLength(uploadsBefore);
  });

  it('asks for an XML body when sent something else', async () => {
    const json = await request(server.url)
      .post('/api/series/gb-empty/green-button')
      .set('Authorization', `Bearer ${tokens.readWrite}`)
      .send({ xml: '<feed/>' });
    expect(json.status).toBe(400);
    expect(json.body.detail).toBe(
      'Send the Green Button XML file as the request body with Content-Type application/xml or application/atom+xml.',
    );
  });

  it('refuses a file over the size limit with 413', async () => {
    const huge = `<feed xmlns="http://www.w3.org/2005/Atom"><!-- ${'x'.repeat(21 * 1024 * 1024)} --></feed>`;
    const response = await importFile('gb-empty', huge);
    expect(response.status).toBe(413);
    expect(response.body.detail).toBe('Green Button files of up to 20 MB are accepted; split the download by date range.');
  });

  it('refuses a read token', async () => {
    const response = await importFile('gb-empty', fixture('hourly-energy-wh.xml'), 'application/atom+xml', tokens.read);
    expect(response.status).toBe(403);
    expect(await stored('gb-empty')).toHaveLength(0);
  });
});
