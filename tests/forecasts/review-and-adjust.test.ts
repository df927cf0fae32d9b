/**
 * Review of a series' forecast across the fall-back day of 2026 in America/Chicago, and the
 * adjustment layer: shift and scale with their order, removal, refusals, and the raw points untouched.
 */
import { forecastReviewSchema, forecastVersionDetailSchema, type ForecastVersion } from '@loadwright/contracts';
import { auditLog, forecastPoints } from '@loadwright/db';
import { asc, eq, inArray } from 'drizzle-orm';
import request from 'supertest';
import { afterAll, beforeAll, describe, expect, it } from 'vitest';
import { asBrowser, startForecastServer, type ForecastTestContext } from './support/forecast-server';
import { writeDraftVersion } from './support/draft-versions';

let t: ForecastTestContext;
let planner: ReturnType<typeof asBrowser>;
let approvedId: number;
let draftId: number;

/** Local midnight of Thursday 2026-10-29 in Chicago (CDT, UTC−5). The week holds the fall-back Sunday, 1 November. */
const draftOrigin = new Date('2026-10-29T05:00:00Z');
const approvedOrigin = new Date('2026-10-28T05:00:00Z');
/** Planted peaks (UTC instant → MW): 17:00 CDT on 30 Oct, the second 01:00 (CST) on 1 Nov, 17:00 CST on 2 Nov. */
const planted = new Map([
  ['2026-10-30T22:00:00.000Z', 150],
  ['2026-11-01T07:00:00.000Z', 200],
  ['2026-11-02T23:00:00.000Z', 160],
]);

beforeAll(async () => {
  t = await startForecastServer();
  planner = asBrowser(t.server.url, t.planner);
  const seriesId = t.seriesId('zone-north');
  approvedId = await writeDraftVersion(t.server.db, { seriesId, origin: approvedOrigin, mean: () => 90 });
  const approval = await planner.post(`/api/forecast-versions/${approvedId}/approve`);
  expect(approval.status).toBe(200);
  draftId = await writeDraftVersion(t.server.db, { seriesId, origin: draftOrigin, mean: (_i, ts) => planted.get(ts.toISOString()) ?? 100 });
});
afterAll(() => t.server.close());

const version = async (id: number): Promise<ForecastVersion> => {
  const response = await planner.get(`/api/forecast-versions/${id}`);
  expect(response.status).toBe(200);
  return forecastVersionDetailSchema.parse(response.body).version;
};
const pointAt = (v: ForecastVersion, iso: string) => v.points.find((p) => p.ts === new Date(iso).toISOString())!;

