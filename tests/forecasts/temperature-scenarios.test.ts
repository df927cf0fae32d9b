/**
 * Weather scenarios re-run the reviewed forecast through its model's degree-hour terms. Demo co-op: zone-central
 * is linked to wx-lowland (°F; balance points 59.9 °F heating, 71.6 °F cooling). A weather feed pushes an issue
 * of a flat 57.9 °F for the 168 forecast hours, the zone is refitted with a fixed additive model (CMLE, AR(3),
 * hour-of-week profile, no logs), and the scenarios are read as a viewer.
 *
 * Worked by hand, per hour, with β_H the fitted heating coefficient (load per heating degree-hour):
 *   assumed 57.9 °F:   HDH = 59.9 − 57.9 = 2,  CDH = 0
 *   5 °F hotter, 62.9: HDH = max(0, 59.9 − 62.9) = 0, CDH = max(0, 62.9 − 71.6) = 0  → change β_H·(0 − 2) = −2 β_H
 *   5 °F colder, 52.9: HDH = 59.9 − 52.9 = 7,        CDH = 0                         → change β_H·(7 − 2) = +5 β_H
 * The same change at every hour, so each daily peak stays at its hour and moves by exactly that: down 2 β_H when
 * it runs hotter (not 5: the warmth above the balance point needs no heating), up 5 β_H when it runs colder.
 */
import { apiTokens, fits, forecastVersions } from '@loadwright/db';
import type { ForecastReview, TemperatureScenarios } from '@loadwright/contracts';
import { eq } from 'drizzle-orm';
import request from 'supertest';
import { afterAll, beforeAll, describe, expect, it } from 'vitest';
import { newApiTokenSecret } from '../../apps/api/src/auth/api-token-secret';
import { seedDemo } from '../../libs/db/src/seed/seed-demo';
import { createPeople, signIn, type SignedIn } from '../support/people';
import { startTestServer, type TestServer } from '../support/server';
import { seriesId, waitForRun } from '../refits/support';

let server: TestServer;
let planner: SignedIn;
let viewer: SignedIn;
let zone: number;
let beta: { heating: number; cooling: number };
let review: ForecastReview;
let scenarios: TemperatureScenarios;

const firstHour = Date.parse('2026-12-01T00:00:00Z');
const hourMs = 3_600_000;

beforeAll(async () => {
  server = await startTestServer();
  await seedDemo(server.databaseUrl);
  const people = await createPeople(server.db, '-scenario');
  planner = await signIn(server.url, people.planner.email);
  viewer = await signIn(server.url, people.viewer.email);
  zone = await seriesId(server.pool, 'zone-central');
  const { token, prefix, hash } = newApiTokenSecret();
  await server.db
    .insert(apiTokens)
    .values({ name: 'weather feed', prefix, secretHash: hash, scope: 'read-write', createdById: people.admin.id });
  const pushed = await request(server.url)
    .post('/api/series/wx-lowland/temperature-forecasts')
    .set('Authorization', `Bearer ${token}`)
    .send({
      issuedAt: '2026-11-30T18:00:00Z',
      unit: 'degF',
      hours: Array.from({ length: 168 }, (_, k) => ({ ts: new Date(firstHour + k * hourMs).toISOString(), value: 57.9 })),
    });
  expect(pushed.status, JSON.stringify(pushed.body)).toBe(201);

  const asPlanner = (req: request.Test) => req.set('Cookie', planner.cookie).set('X-CSRF-Token', planner.csrf);
  const settings = (await asPlanner(request(server.url).get(`/api/series/${zone}/model`))).body;
  const { seriesId: _s, temperatureSeries: _t, updatedAt: _u, updatedBy: _b, ...editable } = settings;
  const saved = await asPlanner(request(server.url).put(`/api/series/${zone}/model`)).send({
    ...editable,
    method: 'cmle',
    arOrder: 3,
    log: false,
    seasonal: { kind: 'profile', slot: 'hour-of-week', form: 'additive' },
  });
  expect(saved.status, JSON.stringify(saved.body)).toBe(200);
  const run = await asPlanner(request(server.url).post('/api/refits')).send({ scope: { kind: 'series', seriesIds: [zone] } });
  expect(run.status, JSON.stringify(run.body)).toBe(202);
  expect((await waitForRun(server.pool, run.body.id, 120_000)).series_done).toBe(1);

  const [draft] = await server.db
    .select({ parameters: fits.parameters })
    .from(forecastVersions)
    .innerJoin(fits, eq(fits.id, forecastVersions.fitId))
    .where(eq(forecastVersions.seriesId, zone))
    .orderBy(forecastVersions.id);
  const regression = (draft!.parameters as { regression: { names: string[]; coefficients: number[] } }).regression;
  beta = {
    heating: regression.coefficients[regression.names.indexOf('heating-degree-hours')]!,
    cooling: regression.coefficients[regression.names.indexOf('cooling-degree-hours')] ?? 0,
  };
  review = (await request(server.url).get(`/api/series/${zone}/forecast`).set('Cookie', viewer.cookie)).body;
  const response = await request(server.url).get(`/api/series/${zone}/temperature-scenarios?shift=5`).set('Cookie', viewer.cookie);
  expect(response.status, JSON.stringify(response.body)).toBe(200);
  scenarios = response.body;
}, 240_000);
afterAll(() => server?.close());

