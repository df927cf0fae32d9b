/**
 * Runs the validation, estimation and editing rules over one series' readings (sorted, one per
 * instant, on the grid) and returns the rows to store and the findings. Pure: the caller supplies
 * which grid intervals already hold stored readings.
 *
 * Editing policy: raw values are never changed. A reading flagged as a spike, negative or
 * impossible keeps its raw value and gets an estimate by linear interpolation between the nearest
 * clean readings at most `maxEstimateReach` intervals away on each side (flagged `estimated`). A gap
 * of at most `maxEstimatedGap` intervals between two clean readings gets rows with no raw value
 * and a linear estimate (flagged `missing` and `estimated`); longer gaps are reported only.
 */
import { qualityFlag } from '@loadwright/db';
import type { Finding } from './findings';
import type { IntervalGrid } from './interval-grid';
import { flatLineLimit, flatRuns } from './rules/flat-lines';
import { findGaps } from './rules/gaps';
import { hampelDefaults } from './rules/hampel-spikes';
import { isNegativeLoad, possibleRange, type BoundsSubject } from './rules/physical-bounds';
import { shapeDefaults, shapeSpikes } from './rules/shape-spikes';
import { offsetMsAt } from './time-zone-offset';
import type { SeriesReadings } from './series-readings';

/** Rows ready to store: value NaN where there is no raw reading, estimated NaN where none. */
export interface ObservationRows {
  ts: Float64Array;
  values: Float64Array;
  estimated: Float64Array;
  quality: Uint16Array;
  length: number;
}

/** Settings of one validation run. */
export interface ValidateOptions extends BoundsSubject {
  seriesId: number;
  grid: IntervalGrid;
  /** Grid indexes that already hold a stored raw reading. */
  stored?: ReadonlySet<number>;
  /** Longest gap filled by an estimate, in intervals (default 3; 0 turns gap filling off). */
  maxEstimatedGap?: number;
  /** Farthest a clean neighbour may lie from a replaced reading, in intervals (default 3). */
  maxEstimateReach?: number;
  /** IANA zone of the series: the spike rule compares readings at the same local time of day (default UTC). */
  timeZone?: string;
}

/** Quality bits that make a raw value unusable for models and neighbours' estimates. */
const unusable = qualityFlag.spike | qualityFlag.negative | qualityFlag.impossible;

