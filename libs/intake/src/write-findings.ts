/** Writes findings into `upload_findings` in batches of array-parameter inserts. */
import { sql } from 'drizzle-orm';
import type { Finding } from './findings';
import type { SqlExecutor } from './write-observations';

/** Findings per statement. */
const batchSize = 10_000;

/** Stores the findings of one upload. */
export async function writeFindings(executor: SqlExecutor, uploadId: number, findings: readonly Finding[]): Promise<void> {
  for (let from = 0; from < findings.length; from += batchSize) {
    const batch = findings.slice(from, from + batchSize);
    await executor.execute(sql`
      insert into upload_findings (upload_id, series_id, rule, ts, value, source_row, detail)
      select ${uploadId}, series_id, rule, case when seconds is null then null else to_timestamp(seconds) end, value, source_row, detail
      from unnest(${sql.param(batch.map((f) => f.seriesId))}::int4[], ${sql.param(batch.map((f) => f.rule))}::validation_rule[],
                  ${sql.param(batch.map((f) => (f.tsMs === null ? null : f.tsMs / 1000)))}::float8[],
                  ${sql.param(batch.map((f) => (f.value === null || !Number.isFinite(f.value) ? null : f.value)))}::float8[],
                  ${sql.param(batch.map((f) => f.sourceRow))}::int4[], ${sql.param(batch.map((f) => JSON.stringify(f.detail)))}::jsonb[])
        as f(series_id, rule, seconds, value, source_row, detail)`);
  }
}
