/**
 * Detection against a seeded forecast: each rule kind fires exactly when it should (k−1 hours, at the
 * threshold, gaps, the 25-hour fall-back day), judges the version in force, and opens or extends one
 * event per rule and series without ever duplicating one.
 */
import { eq } from 'drizzle-orm';
import { missEvents, organisation } from '@loadwright/db';
import { detectMisses } from '@loadwright/misses';
import { afterAll, beforeAll, describe, expect, it } from 'vitest';
import { writeDraftVersion } from '../forecasts/support/draft-versions';
import { startTestServer, type TestServer } from '../support/server';
import { actuals, approvedForecast, eventsOf, loadSeries, seriesRule } from './support';

let server: TestServer;

beforeAll(async () => {
  server = await startTestServer({ worker: false });
});
afterAll(() => server.close());

// 2026-10-31 00:00 CDT is 05:00Z. The 95 % band is [90, 110] around a flat 100.
const oct31 = '2026-10-31T05:00:00Z';
const hourAfter = (iso: string, h: number) => new Date(Date.parse(iso) + h * 3_600_000).toISOString();
const detect = (seriesId: number, now: string) => detectMisses(server.db, seriesId, new Date(now));

describe('outside the band', () => {
  let seriesId: number;
  let approvedId: number;

  beforeAll(async () => {
    seriesId = await loadSeries(server.db, 'band');
    approvedId = await approvedForecast(server.db, seriesId, oct31, 96);
    // A newer draft far off the actuals: the approved version stays in force.
    await writeDraftVersion(server.db, { seriesId, origin: new Date(hourAfter(oct31, 6)), hours: 90, mean: () => 200 });
    await seriesRule(server.db, seriesId, { kind: 'outside_band', hours: 3, bandLevel: 95 });
    await actuals(server.db, seriesId, oct31, [...Array(10).fill(100), 125, 125]);
  });

  it('stays quiet for k−1 hours outside the band', async () => {
    await detect(seriesId, hourAfter(oct31, 13));
    expect(await eventsOf(server.db, seriesId)).toEqual([]);
  });

  it('opens one event at the k-th hour with its evidence, judged against the approved version', async () => {
    await actuals(server.db, seriesId, hourAfter(oct31, 12), [125]);
    const outcome = await detect(seriesId, hourAfter(oct31, 14));
    expect(outcome.opened).toHaveLength(1);
    const [event] = await eventsOf(server.db, seriesId);
    expect(event).toMatchObject({ state: 'open', severity: 'high', versionId: approvedId });
    expect(event!.periodStart.toISOString()).toBe(new Date(hourAfter(oct31, 10)).toISOString());
    expect(event!.periodEnd.toISOString()).toBe(new Date(hourAfter(oct31, 13)).toISOString());
    const detail = event!.detail as {
      hours: { actual: number; forecast: number; lower: number; upper: number; error: number; versionId: number }[];
    };
    expect(detail.hours).toHaveLength(3);
    expect(detail.hours[0]).toMatchObject({ actual: 125, forecast: 100, error: 25, versionId: approvedId });
    expect(detail.hours[0]!.lower).toBeCloseTo(90, 9);
    expect(detail.hours[0]!.upper).toBeCloseTo(110, 9);
  });

  it('adds nothing when the same actuals are judged again', async () => {
    const outcome = await detect(seriesId, hourAfter(oct31, 15));
    expect(outcome.opened).toEqual([]);
    expect(await eventsOf(server.db, seriesId)).toHaveLength(1);
  });

  it('extends the open event as the miss goes on, and folds a later run into it while it is open', async () => {
    const [before] = await eventsOf(server.db, seriesId);
    await actuals(server.db, seriesId, hourAfter(oct31, 13), [125, 100, 100, 100, 100, 100, 100, 130, 130, 130]);
    await detect(seriesId, hourAfter(oct31, 24));
    const events = await eventsOf(server.db, seriesId);
    expect(events).toHaveLength(1);
    expect(events[0]!.id).toBe(before!.id);
    expect(events[0]!.periodEnd.toISOString()).toBe(new Date(hourAfter(oct31, 23)).toISOString());
    expect((events[0]!.detail as { hours: unknown[] }).hours).toHaveLength(7);
  });

  it('opens a new event for a run after the open one was acknowledged, and leaves an actual on the bound alone', async () => {
    const [first] = await eventsOf(server.db, seriesId);
    await server.db.update(missEvents).set({ state: 'acknowledged', acknowledgedAt: new Date() }).where(eq(missEvents.id, first!.id));
    await actuals(server.db, seriesId, hourAfter(oct31, 23), [100, 100, 100, 100, 100, 100, 100, 80, 80, 80, 100, 110, 110, 110]);
    await detect(seriesId, hourAfter(oct31, 40));
    await detect(seriesId, hourAfter(oct31, 41));
    const events = await eventsOf(server.db, seriesId);
    expect(events.map((e) => e.state)).toEqual(['acknowledged', 'open']);
    expect(events[1]!.periodStart.toISOString()).toBe(new Date(hourAfter(oct31, 30)).toISOString());
    expect(events[1]!.periodEnd.toISOString()).toBe(new Date(hourAfter(oct31, 33)).toISOString());
  });
});

