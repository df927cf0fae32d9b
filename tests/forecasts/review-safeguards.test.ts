/**
 * Review that cannot mislead: drafts whose hours have mostly passed are flagged in the approval
 * preview, left out of group approvals unless the planner includes them, and marked in the exports;
 * adjustments never take the load below zero and ask for confirmation beyond a plausible change.
 */
import { approvalPreviewSchema, forecastExportSchema, plausibleAdjustmentShare, staleAfterPassedShare } from '@loadwright/contracts';
import { forecastAdjustments, forecastVersions } from '@loadwright/db';
import { eq, inArray } from 'drizzle-orm';
import request from 'supertest';
import { afterAll, beforeAll, describe, expect, it } from 'vitest';
import { asBrowser, startForecastServer, type ForecastTestContext } from './support/forecast-server';
import { writeDraftVersion } from './support/draft-versions';

const hourMs = 3_600_000;
let t: ForecastTestContext;
let planner: ReturnType<typeof asBrowser>;

beforeAll(async () => {
  t = await startForecastServer();
  planner = asBrowser(t.server.url, t.planner);
}, 120_000);
afterAll(() => t.server.close());

/** States of some versions, by id. */
async function statesOf(ids: number[]): Promise<Map<number, string>> {
  const rows = await t.server.db
    .select({ id: forecastVersions.id, state: forecastVersions.state })
    .from(forecastVersions)
    .where(inArray(forecastVersions.id, ids));
  return new Map(rows.map((row) => [row.id, row.state]));
}

describe('stale drafts', () => {
  let staleSeries: number;
  let freshSeries: number;
  let stale: number;
  let fresh: number;

  beforeAll(async () => {
    staleSeries = t.seriesId('fdr-n1');
    freshSeries = t.seriesId('fdr-n2');
    // 150 of 168 hours behind us: 150 / 168 = 89 % passed, more than the stale share of 50 %.
    stale = await writeDraftVersion(t.server.db, { seriesId: staleSeries, origin: new Date(Date.now() - 150 * hourMs) });
    // Starts an hour from now: nothing has passed.
    fresh = await writeDraftVersion(t.server.db, { seriesId: freshSeries, origin: new Date(Date.now() + hourMs) });
  });

  it('flags the stale draft in the preview and leaves it out of the ids to approve', async () => {
    expect(staleAfterPassedShare).toBe(0.5);
    const response = await planner.post('/api/forecast-approvals/preview', { seriesIds: [staleSeries, freshSeries] });
    expect(response.status).toBe(200);
    const preview = approvalPreviewSchema.parse(response.body);
    expect(preview.versionIds).toEqual([fresh]);
    expect(preview.staleVersionIds).toEqual([stale]);
    const byVersion = new Map(preview.items.map((item) => [item.draft!.versionId, item.draft!]));
    // 168 − 150 = 18 hours ahead when written, so 17 whole hours a moment later.
    expect(byVersion.get(stale)).toMatchObject({ stale: true, hoursAhead: 17 });
    expect(byVersion.get(fresh)).toMatchObject({ stale: false, hoursAhead: 168 });

    const included = await planner.post('/api/forecast-approvals/preview', { seriesIds: [staleSeries, freshSeries], includeStale: true });
    expect(approvalPreviewSchema.parse(included.body).versionIds).toEqual([stale, fresh]);
  });

  it('refuses a group approval holding a stale draft, approving nothing, unless the planner includes it', async () => {
    const refused = await planner.post('/api/forecast-approvals', { versionIds: [fresh, stale] });
    expect(refused.status).toBe(409);
    // 17 whole hours ahead, so 168 − 17 = 151 counted as behind (a started hour is no longer ahead).
    expect(refused.body.errors).toEqual([{ pointer: '/versionIds/1', detail: expect.stringContaining('151 of its 168 hours behind it') }]);
    expect(await statesOf([fresh, stale])).toEqual(
      new Map([
        [fresh, 'draft'],
        [stale, 'draft'],
      ]),
    );

    const approved = await planner.post('/api/forecast-approvals', { versionIds: [fresh, stale], includeStale: true });
    expect(approved.status).toBe(200);
    expect(await statesOf([fresh, stale])).toEqual(
      new Map([
        [fresh, 'approved'],
        [stale, 'approved'],
      ]),
    );
  });

  it('marks the stale version in both exports', async () => {
    const json = await request(t.server.url)
      .get(`/api/exports/forecasts?series=${staleSeries},${freshSeries}`)
      .set('Authorization', `Bearer ${t.readToken}`);
    expect(json.status).toBe(200);
    const body = forecastExportSchema.parse(json.body);
    expect(body.series.map((entry) => [entry.versionId, entry.stale, entry.hoursAhead])).toEqual([
      [stale, true, 17],
      [fresh, false, 168],
    ]);

    const csv = await request(t.server.url)
      .get(`/api/exports/forecasts.csv?series=${staleSeries},${freshSeries}`)
      .set('Authorization', `Bearer ${t.readToken}`);
    const [header, ...rows] = csv.text.trim().split('\r\n');
    const columns = header!.split(',');
    expect(columns.at(-1)).toBe('stale');
    const staleByVersion = new Map(rows.map((row) => row.split(',')).map((cells) => [Number(cells[5]), cells.at(-1)]));
    expect(staleByVersion).toEqual(
      new Map([
        [stale, 'true'],
        [fresh, 'false'],
      ]),
    );
  });
});

