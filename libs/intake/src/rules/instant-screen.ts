/**
 * Readings that cannot be stored at their instant: off the series' interval grid (a 10:07 reading
 * in an hourly series), or in the future (a meter clock running ahead). Both are dropped with a
 * finding; the rest of the upload goes on.
 */
import type { Finding } from '../findings';
import type { IntervalGrid } from '../interval-grid';
import { pickReadings, type SeriesReadings } from '../series-readings';

/** Readings on the grid and not in the future, and findings for the others. Pure. */
export function screenInstants(
  source: SeriesReadings,
  seriesId: number,
  grid: IntervalGrid,
  nowMs: number,
): { readings: SeriesReadings; findings: Finding[] } {
  const kept: number[] = [];
  const findings: Finding[] = [];
  for (let i = 0; i < source.length; i++) {
    const ts = source.ts[i]!;
    const index = grid.indexOf(ts);
    const base = { seriesId, tsMs: ts, value: source.values[i]!, sourceRow: source.sourceRows[i] || null };
    if (Math.abs(index - Math.round(index)) > 1e-9) {
      findings.push({
        rule: 'off_grid',
        ...base,
        detail: { intervalMinutes: grid.intervalMinutes, nearest: new Date(grid.instantOf(Math.round(index))).toISOString() },
      });
    } else if (ts > nowMs) {
      findings.push({ rule: 'future', ...base, detail: { now: new Date(nowMs).toISOString() } });
    } else {
      kept.push(i);
    }
  }
  if (kept.length === source.length) return { readings: source, findings };
  return { readings: pickReadings(source, kept), findings };
}