describe('weather scenarios of a forecast that assumed a flat 57.9 °F', () => {
  it('re-runs the draft the refit wrote with the issue the fit used', () => {
    expect(review.draft?.id).toBe(scenarios.versionId);
    expect(scenarios).toMatchObject({ available: true, shift: 5, station: { key: 'wx-lowland', unit: 'degF' } });
    expect(scenarios.caution).toMatch(/decision support/);
    // Winter load rises as it gets colder: the fitted heating response is positive.
    expect(beta.heating).toBeGreaterThan(0);
  });

  it('moves every hour by −2 β_H when it runs 5 °F hotter and by +5 β_H when it runs 5 °F colder', () => {
    const base = review.draft!.points.map((p) => p.mean);
    const hotter = scenarios.scenarios.find((s) => s.key === 'hotter')!;
    const colder = scenarios.scenarios.find((s) => s.key === 'colder')!;
    expect(hotter).toMatchObject({ kind: 'shift', shift: 5, label: '5 °F hotter', meanTemperatureChange: 5 });
    expect(colder).toMatchObject({ kind: 'shift', shift: -5, label: '5 °F colder' });
    expect(hotter.points).toHaveLength(168);
    hotter.points.forEach((point, h) => {
      expect(point.temperature).toBeCloseTo(62.9, 9);
      expect(point.value - base[h]!).toBeCloseTo(-2 * beta.heating, 6);
    });
    colder.points.forEach((point, h) => {
      expect(point.temperature).toBeCloseTo(52.9, 9);
      expect(point.value - base[h]!).toBeCloseTo(5 * beta.heating, 6);
    });
  });

  it('keeps each daily peak at its hour and moves it by exactly those amounts', () => {
    const basePeaks = scenarios.base.dailyPeaks;
    expect(basePeaks.map((p) => p.value)).toEqual(review.draft!.dailyPeaks.map((p) => p.value));
    const hotter = scenarios.scenarios.find((s) => s.key === 'hotter')!;
    const colder = scenarios.scenarios.find((s) => s.key === 'colder')!;
    basePeaks.forEach((peak, d) => {
      expect(hotter.dailyPeaks[d]).toMatchObject({ date: peak.date, ts: peak.ts });
      expect(hotter.dailyPeaks[d]!.value - peak.value).toBeCloseTo(-2 * beta.heating, 6);
      expect(colder.dailyPeaks[d]!.ts).toBe(peak.ts);
      expect(colder.dailyPeaks[d]!.value - peak.value).toBeCloseTo(5 * beta.heating, 6);
    });
  });

  it('tries the weather the station observed in the same weeks of past years, through the same degree-hours', async () => {
    const pastYears = scenarios.scenarios.filter((s) => s.kind === 'past-year');
    // The demo history starts 1 Dec 2024: the weeks 52 and 104 weeks back are both there.
    expect(pastYears.map((s) => s.key)).toEqual(['year-2025', 'year-2024']);
    const lastYear = pastYears[0]!;
    expect(lastYear.label).toMatch(/^Weather of 2025-11-3\d|^Weather of 2025-12-0\d/);
    const base = review.draft!.points.map((p) => p.mean);
    const hour = 40;
    const { rows } = await server.pool.query(
      `select coalesce(o.estimated, o.value) as value from observations o join series s on s.id = o.series_id
        where s.key = 'wx-lowland' and o.ts = $1`,
      [new Date(firstHour + hour * hourMs - 364 * 24 * hourMs)],
    );
    const observed = Number(rows[0].value);
    expect(lastYear.points[hour]!.temperature).toBeCloseTo(observed, 9);
    // By hand: change = β_H·(HDH(T) − 2) + β_C·CDH(T), HDH(T) = max(0, 59.9 − T), CDH(T) = max(0, T − 71.6).
    const change = beta.heating * (Math.max(0, 59.9 - observed) - 2) + beta.cooling * Math.max(0, observed - 71.6);
    expect(lastYear.points[hour]!.value - base[hour]!).toBeCloseTo(change, 6);
  });

  it('refuses a shift outside 1 to 20 whole degrees, in a sentence', async () => {
    const response = await request(server.url).get(`/api/series/${zone}/temperature-scenarios?shift=40`).set('Cookie', viewer.cookie);
    expect(response.status).toBe(400);
    expect(response.body.errors[0]).toMatchObject({ pointer: '/query/shift', detail: 'Use 20 or less' });
  });

  it('answers a weather station, which has no load forecast, with 404 in a sentence', async () => {
    const station = await seriesId(server.pool, 'wx-lowland');
    const response = await request(server.url).get(`/api/series/${station}/temperature-scenarios`).set('Cookie', viewer.cookie);
    expect(response.status).toBe(404);
    expect(response.body.detail).toBe(`No load series with id ${station}.`);
  });
});