describe('the other kinds', () => {
  it('error over threshold: two hours over 10 % fire with k = 2, one does not', async () => {
    const seriesId = await loadSeries(server.db, 'ape');
    await approvedForecast(server.db, seriesId, oct31, 48);
    await seriesRule(server.db, seriesId, { kind: 'error_over_threshold', hours: 2, threshold: 10, floorKw: 50 });
    // |89 − 100| / 89 = 12.4 %; |95 − 100| / 95 = 5.3 %.
    await actuals(server.db, seriesId, oct31, [100, 89, 95, 89]);
    await detect(seriesId, hourAfter(oct31, 6));
    expect(await eventsOf(server.db, seriesId)).toEqual([]);
    await actuals(server.db, seriesId, hourAfter(oct31, 4), [89]);
    await detect(seriesId, hourAfter(oct31, 6));
    expect(await eventsOf(server.db, seriesId)).toHaveLength(1);
  });

  it('daily peak missed on the 25-hour fall-back day: judged only once all 25 hours are in', async () => {
    const seriesId = await loadSeries(server.db, 'peak');
    // 2026-11-01 runs from 05:00Z to 06:00Z next day. Forecast peak 150 at 18:00 CST (00:00Z on 11-02).
    const nov1 = '2026-11-01T05:00:00Z';
    const peakAt = Date.parse('2026-11-02T00:00:00Z');
    await approvedForecast(server.db, seriesId, nov1, 48, (_, ts) => (ts.getTime() === peakAt ? 150 : 100));
    await seriesRule(server.db, seriesId, { kind: 'daily_peak_missed', threshold: 5, peakHourTolerance: 2, floorKw: 50 });
    // Actual peak 170 at the same hour: |150 − 170| / 170 = 11.8 % off.
    const day = Array.from({ length: 25 }, (_, i) => (Date.parse(nov1) + i * 3_600_000 === peakAt ? 170 : 100));
    await actuals(server.db, seriesId, nov1, day.slice(0, 24));
    await detect(seriesId, '2026-11-02T12:00:00Z');
    expect(await eventsOf(server.db, seriesId)).toEqual([]);
    await actuals(server.db, seriesId, hourAfter(nov1, 24), day.slice(24));
    await detect(seriesId, '2026-11-02T12:00:00Z');
    const [event] = await eventsOf(server.db, seriesId);
    expect(event!.periodEnd.getTime() - event!.periodStart.getTime()).toBe(25 * 3_600_000);
    expect((event!.detail as { summary: string }).summary).toBe(
      'Daily peak of 2026-11-01 missed: peak 170.0 kW against 150.0 kW forecast (11.8 % off).',
    );
  });

  it('creeping bias: four hours all +1 give a tracking signal of exactly 4 (quiet); the fifth fires', async () => {
    const seriesId = await loadSeries(server.db, 'bias');
    await approvedForecast(server.db, seriesId, oct31, 24);
    await seriesRule(server.db, seriesId, { kind: 'creeping_bias', hours: 1, threshold: 4 });
    await actuals(server.db, seriesId, oct31, [101, 101, 101, 101]);
    await detect(seriesId, hourAfter(oct31, 5));
    expect(await eventsOf(server.db, seriesId)).toEqual([]);
    await actuals(server.db, seriesId, hourAfter(oct31, 4), [101]);
    await detect(seriesId, hourAfter(oct31, 6));
    expect(await eventsOf(server.db, seriesId)).toHaveLength(1);
  });

  it('actuals late: quiet at exactly six hours, fires after, then extends the same event', async () => {
    const seriesId = await loadSeries(server.db, 'late');
    await seriesRule(server.db, seriesId, { kind: 'actuals_late', threshold: 6 });
    await actuals(server.db, seriesId, '2026-10-31T10:00:00Z', [100]); // covers 10:00–11:00Z
    await detect(seriesId, '2026-10-31T17:00:00Z');
    expect(await eventsOf(server.db, seriesId)).toEqual([]);
    await detect(seriesId, '2026-10-31T17:30:00Z');
    await detect(seriesId, '2026-10-31T19:30:00Z');
    const events = await eventsOf(server.db, seriesId);
    expect(events).toHaveLength(1);
    expect(events[0]!.periodEnd.toISOString()).toBe('2026-10-31T19:00:00.000Z');
  });

  it('no forecast by the deadline: a version from the morning before counts, one from two days before does not', async () => {
    await server.db
      .insert(organisation)
      .values({ name: 'Test co-op', timeZone: 'America/Chicago', forecastDeadlineMinute: 420 })
      .onConflictDoUpdate({ target: organisation.singleton, set: { timeZone: 'America/Chicago', forecastDeadlineMinute: 420 } });
    const seriesId = await loadSeries(server.db, 'deadline');
    await writeDraftVersion(server.db, { seriesId, origin: new Date('2026-10-31T07:00:00Z'), issuedAt: new Date('2026-10-31T07:00:00Z') });
    await seriesRule(server.db, seriesId, { kind: 'forecast_late' });
    // 07:00 CDT on 10-31 is 12:00Z: the version (07:00Z, 02:00 CDT) is five hours before it.
    await detect(seriesId, '2026-10-31T11:59:00Z');
    await detect(seriesId, '2026-10-31T12:30:00Z');
    expect(await eventsOf(server.db, seriesId)).toEqual([]);
    // 07:00 CST on 11-01 (the fall-back day) is 13:00Z; the version is 30 hours older.
    await detect(seriesId, '2026-11-01T12:59:00Z');
    expect(await eventsOf(server.db, seriesId)).toEqual([]);
    await detect(seriesId, '2026-11-01T13:30:00Z');
    await detect(seriesId, '2026-11-01T14:30:00Z');
    const events = await eventsOf(server.db, seriesId);
    expect(events).toHaveLength(1);
    expect(events[0]!.periodStart.toISOString()).toBe('2026-11-01T13:00:00.000Z');
    expect(events[0]!.versionId).toBeNull();
  });

  it('too many estimated hours: four in a day are quiet, five fire', async () => {
    const seriesId = await loadSeries(server.db, 'estimates');
    await seriesRule(server.db, seriesId, { kind: 'estimated_hours', threshold: 4 });
    await actuals(server.db, seriesId, oct31, Array(12).fill(100));
    await actuals(server.db, seriesId, hourAfter(oct31, 2), [99, 99, 99, 99], true);
    await detect(seriesId, hourAfter(oct31, 13));
    expect(await eventsOf(server.db, seriesId)).toEqual([]);
    await actuals(server.db, seriesId, hourAfter(oct31, 8), [99], true);
    await detect(seriesId, hourAfter(oct31, 13));
    expect(await eventsOf(server.db, seriesId)).toHaveLength(1);
  });
});
