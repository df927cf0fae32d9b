import {
  type DailyPeak,
  type ForecastReview,
  type ForecastVersion,
  type QualityFlagName,
  type ReadingHistory,
  type FittedMethod,
  effectiveMean,
  modelMethodLabels,
  qualityFlagLabels,
  qualityFlagNames,
} from '@loadwright/contracts';

/** One chart point: epoch milliseconds and a value (null breaks the line). */
export interface XY {
  readonly x: number;
  readonly y: number | null;
}

/** Readings of one quality flag, drawn as markers over the history line. */
export interface FlagMarkers {
  readonly flag: QualityFlagName;
  readonly label: string;
  readonly points: XY[];
}

/** The history chart's data: the values to use, and the flagged ones by flag. */
export interface HistoryChartData {
  readonly line: XY[];
  readonly markers: FlagMarkers[];
}

/** Flags drawn as markers; `missing` rows show as estimates and `estimated` says so already. */
const markedFlags: QualityFlagName[] = qualityFlagNames.filter((flag) => flag !== 'missing');

/**
 * The values to chart from a history answer: each reading's value to use (the estimate where there is
 * one, else the raw reading), or each bucket's mean of those; and, per flag, the flagged points. A raw
 * value that was replaced (a spike, a negative reading) is marked where it was, so the planner sees it.
 */
export function historyChartData(history: ReadingHistory): HistoryChartData {
  const line: XY[] = [];
  const byFlag = new Map<QualityFlagName, XY[]>();
  const rows =
    history.resolution === 'interval'
      ? history.points.map((p) => ({ ts: p.ts, used: p.estimated ?? p.value, marked: p.value ?? p.estimated, flags: p.flags }))
      : history.buckets.map((b) => ({ ts: b.ts, used: b.meanUsed, marked: b.meanUsed, flags: b.flags }));
  for (const row of rows) {
    const x = Date.parse(row.ts);
    line.push({ x, y: row.used });
    for (const flag of row.flags) {
      if (!markedFlags.includes(flag) || row.marked === null) continue;
      const list = byFlag.get(flag) ?? [];
      list.push({ x, y: row.marked });
      byFlag.set(flag, list);
    }
  }
  const markers = markedFlags
    .filter((flag) => byFlag.has(flag))
    .map((flag) => ({ flag, label: qualityFlagLabels[flag], points: byFlag.get(flag)! }));
  return { line, markers };
}

/** The fan chart's data: actuals, the version under review with its bands, the approved mean, and adjustments. */
export interface FanChartData {
  readonly actuals: XY[];
  /** The model's mean of the version under review (the draft, or the approved one when there is no draft). */
  readonly mean: XY[];
  /** The adjusted mean where a planner adjusted the version under review; null elsewhere. */
  readonly adjusted: XY[];
  readonly lower80: XY[];
  readonly upper80: XY[];
  readonly lower95: XY[];
  readonly upper95: XY[];
  /** The approved version's mean (adjusted where adjusted), when a draft is under review beside it. */
  readonly approved: XY[];
  readonly hasAdjustments: boolean;
}

/** The version a planner is reviewing: the draft if there is one, else the one in force. */
export function reviewedVersion(review: ForecastReview): ForecastVersion | null {
  return review.draft ?? review.approved;
}

/** Builds the fan chart's lines; bands are the numbers that count (adjusted where adjusted). */
export function fanChartData(review: ForecastReview): FanChartData {
  const version = reviewedVersion(review);
  const points = version?.points ?? [];
  const at = (ts: string) => Date.parse(ts);
  const band = (pick: 'lower80' | 'upper80' | 'lower95' | 'upper95') => points.map((p) => ({ x: at(p.ts), y: (p.adjusted ?? p)[pick] }));
  return {
    actuals: review.actuals.points.map((p) => ({ x: at(p.ts), y: p.value })),
    mean: points.map((p) => ({ x: at(p.ts), y: p.mean })),
    adjusted: points.map((p) => ({ x: at(p.ts), y: p.adjusted?.mean ?? null })),
    lower80: band('lower80'),
    upper80: band('upper80'),
    lower95: band('lower95'),
    upper95: band('upper95'),
    approved: review.draft && review.approved ? review.approved.points.map((p) => ({ x: at(p.ts), y: effectiveMean(p) })) : [],
    hasAdjustments: points.some((p) => p.adjusted !== null),
  };
}

