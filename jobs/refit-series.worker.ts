/**
 * The 'refit-series' handler: each job refits one series for one run. Jobs arrive in batches of
 * WORKER_CONCURRENCY and run side by side (reads and writes overlap the model fitting); one job's
 * failure fails only that job, which pg-boss retries with backoff; a bad series never stops the worker.
 */
import type PgBoss from 'pg-boss';
import type pg from 'pg';
import type { Logger } from 'pino';
import { refitSeriesQueue, type RefitSeriesJob } from '@loadwright/refits';
import { refitSeries } from '@loadwright/refits';
import type { WorkerPresence } from './worker-presence';

/** Starts the handler on `boss` with `concurrency` jobs per batch. */
export async function workRefitSeries(
  boss: PgBoss,
  pool: pg.Pool,
  logger: Logger,
  concurrency: number,
  presence: WorkerPresence,
): Promise<void> {
  await boss.work<RefitSeriesJob>(
    refitSeriesQueue,
    { batchSize: concurrency, includeMetadata: true, pollingIntervalSeconds: 0.5 },
    (jobs) =>
      presence.hold(
        jobs.map((job) => job.id),
        () => refitBatch(jobs),
      ),
  );

  async function refitBatch(jobs: PgBoss.JobWithMetadata<RefitSeriesJob>[]): Promise<void> {
    const results = await Promise.allSettled(
      jobs.map((job) => refitSeries(pool, job.data.runId, job.data.seriesId, { retryCount: job.retryCount, retryLimit: job.retryLimit })),
    );
    for (const [i, result] of results.entries()) {
      const job = jobs[i]!;
      if (result.status === 'fulfilled') {
        const outcome = result.value;
        if (outcome.written)
          logger.debug({ runId: job.data.runId, seriesId: job.data.seriesId, versionId: outcome.versionId }, 'series refitted');
        else logger.info({ runId: job.data.runId, seriesId: job.data.seriesId, outcome }, 'series refit ended without a new version');
        continue;
      }
      logger.warn(
        { runId: job.data.runId, seriesId: job.data.seriesId, err: result.reason, retryCount: job.retryCount },
        'series refit failed; the queue retries it',
      );
      await boss.fail(refitSeriesQueue, job.id, {
        message: result.reason instanceof Error ? result.reason.message : String(result.reason),
      });
    }
  }
}
