/**
 * Turns a Green Button meter reading into a load series' readings: energy per interval becomes mean
 * demand over the interval (W = Wh × 3600 / duration in seconds), demand is taken as given, and both
 * are converted to the series' unit. Interval starts are UTC instants already, so no local time is
 * resolved; the feed's local time parameters are only recorded.
 */
import type { Series } from '@loadwright/db';
import type { IntervalReading } from '../import-service';
import { unitConverter } from '../unit-conversion';
import { GreenButtonFormatError, type GreenButtonUsage } from './parse-green-button';

const secondsPerHour = 3600;

/** The series' readings from a parsed feed. */
export function greenButtonReadings(usage: GreenButtonUsage, series: Series): IntervalReading[] {
  if (series.kind !== 'load')
    throw new GreenButtonFormatError(
      `${series.key} is a ${series.kind} series; Green Button files hold electricity usage, which goes into a load series.`,
    );
  const expectedSeconds = series.intervalMinutes * 60;
  const odd = usage.intervals.find((interval) => interval.durationSeconds !== expectedSeconds);
  if (odd) {
    throw new GreenButtonFormatError(
      `The file's intervals are ${odd.durationSeconds} s (${odd.durationSeconds / 60} minutes) long, starting ${new Date(odd.startSeconds * 1000).toISOString()}; ${series.key} takes ${series.intervalMinutes}-minute readings.`,
    );
  }
  const toSeriesUnit = unitConverter('W', series.unit);
  const isEnergy = usage.readingType.uom === 72;
  return usage.intervals.map((interval) => {
    const watts = isEnergy ? (interval.value * secondsPerHour) / interval.durationSeconds : interval.value;
    return { ts: new Date(interval.startSeconds * 1000), value: toSeriesUnit(watts) };
  });
}
