/** The hourly actual-against-forecast points every rule reads, and the evidence a miss keeps. */
import { normalQuantile } from '@loadwright/forecasting';
import type { LoadUnit } from './rule-kinds';

/** One hour of a series: the actual so far and the forecast in force for it. */
export interface HourPoint {
  /** Start of the hour (UTC instant). */
  ts: Date;
  /** Mean load over the hour, the steward's estimate where the raw reading was replaced; null when no actual arrived. */
  actual: number | null;
  /** True when any reading in the hour is an estimate rather than a raw value. */
  estimated: boolean;
  /** Forecast mean in force for the hour (after planners' adjustments); null when no version covers it. */
  forecast: number | null;
  stdError: number | null;
  lower80: number | null;
  upper80: number | null;
  lower95: number | null;
  upper95: number | null;
  /** The version in force for the hour. */
  versionId: number | null;
}

/** The series a rule is judged on. */
export interface SeriesFacts {
  unit: LoadUnit;
  timeZone: string;
}

/** One hour of a miss's evidence, as stored with the event and shown in e-mail. */
export interface EvidenceHour {
  ts: string;
  actual: number | null;
  forecast: number | null;
  lower: number | null;
  upper: number | null;
  /** Actual minus forecast. */
  error: number | null;
  /** |error| / actual × 100. */
  percentError: number | null;
  estimated: boolean;
  versionId: number | null;
}

/** One miss found by a rule: its period [start, end), the evidence and a one-line summary. */
export interface MissHit {
  start: Date;
  end: Date;
  evidence: EvidenceHour[];
  summary: string;
  /** The numbers the rule measured (e.g. peak error, tracking signal), by name. */
  measures: Record<string, number>;
}

export const hourMs = 3_600_000;

/** The hour's evidence, with the band the rule judged against. */
export function evidenceOf(point: HourPoint, band: { lower: number | null; upper: number | null } = bandAt(point, 95)): EvidenceHour {
  const error = point.actual !== null && point.forecast !== null ? point.actual - point.forecast : null;
  return {
    ts: point.ts.toISOString(),
    actual: point.actual,
    forecast: point.forecast,
    lower: band.lower,
    upper: band.upper,
    error,
    percentError: error !== null && point.actual ? (Math.abs(error) / Math.abs(point.actual)) * 100 : null,
    estimated: point.estimated,
    versionId: point.versionId,
  };
}

/**
 * The hour's band at `level` percent: the stored 80 % and 95 % bounds, or mean ± z·se for another
 * level, with z the standard normal quantile (the forecasts' own Gaussian intervals).
 */
export function bandAt(point: HourPoint, level: number): { lower: number | null; upper: number | null } {
  if (level === 95) return { lower: point.lower95, upper: point.upper95 };
  if (level === 80) return { lower: point.lower80, upper: point.upper80 };
  if (point.forecast === null || point.stdError === null) return { lower: null, upper: null };
  const z = normalQuantile(0.5 + level / 200);
  return { lower: point.forecast - z * point.stdError, upper: point.forecast + z * point.stdError };
}

/**
 * Maximal runs of consecutive hours (each exactly one hour after the one before) for which `breaks`
 * is true, of at least `k` hours. A missing hour or an hour that does not break ends a run.
 */
export function runsOf(points: readonly HourPoint[], k: number, breaks: (point: HourPoint) => boolean): HourPoint[][] {
  const sorted = [...points].sort((x, y) => x.ts.getTime() - y.ts.getTime());
  const runs: HourPoint[][] = [];
  let run: HourPoint[] = [];
  const close = () => {
    if (run.length >= k) runs.push(run);
    run = [];
  };
  for (const point of sorted) {
    const previous = run.at(-1);
    if (previous && point.ts.getTime() - previous.ts.getTime() !== hourMs) close();
    if (breaks(point)) run.push(point);
    else close();
  }
  close();
  return runs;
}

/** Formats a load with its unit, to one decimal. */
export function load(value: number, unit: LoadUnit): string {
  return `${value.toLocaleString('en-US', { maximumFractionDigits: 1, minimumFractionDigits: 1 })} ${unit}`;
}

/** "for 1 hour" or "for 3 hours in a row". */
export function forHours(n: number): string {
  return n === 1 ? 'for 1 hour' : `for ${n} hours in a row`;
}