/** One local day in the peaks table: the draft's and the approved version's peak, and how they differ. */
export interface PeakRow {
  readonly date: string;
  readonly draft: DailyPeak | null;
  readonly approved: DailyPeak | null;
  readonly actual: DailyPeak | null;
  readonly difference: number | null;
  readonly differencePercent: number | null;
  readonly peakShiftMinutes: number | null;
}

/** Peaks per local day of the draft, the approved version and the actuals so far, in date order. */
export function peakRows(review: ForecastReview): PeakRow[] {
  const dates = new Set<string>();
  const byDate = (peaks: readonly DailyPeak[] | undefined) =>
    new Map((peaks ?? []).map((peak) => (dates.add(peak.date), [peak.date, peak])));
  const draft = byDate(review.draft?.dailyPeaks);
  const approved = byDate(review.approved?.dailyPeaks);
  const actual = new Map(review.actuals.dailyPeaks.map((peak) => [peak.date, peak]));
  const compared = new Map((review.comparison?.dailyPeaks ?? []).map((row) => [row.date, row]));
  return [...dates].sort().map((date) => ({
    date,
    draft: draft.get(date) ?? null,
    approved: approved.get(date) ?? null,
    actual: actual.get(date) ?? null,
    difference: compared.get(date)?.difference ?? null,
    differencePercent: compared.get(date)?.differencePercent ?? null,
    peakShiftMinutes: compared.get(date)?.peakShiftMinutes ?? null,
  }));
}

/** "+1 h 30 min later", "15 min earlier", "same time". */
export function peakShiftText(minutes: number | null): string {
  if (minutes === null) return '—';
  if (minutes === 0) return 'same time';
  const size = Math.abs(minutes);
  const text = size >= 60 ? `${Math.floor(size / 60)} h${size % 60 ? ` ${size % 60} min` : ''}` : `${size} min`;
  return `${text} ${minutes > 0 ? 'later' : 'earlier'}`;
}

/** The highest peak of a version over its horizon, by local day (the version's own daily peaks). */
export function horizonPeak(version: Pick<ForecastVersion, 'dailyPeaks'> | null): DailyPeak | null {
  if (!version?.dailyPeaks.length) return null;
  return version.dailyPeaks.reduce((best, peak) => (peak.value > best.value ? peak : best));
}

/** Database names of fitted methods, mapped to the contract's names. */
const storedMethodNames: Readonly<Record<string, FittedMethod>> = {
  yule_walker: 'yule-walker',
  conditional_mle: 'cmle',
  nls_arma: 'nls',
  ridge_ar: 'ridge',
  lasso_ar: 'lasso',
  seasonal_naive: 'seasonal-naive',
};

/** A fit's method in words, whether named as the database or as the contract names it. */
export function methodName(method: string): string {
  const known = (storedMethodNames[method] ?? method) as FittedMethod;
  return modelMethodLabels[known] ?? method;
}

/**
 * The tooltip line of a filled band: its name with both bounds, "Draft: 80 % interval: 812 – 947 kW",
 * so the planner reads the interval rather than only its upper edge. Names drop the fill hint.
 */
export function bandTooltipText(bandLabel: string, lower: number | null, upper: number | null, format: (value: number) => string): string {
  const name = bandLabel.replace(/ \((light|darker) fill\)$/, '');
  if (lower === null || upper === null) return `${name}: —`;
  return `${name}: ${format(lower)} – ${format(upper)}`;
}

/** The highest interval of a version still ahead: its start (UTC) and value (adjusted where adjusted). */
export interface PeakAhead {
  readonly ts: string;
  readonly value: number;
  /** Hours of the version still ahead when it was read (0 when the whole horizon has passed). */
  readonly hoursAhead: number;
}

/**
 * The peak over the hours of a version that have not ended yet at `now` (an interval ending after
 * `now` counts, so the hour under way does); null when every hour has passed. A peak that already
 * happened is no warning of what is to come.
 */
export function peakAhead(
  version: Pick<ForecastVersion, 'points'> | null,
  intervalMinutes: number,
  now: Date = new Date(),
): PeakAhead | null {
  if (!version) return null;
  const intervalMs = intervalMinutes * 60_000;
  const ahead = version.points.filter((point) => Date.parse(point.ts) + intervalMs > now.getTime());
  if (!ahead.length) return null;
  const best = ahead.reduce((top, point) => (effectiveMean(point) > effectiveMean(top) ? point : top));
  return { ts: best.ts, value: effectiveMean(best), hoursAhead: Math.round((ahead.length * intervalMs) / 3_600_000) };
}
