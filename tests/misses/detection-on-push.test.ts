/**
 * Detection runs as actuals are stored: a push through the API adds a detection job in the same
 * transaction, the worker judges the series, and a miss appears; the hourly schedule is registered.
 */
import { detectMissesHourlyQueue, detectionCron } from '@loadwright/misses';
import request from 'supertest';
import { afterAll, beforeAll, expect, it } from 'vitest';
import { createTokens } from '../series/support/tokens';
import { startTestServer, type TestServer } from '../support/server';
import { approvedForecast, eventsOf, loadSeries, seriesRule } from './support';

let server: TestServer;

beforeAll(async () => {
  server = await startTestServer();
});
afterAll(() => server.close());

it('finds a miss in pushed actuals without anyone asking, and has the hourly schedule in place', async () => {
  const seriesId = await loadSeries(server.db, 'pushed');
  const hour = Math.floor(Date.now() / 3_600_000) * 3_600_000;
  const origin = new Date(hour - 48 * 3_600_000).toISOString();
  await approvedForecast(server.db, seriesId, origin, 96);
  const ruleId = await seriesRule(server.db, seriesId, { kind: 'outside_band', hours: 2, bandLevel: 95 });
  // A token acts for its creator, so it comes from the shared helper that makes one with an active admin.
  const token = (await createTokens(server.db)).readWrite;

  // Ten hours ago: 100, 150, 150 (two hours above the [90, 110] band).
  const readings = [100, 150, 150].map((value, i) => ({ ts: new Date(hour - (10 - i) * 3_600_000).toISOString(), value }));
  const pushed = await request(server.url).post('/api/series/pushed/readings').set('Authorization', `Bearer ${token}`).send({ readings });
  expect(pushed.status).toBe(200);

  // The worker also wrote the default rules; the newest actual is eight hours old, so "Actuals late"
  // (default: over six hours) fires beside the band rule. The band rule's own event is checked here.
  const bandEvents = async () => (await eventsOf(server.db, seriesId)).filter((event) => event.ruleId === ruleId);
  let events = await bandEvents();
  for (let i = 0; i < 50 && events.length === 0; i++) {
    await new Promise((r) => setTimeout(r, 200));
    events = await bandEvents();
  }
  expect(events).toHaveLength(1);
  expect(events[0]!.periodStart.getTime()).toBe(hour - 9 * 3_600_000);
  expect(events[0]!.periodEnd.getTime()).toBe(hour - 7 * 3_600_000);

  const schedules = await server.pool.query<{ name: string; cron: string }>('select name, cron from pgboss.schedule where name = $1', [
    detectMissesHourlyQueue,
  ]);
  expect(schedules.rows).toEqual([{ name: detectMissesHourlyQueue, cron: detectionCron }]);
});
