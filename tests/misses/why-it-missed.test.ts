/**
 * Why it missed, on a constructed case through the real paths: a forecast made with temperatures of
 * 90 and 92 °F, observed temperatures of 96 and 98 °F pushed afterwards, and actuals 4 MW over the
 * forecast. With 0.5 MW per cooling degree-hour (base 71.6 °F), 3 of the 4 MW are the temperature
 * forecast's (6 °F × 0.5 MW/°F) and 1 MW is model error. The same case is made twice: once with the
 * assumed temperatures stored as the station's readings, once with them in the temperature forecast
 * issue the refit used, beside an older and a newer issue that must not be read.
 */
import { eq } from 'drizzle-orm';
import { fits, forecastVersions, holidays, observations, organisation, series, temperatureForecasts } from '@loadwright/db';
import { detectMisses, explainEvent } from '@loadwright/misses';
import request from 'supertest';
import { afterAll, beforeAll, expect, it } from 'vitest';
import { createTokens } from '../series/support/tokens';
import { writeDraftVersion } from '../forecasts/support/draft-versions';
import { startTestServer, type TestServer } from '../support/server';
import { actuals, eventsOf, seriesRule } from './support';

let server: TestServer;
let token: string;

beforeAll(async () => {
  server = await startTestServer({ worker: false });
  // A token acts for its creator, so it comes from the shared helper that makes one with an active admin.
  token = (await createTokens(server.db)).readWrite;
});
afterAll(() => server.close());

const h21 = '2026-07-20T21:00:00.000Z';
const h22 = '2026-07-20T22:00:00.000Z';

it('splits the error into the temperature forecast part and model error, in words', async () => {
  const [station] = await server.db
    .insert(series)
    .values({ key: 'wx-test', name: 'Test station', kind: 'temperature', unit: 'degF', intervalMinutes: 60, timeZone: 'America/Chicago' })
    .returning({ id: series.id });
  const [load] = await server.db
    .insert(series)
    .values({
      key: 'sys-test',
      name: 'Test system',
      kind: 'load',
      level: 'system',
      unit: 'MW',
      intervalMinutes: 60,
      timeZone: 'America/Chicago',
      temperatureSeriesId: station!.id,
    })
    .returning({ id: series.id });
  // The temperature forecast as the refit saw it: stored as the station's readings before the version was issued.
  await server.db.insert(observations).values([
    { seriesId: station!.id, ts: new Date(h21), value: 90 },
    { seriesId: station!.id, ts: new Date(h22), value: 92 },
  ]);
  const versionId = await writeDraftVersion(server.db, {
    seriesId: load!.id,
    origin: new Date('2026-07-20T12:00:00Z'),
    hours: 24,
    issuedAt: new Date('2026-07-20T07:00:00Z'),
    mean: (_, ts) => (ts.toISOString() === h22 ? 110 : 100),
    stdError: () => 1,
  });
  const [version] = await server.db
    .select({ fitId: forecastVersions.fitId })
    .from(forecastVersions)
    .where(eq(forecastVersions.id, versionId));
  await server.db
    .update(fits)
    .set({
      parameters: {
        mean: 0,
        ar: [0.5],
        ma: [],
        regression: { names: ['heating-degree-hours', 'cooling-degree-hours'], coefficients: [0.2, 0.5], dropped: [] },
      },
    })
    .where(eq(fits.id, version!.fitId));
  await seriesRule(server.db, load!.id, { kind: 'outside_band', hours: 2, bandLevel: 95 });
  await actuals(server.db, load!.id, h21, [104, 114]);

  // Before observed temperatures arrive, the explanation says it must wait.
  await detectMisses(server.db, load!.id, new Date('2026-07-21T00:00:00Z'));
  const [event] = await eventsOf(server.db, load!.id);
  expect((event!.cause as { words: string }).words).toBe(
    'Observed temperatures for these hours have not arrived yet; the split follows once they do.',
  );

  // Observed temperatures arrive through the push API (the forecast values move to the revisions).
  const pushed = await request(server.url)
    .post('/api/series/wx-test/readings')
    .set('Authorization', `Bearer ${token}`)
    .send({
      readings: [
        { ts: h21, value: 96 },
        { ts: h22, value: 98 },
      ],
    });
  expect(pushed.status).toBe(200);
  // The station's detection job re-explains the misses of the series it serves (run here without a worker).
  await detectMisses(server.db, station!.id, new Date('2026-07-21T01:00:00Z'));
  const [explained] = await eventsOf(server.db, load!.id);
  const cause = explained!.cause as { words: string; split: { meanError: number; temperaturePart: number; modelPart: number } };
  // Hand arithmetic: CDH(96) − CDH(90) = 24.4 − 18.4 = 6 and CDH(98) − CDH(92) = 6, so each re-forecast rises
  // by 0.5 × 6 = 3 MW; errors 104 − 100 = 4 and 114 − 110 = 4 MW; mean temperature part 3, model part 1.
  expect(cause.split.meanError).toBeCloseTo(4, 9);
  expect(cause.split.temperaturePart).toBeCloseTo(3, 9);
  expect(cause.split.modelPart).toBeCloseTo(1, 9);
  expect(cause.words).toBe('3.0 of the 4.0 MW under-forecast came from a temperature forecast 6.0 °F too low; 1.0 MW is model error.');
});

