/**
 * One series' refit within a run, start to end: mark it running, read, fit, diagnose, forecast, write.
 * A failure that retrying cannot fix (bad data) or that happens on the last attempt marks the series
 * failed with its error and leaves its previous forecast untouched; any other failure is put back to
 * queued and rethrown for the job queue to retry with backoff.
 */
import type pg from 'pg';
import type { AutoOptions } from './auto-select';
import { fitSeriesModel } from './fit-series-model';
import { readHolidaySpec } from './holiday-calendar';
import { describeRefitError, isPermanentRefitError } from './refit-errors';
import { readRefitInputs } from './series-window';
import { writeRefit, type WriteResult } from './write-refit';

/** Which attempt this is, as the job queue counts them. */
export interface Attempt {
  /** Retries already made (0 on the first try). */
  retryCount: number;
  /** Retries allowed in all. */
  retryLimit: number;
}

/** How a refit job ended. */
export type RefitSeriesResult =
  WriteResult | { written: false; reason: 'failed'; error: string } | { written: false; reason: 'skipped-done' };

/** Refits `seriesId` for run `runId`; see the file comment. */
export async function refitSeries(
  pool: pg.Pool,
  runId: number,
  seriesId: number,
  attempt: Attempt,
  autoOptions: AutoOptions = {},
): Promise<RefitSeriesResult> {
  const startedMs = performance.now();
  const marked = await pool.query<{ status: string }>(
    `update refit_run_series set status = 'running', attempts = attempts + 1, started_at = coalesce(started_at, now())
      where run_id = $1 and series_id = $2 and status in ('queued', 'running')
      returning status`,
    [runId, seriesId],
  );
  // A copy of a job whose series already finished (done, or failed for good) changes nothing.
  if (marked.rows.length === 0) return { written: false, reason: 'skipped-done' };
  await pool.query('update refit_runs set started_at = now() where id = $1 and started_at is null', [runId]);
  try {
    const at = performance.now();
    const inputs = await readRefitInputs(pool, seriesId);
    const holidays = await readHolidaySpec(pool);
    const read = performance.now() - at;
    const outcome = fitSeriesModel(inputs, holidays, autoOptions);
    return await writeRefit(pool, runId, inputs, outcome, { read, ...outcome.timings }, startedMs);
  } catch (error) {
    const message = describeRefitError(error);
    if (isPermanentRefitError(error) || attempt.retryCount >= attempt.retryLimit) {
      await markFailed(pool, runId, seriesId, message, performance.now() - startedMs);
      return { written: false, reason: 'failed', error: message };
    }
    await pool.query(
      `update refit_run_series set status = 'queued', error = $3 where run_id = $1 and series_id = $2 and status = 'running'`,
      [runId, seriesId, message],
    );
    throw error;
  }
}

/** Marks the series failed (once) and counts it on the run, finishing the run if it was the last. */
export async function markFailed(pool: pg.Pool, runId: number, seriesId: number, message: string, durationMs: number): Promise<void> {
  const client = await pool.connect();
  try {
    await client.query('begin');
    const updated = await client.query(
      `update refit_run_series set status = 'failed', error = $3, finished_at = now(), duration_ms = $4
        where run_id = $1 and series_id = $2 and status not in ('done', 'failed') returning 1`,
      [runId, seriesId, message, Math.round(durationMs)],
    );
    if (updated.rows.length > 0) {
      await client.query(
        `update refit_runs set series_failed = series_failed + 1,
                finished_at = case when series_done + series_failed + 1 >= series_total then now() else finished_at end
          where id = $1`,
        [runId],
      );
    }
    await client.query('commit');
  } catch (error) {
    await client.query('rollback').catch(() => {});
    throw error;
  } finally {
    client.release();
  }
}
