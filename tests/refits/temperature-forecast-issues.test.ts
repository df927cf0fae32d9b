/**
 * Temperature forecasts as their own data: an issue pushed with a read-write token (°C converted once to the
 * station's °F), kept whole (the same issue time twice is refused), bad hours refused with pointers; the refit
 * reads the latest issue made before it runs, falls back with the warning when that issue does not cover the
 * horizon, and a real refit names the issue on the model card. Demo co-op: sys is linked to wx-lowland (°F),
 * whose readings stop with the load's at 2026-11-30T23:00Z, so the 168 forecast hours start 2026-12-01T00:00Z;
 * the demo ships its own issues each morning at 12:00 UTC up to 30 Nov, so the pushed ones come later.
 */
import { apiTokens, temperatureForecasts } from '@loadwright/db';
import { readRefitInputs } from '../../libs/refits/src/series-window';
import { and, eq } from 'drizzle-orm';
import request from 'supertest';
import { afterAll, beforeAll, describe, expect, it } from 'vitest';
import { newApiTokenSecret } from '../../apps/api/src/auth/api-token-secret';
import { seedDemo } from '../../libs/db/src/seed/seed-demo';
import { createPeople, signIn, type SignedIn } from '../support/people';
import { startTestServer, type TestServer } from '../support/server';
import { seriesId, waitForRun } from './support';

let server: TestServer;
let planner: SignedIn;
let viewer: SignedIn;
let writeToken: string;
let readToken: string;
let station: number;
let sys: number;

const firstHour = Date.parse('2026-12-01T00:00:00Z');
const hourMs = 3_600_000;
/** `count` valid hours from the first forecast hour, each value from `value(k)`. */
const hours = (count: number, value: (k: number) => number) =>
  Array.from({ length: count }, (_, k) => ({ ts: new Date(firstHour + k * hourMs).toISOString(), value: value(k) }));

/** The stored rows of the issue pushed first (30 Nov 18:00 UTC). */
const pushedRows = () =>
  server.db
    .select()
    .from(temperatureForecasts)
    .where(and(eq(temperatureForecasts.seriesId, station), eq(temperatureForecasts.issuedAt, new Date('2026-11-30T18:00:00Z'))));

/** Pushes an issue with the read-write token. */
const push = (body: object, token = writeToken) =>
  request(server.url).post('/api/series/wx-lowland/temperature-forecasts').set('Authorization', `Bearer ${token}`).send(body);

beforeAll(async () => {
  server = await startTestServer();
  await seedDemo(server.databaseUrl);
  const people = await createPeople(server.db, '-weather');
  planner = await signIn(server.url, people.planner.email);
  viewer = await signIn(server.url, people.viewer.email);
  for (const scope of ['read-write', 'read'] as const) {
    const { token, prefix, hash } = newApiTokenSecret();
    // A token acts for its creator (an admin here, who holds every permission).
    await server.db
      .insert(apiTokens)
      .values({ name: `weather feed ${scope}`, prefix, secretHash: hash, scope, createdById: people.admin.id });
    if (scope === 'read') readToken = token;
    else writeToken = token;
  }
  station = await seriesId(server.pool, 'wx-lowland');
  sys = await seriesId(server.pool, 'sys');
}, 120_000);
afterAll(() => server?.close());

