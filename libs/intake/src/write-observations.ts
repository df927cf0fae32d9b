/**
 * Writes validated rows into `observations` in batches of multi-row statements that send each column
 * as one array (`unnest`), merging with what is stored:
 *   - an instant not stored yet is inserted;
 *   - a stored raw value equal to the incoming one is left alone (re-uploads are idempotent);
 *   - a changed raw value first copies the stored row to `observation_revisions`, then replaces it
 *     with revision + 1 (raw readings are never lost);
 *   - an estimate-only row (no raw value) never replaces a stored row.
 * When nothing is stored in the batch's time range a plain insert skips the merge work.
 */
import { sql } from 'drizzle-orm';
import type { Database } from '@loadwright/db';
import type { ObservationRows } from './validate-series';

/** Anything that runs SQL: a Drizzle database or transaction. */
export type SqlExecutor = Pick<Database, 'execute'>;

/** Rows per statement: big enough that round trips stop mattering, small enough to keep memory low. */
export const writeBatchRows = 20_000;

/** What a write did. */
export interface WriteCounts {
  inserted: number;
  unchanged: number;
  revised: number;
}

/** Merges the rows of one series; `onRows` hears the running count of rows written. */
export async function writeObservations(
  executor: SqlExecutor,
  seriesId: number,
  uploadId: number | null,
  rows: ObservationRows,
  onRows?: (written: number) => Promise<void> | void,
): Promise<WriteCounts> {
  const counts: WriteCounts = { inserted: 0, unchanged: 0, revised: 0 };
  if (rows.length === 0) return counts;
  let min = Infinity;
  let max = -Infinity;
  for (let i = 0; i < rows.length; i++) {
    if (rows.ts[i]! < min) min = rows.ts[i]!;
    if (rows.ts[i]! > max) max = rows.ts[i]!;
  }
  const existing = await executor.execute(sql`
    select exists (select 1 from observations where series_id = ${seriesId}
      and ts between to_timestamp(${min / 1000}::float8) and to_timestamp(${max / 1000}::float8)) as found`);
  const merge = Boolean((existing.rows[0] as { found: boolean }).found);

  for (let from = 0; from < rows.length; from += writeBatchRows) {
    const to = Math.min(rows.length, from + writeBatchRows);
    const ts: number[] = [];
    const values: (number | null)[] = [];
    const estimates: (number | null)[] = [];
    const quality: number[] = [];
    for (let i = from; i < to; i++) {
      ts.push(rows.ts[i]! / 1000);
      values.push(Number.isNaN(rows.values[i]!) ? null : rows.values[i]!);
      estimates.push(Number.isNaN(rows.estimated[i]!) ? null : rows.estimated[i]!);
      quality.push(rows.quality[i]!);
    }
    const incoming = sql`unnest(${sql.param(ts)}::float8[], ${sql.param(values)}::float8[], ${sql.param(estimates)}::float8[], ${sql.param(quality)}::int2[]) as i(seconds, value, estimated, quality)`;
    if (!merge) {
      await executor.execute(sql`
        insert into observations (ts, value, series_id, upload_id, quality, revision, estimated)
        select to_timestamp(seconds), value, ${seriesId}, ${uploadId}, quality, 1, estimated from ${incoming}`);
      counts.inserted += to - from;
    } else {
      const result = await executor.execute(sql`
        with incoming as materialized (
          select to_timestamp(seconds) as ts, value, estimated, quality from ${incoming}
        ),
        superseded as (
          insert into observation_revisions (ts, value, series_id, upload_id, superseded_by_upload_id, quality, revision, estimated)
          select o.ts, o.value, o.series_id, o.upload_id, ${uploadId}, o.quality, o.revision, o.estimated
          from incoming i join observations o on o.series_id = ${seriesId} and o.ts = i.ts
          where i.value is not null and o.value is distinct from i.value
          returning 1
        ),
        written as (
          insert into observations as o (ts, value, series_id, upload_id, quality, revision, estimated)
          select ts, value, ${seriesId}, ${uploadId}, quality, 1, estimated from incoming
          on conflict (series_id, ts) do update
            set value = excluded.value, upload_id = excluded.upload_id, quality = excluded.quality,
                estimated = excluded.estimated, revision = o.revision + 1
            where excluded.value is not null and o.value is distinct from excluded.value
          returning (xmax = 0) as inserted
        )
        select count(*) filter (where inserted)::int as inserted, count(*) filter (where not inserted)::int as revised,
               (select count(*) from superseded)::int as superseded
        from written`);
      const row = result.rows[0] as { inserted: number; revised: number; superseded: number };
      counts.inserted += row.inserted;
      counts.revised += row.revised;
      counts.unchanged += to - from - row.inserted - row.revised;
    }
    await onRows?.(to);
  }
  return counts;
}