describe('adjustment limits', () => {
  let seriesId: number;
  let draft: number;
  let origin: Date;
  const adjustmentCount = async () =>
    (await t.server.db.select().from(forecastAdjustments).where(eq(forecastAdjustments.versionId, draft))).length;
  const adjust = (amount: number, kind: 'shift' | 'scale' = 'shift', extra: object = {}) =>
    planner.post(`/api/forecast-versions/${draft}/adjustments`, {
      from: origin.toISOString(),
      to: new Date(origin.getTime() + 4 * hourMs).toISOString(),
      kind,
      amount,
      reason: 'Planned outage on the feeder',
      ...extra,
    });

  beforeAll(async () => {
    seriesId = t.seriesId('fdr-n3');
    origin = new Date(Math.ceil(Date.now() / hourMs) * hourMs);
    // A flat model mean of 100 kW.
    draft = await writeDraftVersion(t.server.db, { seriesId, origin });
  });

  it('refuses a shift that takes the load below zero and stores nothing', async () => {
    const response = await adjust(-9000);
    expect(response.status).toBe(400);
    // 100 − 9,000 = −8,900.
    expect(response.body.errors).toEqual([{ pointer: '/amount', detail: expect.stringContaining('below zero (to -8,900') }]);
    expect(await adjustmentCount()).toBe(0);
  });

  it('asks for confirmation beyond a plausible change, and accepts it confirmed', async () => {
    expect(plausibleAdjustmentShare).toBe(0.5);
    // −60 on 100 is a 60 % change: more than 50 %.
    const unconfirmed = await adjust(-60);
    expect(unconfirmed.status).toBe(400);
    expect(unconfirmed.body.errors).toEqual([{ pointer: '/confirmLargeChange', detail: 'Confirm a change of up to 60 % of the forecast' }]);
    // A scale of 0.4 is the same 60 % change.
    expect((await adjust(0.4, 'scale')).body.errors[0].pointer).toBe('/confirmLargeChange');
    expect(await adjustmentCount()).toBe(0);

    const confirmed = await adjust(-60, 'shift', { confirmLargeChange: true });
    expect(confirmed.status).toBe(201);
    expect(await adjustmentCount()).toBe(1);
  });

  it('measures a change against the numbers already adjusted', async () => {
    // 100 − 60 = 40 now; a further −15 is 15 / 40 = 37.5 %, plausible.
    expect((await adjust(-15)).status).toBe(201);
    const further = await adjust(-20);
    // 40 − 15 = 25; −20 on 25 is 80 %.
    expect(further.status).toBe(400);
    expect(further.body.errors[0].detail).toBe('Confirm a change of up to 80 % of the forecast');
    // 25 − 30 = −5 is below zero even when confirmed.
    const belowZero = await adjust(-30, 'shift', { confirmLargeChange: true });
    expect(belowZero.status).toBe(400);
    expect(belowZero.body.errors[0].pointer).toBe('/amount');
    expect(await adjustmentCount()).toBe(2);
  });

  it('describes refused fields in sentences, not in the validator’s words', async () => {
    const response = await adjust(Number.NaN);
    const typed = await planner.post(`/api/forecast-versions/${draft}/adjustments`, {
      from: 'soon',
      kind: 'stretch',
      amount: 'ten',
      reason: 'Planned outage',
    });
    expect(response.status).toBe(400);
    expect(typed.status).toBe(400);
    const details = Object.fromEntries(
      (typed.body.errors as { pointer: string; detail: string }[]).map((error) => [error.pointer, error.detail]),
    );
    expect(details).toEqual({
      '/from': 'Write the time as ISO 8601, e.g. 2026-03-01T06:00:00Z',
      '/to': 'Give a value: this field is required',
      '/kind': 'Choose one of "shift", "scale"',
      '/amount': 'Give a number',
    });
  });

  it('names the adjusted version and its series in the audit log, not by bare ids', async () => {
    const audit = await asBrowser(t.server.url, t.admin).get('/api/audit?action=forecast.adjusted');
    expect(audit.status).toBe(200);
    const entry = (audit.body.entries as { targetId: string; targetName: string | null }[]).find((e) => e.targetId === String(draft));
    expect(entry?.targetName).toBe(`version ${draft} of N3 Bramblecote Lane`);
  });

  it('keeps a series that runs negative by itself adjustable below zero', async () => {
    // A feeder exporting solar at noon: the model says −10 kW.
    const exporting = await writeDraftVersion(t.server.db, { seriesId: t.seriesId('fdr-n4'), origin, mean: () => -10 });
    const response = await planner.post(`/api/forecast-versions/${exporting}/adjustments`, {
      from: origin.toISOString(),
      to: new Date(origin.getTime() + 2 * hourMs).toISOString(),
      kind: 'shift',
      amount: -2,
      reason: 'More rooftop solar connected',
    });
    expect(response.status).toBe(201);
  });
});

