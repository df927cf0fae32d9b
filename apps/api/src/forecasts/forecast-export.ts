/**
 * Hands approved forecasts on as CSV or JSON, streamed a batch of versions at a time so that a
 * whole-system export never sits in memory as one string. Every row states its interval
 * ([interval_start, interval_end), local time with offset) and time zone; the mean is the adjusted
 * mean where a planner adjusted it. A version most of whose hours had passed at the export is marked
 * stale (CSV column `stale`, JSON `stale` and `hoursAhead`), so an old week is never handed on
 * beside current ones without a word.
 *
 * The versions to export are chosen once, up front; the batches read later still match that choice
 * even if an approval supersedes one of them meanwhile, because a version's points and adjustments
 * never change after approval.
 */
import { once } from 'node:events';
import {
  versionTimeliness,
  exportIntervalConvention,
  type ExportedPoint,
  type ExportedSeries,
  type ForecastExportQuery,
  type ForecastSeries,
} from '@loadwright/contracts';
import { forecastVersions, type Database } from '@loadwright/db';
import { and, eq, inArray } from 'drizzle-orm';
import type { Response } from 'express';
import { adjustPoints } from '@loadwright/forecasts';
import { csvLine, numberCell, textCell } from '../http/csv-cells';
import { adjustmentsOf, pointsOf } from '@loadwright/forecasts';
import { localIso } from '@loadwright/forecasts';
import { resolveSeriesScope } from '@loadwright/forecasts';

/** Versions whose points are read and written per round trip. */
const versionsPerBatch = 100;

/** An approved version to export, with its series. */
interface ExportEntry {
  series: ForecastSeries;
  versionId: number;
  issuedAt: Date;
  approvedAt: Date | null;
  origin: Date;
  horizonHours: number;
}

/** What is exported: the approved versions in scope and the series in scope without one. */
interface ExportPlan {
  entries: ExportEntry[];
  withoutApproved: ForecastSeries[];
  scopeName: string;
}

/** Resolves the query's scope to approved versions; throws not found for unknown series. */
async function planExport(db: Database, query: ForecastExportQuery): Promise<ExportPlan> {
  const scope = await resolveSeriesScope(db, { seriesIds: query.series, parentId: query.parent });
  let inScope = scope.series;
  if (query.seriesLevels) {
    const wanted = new Set<string | null>(query.seriesLevels);
    inScope = inScope.filter((row) => wanted.has(row.level));
  }
  const bySeries = new Map(inScope.map((row) => [row.id, row]));
  const entries: ExportEntry[] = [];
  const ids = inScope.map((row) => row.id);
  for (let start = 0; start < ids.length; start += 5_000) {
    const rows = await db
      .select({
        versionId: forecastVersions.id,
        seriesId: forecastVersions.seriesId,
        issuedAt: forecastVersions.issuedAt,
        approvedAt: forecastVersions.approvedAt,
        origin: forecastVersions.origin,
        horizonHours: forecastVersions.horizonHours,
      })
      .from(forecastVersions)
      .where(and(eq(forecastVersions.state, 'approved'), inArray(forecastVersions.seriesId, ids.slice(start, start + 5_000))));
    for (const row of rows) entries.push({ series: bySeries.get(row.seriesId)!, ...row });
  }
  entries.sort((a, b) => a.series.id - b.series.id);
  const exported = new Set(entries.map((entry) => entry.series.id));
  return { entries, withoutApproved: inScope.filter((row) => !exported.has(row.id)), scopeName: scope.name };
}

/** Formats instants in one zone, remembering each: the series of an export share their hours. */
function instantFormatter(timeZone: string): (ms: number) => string {
  const cache = new Map<number, string>();
  return (ms) => {
    let text = cache.get(ms);
    if (text === undefined) {
      if (cache.size > 100_000) cache.clear();
      text = localIso(ms, timeZone);
      cache.set(ms, text);
    }
    return text;
  };
}

/** Yields each approved version's points as exported, one batch of versions per database round trip. */
async function* exportedSeries(db: Database, plan: ExportPlan, query: ForecastExportQuery): AsyncGenerator<ExportedSeries> {
  const format = instantFormatter(query.tz);
  const now = new Date();
  for (let start = 0; start < plan.entries.length; start += versionsPerBatch) {
    const batch = plan.entries.slice(start, start + versionsPerBatch);
    const ids = batch.map((entry) => entry.versionId);
    const [points, adjustments] = await Promise.all([pointsOf(db, ids), adjustmentsOf(db, ids)]);
    for (const entry of batch) {
      const modelPoints = points.get(entry.versionId)!;
      const adjusted = adjustPoints(modelPoints, adjustments.get(entry.versionId)!);
      const intervalMs = entry.series.intervalMinutes * 60_000;
      yield {
        id: entry.series.id,
        key: entry.series.key,
        name: entry.series.name,
        level: entry.series.level,
        unit: entry.series.unit,
        intervalMinutes: entry.series.intervalMinutes,
        versionId: entry.versionId,
        issuedAt: format(entry.issuedAt.getTime()),
        approvedAt: entry.approvedAt ? format(entry.approvedAt.getTime()) : null,
        end: format(entry.origin.getTime() + entry.horizonHours * 3_600_000),
        ...timelinessOf(entry, now),
        points: modelPoints.map((point, i): ExportedPoint => {
          const band = adjusted[i] ?? point;
          const ts = point.ts.getTime();
          return {
            intervalStart: format(ts),
            intervalEnd: format(ts + intervalMs),
            mean: band.mean,
            modelMean: point.mean,
            adjusted: adjusted[i] !== null,
            ...(query.levels.includes(80) && { lower80: band.lower80, upper80: band.upper80 }),
            ...(query.levels.includes(95) && { lower95: band.lower95, upper95: band.upper95 }),
          };
        }),
      };
    }
  }
}

