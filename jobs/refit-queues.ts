/** Registers the refit queues, the nightly schedule and their handlers in a worker process. */
import pg from 'pg';
import type PgBoss from 'pg-boss';
import { createRefitQueues } from '@loadwright/refits';
import type { QueueContext } from './queues';
import { applyRefitSchedule, keepRefitScheduleCurrent, workRefitNightly } from './refit-nightly.worker';
import { workRefitSeries } from './refit-series.worker';
import { startRefitSweeper } from './refit-sweeper';

/** Creates the queues, applies the schedule and starts both handlers; stops the pool with the boss. */
export async function registerRefitQueues(boss: PgBoss, context: QueueContext): Promise<void> {
  const pool = new pg.Pool({
    connectionString: context.databaseUrl,
    max: context.concurrency + 2,
    application_name: 'loadwright-refit',
    idleTimeoutMillis: 5_000,
    connectionTimeoutMillis: 10_000,
    allowExitOnIdle: true,
  });
  pool.on('error', (error) => context.logger.warn({ err: error }, 'refit database connection lost'));
  await createRefitQueues(boss);
  const schedule = await applyRefitSchedule(boss, pool);
  context.logger.info(schedule, 'nightly refit scheduled');
  const stopChecks = keepRefitScheduleCurrent(boss, pool, context.logger, schedule);
  const stopSweeps = startRefitSweeper(pool, context.logger);
  boss.once('stopped', () => {
    stopChecks();
    stopSweeps();
    void pool.end().catch(() => {});
  });
  await workRefitNightly(boss, pool, context.logger, context.presence);
  await workRefitSeries(boss, pool, context.logger, context.concurrency, context.presence);
}