describe('pushing a temperature forecast issue', () => {
  it('stores it in the station’s unit, converted once: 20 °C is 68 °F, 0 °C is 32 °F', async () => {
    const response = await push({ issuedAt: '2026-11-30T18:00:00Z', unit: 'degC', hours: hours(168, (k) => (k % 2 === 0 ? 20 : 0)) });
    expect(response.status, JSON.stringify(response.body)).toBe(201);
    expect(response.body).toMatchObject({ key: 'wx-lowland', hours: 168, unit: 'degF', converted: true, min: 32, max: 68 });
    const rows = await pushedRows();
    expect(rows).toHaveLength(168);
    // °F = °C × 9/5 + 32: 20 → 68, 0 → 32.
    expect(new Set(rows.map((r) => r.value))).toEqual(new Set([68, 32]));
  });

  it('keeps issues whole: the same issue time again is refused and the stored values stay', async () => {
    const again = await push({ issuedAt: '2026-11-30T18:00:00Z', unit: 'degF', hours: hours(168, () => 99) });
    expect(again.status).toBe(409);
    expect(again.body.detail).toMatch(/never overwritten/);
    const rows = await pushedRows();
    expect(rows.every((r) => r.value !== 99)).toBe(true);
  });

  it('refuses bad hours with pointers, load series, a read-only token and a viewer, storing nothing', async () => {
    const bad = await push({
      issuedAt: '2026-12-01T06:00:00Z',
      unit: 'degF',
      hours: [
        { ts: '2026-12-01T07:30:00Z', value: 40 },
        { ts: '2026-12-01T08:00:00Z', value: 400 },
        { ts: '2026-11-20T08:00:00Z', value: 40 },
      ],
    });
    expect(bad.status).toBe(400);
    expect(bad.body.errors.map((e: { pointer: string }) => e.pointer)).toEqual(['/hours/0/ts', '/hours/1/value', '/hours/2/ts']);
    expect(bad.body.errors[1].detail).toMatch(/outside plausible air temperatures.*Is the unit right/);
    const load = await request(server.url)
      .post('/api/series/sys/temperature-forecasts')
      .set('Authorization', `Bearer ${writeToken}`)
      .send({ issuedAt: '2026-12-01T06:00:00Z', unit: 'degF', hours: hours(2, () => 40) });
    expect(load.status).toBe(409);
    expect((await push({ issuedAt: '2026-12-01T06:00:00Z', unit: 'degF', hours: hours(2, () => 40) }, readToken)).status).toBe(403);
    const asViewer = await request(server.url)
      .post('/api/series/wx-lowland/temperature-forecasts')
      .set('Cookie', viewer.cookie)
      .set('X-CSRF-Token', viewer.csrf)
      .send({ issuedAt: '2026-12-01T06:00:00Z', unit: 'degF', hours: hours(2, () => 40) });
    expect(asViewer.status).toBe(403);
    const list = await request(server.url).get('/api/series/wx-lowland/temperature-forecasts').set('Cookie', viewer.cookie);
    // The demo's seven morning issues (06:00 local = 12:00 UTC, 24–30 Nov) and the one pushed above, newest first.
    expect(list.body.issues.map((i: { issuedAt: string }) => i.issuedAt).slice(0, 2)).toEqual([
      '2026-11-30T18:00:00.000Z',
      '2026-11-30T12:00:00.000Z',
    ]);
    expect(list.body.issues).toHaveLength(8);
  });
});

