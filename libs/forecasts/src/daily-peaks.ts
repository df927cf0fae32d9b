/**
 * Daily peaks in local time: for each local calendar day of a series' time zone, the highest value
 * and the interval it starts at. Days at the edges of a forecast horizon are reported as incomplete.
 */
import type { DailyPeak, HorizonPeak } from '@loadwright/contracts';
import { formatOffset, intervalsInLocalDay, localClock } from './local-time';

/** A value at the start instant of its interval. */
export interface TimedValue {
  ts: Date;
  value: number;
}

/**
 * The peak of every local day the values touch, in date order. Ties go to the earlier interval, so a
 * flat plateau peaks where it starts.
 */
export function dailyPeaks(values: readonly TimedValue[], timeZone: string, intervalMinutes: number): DailyPeak[] {
  const byDate = new Map<string, { best: TimedValue; count: number }>();
  for (const point of values) {
    const { date } = localClock(point.ts, timeZone);
    const day = byDate.get(date);
    if (!day) byDate.set(date, { best: point, count: 1 });
    else {
      day.count++;
      if (point.value > day.best.value || (point.value === day.best.value && point.ts < day.best.ts)) day.best = point;
    }
  }
  return [...byDate.entries()]
    .sort(([a], [b]) => a.localeCompare(b))
    .map(([date, { best, count }]) => {
      const clock = localClock(best.ts, timeZone);
      return {
        date,
        ts: best.ts.toISOString(),
        localTime: clock.time.slice(0, 5),
        utcOffset: formatOffset(clock.offsetMinutes),
        value: best.value,
        intervals: count,
        complete: count >= intervalsInLocalDay(date, timeZone, intervalMinutes),
      };
    });
}

/** The highest value over all the values (earliest on a tie), with its local date and time; null for none. */
export function horizonPeak(values: readonly TimedValue[], timeZone: string): HorizonPeak | null {
  let best: TimedValue | null = null;
  for (const point of values) if (!best || point.value > best.value) best = point;
  if (!best) return null;
  const clock = localClock(best.ts, timeZone);
  return { ts: best.ts.toISOString(), date: clock.date, localTime: clock.time.slice(0, 5), value: best.value };
}
