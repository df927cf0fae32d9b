/**
 * Reads one series' stored readings for the history chart: each row, or hourly or local-day
 * aggregates computed in PostgreSQL so a two-year range sends a few hundred rows, not seventeen
 * thousand. Instants travel as epoch milliseconds (float8) so no timestamp text is parsed.
 */
import { sql } from 'drizzle-orm';
import { qualityFlagBits, qualityFlagNames, type QualityFlagName } from '@loadwright/contracts';
import type { Database } from '@loadwright/db';

/** Anything that runs SQL. */
type Executor = Pick<Database, 'execute'>;

/** A range of one series: [fromMs, toMs). */
export interface SeriesRange {
  seriesId: number;
  fromMs: number;
  toMs: number;
}

/** One stored row. */
export interface StoredReading {
  ms: number;
  value: number | null;
  estimated: number | null;
  quality: number;
}

/** One aggregate. */
export interface StoredBucket {
  /** Start of the bucket, epoch ms. */
  ms: number;
  /** Local calendar day (YYYY-MM-DD) for daily buckets. */
  day: string | null;
  mean: number | null;
  min: number | null;
  max: number | null;
  meanUsed: number | null;
  count: number;
  estimatedCount: number;
  quality: number;
}

const toSeconds = (ms: number) => ms / 1000;
const numberOrNull = (v: unknown) => (v === null || v === undefined ? null : Number(v));

/** Every stored row in the range, oldest first. */
export async function readingsInRange(db: Executor, range: SeriesRange): Promise<StoredReading[]> {
  const result = await db.execute<Record<string, unknown>>(sql`
    select extract(epoch from ts)::float8 * 1000 as ms, value, estimated, quality
    from observations
    where series_id = ${range.seriesId} and ts >= to_timestamp(${toSeconds(range.fromMs)}) and ts < to_timestamp(${toSeconds(range.toMs)})
    order by ts`);
  return result.rows.map((row) => ({
    ms: Number(row['ms']),
    value: numberOrNull(row['value']),
    estimated: numberOrNull(row['estimated']),
    quality: Number(row['quality']),
  }));
}

/**
 * Aggregates per hour or per local calendar day in `timeZone`. Hours are binned from a local
 * midnight so half-hour zones bin on their own hours; days follow the zone's clock, so a
 * daylight-saving day holds 23 or 25 hourly readings.
 */
export async function bucketsInRange(db: Executor, range: SeriesRange, by: 'hour' | 'day', timeZone: string): Promise<StoredBucket[]> {
  const bucket =
    by === 'hour'
      ? sql`date_bin(interval '1 hour', ts, ('2000-01-01 00:00'::timestamp at time zone ${timeZone}))`
      : sql`((ts at time zone ${timeZone})::date::timestamp at time zone ${timeZone})`;
  const day = by === 'day' ? sql`to_char(min(ts at time zone ${timeZone}), 'YYYY-MM-DD')` : sql`null`;
  const result = await db.execute<Record<string, unknown>>(sql`
    select extract(epoch from ${bucket})::float8 * 1000 as ms, ${day} as day,
      avg(value) as mean, min(value) as min, max(value) as max, avg(coalesce(estimated, value)) as mean_used,
      count(*)::int as count, count(*) filter (where estimated is not null)::int as estimated_count,
      bit_or(quality)::int as quality
    from observations
    where series_id = ${range.seriesId} and ts >= to_timestamp(${toSeconds(range.fromMs)}) and ts < to_timestamp(${toSeconds(range.toMs)})
    group by 1 order by 1`);
  return result.rows.map((row) => ({
    ms: Number(row['ms']),
    day: (row['day'] as string | null) ?? null,
    mean: numberOrNull(row['mean']),
    min: numberOrNull(row['min']),
    max: numberOrNull(row['max']),
    meanUsed: numberOrNull(row['mean_used']),
    count: Number(row['count']),
    estimatedCount: Number(row['estimated_count']),
    quality: Number(row['quality']),
  }));
}

/** Rows in the range, and rows carrying each quality flag. */
export async function qualityCounts(db: Executor, range: SeriesRange): Promise<{ count: number; byFlag: Record<QualityFlagName, number> }> {
  const perFlag = qualityFlagNames.map(
    (name) => sql`count(*) filter (where quality & ${qualityFlagBits[name]} <> 0)::int as ${sql.identifier(name)}`,
  );
  const result = await db.execute<Record<string, unknown>>(sql`
    select count(*)::int as total, ${sql.join(perFlag, sql`, `)}
    from observations
    where series_id = ${range.seriesId} and ts >= to_timestamp(${toSeconds(range.fromMs)}) and ts < to_timestamp(${toSeconds(range.toMs)})`);
  const row = result.rows[0]!;
  return {
    count: Number(row['total']),
    byFlag: Object.fromEntries(qualityFlagNames.map((name) => [name, Number(row[name])])) as Record<QualityFlagName, number>,
  };
}

/** Epoch ms of the newest stored reading of a series, or null. */
export async function latestReadingMs(db: Executor, seriesId: number): Promise<number | null> {
  const result = await db.execute<Record<string, unknown>>(
    sql`select extract(epoch from max(ts))::float8 * 1000 as ms from observations where series_id = ${seriesId}`,
  );
  return numberOrNull(result.rows[0]?.['ms']);
}
