import { sql } from 'drizzle-orm';
import type { Database } from '../client';

/** Hourly readings of one series, NaN where no reading was recorded. */
export interface SeriesReadings {
  seriesId: number;
  /** UTC epoch ms of values[0]. */
  startMs: number;
  intervalMs: number;
  values: Float64Array;
}

/** A transaction or database that can run SQL. */
type Executor = Pick<Database, 'execute'>;

/** Rows per INSERT: large enough that round trips stop mattering, small enough for modest memory. */
export const defaultBatchRows = 10_000;

/**
 * Writes raw readings to `observations` as multi-row INSERTs, one statement per `batchRows` rows,
 * each sending three arrays that `unnest()` turns back into rows (three bind parameters instead of
 * three per row). NaN values are skipped: a missing reading is an absent row. Returns rows written.
 */
export async function insertObservations(
  executor: Executor,
  readings: readonly SeriesReadings[],
  batchRows = defaultBatchRows,
): Promise<number> {
  let seriesIds: number[] = [];
  let instants: string[] = [];
  let values: number[] = [];
  let written = 0;

  const flush = async () => {
    if (values.length === 0) return;
    await executor.execute(sql`
      insert into observations (series_id, ts, value)
      select series_id, ts, value
      from unnest(${sql.param(seriesIds)}::integer[], ${sql.param(instants)}::timestamptz[], ${sql.param(values)}::float8[])
        as batch(series_id, ts, value)`);
    written += values.length;
    seriesIds = [];
    instants = [];
    values = [];
  };

  for (const series of readings) {
    for (let i = 0; i < series.values.length; i++) {
      const value = series.values[i]!;
      if (Number.isNaN(value)) continue;
      seriesIds.push(series.seriesId);
      instants.push(new Date(series.startMs + i * series.intervalMs).toISOString());
      values.push(value);
      if (values.length >= batchRows) await flush();
    }
  }
  await flush();
  return written;
}