/** Validates one series' readings; see the file comment for the policy. */
export function validateSeries(readings: SeriesReadings, options: ValidateOptions): { rows: ObservationRows; findings: Finding[] } {
  const { seriesId, grid } = options;
  const n = readings.length;
  const maxGap = options.maxEstimatedGap ?? 3;
  const reach = options.maxEstimateReach ?? 3;
  const values = readings.values.subarray(0, n);
  const gridIndex = new Float64Array(n);
  for (let i = 0; i < n; i++) gridIndex[i] = Math.round(grid.indexOf(readings.ts[i]!));
  const quality = new Uint16Array(readings.flags.subarray(0, n));
  const estimated = new Float64Array(n).fill(Number.NaN);
  const findings: Finding[] = [];
  const finding = (rule: Finding['rule'], i: number, detail: Record<string, unknown>) =>
    findings.push({ rule, seriesId, tsMs: readings.ts[i]!, value: values[i]!, sourceRow: readings.sourceRows[i] || null, detail });

  const range = possibleRange(options, values, n);
  for (let i = 0; i < n; i++) {
    if (isNegativeLoad(options, values[i]!)) {
      quality[i]! |= qualityFlag.negative;
      finding('negative', i, {});
    } else if (range && (values[i]! < range.low || values[i]! > range.high)) {
      quality[i]! |= qualityFlag.impossible;
      finding('impossible', i, { low: Number.isFinite(range.low) ? range.low : null, high: range.high });
    }
  }
  const stepMs = grid.intervalMinutes * 60_000;
  const zone = options.timeZone ?? 'UTC';
  const stepsEast = (g: number) => offsetMsAt(zone, grid.instantOf(g)) / stepMs;
  for (const i of shapeSpikes(values, gridIndex, n, grid.intervalMinutes, stepsEast)) {
    if (quality[i]! & unusable) continue;
    quality[i]! |= qualityFlag.spike;
    finding('spike', i, {
      method: 'Hampel identifier against the daily and weekly shape',
      ...hampelDefaults,
      shapeDays: shapeDefaults.days,
      shapeWeeks: shapeDefaults.weeks,
    });
  }
  const flatLimit = flatLineLimit(options.kind, grid.intervalMinutes);
  for (const run of flatRuns(values, gridIndex, n, flatLimit)) {
    // One finding per run, at its first reading: the steward acts on the run, not on each reading in it.
    for (let i = run.start; i <= run.end; i++) quality[i]! |= qualityFlag.flatLine;
    finding('flat_line', run.start, {
      runIntervals: run.end - run.start + 1,
      runHours: ((run.end - run.start + 1) * grid.intervalMinutes) / 60,
      until: new Date(readings.ts[run.end]!).toISOString(),
      limitIntervals: flatLimit,
    });
  }

  const clean = (i: number) => (quality[i]! & (unusable | qualityFlag.flatLine)) === 0;
  for (let i = 0; i < n; i++) {
    if (!(quality[i]! & unusable)) continue;
    let left = i - 1;
    while (left >= 0 && !clean(left) && gridIndex[i]! - gridIndex[left]! <= reach) left--;
    let right = i + 1;
    while (right < n && !clean(right) && gridIndex[right]! - gridIndex[i]! <= reach) right++;
    if (left < 0 || right >= n || !clean(left) || !clean(right)) continue;
    if (gridIndex[i]! - gridIndex[left]! > reach || gridIndex[right]! - gridIndex[i]! > reach) continue;
    estimated[i] = interpolate(gridIndex[left]!, values[left]!, gridIndex[right]!, values[right]!, gridIndex[i]!);
    quality[i]! |= qualityFlag.estimated;
    finding('estimated', i, { method: 'linear interpolation', replaces: ruleOf(quality[i]!), estimate: estimated[i] });
  }

  const gapTs: number[] = [];
  const gapEstimates: number[] = [];
  for (const gap of findGaps(gridIndex, n, options.stored)) {
    const fill = maxGap > 0 && gap.count <= maxGap && gap.bounded && clean(gap.before) && clean(gap.after);
    findings.push({
      rule: 'gap',
      seriesId,
      tsMs: grid.instantOf(gap.firstIndex),
      value: null,
      sourceRow: null,
      detail: { intervals: gap.count, until: new Date(grid.instantOf(gap.firstIndex + gap.count - 1)).toISOString(), estimated: fill },
    });
    if (!fill) continue;
    for (let index = gap.firstIndex; index < gap.firstIndex + gap.count; index++) {
      const estimate = interpolate(gridIndex[gap.before]!, values[gap.before]!, gridIndex[gap.after]!, values[gap.after]!, index);
      const ts = grid.instantOf(index);
      gapTs.push(ts);
      gapEstimates.push(estimate);
      findings.push({
        rule: 'estimated',
        seriesId,
        tsMs: ts,
        value: null,
        sourceRow: null,
        detail: { method: 'linear interpolation', replaces: 'gap', gapIntervals: gap.count, estimate },
      });
    }
  }

  const total = n + gapTs.length;
  const rows: ObservationRows = {
    ts: new Float64Array(total),
    values: new Float64Array(total),
    estimated: new Float64Array(total),
    quality: new Uint16Array(total),
    length: total,
  };
  rows.ts.set(readings.ts.subarray(0, n));
  rows.values.set(values);
  rows.estimated.set(estimated);
  rows.quality.set(quality);
  for (let g = 0; g < gapTs.length; g++) {
    rows.ts[n + g] = gapTs[g]!;
    rows.values[n + g] = Number.NaN;
    rows.estimated[n + g] = gapEstimates[g]!;
    rows.quality[n + g] = qualityFlag.estimated | qualityFlag.missing;
  }
  return { rows, findings };
}

/** Straight line through (x0, y0) and (x1, y1), read at x; rounded to 6 decimals like a meter value. */
function interpolate(x0: number, y0: number, x1: number, y1: number, x: number): number {
  return Math.round((y0 + ((y1 - y0) * (x - x0)) / (x1 - x0)) * 1e6) / 1e6;
}

/** The rule an estimate replaces, for the finding. */
function ruleOf(quality: number): string {
  if (quality & qualityFlag.impossible) return 'impossible';
  if (quality & qualityFlag.negative) return 'negative';
  return 'spike';
}
