/** The demo utility shows accuracy from its first start: its versions are scored when it is seeded. */
import { seriesAccuracySchema } from '@loadwright/contracts';
import { series } from '@loadwright/db';
import { eq } from 'drizzle-orm';
import request from 'supertest';
import { afterAll, beforeAll, expect, it } from 'vitest';
import { seedDemo } from '../../libs/db/src/seed/seed-demo';
import { addDemoAccuracy, addDemoMisses } from '../../scripts/demo-seed';
import { createTokens } from '../series/support/tokens';
import { startTestServer, type TestServer } from '../support/server';

let server: TestServer;

beforeAll(async () => {
  server = await startTestServer({ worker: false });
  await seedDemo(server.databaseUrl);
  await addDemoMisses(server.databaseUrl);
});
afterAll(() => server.close());

it('scores the demo versions, superseded and draft, with the naive benchmark and the MASE scale', async () => {
  const hours = await addDemoAccuracy(server.databaseUrl);
  expect(hours).toBeGreaterThan(3 * 168);
  const [system] = await server.db.select({ id: series.id }).from(series).where(eq(series.key, 'sys'));
  const token = (await createTokens(server.db)).read;
  const response = await request(server.url).get(`/api/series/${system!.id}/accuracy`).set('Authorization', `Bearer ${token}`);
  const report = seriesAccuracySchema.parse(response.body);
  expect(new Set(report.versions.map((v) => v.state))).toEqual(new Set(['superseded', 'draft']));
  expect(report.byHorizon.length).toBe(168);
  expect(report.overall!.mase).not.toBeNull();
  expect(report.peaks!.days).toBeGreaterThanOrEqual(6);
  expect(report.recentHours.length).toBeGreaterThan(100);
  // Scoring again finds the same hours.
  expect(await addDemoAccuracy(server.databaseUrl)).toBe(hours);
});
