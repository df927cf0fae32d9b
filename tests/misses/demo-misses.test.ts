/** The demo utility starts with a few realistic misses in its history, in every state, each explained. */
import { fitDiagnosticsSchema } from '@loadwright/contracts';
import { fits, missComments, missEvents } from '@loadwright/db';
import { afterAll, beforeAll, expect, it } from 'vitest';
import { seedDemo } from '../../libs/db/src/seed/seed-demo';
import { addDemoMisses } from '../../scripts/demo-seed';
import { startTestServer, type TestServer } from '../support/server';

let server: TestServer;

beforeAll(async () => {
  server = await startTestServer({ worker: false });
  await seedDemo(server.databaseUrl);
});
afterAll(() => server.close());

it('adds a few misses judged by the default rules, acknowledged and resolved ones among them, and only once', async () => {
  const count = await addDemoMisses(server.databaseUrl);
  const events = await server.db.select().from(missEvents);
  expect(events.length).toBe(count);
  expect(count).toBeGreaterThanOrEqual(3);
  expect(count).toBeLessThanOrEqual(30);
  expect(new Set(events.map((e) => e.state))).toContain('open');
  expect(new Set(events.map((e) => e.state))).toContain('acknowledged');
  expect(new Set(events.map((e) => e.state))).toContain('resolved');
  expect(events.every((e) => e.notifiedAt !== null)).toBe(true);
  expect(events.filter((e) => (e.detail as { hours: unknown[] }).hours.length > 0).every((e) => e.cause !== null)).toBe(true);
  expect((await server.db.select().from(missComments)).length).toBeGreaterThanOrEqual(1);
  expect(await addDemoMisses(server.databaseUrl)).toBe(0);
});

it('gives the fits behind those forecasts the residual checks the model card reads', async () => {
  const rows = await server.db.select({ diagnostics: fits.diagnostics }).from(fits);
  expect(rows.length).toBeGreaterThan(0);
  for (const row of rows) expect(fitDiagnosticsSchema.safeParse(row.diagnostics).success).toBe(true);
});
