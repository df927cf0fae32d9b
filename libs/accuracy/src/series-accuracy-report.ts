/**
 * The accuracy report of one series, built from its stored scored hours: overall, by horizon, by day
 * type, by band kind and by version, daily peaks, and the recent days of actuals against the forecast
 * in force.
 */
import type { AccuracySummaryBody, SeriesAccuracy } from '@loadwright/contracts';
import { summariseAccuracy, type AccuracySummary } from './accuracy-summary';
import { dayPeakScores, summarisePeaks } from './day-peak-scores';
import { dayTypes } from './day-type';
import type { StoredScore } from './score-repository';

/** Versions listed with their own figures, newest origin first. */
export const listedVersions = 12;
/** Days of hourly actual against forecast drawn on the series page. */
export const recentDays = 7;

const hourMs = 3_600_000;

/** Groups items by a key, keeping first-seen order. */
function groupBy<T, K>(items: readonly T[], key: (item: T) => K): Map<K, T[]> {
  const groups = new Map<K, T[]>();
  for (const item of items) {
    const k = key(item);
    const group = groups.get(k);
    if (group) group.push(item);
    else groups.set(k, [item]);
  }
  return groups;
}

/** A summary of a group that is known to be non-empty. */
function summaryOf(rows: readonly StoredScore[]): AccuracySummaryBody {
  return summariseAccuracy(rows) as AccuracySummary;
}

/**
 * The forecast in force for an hour among the versions scored for it: the approved one with the latest
 * origin, else the draft with the latest origin (the rule miss detection judges by).
 */
export function inForce(rows: readonly StoredScore[]): StoredScore {
  const later = (a: StoredScore, b: StoredScore) =>
    b.origin.getTime() > a.origin.getTime() || (b.origin.getTime() === a.origin.getTime() && b.versionId > a.versionId);
  const approved = rows.filter((row) => row.approvedAt !== null);
  const pool = approved.length ? approved : rows;
  return pool.reduce((best, row) => (later(best, row) ? row : best));
}

/** The report over scored hours `rows` of [from, to). */
export function buildSeriesAccuracy(
  rows: readonly StoredScore[],
  context: { seriesId: number; unit: string; timeZone: string; from: Date; to: Date; days: number },
): SeriesAccuracy {
  const { seriesId, unit, timeZone } = context;
  const window = { from: context.from.toISOString(), to: context.to.toISOString(), days: context.days };
  const byHorizon = [...groupBy(rows, (row) => row.horizon)]
    .sort(([a], [b]) => a - b)
    .map(([horizon, group]) => ({ horizon, ...summaryOf(group) }));
  const dayTypeGroups = groupBy(rows, (row) => row.dayType);
  const byDayType = dayTypes.flatMap((dayType) => {
    const group = dayTypeGroups.get(dayType);
    return group ? [{ dayType, ...summaryOf(group) }] : [];
  });
  const byBandKind = [...groupBy(rows, (row) => row.bandKind)].map(([bandKind, group]) => ({
    bandKind,
    versions: new Set(group.map((row) => row.versionId)).size,
    ...summaryOf(group),
  }));
  const versions = [...groupBy(rows, (row) => row.versionId).values()]
    .sort((a, b) => b[0]!.origin.getTime() - a[0]!.origin.getTime() || b[0]!.versionId - a[0]!.versionId)
    .slice(0, listedVersions)
    .map((group) => {
      const first = group[0]!;
      return {
        id: first.versionId,
        state: first.state,
        bandKind: first.bandKind,
        origin: first.origin.toISOString(),
        horizonHours: first.horizonHours,
        summary: summaryOf(group),
        peaks: summarisePeaks(dayPeakScores(group)),
      };
    });
  const recentFrom = context.to.getTime() - recentDays * 24 * hourMs;
  const recentHours = [...groupBy(rows, (row) => row.ts.getTime())]
    .filter(([t]) => t >= recentFrom)
    .map(([, group]) => {
      const row = inForce(group);
      return {
        ts: row.ts.toISOString(),
        actual: row.actual,
        forecast: row.forecast,
        lower80: row.lower80,
        upper80: row.upper80,
        versionId: row.versionId,
      };
    });
  return {
    seriesId,
    unit,
    timeZone,
    window: rows.length ? window : null,
    overall: summariseAccuracy(rows),
    peaks: summarisePeaks(dayPeakScores(rows)),
    byHorizon,
    byDayType,
    byBandKind,
    versions,
    recentHours,
  };
}