it('reads the assumed temperatures from the forecast issue the version used, not an older or newer one', async () => {
  const [station] = await server.db
    .insert(series)
    .values({ key: 'wx-issue', name: 'Issue station', kind: 'temperature', unit: 'degF', intervalMinutes: 60, timeZone: 'America/Chicago' })
    .returning({ id: series.id });
  const [load] = await server.db
    .insert(series)
    .values({
      key: 'sys-issue',
      name: 'Issue system',
      kind: 'load',
      level: 'system',
      unit: 'MW',
      intervalMinutes: 60,
      timeZone: 'America/Chicago',
      temperatureSeriesId: station!.id,
    })
    .returning({ id: series.id });
  // Three issues of the station's temperature forecast for the two hours: the refit at 07:00 used the 06:00 one.
  const issue = (issuedAt: string, at21: number, at22: number) => [
    { seriesId: station!.id, issuedAt: new Date(issuedAt), ts: new Date(h21), value: at21 },
    { seriesId: station!.id, issuedAt: new Date(issuedAt), ts: new Date(h22), value: at22 },
  ];
  await server.db
    .insert(temperatureForecasts)
    .values([...issue('2026-07-20T00:00:00Z', 80, 82), ...issue('2026-07-20T06:00:00Z', 90, 92), ...issue('2026-07-20T09:00:00Z', 95, 97)]);
  const versionId = await writeDraftVersion(server.db, {
    seriesId: load!.id,
    origin: new Date('2026-07-20T12:00:00Z'),
    hours: 24,
    issuedAt: new Date('2026-07-20T07:00:00Z'),
    mean: (_, ts) => (ts.toISOString() === h22 ? 110 : 100),
    stdError: () => 1,
  });
  const [version] = await server.db
    .select({ fitId: forecastVersions.fitId })
    .from(forecastVersions)
    .where(eq(forecastVersions.id, versionId));
  await server.db
    .update(fits)
    .set({
      parameters: {
        mean: 0,
        ar: [0.5],
        ma: [],
        regression: { names: ['heating-degree-hours', 'cooling-degree-hours'], coefficients: [0.2, 0.5], dropped: [] },
      },
      // What the refit records when the forecast hours' temperatures came from an issue.
      diagnostics: { temperature: { used: true, reason: 'test', forecastIssuedAt: '2026-07-20T06:00:00.000Z' } },
    })
    .where(eq(fits.id, version!.fitId));
  await seriesRule(server.db, load!.id, { kind: 'outside_band', hours: 2, bandLevel: 95 });
  await actuals(server.db, load!.id, h21, [104, 114]);
  await detectMisses(server.db, load!.id, new Date('2026-07-21T00:00:00Z'));
  const [event] = await eventsOf(server.db, load!.id);
  expect((event!.cause as { words: string }).words).toBe(
    'Observed temperatures for these hours have not arrived yet; the split follows once they do.',
  );

  const pushed = await request(server.url)
    .post('/api/series/wx-issue/readings')
    .set('Authorization', `Bearer ${token}`)
    .send({
      readings: [
        { ts: h21, value: 96 },
        { ts: h22, value: 98 },
      ],
    });
  expect(pushed.status).toBe(200);
  await detectMisses(server.db, station!.id, new Date('2026-07-21T01:00:00Z'));
  const [explained] = await eventsOf(server.db, load!.id);
  const cause = explained!.cause as { words: string; split: { temperaturePart: number; modelPart: number; temperatureError: number } };
  // Hand arithmetic with the 06:00 issue (90, 92 °F) against observed 96, 98 °F: 6 °F too low each hour,
  // 0.5 MW × 6 = 3 MW of the 4 MW error, 1 MW model error.
  // The newer 09:00 issue (95, 97) would give 0.5 × 1 = 0.5 MW and the older 00:00 one (80, 82) 0.5 × 16 = 8 MW.
  expect(cause.split.temperatureError).toBeCloseTo(-6, 9);
  expect(cause.split.temperaturePart).toBeCloseTo(3, 9);
  expect(cause.split.modelPart).toBeCloseTo(1, 9);
  expect(cause.words).toBe('3.0 of the 4.0 MW under-forecast came from a temperature forecast 6.0 °F too low; 1.0 MW is model error.');
});

it('flags a public holiday missing from the calendar, and stops once it is back', async () => {
  await server.db.insert(organisation).values({ name: 'Test co-op', timeZone: 'America/Chicago', holidayCountry: 'US' });
  const [load] = await server.db
    .insert(series)
    .values({
      key: 'hol-test',
      name: 'Holiday feeder',
      kind: 'load',
      level: 'feeder',
      unit: 'kW',
      intervalMinutes: 60,
      timeZone: 'America/Chicago',
    })
    .returning({ id: series.id });
  // Thanksgiving 2026 is Thursday 26 November; 12:00 CST is 18:00Z.
  await writeDraftVersion(server.db, { seriesId: load!.id, origin: new Date('2026-11-26T06:00:00Z'), hours: 24, stdError: () => 1 });
  await seriesRule(server.db, load!.id, { kind: 'outside_band', hours: 1, bandLevel: 95 });
  await actuals(server.db, load!.id, '2026-11-26T18:00:00Z', [80]);
  await detectMisses(server.db, load!.id, new Date('2026-11-27T00:00:00Z'));
  const [event] = await eventsOf(server.db, load!.id);
  expect((event!.cause as { flags: string[] }).flags).toContain(
    '2026-11-26 is Thanksgiving Day, a public holiday missing from the holiday calendar: the forecast treated it as a working day.',
  );
  await server.db.insert(holidays).values({ day: '2026-11-26', name: 'Thanksgiving Day', kind: 'public', source: 'package' });
  const again = await explainEvent(server.db, event!.id);
  expect(again!.flags).toEqual([]);
});