describe('the review answer kept between requests', () => {
  it('answers 304 while nothing changed, and a new review after an adjustment, a reading or an approval', async () => {
    const seriesId = t.seriesId('fdr-s1');
    const origin = new Date(Math.floor(Date.now() / hourMs) * hourMs - 2 * hourMs);
    const draft = await writeDraftVersion(t.server.db, { seriesId, origin });
    const path = `/api/series/${seriesId}/forecast`;
    const read = (etag?: string) => {
      const call = planner.get(path);
      return etag ? call.set('If-None-Match', etag) : call;
    };

    const first = await read();
    expect(first.status).toBe(200);
    const etag = first.headers['etag'] as string;
    expect(etag).toMatch(/^"[\w-]+"$/);
    expect(first.headers['cache-control']).toBe('private, no-cache');
    expect((await read(etag)).status).toBe(304);

    // An adjustment changes the draft's numbers: a new review with the adjusted mean (100 + 10 = 110).
    expect(
      (
        await planner.post(`/api/forecast-versions/${draft}/adjustments`, {
          from: origin.toISOString(),
          to: new Date(origin.getTime() + hourMs).toISOString(),
          kind: 'shift',
          amount: 10,
          reason: 'Feeder transfer from fdr-s2',
        })
      ).status,
    ).toBe(201);
    const adjusted = await read(etag);
    expect(adjusted.status).toBe(200);
    expect(adjusted.body.draft.points[0].adjusted.mean).toBe(110);
    const etagAdjusted = adjusted.headers['etag'] as string;
    expect(etagAdjusted).not.toBe(etag);

    // A reading arriving inside the draft's window changes the actuals.
    await t.server.pool.query('insert into observations (series_id, ts, value) values ($1, $2, 97.5)', [seriesId, origin]);
    const withReading = await read(etagAdjusted);
    expect(withReading.status).toBe(200);
    expect(withReading.body.actuals.points).toEqual([{ ts: origin.toISOString(), value: 97.5, estimated: false }]);
    // A corrected reading (same instant, next revision) changes it again.
    await t.server.pool.query('update observations set value = 98.5, revision = revision + 1 where series_id = $1 and ts = $2', [
      seriesId,
      origin,
    ]);
    const corrected = await read(withReading.headers['etag'] as string);
    expect(corrected.status).toBe(200);
    expect(corrected.body.actuals.points[0].value).toBe(98.5);

    // Approval moves the draft to approved.
    expect((await planner.post(`/api/forecast-versions/${draft}/approve`)).status).toBe(200);
    const approved = await read(corrected.headers['etag'] as string);
    expect(approved.status).toBe(200);
    expect(approved.body.draft).toBeNull();
    expect(approved.body.approved.id).toBe(draft);
    expect((await read(approved.headers['etag'] as string)).status).toBe(304);
  });

  it('sends the review gzip-compressed to clients that accept it, identical once decoded', async () => {
    const path = `/api/series/${t.seriesId('fdr-s1')}/forecast`;
    const plain = await planner.get(path).set('Accept-Encoding', 'identity');
    const zipped = await planner.get(path).set('Accept-Encoding', 'gzip');
    expect(plain.headers['content-encoding']).toBeUndefined();
    expect(zipped.headers['content-encoding']).toBe('gzip');
    expect(zipped.body).toEqual(plain.body);
  });
});
