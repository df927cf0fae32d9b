/** Helpers of the refit tests: waiting for runs, reading versions, sending jobs as the queue would. */
import type pg from 'pg';

/** Waits until run `runId` has finished (every series done or failed); returns its row. */
export async function waitForRun(
  pool: pg.Pool,
  runId: number,
  timeoutMs = 60_000,
): Promise<{ series_done: number; series_failed: number; series_total: number; started_at: Date; finished_at: Date }> {
  const deadline = Date.now() + timeoutMs;
  for (;;) {
    const { rows } = await pool.query(
      'select series_done, series_failed, series_total, started_at, finished_at from refit_runs where id = $1',
      [runId],
    );
    if (rows[0]?.finished_at) return rows[0];
    if (Date.now() > deadline) throw new Error(`run ${runId} did not finish within ${timeoutMs} ms: ${JSON.stringify(rows[0])}`);
    await new Promise((done) => setTimeout(done, 200));
  }
}

/** Waits until `check` returns a value other than undefined. */
export async function waitFor<T>(check: () => Promise<T | undefined>, what: string, timeoutMs = 60_000): Promise<T> {
  const deadline = Date.now() + timeoutMs;
  for (;;) {
    const value = await check();
    if (value !== undefined) return value;
    if (Date.now() > deadline) throw new Error(`timed out waiting for ${what}`);
    await new Promise((done) => setTimeout(done, 200));
  }
}

/** The id of the series with `key`. */
export async function seriesId(pool: pg.Pool, key: string): Promise<number> {
  const { rows } = await pool.query('select id from series where key = $1', [key]);
  if (!rows[0]) throw new Error(`no series ${key}`);
  return rows[0].id;
}

/** Every forecast version of a series, oldest first. */
export async function versionsOf(
  pool: pg.Pool,
  id: number,
): Promise<Array<{ id: number; state: string; refit_run_id: number | null; warnings: Array<{ code: string }> }>> {
  const { rows } = await pool.query(
    'select id::int, state, refit_run_id, warnings from forecast_versions where series_id = $1 order by id',
    [id],
  );
  return rows;
}
