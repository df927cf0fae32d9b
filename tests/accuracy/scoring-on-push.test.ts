/**
 * Scoring runs as actuals arrive: a push through the API adds a scoring job in the same transaction,
 * the worker scores every version that forecast those hours (approved and draft alike), and the
 * series' accuracy is served with the figures worked by hand below. Scoring again writes the same
 * rows; a revised actual is scored again.
 */
import { accuracyOverviewSchema, seriesAccuracySchema } from '@loadwright/contracts';
import { forecastHourScores } from '@loadwright/db';
import { scoreAccuracyHourlyQueue, scoreSeries, scoringCron } from '@loadwright/accuracy';
import { asc, eq } from 'drizzle-orm';
import request from 'supertest';
import { afterAll, beforeAll, expect, it } from 'vitest';
import { writeDraftVersion } from '../forecasts/support/draft-versions';
import { actuals, approvedForecast, loadSeries, seFor10 } from '../misses/support';
import { createTokens, type Tokens } from '../series/support/tokens';
import { startTestServer, type TestServer } from '../support/server';

const hourMs = 3_600_000;
let server: TestServer;
let tokens: Tokens;

beforeAll(async () => {
  server = await startTestServer();
  tokens = await createTokens(server.db);
});
afterAll(() => server.close());

const scoresOf = (versionId: number) =>
  server.db.select().from(forecastHourScores).where(eq(forecastHourScores.versionId, versionId)).orderBy(asc(forecastHourScores.ts));

it('scores the approved and the draft version of pushed hours without anyone asking, and serves the figures', async () => {
  const seriesId = await loadSeries(server.db, 'scored');
  const hour = Math.floor(Date.now() / hourMs) * hourMs;
  // Approved: flat 100 with a 95 % band of ±10, from 48 hours ago for 96 hours.
  const approved = await approvedForecast(server.db, seriesId, new Date(hour - 48 * hourMs).toISOString(), 96);
  // Draft: flat 110, same band width, from 24 hours ago for 72 hours.
  const draft = await writeDraftVersion(server.db, {
    seriesId,
    origin: new Date(hour - 24 * hourMs),
    hours: 72,
    mean: () => 110,
    stdError: () => seFor10,
  });
  const pushed = [
    [-30, 100],
    [-29, 150],
    [-28, 95],
    [-27, 105],
    [-3, 119],
    [-2, 101],
  ].map(([offset, value]) => ({ ts: new Date(hour + offset! * hourMs).toISOString(), value }));
  const response = await request(server.url)
    .post('/api/series/scored/readings')
    .set('Authorization', `Bearer ${tokens.readWrite}`)
    .send({ readings: pushed });
  expect(response.status).toBe(200);

  let rows = await scoresOf(draft);
  for (let i = 0; i < 50 && rows.length < 2; i++) {
    await new Promise((r) => setTimeout(r, 200));
    rows = await scoresOf(draft);
  }
  expect(rows.map((r) => [r.horizon, r.actual, r.forecast])).toEqual([
    [22, 119, 110],
    [23, 101, 110],
  ]);
  expect((await scoresOf(approved)).map((r) => [r.horizon, r.actual])).toEqual([
    [19, 100],
    [20, 150],
    [21, 95],
    [22, 105],
    [46, 119],
    [47, 101],
  ]);

  const got = await request(server.url).get(`/api/series/${seriesId}/accuracy`).set('Authorization', `Bearer ${tokens.read}`);
  expect(got.status).toBe(200);
  const report = seriesAccuracySchema.parse(got.body);
  // Errors: approved 0, −50, 5, −5, −19, −1 (sum of |e| 80); draft 9, −9. MAE = 98 / 8 (Hyndman & Koehler 2006).
  expect(report.overall!.hours).toBe(8);
  expect(report.overall!.mae).toBeCloseTo(98 / 8, 9);
  // 95 % bands [90, 110] and [100, 120]: 150 and 119 fall outside the approved band; the draft's hours are inside.
  expect(report.overall!.coverage95).toBeCloseTo(6 / 8, 12);
  // No actuals a week before: no naive benchmark, no MASE scale.
  expect(report.overall!.skill).toBeNull();
  expect(report.overall!.mase).toBeNull();
  // Horizon 22 holds the approved version's 105 (|e| 5) and the draft's 119 (|e| 9).
  expect(report.byHorizon.find((h) => h.horizon === 22)!.mae).toBeCloseTo(7, 12);
  expect(report.versions.map((v) => [v.id, v.state, v.bandKind, v.summary.hours])).toEqual([
    [draft, 'draft', 'gaussian', 2],
    [approved, 'approved', 'gaussian', 6],
  ]);
  expect(report.byBandKind).toEqual([expect.objectContaining({ bandKind: 'gaussian', versions: 2, hours: 8 })]);
  // The recent days draw the version in force: the approved one wherever it covers the hour.
  expect(report.recentHours.every((h) => h.versionId === approved)).toBe(true);
  expect(report.recentHours).toHaveLength(6);

  const schedules = await server.pool.query<{ name: string; cron: string }>('select name, cron from pgboss.schedule where name = $1', [
    scoreAccuracyHourlyQueue,
  ]);
  expect(schedules.rows).toEqual([{ name: scoreAccuracyHourlyQueue, cron: scoringCron }]);

  // Again: the same rows. A revised actual: its hour scored again.
  await scoreSeries(server.db, seriesId);
  expect(await scoresOf(approved)).toHaveLength(6);
  await actuals(server.db, seriesId, new Date(hour - 29 * hourMs).toISOString(), [130]);
  await scoreSeries(server.db, seriesId);
  expect((await scoresOf(approved)).find((r) => r.horizon === 20)!.actual).toBe(130);

  const overview = await request(server.url).get('/api/accuracy/overview').set('Authorization', `Bearer ${tokens.read}`);
  expect(overview.status).toBe(200);
  expect(accuracyOverviewSchema.parse(overview.body)).toMatchObject({ hours: 8, seriesCount: 1, skill: null });
});

it('refuses a bad window in plain words and answers 404 for a series that does not exist', async () => {
  const auth = { Authorization: `Bearer ${tokens.read}` };
  const zero = await request(server.url).get('/api/accuracy/overview?days=0').set(auth);
  expect(zero.status).toBe(400);
  expect(JSON.stringify(zero.body)).toContain('Use 1 or more');
  const words = await request(server.url).get('/api/series/1/accuracy?days=week').set(auth);
  expect(words.status).toBe(400);
  expect(JSON.stringify(words.body)).toContain('plain decimal digits');
  const missing = await request(server.url).get('/api/series/987654/accuracy').set(auth);
  expect(missing.status).toBe(404);
  expect(missing.body.detail).toBe('No series with id 987654.');
});
