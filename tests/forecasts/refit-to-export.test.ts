/**
 * The refit's own write path feeding review, adjustment, approval and export: a draft written by the
 * real refit of a demo zone (fit, diagnostics, forecast, one-transaction write), no hand-made rows.
 */
import { forecastReviewSchema } from '@loadwright/contracts';
import { parse } from 'csv-parse/sync';
import request from 'supertest';
import { afterAll, beforeAll, describe, expect, it } from 'vitest';
import { refitSeries } from '@loadwright/refits';
import { startRefitRun } from '@loadwright/refits';
import { asBrowser, startForecastServer, type ForecastTestContext } from './support/forecast-server';

let t: ForecastTestContext;
let planner: ReturnType<typeof asBrowser>;
let seriesId: number;

/** Runs the refit of one series now, in this process, exactly as a queued job would; returns the draft's id. */
async function refitNow(id: number): Promise<number> {
  const run = await startRefitRun(t.server.pool, async () => {}, {
    trigger: 'manual',
    scope: { kind: 'series', seriesIds: [id] },
    requestedById: null,
  });
  const result = await refitSeries(t.server.pool, run!.runId, id, { retryCount: 0, retryLimit: 0 });
  if (!result.written) throw new Error(`refit did not write: ${JSON.stringify(result)}`);
  return result.versionId;
}

/** The local calendar date of an instant in a zone, computed apart from the API's own code. */
const localDate = (iso: string, timeZone: string) =>
  new Intl.DateTimeFormat('en-CA', { timeZone, year: 'numeric', month: '2-digit', day: '2-digit' }).format(new Date(iso));

beforeAll(async () => {
  t = await startForecastServer();
  planner = asBrowser(t.server.url, t.planner);
  seriesId = t.seriesId('zone-south');
}, 120_000);
afterAll(() => t.server.close());

describe('a refit draft through review, approval and export', () => {
  let firstDraft: number;

  it('reviews the refit draft with its fit and local daily peaks', async () => {
    firstDraft = await refitNow(seriesId);
    const review = forecastReviewSchema.parse((await planner.get(`/api/series/${seriesId}/forecast`)).body);
    expect(review.draft).toMatchObject({ id: firstDraft, state: 'draft', horizonHours: 168 });
    expect(review.draft!.points).toHaveLength(168);
    expect(review.draft!.fit.observationCount).toBeGreaterThan(1000);
    expect(review.approved).toBeNull();
    // The forecast starts after the last reading, so there are no actuals for it yet.
    expect(review.actuals.points).toHaveLength(0);
    for (const peak of review.draft!.dailyPeaks) {
      const sameDay = review.draft!.points.filter((point) => localDate(point.ts, 'America/Chicago') === peak.date);
      expect(peak.intervals).toBe(sameDay.length);
      expect(peak.value).toBe(Math.max(...sameDay.map((point) => point.mean)));
      expect(localDate(peak.ts, 'America/Chicago')).toBe(peak.date);
    }
  }, 120_000);

  it('adjusts, approves and exports the adjusted numbers', async () => {
    const review = forecastReviewSchema.parse((await planner.get(`/api/series/${seriesId}/forecast`)).body);
    const points = review.draft!.points;
    const adjustment = await planner.post(`/api/forecast-versions/${firstDraft}/adjustments`, {
      from: points[0]!.ts,
      to: points[3]!.ts,
      kind: 'shift',
      amount: 5,
      reason: 'Irrigation pumps start early',
    });
    expect(adjustment.status).toBe(201);
    expect((await planner.post(`/api/forecast-versions/${firstDraft}/approve`)).status).toBe(200);

    const csv = await request(t.server.url)
      .get(`/api/exports/forecasts.csv?series=${seriesId}`)
      .set('Authorization', `Bearer ${t.readToken}`)
      .buffer(true);
    const rows: Record<string, string>[] = parse(csv.text, { columns: true });
    expect(rows).toHaveLength(168);
    rows.slice(0, 3).forEach((row, i) => {
      expect(row.adjusted).toBe('true');
      expect(Number(row.mean)).toBeCloseTo(points[i]!.mean + 5, 3);
    });
    expect(rows[3]).toMatchObject({ adjusted: 'false' });
    expect(Number(rows[3]!.mean)).toBeCloseTo(points[3]!.mean, 3);
  });

  it('compares the next refit draft with the approved, adjusted version', async () => {
    const secondDraft = await refitNow(seriesId);
    const review = forecastReviewSchema.parse((await planner.get(`/api/series/${seriesId}/forecast`)).body);
    expect(review.draft!.id).toBe(secondDraft);
    expect(review.approved!.id).toBe(firstDraft);
    const comparison = review.comparison!;
    expect(comparison.intervals).toHaveLength(168);
    // The approved side counts with its shift: +5 over its first three hours, the model's mean after.
    const draftPoints = review.draft!.points;
    const approvedPoints = review.approved!.points;
    comparison.intervals.forEach((interval, i) => {
      expect(interval.ts).toBe(draftPoints[i]!.ts);
      expect(interval.approved).toBeCloseTo(approvedPoints[i]!.mean + (i < 3 ? 5 : 0), 9);
      expect(interval.difference).toBeCloseTo(draftPoints[i]!.mean - approvedPoints[i]!.mean - (i < 3 ? 5 : 0), 9);
    });
    const modelEnergy = draftPoints.reduce((sum, p, i) => sum + p.mean - approvedPoints[i]!.mean, 0);
    expect(comparison.energy.difference).toBeCloseTo(modelEnergy - 15, 6);
  }, 120_000);
});