describe('the refit reads the latest issue made before it runs', () => {
  beforeAll(async () => {
    // Issue of 1 Dec 06:00 at a flat 50 °F, and one of 2 Dec 06:00 at 30 °F that only covers 100 hours.
    expect((await push({ issuedAt: '2026-12-01T06:00:00Z', unit: 'degF', hours: hours(168, () => 50) })).status).toBe(201);
    expect((await push({ issuedAt: '2026-12-02T06:00:00Z', unit: 'degF', hours: hours(100, () => 30) })).status).toBe(201);
  });

  it('uses the 30 Nov 18:00 issue before 1 Dec 06:00, the 1 Dec issue after it', async () => {
    const before = await readRefitInputs(server.pool, sys, new Date('2026-12-01T05:59:00Z'));
    expect(before.temperature.usable).toBe(true);
    if (!before.temperature.usable) return;
    expect(before.temperature.future).toHaveLength(168);
    // The 30 Nov issue alternates 68, 32 °F hour by hour from the first forecast hour.
    expect(Array.from(before.temperature.future.slice(0, 4))).toEqual([68, 32, 68, 32]);
    expect(before.temperature.forecastIssue?.description).toBe('forecast issued 2026-11-30 18:00 UTC (168 of 168 hours)');

    const after = await readRefitInputs(server.pool, sys, new Date('2026-12-01T06:00:00Z'));
    expect(after.temperature.usable && new Set(after.temperature.future)).toEqual(new Set([50]));
  });

  it('falls back, with the warning’s reason, when the latest issue leaves hours uncovered (168 − 100 = 68)', async () => {
    const inputs = await readRefitInputs(server.pool, sys, new Date('2026-12-02T07:00:00Z'));
    expect(inputs.temperature.usable).toBe(false);
    if (inputs.temperature.usable) return;
    expect(inputs.temperature.fallback).toBe(true);
    expect(inputs.temperature.reason).toBe(
      'the latest temperature forecast of Millrace Flats weather station (issued 2026-12-02 06:00 UTC) leaves 68 of the next 168 hours uncovered: fitted without temperature',
    );
  });

  it('a real refit now (3 Dec) falls back with the warning, and with a newer full issue names it on the model card', async () => {
    const startRun = async () => {
      const response = await request(server.url)
        .post('/api/refits')
        .set('Cookie', planner.cookie)
        .set('X-CSRF-Token', planner.csrf)
        .send({ scope: { kind: 'series', seriesIds: [sys] } });
      expect(response.status, JSON.stringify(response.body)).toBe(202);
      await waitForRun(server.pool, response.body.id);
    };
    // A fixed method, so the regression on degree-hours is part of the model whatever auto would pick.
    const settings = await request(server.url).get(`/api/series/${sys}/model`).set('Cookie', planner.cookie);
    const { seriesId: _s, temperatureSeries: _t, updatedAt: _u, updatedBy: _b, ...editable } = settings.body;
    const put = await request(server.url)
      .put(`/api/series/${sys}/model`)
      .set('Cookie', planner.cookie)
      .set('X-CSRF-Token', planner.csrf)
      .send({ ...editable, method: 'cmle', arOrder: 3 });
    expect(put.status, JSON.stringify(put.body)).toBe(200);
    await startRun();
    const fallback = await request(server.url).get(`/api/series/${sys}/fit`).set('Cookie', viewer.cookie);
    expect(fallback.body.diagnostics.warnings.map((w: { code: string }) => w.code)).toContain('temperature-fallback');

    expect((await push({ issuedAt: '2026-12-02T18:00:00Z', unit: 'degC', hours: hours(168, (k) => 5 + (k % 24) / 4) })).status).toBe(201);
    await startRun();
    const fit = await request(server.url).get(`/api/series/${sys}/fit`).set('Cookie', viewer.cookie);
    expect(fit.body.diagnostics.warnings.map((w: { code: string }) => w.code)).not.toContain('temperature-fallback');
    expect(fit.body.diagnostics.temperature).toEqual({
      used: true,
      reason: 'degree-hours from Millrace Flats weather station; forecast issued 2026-12-02 18:00 UTC (168 of 168 hours)',
      forecastIssuedAt: '2026-12-02T18:00:00.000Z',
    });

    // The overlay: three observed days before the origin, then the issue's 168 hours in the station's °F,
    // (5 + (k mod 24)/4) °C × 9/5 + 32: hour 0 → 41 °F, hour 4 → 6 °C = 42.8 °F.
    const assumed = await request(server.url).get(`/api/series/${sys}/assumed-temperatures`).set('Cookie', viewer.cookie);
    expect(assumed.status).toBe(200);
    expect(assumed.body).toMatchObject({ used: true, issuedAt: '2026-12-02T18:00:00.000Z', station: { key: 'wx-lowland', unit: 'degF' } });
    const observed = assumed.body.hours.filter((h: { source: string }) => h.source === 'observed');
    const forecast = assumed.body.hours.filter((h: { source: string }) => h.source === 'forecast');
    expect(observed).toHaveLength(72);
    expect(forecast).toHaveLength(168);
    expect(forecast[0]).toEqual({ ts: '2026-12-01T00:00:00.000Z', value: 41, source: 'forecast' });
    expect(forecast[4].value).toBeCloseTo(42.8, 10);
  }, 180_000);
});