describe('GET /api/series/:id/forecast', () => {
  it('shows draft and approved with fit, points and bands', async () => {
    const response = await planner.get(`/api/series/${t.seriesId('zone-north')}/forecast`);
    expect(response.status).toBe(200);
    const review = forecastReviewSchema.parse(response.body);
    expect(review.series).toMatchObject({ key: 'zone-north', unit: 'MW', timeZone: 'America/Chicago', intervalMinutes: 60 });
    expect(review.draft).toMatchObject({
      id: draftId,
      state: 'draft',
      origin: draftOrigin.toISOString(),
      horizonHours: 168,
      end: '2026-11-05T05:00:00.000Z',
    });
    expect(review.approved).toMatchObject({ id: approvedId, state: 'approved' });
    expect(review.draft!.fit).toMatchObject({ method: 'yule_walker', arOrder: 2, maOrder: 0, aic: 2475, bic: 2490 });
    expect(review.draft!.points).toHaveLength(168);
    const first = review.draft!.points[0]!;
    expect(first.lower95).toBeLessThan(first.lower80);
    expect(first.upper80).toBeLessThan(first.upper95);
    expect(first.adjusted).toBeNull();
  });

  it('finds each local day’s peak in Chicago time, with 25 hours on the fall-back day', async () => {
    const review = forecastReviewSchema.parse((await planner.get(`/api/series/${t.seriesId('zone-north')}/forecast`)).body);
    const peaks = new Map(review.draft!.dailyPeaks.map((peak) => [peak.date, peak]));
    expect([...peaks.keys()]).toEqual(['2026-10-29', '2026-10-30', '2026-10-31', '2026-11-01', '2026-11-02', '2026-11-03', '2026-11-04']);
    expect(peaks.get('2026-10-30')).toMatchObject({ localTime: '17:00', utcOffset: '-05:00', value: 150, intervals: 24, complete: true });
    // The peak sits in the repeated hour: the second 01:00, already on standard time.
    expect(peaks.get('2026-11-01')).toMatchObject({
      ts: '2026-11-01T07:00:00.000Z',
      localTime: '01:00',
      utcOffset: '-06:00',
      value: 200,
      intervals: 25,
      complete: true,
    });
    expect(peaks.get('2026-11-02')).toMatchObject({ ts: '2026-11-02T23:00:00.000Z', localTime: '17:00', utcOffset: '-06:00', value: 160 });
    // The horizon ends at 23:00 CST on 4 November: that day is one hour short.
    expect(peaks.get('2026-11-04')).toMatchObject({ intervals: 23, complete: false });
  });

  it('brings the actuals of the window both versions span, read from the observations', async () => {
    const review = forecastReviewSchema.parse((await planner.get(`/api/series/${t.seriesId('zone-north')}/forecast`)).body);
    expect(review.actuals.from).toBe(approvedOrigin.toISOString());
    expect(review.actuals.to).toBe('2026-11-05T05:00:00.000Z');
    const { rows } = await t.server.pool.query<{ ts: Date; v: number }>(
      `select ts, coalesce(estimated, value) as v from observations where series_id = $1 and ts >= $2 and ts < $3 order by ts`,
      [t.seriesId('zone-north'), approvedOrigin, new Date('2026-11-05T05:00:00Z')],
    );
    expect(rows.length).toBeGreaterThan(150);
    expect(review.actuals.points.map((p) => [p.ts, p.value])).toEqual(rows.map((row) => [row.ts.toISOString(), row.v]));
    const fallBack = review.actuals.dailyPeaks.find((peak) => peak.date === '2026-11-01')!;
    expect(fallBack.intervals).toBe(
      rows.filter((row) => row.ts >= new Date('2026-11-01T05:00:00Z') && row.ts < new Date('2026-11-02T06:00:00Z')).length,
    );
  });

  it('compares draft with approved per interval, at the daily peaks and in energy', async () => {
    const review = forecastReviewSchema.parse((await planner.get(`/api/series/${t.seriesId('zone-north')}/forecast`)).body);
    const comparison = review.comparison!;
    // Common window: 29 Oct 05:00Z to 4 Nov 05:00Z, the approved week's end.
    expect(comparison.intervals).toHaveLength(144);
    expect(comparison.intervals[0]).toMatchObject({ ts: draftOrigin.toISOString(), draft: 100, approved: 90, difference: 10 });
    expect(comparison.intervals[0]!.differencePercent).toBeCloseTo(100 / 9, 10);
    const fallBack = comparison.dailyPeaks.find((day) => day.date === '2026-11-01')!;
    expect(fallBack).toMatchObject({ difference: 110 });
    // The approved week is flat, so it peaks at the day's first hour (00:00 CDT); the draft peaks at the
    // second 01:00 (CST), two real hours later.
    expect(fallBack.approved).toMatchObject({ localTime: '00:00', utcOffset: '-05:00' });
    expect(fallBack.peakShiftMinutes).toBe(120);
    const extra = 50 + 100 + 60; // the three planted peaks all fall inside the common window
    expect(comparison.energy).toMatchObject({ intervals: 144, draft: 144 * 100 + extra, approved: 144 * 90 });
    expect(comparison.energy.differencePercent).toBeCloseTo(((144 * 100 + extra - 144 * 90) / (144 * 90)) * 100, 10);
    // Days only one version has are listed without a difference.
    expect(comparison.dailyPeaks.find((day) => day.date === '2026-10-28')).toMatchObject({ draft: null, difference: null });
  });

  it('answers 404 for an unknown series and lets viewers and read tokens read', async () => {
    expect((await planner.get('/api/series/999999/forecast')).status).toBe(404);
    expect((await asBrowser(t.server.url, t.viewer).get(`/api/series/${t.seriesId('zone-north')}/forecast`)).status).toBe(200);
    const byToken = await request(t.server.url).get(`/api/forecast-versions/${draftId}`).set('Authorization', `Bearer ${t.readToken}`);
    expect(byToken.status).toBe(200);
  });
});

