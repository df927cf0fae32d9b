/** One hour of one forecast version with its actual: the unit every accuracy figure is built from. */
import type { DayType } from './day-type';

/** A version's forecast of one hour beside what happened (as stored in forecast_hour_scores). */
export interface ScoredHour {
  versionId: number;
  /** Start of the hour (UTC instant). */
  ts: Date;
  /** Hours ahead of the version's origin, 1 for the origin hour. */
  horizon: number;
  /** Local calendar date and hour of day (0–23) in the series' time zone. */
  localDate: string;
  localHour: number;
  dayType: DayType;
  /** Mean load over the hour (the steward's estimate where a reading was replaced). */
  actual: number;
  /** The version's mean as handed on, after planners' adjustments. */
  forecast: number;
  /** Seasonal-naive forecast of the hour (same hour one week earlier); null when that actual is missing. */
  naive: number | null;
  /** The version's MASE scale; null when it could not be formed or is 0. */
  scale: number | null;
  lower80: number;
  upper80: number;
  lower95: number;
  upper95: number;
}
