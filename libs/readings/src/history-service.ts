/**
 * The history the series page charts: picks the range and resolution, then reads each stored
 * reading or hourly/daily aggregates, with a count of readings per quality flag.
 */
import {
  autoDailyAboveDays,
  autoHourlyAbovePoints,
  defaultHistoryDays,
  maxHistoryDays,
  qualityFlagsOf,
  type ReadingHistory,
  type ReadingHistoryQuery,
  type ReadingResolution,
} from '@loadwright/contracts';
import type { Database, Series } from '@loadwright/db';
import { HttpProblem } from '@loadwright/problems';
import { bucketsInRange, latestReadingMs, qualityCounts, readingsInRange } from './history-repository';

const dayMs = 86_400_000;

/** Most rows one answer may hold; a longer range needs a coarser resolution. */
export const maxHistoryRows = 200_000;

/** The resolution `auto` picks for a span of `spanMs` on a series with `intervalMinutes`. */
export function autoResolution(spanMs: number, intervalMinutes: number): ReadingResolution {
  if (spanMs > autoDailyAboveDays * dayMs) return 'day';
  if (spanMs / (intervalMinutes * 60_000) > autoHourlyAbovePoints) return 'hour';
  return 'interval';
}

/** The range asked for, with defaults: up to just after the newest reading, `defaultHistoryDays` long. */
export async function resolveRange(
  db: Pick<Database, 'execute'>,
  series: Series,
  query: Pick<ReadingHistoryQuery, 'from' | 'to'>,
): Promise<{ fromMs: number; toMs: number }> {
  const intervalMs = series.intervalMinutes * 60_000;
  let toMs = query.to ? Date.parse(query.to) : ((await latestReadingMs(db, series.id)) ?? Date.now() - intervalMs) + intervalMs;
  const fromMs = query.from ? Date.parse(query.from) : toMs - defaultHistoryDays * dayMs;
  if (!query.to && fromMs >= toMs) toMs = fromMs + defaultHistoryDays * dayMs;
  if (toMs - fromMs > maxHistoryDays * dayMs) {
    throw new HttpProblem('invalidInput', `Ask for at most ${maxHistoryDays} days at once.`, [
      { pointer: '/query/from', detail: `More than ${maxHistoryDays} days before to` },
    ]);
  }
  return { fromMs, toMs };
}

/** The history of one series for the chart. */
export async function readingHistory(db: Pick<Database, 'execute'>, series: Series, query: ReadingHistoryQuery): Promise<ReadingHistory> {
  const { fromMs, toMs } = await resolveRange(db, series, query);
  const resolution = query.resolution === 'auto' ? autoResolution(toMs - fromMs, series.intervalMinutes) : query.resolution;
  const rowsAsked =
    resolution === 'day'
      ? (toMs - fromMs) / dayMs
      : (toMs - fromMs) / (resolution === 'hour' ? 3_600_000 : series.intervalMinutes * 60_000);
  if (rowsAsked > maxHistoryRows) {
    throw new HttpProblem(
      'invalidInput',
      `That range holds about ${Math.round(rowsAsked)} ${resolution === 'interval' ? 'readings' : `${resolution}s`}; ask for a shorter range or a coarser resolution (at most ${maxHistoryRows} rows).`,
      [{ pointer: '/query/resolution', detail: 'Too many rows for this range' }],
    );
  }
  const range = { seriesId: series.id, fromMs, toMs };
  const summary = await qualityCounts(db, range);
  const base = {
    seriesId: series.id,
    key: series.key,
    unit: series.unit,
    intervalMinutes: series.intervalMinutes,
    timeZone: series.timeZone,
    from: new Date(fromMs).toISOString(),
    to: new Date(toMs).toISOString(),
    readingCount: summary.count,
    qualitySummary: summary.byFlag,
  };
  if (resolution === 'interval') {
    const rows = await readingsInRange(db, range);
    return {
      ...base,
      resolution,
      points: rows.map((row) => ({
        ts: new Date(row.ms).toISOString(),
        value: row.value,
        estimated: row.estimated,
        quality: row.quality,
        flags: qualityFlagsOf(row.quality),
      })),
    };
  }
  const buckets = await bucketsInRange(db, range, resolution, series.timeZone);
  return {
    ...base,
    resolution,
    buckets: buckets.map((b) => ({
      ts: new Date(b.ms).toISOString(),
      day: b.day,
      mean: b.mean,
      min: b.min,
      max: b.max,
      meanUsed: b.meanUsed,
      count: b.count,
      estimatedCount: b.estimatedCount,
      quality: b.quality,
      flags: qualityFlagsOf(b.quality),
    })),
  };
}
