/**
 * Readings finer than their series, combined into the series' intervals: a 60-minute interval holds
 * four 15-minute readings, whose mean is the interval's mean demand (each reading is already a mean
 * demand over its own 15 minutes, or was converted to one from energy). An interval is stored only
 * when every one of its readings is there; one the file covers in part is left out with a
 * `partial_interval` finding, since a mean of what is there would pass a part for the whole. A
 * daily interval holds 23, 24 or 25 hourly readings across daylight-saving changes. Duplicates are
 * collapsed first (see rules/duplicates.ts); a reading off the file's own grid is dropped `off_grid`.
 */
import type { Finding } from './findings';
import type { IntervalGrid } from './interval-grid';
import { ReadingColumns } from './reading-columns';
import { collapseDuplicates } from './rules/duplicates';
import type { SeriesReadings } from './series-readings';

/** Significant digits a combined mean keeps (as a converted value does, see csv/units.ts). */
const meanDigits = 12;

/** The combined readings, findings on what was dropped, and how many file readings were dropped. */
export interface CombinedReadings {
  readings: ReadingColumns;
  findings: Finding[];
  dropped: number;
}

/** Combines `source` (readings every `fileMinutes`) into the intervals of `grid`. Pure. */
export function combineIntervals(source: SeriesReadings, seriesId: number, grid: IntervalGrid, fileMinutes: number): CombinedReadings {
  const { readings: sorted, findings } = collapseDuplicates(source, seriesId);
  let dropped = source.length - sorted.length;
  const stepMs = fileMinutes * 60_000;
  const combined = new ReadingColumns(Math.max(1, Math.ceil(sorted.length / Math.max(1, grid.intervalMinutes / fileMinutes))));
  let bucket = Number.NaN;
  let start = 0;
  let needed = 0;
  let sum = 0;
  let count = 0;
  let firstRow = 0;
  let flags = 0;
  const close = () => {
    if (count === 0) return;
    if (count === needed) {
      combined.push(start, Number((sum / count).toPrecision(meanDigits)), firstRow, flags);
    } else {
      dropped += count;
      findings.push({
        rule: 'partial_interval',
        seriesId,
        tsMs: start,
        value: null,
        sourceRow: firstRow || null,
        detail: { readings: count, needed, fileIntervalMinutes: fileMinutes, intervalMinutes: grid.intervalMinutes },
      });
    }
  };
  for (let i = 0; i < sorted.length; i++) {
    const ts = sorted.ts[i]!;
    const index = Math.floor(grid.indexOf(ts) + 1e-9);
    if (index !== bucket) {
      close();
      bucket = index;
      start = grid.instantOf(index);
      needed = Math.round((grid.instantOf(index + 1) - start) / stepMs);
      sum = 0;
      count = 0;
      firstRow = sorted.sourceRows[i]!;
      flags = 0;
    }
    const slot = (ts - start) / stepMs;
    if (Math.abs(slot - Math.round(slot)) > 1e-9) {
      dropped++;
      findings.push({
        rule: 'off_grid',
        seriesId,
        tsMs: ts,
        value: sorted.values[i]!,
        sourceRow: sorted.sourceRows[i] || null,
        detail: { intervalMinutes: fileMinutes, nearest: new Date(start + Math.round(slot) * stepMs).toISOString() },
      });
      continue;
    }
    sum += sorted.values[i]!;
    count++;
    flags |= sorted.flags[i]!;
  }
  close();
  return { readings: combined, findings, dropped };
}
