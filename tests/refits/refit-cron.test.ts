/**
 * The nightly schedule firing for real: a per-minute cron (REFIT_CRON) and a supervising pg-boss with
 * its cron checks shortened to one second; the run it starts covers every active load series.
 */
import PgBoss from 'pg-boss';
import { afterAll, beforeAll, expect, it } from 'vitest';
import { createBoss } from '../../jobs/boss';
import { seedDemo } from '../../libs/db/src/seed/seed-demo';
import { startTestServer, type TestServer } from '../support/server';
import { waitFor, waitForRun } from './support';

let server: TestServer;
let clock: PgBoss;

beforeAll(async () => {
  process.env['REFIT_CRON'] = '* * * * *';
  server = await startTestServer();
  await seedDemo(server.databaseUrl);
  // Leave three series active so the run is short.
  await server.pool.query(`update series set archived_at = now() where kind = 'load' and key not in ('sys', 'zone-north', 'zone-south')`);
  clock = createBoss(server.databaseUrl, { supervise: true, cronMonitorIntervalSeconds: 1, cronWorkerIntervalSeconds: 1 });
  await clock.start();
}, 120_000);

afterAll(async () => {
  await clock?.stop({ wait: false });
  await server?.close();
  delete process.env['REFIT_CRON'];
});

it('starts a scheduled run at the next minute and refits every active load series', async () => {
  const run = await waitFor(
    async () => {
      const { rows } = await server.pool.query(`select id, scheduled_for from refit_runs where trigger = 'schedule' order by id limit 1`);
      return rows[0] as { id: number; scheduled_for: Date } | undefined;
    },
    'the cron to fire',
    90_000,
  );
  expect(run.scheduled_for.getUTCSeconds()).toBe(0);
  const finished = await waitForRun(server.pool, run.id, 60_000);
  expect(finished).toMatchObject({ series_total: 3, series_done: 3, series_failed: 0 });
}, 180_000);
