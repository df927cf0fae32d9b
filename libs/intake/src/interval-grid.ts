/**
 * The grid of interval instants a series' readings must sit on, numbered so that consecutive
 * intervals have consecutive indexes. Sub-daily grids are fixed steps in UTC, aligned to the zone's
 * standard offset (so a 60-minute grid in a UTC+05:30 zone sits on the local hour); the daily grid is
 * local midnights, whose UTC steps are 23, 24 or 25 hours across daylight-saving changes.
 */
import { instantsForWallClock, offsetMsAt } from './time-zone-offset';

const minuteMs = 60_000;
const dayMs = 86_400_000;

/** Interval instants of one series. */
export interface IntervalGrid {
  /** Interval length in minutes (1440 for daily). */
  readonly intervalMinutes: number;
  /** Grid index of an instant; not a whole number when the instant is off the grid. */
  indexOf(ms: number): number;
  /** The instant of a grid index. */
  instantOf(index: number): number;
}

/** The grid for an interval length and time zone. */
export function intervalGrid(intervalMinutes: number, timeZone = 'UTC'): IntervalGrid {
  if (intervalMinutes >= 1440) {
    return {
      intervalMinutes,
      indexOf: (ms) => (ms + offsetMsAt(timeZone, ms)) / dayMs,
      instantOf: (index) => instantsForWallClock(timeZone, index * dayMs)[0] ?? index * dayMs - offsetMsAt(timeZone, index * dayMs),
    };
  }
  const stepMs = intervalMinutes * minuteMs;
  // Standard offset: the smaller of the January and July offsets (daylight time is the larger one).
  const year = new Date().getUTCFullYear();
  const standard = Math.min(offsetMsAt(timeZone, Date.UTC(year, 0, 1)), offsetMsAt(timeZone, Date.UTC(year, 6, 1)));
  const origin = -(((standard % stepMs) + stepMs) % stepMs);
  return {
    intervalMinutes,
    indexOf: (ms) => (ms - origin) / stepMs,
    instantOf: (index) => origin + index * stepMs,
  };
}
