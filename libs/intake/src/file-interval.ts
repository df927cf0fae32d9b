/**
 * The interval a file's readings cover, against the interval its series stores. A file may be finer
 * than its series when the series' interval is a whole number of the file's (four 15-minute readings
 * make an hour, whose stored value is their mean demand); it may never be coarser, since one reading
 * cannot be split across intervals without inventing the shape inside it.
 */
import type { CatalogueEntry } from './catalogue-entry';

/** Minutes each of the file's readings covers for this series, or the sentence saying why it does not fit. */
export function readingMinutesFor(series: Pick<CatalogueEntry, 'key' | 'intervalMinutes'>, fileMinutes: number | null): number | string {
  const seriesMinutes = series.intervalMinutes;
  if (fileMinutes === null || fileMinutes === seriesMinutes) return seriesMinutes;
  if (fileMinutes > seriesMinutes)
    return `the file holds one reading every ${every(fileMinutes)} but series "${series.key}" stores one every ${every(seriesMinutes)}, and a reading is never split across intervals; upload it into a series of ${spell(fileMinutes)} intervals`;
  if (seriesMinutes % fileMinutes !== 0)
    return `the file holds one reading every ${every(fileMinutes)}, which does not divide the ${spell(seriesMinutes)} intervals of series "${series.key}"`;
  return fileMinutes;
}

/** "15-minute", "1-hour", "1-day": an interval length as an adjective. */
export function spell(minutes: number): string {
  if (minutes % 1440 === 0) return `${minutes / 1440}-day`;
  if (minutes % 60 === 0) return `${minutes / 60}-hour`;
  return `${minutes}-minute`;
}

/** "15 minutes", "hour", "day": what follows "every". */
export function every(minutes: number): string {
  if (minutes === 1440) return 'day';
  if (minutes === 60) return 'hour';
  if (minutes % 1440 === 0) return `${minutes / 1440} days`;
  if (minutes % 60 === 0) return `${minutes / 60} hours`;
  return minutes === 1 ? 'minute' : `${minutes} minutes`;
}