describe('version history', () => {
  it('pages newest first', async () => {
    const seriesId = t.seriesId('zone-north');
    const first = await planner.get(`/api/series/${seriesId}/forecast-versions?limit=1`);
    expect(first.status).toBe(200);
    expect(first.body.versions.map((v: { id: number }) => v.id)).toEqual([draftId]);
    expect(first.body.nextBefore).toBe(draftId);
    const second = await planner.get(`/api/series/${seriesId}/forecast-versions?limit=1&before=${draftId}`);
    expect(second.body.versions.map((v: { id: number; state: string }) => [v.id, v.state])).toEqual([[approvedId, 'approved']]);
    const approvedOnly = await planner.get(`/api/series/${seriesId}/forecast-versions?state=approved`);
    expect(approvedOnly.body).toMatchObject({ nextBefore: null });
    expect(approvedOnly.body.versions).toHaveLength(1);
  });
});

describe('adjustments', () => {
  let shiftId: number;
  const rawBefore = async () =>
    t.server.db.select().from(forecastPoints).where(eq(forecastPoints.versionId, draftId)).orderBy(asc(forecastPoints.ts));

  it('adds a shift and a later scale; the scale acts first, and bounds move and stretch', async () => {
    const raw = await rawBefore();
    const shift = await planner.post(`/api/forecast-versions/${draftId}/adjustments`, {
      from: '2026-11-02T00:00:00Z',
      to: '2026-11-02T02:00:00Z',
      kind: 'shift',
      amount: 10,
      reason: 'Quarry crusher restart',
    });
    expect(shift.status).toBe(201);
    expect(shift.body).toMatchObject({
      kind: 'shift',
      amount: 10,
      intervals: 2,
      reason: 'Quarry crusher restart',
      createdBy: { id: t.planner.userId },
    });
    shiftId = shift.body.id;
    // Offsets are accepted: 20:00 CDT on 1 Nov is 01:00Z on 2 Nov.
    const scale = await planner.post(`/api/forecast-versions/${draftId}/adjustments`, {
      from: '2026-11-01T20:00:00-05:00',
      to: '2026-11-02T03:00:00Z',
      kind: 'scale',
      amount: 1.5,
      reason: 'Cold snap on the way',
    });
    expect(scale.status).toBe(201);
    expect(scale.body.intervals).toBe(2);

    const v = await version(draftId);
    expect(v.adjustmentCount).toBe(2);
    expect(v.adjustments.map((a) => a.kind)).toEqual(['shift', 'scale']);
    const at0 = pointAt(v, '2026-11-02T00:00:00Z');
    const at1 = pointAt(v, '2026-11-02T01:00:00Z');
    const at2 = pointAt(v, '2026-11-02T02:00:00Z');
    expect(at0.adjusted!.mean).toBe(110);
    expect(at0.adjusted!.lower80).toBeCloseTo(at0.lower80 + 10, 10);
    // 100 × 1.5 + 10 = 160, not (100 + 10) × 1.5 = 165, although the shift came first.
    expect(at1.adjusted!.mean).toBeCloseTo(160, 10);
    expect(at1.adjusted!.upper95).toBeCloseTo(at1.upper95 * 1.5 + 10, 10);
    expect(at2.adjusted!.mean).toBeCloseTo(150, 10);
    expect(at2.adjusted!.lower95).toBeCloseTo(at2.lower95 * 1.5, 10);
    expect(pointAt(v, '2026-11-02T03:00:00Z').adjusted).toBeNull();
    // The model's own numbers are shown and stored unchanged.
    expect(at1.mean).toBe(100);
    expect(await rawBefore()).toEqual(raw);
  });

  it('uses adjusted means for daily peaks and for the comparison', async () => {
    const peak = await planner.post(`/api/forecast-versions/${draftId}/adjustments`, {
      from: '2026-11-03T15:00:00Z',
      to: '2026-11-03T16:00:00Z',
      kind: 'scale',
      amount: 3,
      reason: 'Big customer test run',
      // Tripling is beyond a plausible change (plausibleAdjustmentShare): the planner confirms it.
      confirmLargeChange: true,
    });
    expect(peak.status).toBe(201);
    const review = forecastReviewSchema.parse((await planner.get(`/api/series/${t.seriesId('zone-north')}/forecast`)).body);
    expect(review.draft!.dailyPeaks.find((p) => p.date === '2026-11-03')).toMatchObject({
      value: 300,
      localTime: '09:00',
      ts: '2026-11-03T15:00:00.000Z',
    });
    expect(review.comparison!.intervals.find((i) => i.ts === '2026-11-03T15:00:00.000Z')).toMatchObject({
      draft: 300,
      approved: 90,
      difference: 210,
    });
  });

  it('removes an adjustment while the version is a draft', async () => {
    const removed = await planner.delete(`/api/forecast-versions/${draftId}/adjustments/${shiftId}`);
    expect(removed.status).toBe(204);
    const v = await version(draftId);
    expect(pointAt(v, '2026-11-02T00:00:00Z').adjusted).toBeNull();
    expect(pointAt(v, '2026-11-02T01:00:00Z').adjusted!.mean).toBe(150);
    expect((await planner.delete(`/api/forecast-versions/${draftId}/adjustments/${shiftId}`)).status).toBe(404);
  });

  it('refuses a short reason, a period outside the horizon and a non-positive factor, with pointers', async () => {
    const short = await planner.post(`/api/forecast-versions/${draftId}/adjustments`, {
      from: '2026-11-02T00:00:00Z',
      to: '2026-11-02T02:00:00Z',
      kind: 'shift',
      amount: 5,
      reason: ' ok  ',
    });
    expect(short.status).toBe(400);
    expect(short.body.errors).toEqual([{ pointer: '/reason', detail: 'Give a reason of at least 5 characters' }]);
    const outside = await planner.post(`/api/forecast-versions/${draftId}/adjustments`, {
      from: '2026-12-20T00:00:00Z',
      to: '2026-12-21T00:00:00Z',
      kind: 'shift',
      amount: 5,
      reason: 'Far in the future',
    });
    expect(outside.status).toBe(400);
    expect(outside.body.errors[0].pointer).toBe('/from');
    const factor = await planner.post(`/api/forecast-versions/${draftId}/adjustments`, {
      from: '2026-11-02T00:00:00Z',
      to: '2026-11-02T02:00:00Z',
      kind: 'scale',
      amount: -1,
      reason: 'Negative factor',
    });
    expect(factor.status).toBe(400);
    expect(factor.body.errors[0].pointer).toBe('/amount');
  });

  it('refuses adjusting an approved version (409) and viewers (403)', async () => {
    const onApproved = await planner.post(`/api/forecast-versions/${approvedId}/adjustments`, {
      from: '2026-10-29T00:00:00Z',
      to: '2026-10-29T02:00:00Z',
      kind: 'shift',
      amount: 5,
      reason: 'Too late for this one',
    });
    expect(onApproved.status).toBe(409);
    expect(onApproved.body.type).toBe('/problems/conflict');
    const byViewer = await asBrowser(t.server.url, t.viewer).post(`/api/forecast-versions/${draftId}/adjustments`, {
      from: '2026-11-02T00:00:00Z',
      to: '2026-11-02T02:00:00Z',
      kind: 'shift',
      amount: 5,
      reason: 'Viewer trying',
    });
    expect(byViewer.status).toBe(403);
  });

  it('audits each adjustment and removal with who, what and why', async () => {
    const entries = await t.server.db
      .select()
      .from(auditLog)
      .where(inArray(auditLog.action, ['forecast.adjusted', 'forecast.adjustment_removed']))
      .orderBy(asc(auditLog.id));
    expect(entries.map((e) => e.action)).toEqual([
      'forecast.adjusted',
      'forecast.adjusted',
      'forecast.adjusted',
      'forecast.adjustment_removed',
    ]);
    expect(entries[0]).toMatchObject({ actorUserId: t.planner.userId, targetType: 'forecast_version', targetId: String(draftId) });
    expect(entries[0]!.detail).toMatchObject({
      kind: 'shift',
      amount: 10,
      reason: 'Quarry crusher restart',
      from: '2026-11-02T00:00:00.000Z',
    });
    expect(entries[0]!.ip).toBeTruthy();
  });
});