/** Hours still ahead and staleness of an exported version at `now`. */
function timelinessOf(entry: ExportEntry, now: Date): { hoursAhead: number; stale: boolean } {
  const { hoursAhead, stale } = versionTimeliness(entry, now);
  return { hoursAhead, stale };
}

/** Writes a chunk, waiting while the client is slower than we are; false once the client has gone. */
async function send(res: Response, chunk: string): Promise<boolean> {
  if (res.destroyed) return false;
  if (!res.write(chunk)) await Promise.race([once(res, 'drain'), once(res, 'close')]);
  return !res.destroyed;
}

/**
 * Runs a stream writer; a failure after the first byte cannot become a problem response any more, so
 * the connection is cut instead, and the client sees a truncated download rather than a complete-looking one.
 */
async function guarded(res: Response, write: () => Promise<void>): Promise<void> {
  try {
    await write();
  } catch (error) {
    if (!res.headersSent) throw error;
    res.destroy(error instanceof Error ? error : new Error(String(error)));
  }
}

/** Today's UTC date as YYYYMMDD, for file names. */
function fileDate(): string {
  return new Date().toISOString().slice(0, 10).replace(/-/g, '');
}

/** The CSV's columns: who, which version, the interval and its zone, then the numbers. */
function csvHeader(levels: readonly number[]): string {
  const bounds = levels.flatMap((level) => [`lower_${level}`, `upper_${level}`]);
  return csvLine([
    'series_id',
    'series_key',
    'series_name',
    'level',
    'unit',
    'version_id',
    'approved_at',
    'interval_start',
    'interval_end',
    'time_zone',
    'mean',
    'model_mean',
    'adjusted',
    ...bounds,
    'stale',
  ]);
}

/** Streams the approved forecasts in scope as CSV (RFC 4180, UTF-8, CRLF, one header row). */
export async function streamForecastCsv(db: Database, res: Response, query: ForecastExportQuery): Promise<void> {
  const plan = await planExport(db, query);
  await guarded(res, () => writeCsv(db, res, query, plan));
}

/** Writes the CSV of a planned export. */
async function writeCsv(db: Database, res: Response, query: ForecastExportQuery, plan: ExportPlan): Promise<void> {
  res.status(200);
  res.setHeader('Content-Type', 'text/csv; charset=utf-8; header=present');
  res.setHeader('Content-Disposition', `attachment; filename="forecasts-${plan.scopeName.replace(/[^\w.-]+/g, '_')}-${fileDate()}.csv"`);
  res.setHeader('Cache-Control', 'no-store');
  if (!(await send(res, csvHeader(query.levels)))) return;
  const zone = textCell(query.tz);
  for await (const entry of exportedSeries(db, plan, query)) {
    const fixed = [
      String(entry.id),
      textCell(entry.key),
      textCell(entry.name),
      textCell(entry.level),
      textCell(entry.unit),
      String(entry.versionId),
      textCell(entry.approvedAt),
    ];
    const stale = entry.stale ? 'true' : 'false';
    let chunk = '';
    for (const point of entry.points) {
      const bounds = query.levels.flatMap((level) =>
        level === 80 ? [numberCell(point.lower80), numberCell(point.upper80)] : [numberCell(point.lower95), numberCell(point.upper95)],
      );
      chunk += csvLine([
        ...fixed,
        textCell(point.intervalStart),
        textCell(point.intervalEnd),
        zone,
        numberCell(point.mean),
        numberCell(point.modelMean),
        point.adjusted ? 'true' : 'false',
        ...bounds,
        stale,
      ]);
    }
    if (!(await send(res, chunk))) return;
  }
  res.end();
}

/** Streams the approved forecasts in scope as one JSON document (see forecastExportSchema). */
export async function streamForecastJson(db: Database, res: Response, query: ForecastExportQuery): Promise<void> {
  const plan = await planExport(db, query);
  await guarded(res, () => writeJson(db, res, query, plan));
}

/** Writes the JSON document of a planned export. */
async function writeJson(db: Database, res: Response, query: ForecastExportQuery, plan: ExportPlan): Promise<void> {
  res.status(200);
  res.setHeader('Content-Type', 'application/json; charset=utf-8');
  res.setHeader('Cache-Control', 'no-store');
  const head = {
    generatedAt: new Date().toISOString(),
    timeZone: query.tz,
    intervalConvention: exportIntervalConvention,
    levels: query.levels,
  };
  if (!(await send(res, `${JSON.stringify(head).slice(0, -1)},"series":[`))) return;
  let first = true;
  for await (const entry of exportedSeries(db, plan, query)) {
    if (!(await send(res, `${first ? '' : ','}${JSON.stringify(entry)}`))) return;
    first = false;
  }
  const withoutApproved = plan.withoutApproved.map((row) => ({ id: row.id, key: row.key, name: row.name }));
  res.end(`],"withoutApproved":${JSON.stringify(withoutApproved)}}`);
}
