/**
 * The Overview's accuracy: per series MASE, MAPE and skill against seasonal naive over the stored
 * hours, the pooled skill of the network, and the series that miss most first; figures worked by hand.
 */
import { accuracyOverviewSchema } from '@loadwright/contracts';
import { scoreSeries } from '@loadwright/accuracy';
import request from 'supertest';
import { afterAll, beforeAll, expect, it } from 'vitest';
import { writeDraftVersion } from '../forecasts/support/draft-versions';
import { actuals, loadSeries } from '../misses/support';
import { createTokens } from '../series/support/tokens';
import { startTestServer, type TestServer } from '../support/server';

const hourMs = 3_600_000;
const origin = Date.parse('2026-10-05T00:00:00Z');
let server: TestServer;

beforeAll(async () => {
  server = await startTestServer({ worker: false });
});
afterAll(() => server.close());

/**
 * A series whose five weeks before the origin step up by 10 a week (110, 120, …, 150), so the MASE
 * scale Q = mean |y_t − y_{t−168}| = 10 and seasonal naive forecasts 150; then 24 hours at 160
 * forecast flat at `mean`.
 */
async function seriesForecastAt(key: string, mean: number): Promise<number> {
  const seriesId = await loadSeries(server.db, key);
  const history = Array.from({ length: 5 * 168 }, (_, i) => 110 + 10 * Math.floor(i / 168));
  await actuals(server.db, seriesId, new Date(origin - 5 * 168 * hourMs).toISOString(), [...history, ...Array<number>(24).fill(160)]);
  await writeDraftVersion(server.db, { seriesId, origin: new Date(origin), hours: 24, mean: () => mean });
  await scoreSeries(server.db, seriesId, { now: new Date(origin + 24 * hourMs) });
  return seriesId;
}

it('pools skill over scaled errors and lists the series with the highest MASE first', async () => {
  const close = await seriesForecastAt('close', 155); // |e| = 5: MASE 0.5, naive |e| 10, skill 1 − 5/10 = 0.5, MAPE 5/160 = 3.125 %
  const far = await seriesForecastAt('far', 140); // |e| = 20: MASE 2, skill 1 − 20/10 = −1, MAPE 12.5 %
  const token = (await createTokens(server.db)).read;
  const response = await request(server.url).get('/api/accuracy/overview').set('Authorization', `Bearer ${token}`);
  expect(response.status).toBe(200);
  const overview = accuracyOverviewSchema.parse(response.body);
  expect(overview.hours).toBe(48);
  expect(overview.seriesCount).toBe(2);
  // Pooled: 1 − (24·0.5 + 24·2) / (24·1 + 24·1) = 1 − 60/48 = −0.25 (Murphy 1988 on scaled errors, Hyndman & Koehler 2006).
  expect(overview.skill).toBeCloseTo(-0.25, 12);
  expect(overview.worst.map((s) => s.seriesId)).toEqual([far, close]);
  expect(overview.worst[0]).toMatchObject({ key: 'far', hours: 24 });
  expect(overview.worst[0]!.mase).toBeCloseTo(2, 12);
  expect(overview.worst[0]!.skill).toBeCloseTo(-1, 12);
  expect(overview.worst[0]!.mape).toBeCloseTo(12.5, 12);
  expect(overview.worst[1]!.mase).toBeCloseTo(0.5, 12);
  expect(overview.worst[1]!.skill).toBeCloseTo(0.5, 12);
  expect(overview.worst[1]!.mape).toBeCloseTo(3.125, 12);
  // Flat forecasts with a ±3.9 band miss 160 every hour.
  expect(overview.worst[1]!.coverage95).toBe(0);
  expect(overview.window).toEqual({
    from: new Date(origin + 24 * hourMs - 28 * 86_400_000).toISOString(),
    to: new Date(origin + 24 * hourMs).toISOString(),
    days: 28,
  });
});
