/**
 * Closes run-series rows that nobody will finish: a row still queued or running whose job is gone from
 * the queue (its last attempt expired because a worker died mid-job, or the job was deleted) is marked
 * failed, so the run can finish and the planner sees why. Every worker sweeps once a minute; the update
 * is guarded, so two sweepers do not count a series twice.
 */
import type pg from 'pg';
import type { Logger } from 'pino';
import { refitSeriesQueue } from '@loadwright/refits';
import { markFailed } from '@loadwright/refits';

/** Rows of unfinished runs that have no live job left, older than a minute. */
export async function sweepOrphanedRefits(pool: pg.Pool): Promise<number> {
  const { rows } = await pool.query<{ run_id: number; series_id: number }>(
    `select rs.run_id, rs.series_id from refit_run_series rs join refit_runs r on r.id = rs.run_id
      where r.finished_at is null and rs.status in ('queued', 'running') and rs.queued_at < now() - interval '1 minute'
        and not exists (select 1 from pgboss.job j where j.name = $1 and j.state < 'completed'
                          and j.data->>'runId' = rs.run_id::text and j.data->>'seriesId' = rs.series_id::text)
      limit 1000`,
    [refitSeriesQueue],
  );
  for (const row of rows)
    await markFailed(
      pool,
      row.run_id,
      row.series_id,
      'the refit job ended without finishing (a worker stopped during its last attempt)',
      0,
    );
  return rows.length;
}

/** Sweeps every `seconds` seconds; returns a function that stops it. */
export function startRefitSweeper(pool: pg.Pool, logger: Logger, seconds = 60): () => void {
  const timer = setInterval(() => {
    sweepOrphanedRefits(pool)
      .then((count) => count > 0 && logger.warn({ count }, 'refit series without a live job marked failed'))
      .catch((error) => logger.warn({ err: error }, 'refit sweep failed'));
  }, seconds * 1000);
  timer.unref();
  return () => clearInterval(timer);
}
