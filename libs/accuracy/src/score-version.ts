/**
 * Scoring one forecast version: every hour it forecast that now has an actual becomes a ScoredHour,
 * with its horizon, local day and day type, the seasonal-naive benchmark and the version's MASE scale.
 */
import { localClock } from '@loadwright/forecasts';
import { dayTypeOf } from './day-type';
import type { ScoredHour } from './scored-hour';
import { seasonalNaiveAt, seasonalNaiveScale } from './seasonal-naive-scale';

const hourMs = 3_600_000;

/** A version as scoring needs it. */
export interface VersionToScore {
  id: number;
  origin: Date;
  horizonHours: number;
}

/** One forecast hour of a version as handed on (after adjustments). */
export interface HandedOnHour {
  ts: Date;
  mean: number;
  lower80: number;
  upper80: number;
  lower95: number;
  upper95: number;
}

/** Where the series' days begin and end. */
export interface ScoringCalendar {
  timeZone: string;
  /** Local dates of the holiday calendar (YYYY-MM-DD). */
  holidays: ReadonlySet<string>;
  /**
   * Local date and hour by instant, shared by the versions of one scoring: reading a zone's clock is the
   * dearest step, and each hour is forecast by up to seven versions.
   */
  clocks?: Map<number, { date: string; hour: number }>;
}

/** The local date and hour of instant `t`, read once per instant when a cache is given. */
function localHourOf(t: number, calendar: ScoringCalendar): { date: string; hour: number } {
  const cached = calendar.clocks?.get(t);
  if (cached) return cached;
  const clock = localClock(t, calendar.timeZone);
  const local = { date: clock.date, hour: Number(clock.time.slice(0, 2)) };
  calendar.clocks?.set(t, local);
  return local;
}

/** The scored hours of `version`: its hours in [origin, origin + horizon) that have an actual, in time order. */
export function scoreVersion(
  version: VersionToScore,
  hours: readonly HandedOnHour[],
  actuals: ReadonlyMap<number, number>,
  calendar: ScoringCalendar,
): ScoredHour[] {
  const originMs = version.origin.getTime();
  const endMs = originMs + version.horizonHours * hourMs;
  const scale = seasonalNaiveScale(actuals, originMs);
  const scored: ScoredHour[] = [];
  for (const hour of [...hours].sort((a, b) => a.ts.getTime() - b.ts.getTime())) {
    const t = hour.ts.getTime();
    const actual = actuals.get(t);
    if (actual === undefined || t < originMs || t >= endMs) continue;
    const clock = localHourOf(t, calendar);
    scored.push({
      versionId: version.id,
      ts: hour.ts,
      horizon: Math.round((t - originMs) / hourMs) + 1,
      localDate: clock.date,
      localHour: clock.hour,
      dayType: dayTypeOf(clock.date, calendar.holidays),
      actual,
      forecast: hour.mean,
      naive: seasonalNaiveAt(actuals, originMs, t),
      scale,
      lower80: hour.lower80,
      upper80: hour.upper80,
      lower95: hour.lower95,
      upper95: hour.upper95,
    });
  }
  return scored;
}
