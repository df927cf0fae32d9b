/**
 * What a planner reviews: the draft and the approved version of a series with their adjusted
 * numbers and local daily peaks, the actuals so far over the same window, and how the two differ.
 */
import type {
  ForecastReview,
  ForecastSeries,
  ForecastVersion,
  ForecastVersionDetail,
  ForecastVersionPage,
  ForecastVersionSummary,
  ForecastVersionsQuery,
} from '@loadwright/contracts';
import { HttpProblem } from '@loadwright/problems';
import { adjustPoints } from './adjustment-layer';
import { dailyPeaks, type TimedValue } from './daily-peaks';
import {
  actualsBetween,
  adjustmentsOf,
  currentVersions,
  findSeries,
  pointsOf,
  versionHistory,
  versionsById,
  type AdjustmentRow,
  type PointRow,
  type Reader,
  type VersionRow,
} from './forecast-repository';
import { compareVersions } from './version-comparison';

const hourMs = 3_600_000;

/** End (exclusive) of a version's last interval. */
export function versionEnd(row: Pick<VersionRow, 'origin' | 'horizonHours'>): Date {
  return new Date(row.origin.getTime() + row.horizonHours * hourMs);
}

/** A version row as the summary contract shows it. */
export function toSummary(row: VersionRow): ForecastVersionSummary {
  const iso = (date: Date | null) => date?.toISOString() ?? null;
  return {
    id: row.id,
    seriesId: row.seriesId,
    state: row.state,
    issuedAt: row.issuedAt.toISOString(),
    origin: row.origin.toISOString(),
    end: versionEnd(row).toISOString(),
    horizonHours: row.horizonHours,
    levels: row.levels,
    warnings: row.warnings,
    refitRunId: row.refitRunId,
    approvedAt: iso(row.approvedAt),
    approvedBy: row.approvedById !== null && row.approvedByName !== null ? { id: row.approvedById, name: row.approvedByName } : null,
    supersededAt: iso(row.supersededAt),
    fit: { ...row.fit, dataStart: row.fit.dataStart.toISOString(), dataEnd: row.fit.dataEnd.toISOString() },
    adjustmentCount: row.adjustmentCount,
  };
}

/** The value that counts at each point: adjusted mean where adjusted, else the model's mean. */
export function effectiveValues(points: readonly PointRow[], adjustments: readonly AdjustmentRow[]): TimedValue[] {
  const adjusted = adjustPoints(points, adjustments);
  return points.map((point, i) => ({ ts: point.ts, value: adjusted[i]?.mean ?? point.mean }));
}

/** A whole version: points with their adjusted bands, adjustments and local daily peaks. */
export function toVersion(
  row: VersionRow,
  points: readonly PointRow[],
  adjustments: readonly AdjustmentRow[],
  seriesRow: ForecastSeries,
): ForecastVersion {
  const adjusted = adjustPoints(points, adjustments);
  const effective = points.map((point, i) => ({ ts: point.ts, value: adjusted[i]?.mean ?? point.mean }));
  return {
    ...toSummary(row),
    adjustments: adjustments.map((adjustment) => ({
      id: adjustment.id,
      versionId: adjustment.versionId,
      from: adjustment.periodStart.toISOString(),
      to: adjustment.periodEnd.toISOString(),
      kind: adjustment.kind,
      amount: adjustment.amount,
      reason: adjustment.reason,
      createdBy:
        adjustment.createdById !== null && adjustment.createdByName !== null
          ? { id: adjustment.createdById, name: adjustment.createdByName }
          : null,
      createdAt: adjustment.createdAt.toISOString(),
      intervals: points.filter((point) => adjustment.periodStart <= point.ts && point.ts < adjustment.periodEnd).length,
    })),
    points: points.map((point, i) => ({
      ts: point.ts.toISOString(),
      mean: point.mean,
      stdError: point.stdError,
      lower80: point.lower80,
      upper80: point.upper80,
      lower95: point.lower95,
      upper95: point.upper95,
      adjusted: adjusted[i] ?? null,
    })),
    dailyPeaks: dailyPeaks(effective, seriesRow.timeZone, seriesRow.intervalMinutes),
  };
}

/** Loads points and adjustments for rows and builds whole versions. */
async function loadVersions(
  db: Reader,
  rows: VersionRow[],
  seriesRow: ForecastSeries,
): Promise<{ version: ForecastVersion; effective: TimedValue[] }[]> {
  const ids = rows.map((row) => row.id);
  const [points, adjustments] = await Promise.all([pointsOf(db, ids), adjustmentsOf(db, ids)]);
  return rows.map((row) => ({
    version: toVersion(row, points.get(row.id)!, adjustments.get(row.id)!, seriesRow),
    effective: effectiveValues(points.get(row.id)!, adjustments.get(row.id)!),
  }));
}

/** The review of one series: draft, approved, actuals over their window, and the comparison. */
export async function reviewForecast(db: Reader, seriesId: number): Promise<ForecastReview> {
  const seriesRow = await findSeries(db, seriesId);
  if (!seriesRow) throw new HttpProblem('notFound', `No series with id ${seriesId}.`);
  const rows = await currentVersions(db, [seriesId]);
  const loaded = await loadVersions(db, rows, seriesRow);
  const draft = loaded.find((entry) => entry.version.state === 'draft') ?? null;
  const approved = loaded.find((entry) => entry.version.state === 'approved') ?? null;

  let actuals: ForecastReview['actuals'] = { from: null, to: null, points: [], dailyPeaks: [] };
  if (rows.length > 0) {
    const from = new Date(Math.min(...rows.map((row) => row.origin.getTime())));
    const to = new Date(Math.max(...rows.map((row) => versionEnd(row).getTime())));
    const readings = await actualsBetween(db, seriesId, from, to);
    actuals = {
      from: from.toISOString(),
      to: to.toISOString(),
      points: readings.map((reading) => ({ ts: reading.ts.toISOString(), value: reading.value, estimated: reading.estimated })),
      dailyPeaks: dailyPeaks(readings, seriesRow.timeZone, seriesRow.intervalMinutes),
    };
  }

  return {
    series: seriesRow,
    draft: draft?.version ?? null,
    approved: approved?.version ?? null,
    actuals,
    comparison:
      draft && approved ? compareVersions(draft.effective, approved.effective, seriesRow.timeZone, seriesRow.intervalMinutes) : null,
  };
}

/** One version in full with its series. */
export async function versionDetail(db: Reader, versionId: number): Promise<ForecastVersionDetail> {
  const [row] = await versionsById(db, [versionId]);
  if (!row) throw new HttpProblem('notFound', `No forecast version with id ${versionId}.`);
  const seriesRow = (await findSeries(db, row.seriesId))!;
  const [loaded] = await loadVersions(db, [row], seriesRow);
  return { series: seriesRow, version: loaded!.version };
}

/** A page of a series' version history, newest first. */
export async function versionPage(db: Reader, seriesId: number, query: ForecastVersionsQuery): Promise<ForecastVersionPage> {
  if (!(await findSeries(db, seriesId))) throw new HttpProblem('notFound', `No series with id ${seriesId}.`);
  const rows = await versionHistory(db, seriesId, query);
  return { versions: rows.map(toSummary), nextBefore: rows.length === query.limit ? rows.at(-1)!.id : null };
}
