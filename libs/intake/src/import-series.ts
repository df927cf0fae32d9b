/**
 * The import core for one series, in three steps that the upload job can overlap across series:
 * screen (collapse duplicates, drop off-grid and future readings), look up which missing intervals
 * already hold stored readings, then validate and store (merge into `observations`, record
 * findings). `importSeries` runs them in a row inside the caller's transaction.
 */
import { sql } from 'drizzle-orm';
import { FindingTally, type Finding } from './findings';
import { intervalGrid, type IntervalGrid } from './interval-grid';
import { collapseDuplicates } from './rules/duplicates';
import { screenInstants } from './rules/instant-screen';
import type { SeriesReadings } from './series-readings';
import { validateSeries } from './validate-series';
import { writeFindings } from './write-findings';
import { enqueueDetection } from '@loadwright/misses';
import { enqueueScoring } from '@loadwright/accuracy';
import { writeObservations, type SqlExecutor, type WriteCounts } from './write-observations';

/** The series a batch belongs to, as the catalogue describes it. */
export interface SeriesTarget {
  seriesId: number;
  kind: 'load' | 'temperature';
  /** Unit of stored values (W, kW, MW, degC, degF). */
  unit: string;
  intervalMinutes: number;
  /** IANA zone; places the daily grid on local midnights (default UTC). */
  timeZone?: string;
}

/** How to import. */
export interface ImportSeriesOptions {
  uploadId: number | null;
  /** Readings after this instant are findings, not data (default: the clock). */
  now?: Date;
  /** Longest gap estimated, in intervals (default 3). */
  maxEstimatedGap?: number;
  /** Hears rows written so far for this series. */
  onRows?: (written: number) => Promise<void> | void;
}

/** What importing one series did. */
export interface ImportSeriesResult extends WriteCounts {
  /** Readings dropped before storing: duplicates, off-grid and future instants. */
  rejected: number;
  findings: FindingTally;
}

/** Readings of one series after screening, with the stored intervals inside their gaps. */
export interface ScreenedSeries {
  target: SeriesTarget;
  grid: IntervalGrid;
  readings: SeriesReadings;
  findings: Finding[];
  rejected: number;
  stored: Set<number>;
}

/** Steps 1 and 2: screens the readings and looks up stored intervals inside their gaps. */
export async function screenSeries(
  executor: SqlExecutor,
  target: SeriesTarget,
  source: SeriesReadings,
  now: Date = new Date(),
): Promise<ScreenedSeries> {
  const grid = intervalGrid(target.intervalMinutes, target.timeZone);
  const collapsed = collapseDuplicates(source, target.seriesId);
  const screened = screenInstants(collapsed.readings, target.seriesId, grid, now.getTime());
  const readings = screened.readings;
  const stored = await storedInGaps(executor, target.seriesId, readings, grid.intervalMinutes * 60_000, grid.indexOf);
  return {
    target,
    grid,
    readings,
    findings: [...collapsed.findings, ...screened.findings],
    rejected: source.length - readings.length,
    stored,
  };
}

/** Step 3, the pure part: validates and estimates (no database). */
export function validateScreened(screened: ScreenedSeries, maxEstimatedGap?: number) {
  const { rows, findings } = validateSeries(screened.readings, {
    ...screened.target,
    grid: screened.grid,
    stored: screened.stored,
    maxEstimatedGap,
  });
  return { rows, findings: [...screened.findings, ...findings], rejected: screened.rejected };
}

/** Step 3, the writing part: merges the rows and stores the findings; returns counts and the tally. */
export async function storeSeries(
  executor: SqlExecutor,
  seriesId: number,
  validated: ReturnType<typeof validateScreened>,
  options: Pick<ImportSeriesOptions, 'uploadId' | 'onRows'>,
): Promise<ImportSeriesResult> {
  const counts = await writeObservations(executor, seriesId, options.uploadId, validated.rows, options.onRows);
  // New or corrected actuals are judged against the forecast at once; the job commits with them.
  // Both are jobs of their own, so the import never waits on detection or scoring.
  if (counts.inserted + counts.revised > 0) {
    await enqueueDetection(executor, [seriesId]);
    await enqueueScoring(executor, [seriesId]);
  }
  if (options.uploadId !== null) await writeFindings(executor, options.uploadId, validated.findings);
  const tally = new FindingTally();
  for (const finding of validated.findings) tally.add(finding);
  return { ...counts, rejected: validated.rejected, findings: tally };
}

/** Imports one series' readings (any order, duplicates allowed): the three steps in a row. */
export async function importSeries(
  executor: SqlExecutor,
  target: SeriesTarget,
  source: SeriesReadings,
  options: ImportSeriesOptions,
): Promise<ImportSeriesResult> {
  const screened = await screenSeries(executor, target, source, options.now);
  return storeSeries(executor, target.seriesId, validateScreened(screened, options.maxEstimatedGap), options);
}

/**
 * Grid indexes inside the batch's gaps that already hold a stored raw reading, found with one query
 * over the gap ranges.
 */
async function storedInGaps(
  executor: SqlExecutor,
  seriesId: number,
  readings: SeriesReadings,
  nominalStepMs: number,
  indexOf: (ms: number) => number,
): Promise<Set<number>> {
  const from: number[] = [];
  const to: number[] = [];
  for (let i = 1; i < readings.length; i++) {
    // Daily steps vary by an hour across daylight-saving changes; any step over 1.5 intervals is a gap.
    if (readings.ts[i]! - readings.ts[i - 1]! > nominalStepMs * 1.5) {
      from.push(readings.ts[i - 1]! / 1000);
      to.push(readings.ts[i]! / 1000);
    }
  }
  const stored = new Set<number>();
  if (from.length === 0) return stored;
  const result = await executor.execute(sql`
    select extract(epoch from o.ts)::float8 * 1000 as ms
    from unnest(${sql.param(from)}::float8[], ${sql.param(to)}::float8[]) as r(a, b)
    join observations o on o.series_id = ${seriesId} and o.ts > to_timestamp(r.a) and o.ts < to_timestamp(r.b)
    where o.value is not null`);
  for (const row of result.rows as { ms: number }[]) stored.add(Math.round(indexOf(Number(row.ms))));
  return stored;
}
