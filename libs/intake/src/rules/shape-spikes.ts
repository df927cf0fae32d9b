/**
 * Spikes judged against the series' own daily and weekly shape. The Hampel identifier
 * (hampel-spikes.ts) sees only the readings beside one in time, so an ordinary morning peak that
 * rises steeply out of the night (3,011 kW at 07:00 beside 2,687 and 2,860) looks like a spike to
 * it. Here each reading is first compared with what the series reads at the same time of day on
 * the days around it, and the Hampel identifier judges those residuals instead of the raw values:
 *
 *     r_i = x_i − median{ x at the same time on days d ± 1, ±2, ±3 }
 *     spike when |r_i − median(r_W)| > k · 1.4826 · MAD(r_W), W the 2h + 1 residuals around i,
 *            and |x_i − median(x_V)| > k_local · 1.4826 · MAD(x_V), V the 2h + 1 readings around i,
 *     unless |x_i − median{ x at the same time of week in weeks ± 1, ±2 }| ≤ k · 1.4826 · MAD(r_W)
 *
 * The daily shape (a steep morning) leaves the residuals, and a day that runs hot or cold shifts its
 * residuals together, which the window's median absorbs; a spike stands out of both. The second
 * test asks that the reading also stand out from the readings beside it in time: a holiday morning
 * without its usual ramp is far from the profile but smooth in time, and is no spike. The weekly
 * test keeps a shape that belongs to the day of the week (a Sunday morning unlike the weekdays
 * around it). "The same time" is the same local time when the caller gives the zone's offsets, so
 * the days around a daylight-saving change line up. A daily series uses the days of the week as its
 * "time of day" (period 7) and has no weekly test.
 *
 * Conventions: 3 days and 2 weeks either side, h = 6 and k = 6 as for the Hampel identifier on
 * residuals, k_local = 3 (Pearson's usual threshold) in time; chosen with bench/intake/spike-rule.ts,
 * where k_local = 4 found a sixth fewer injected spikes, and the residual test alone flagged holiday
 * mornings: 78 false alarms in 280,300 clean readings. A profile needs at least 2 of its neighbours;
 * when fewer than half the readings have a daily
 * profile (a batch of a day or two), the shape cannot be judged and the Hampel identifier on the
 * raw readings decides. Measured in bench/intake/spike-rule.ts.
 *
 * References: the Hampel identifier as in hampel-spikes.ts; judging residuals from a seasonal
 * profile rather than raw values follows R. J. Hyndman and G. Athanasopoulos, Forecasting:
 * Principles and Practice (3rd ed., 2021), §3.4 (seasonal decomposition) and §5.3 (residual
 * diagnostics), with the median in place of the mean for robustness.
 */
import { hampelDefaults, hampelOutliers, madToSigma } from './hampel-spikes';

/** Days and weeks either side, and the threshold, used unless told otherwise (see Conventions). */
export const shapeDefaults = { days: 3, weeks: 2, k: 6, localK: 3 } as const;

/** Fewest neighbours a profile needs before it judges a reading. */
const fewestNeighbours = 2;

/** Positions of the readings that are spikes against the series' shape. Pure. */
export function shapeSpikes(
  values: Float64Array,
  gridIndex: Float64Array,
  length: number,
  intervalMinutes: number,
  stepsEastOfUtc?: (gridIndex: number) => number,
): number[] {
  const daily = intervalMinutes < 1440;
  const period = daily ? Math.round(1440 / intervalMinutes) : 7;
  const h = hampelDefaults.halfWindow;
  if (length < 2 * h + 1) return [];
  const first = gridIndex[0]!;
  const span = gridIndex[length - 1]! - first + 1;
  // A batch spread very thinly over a long span (a few readings years apart) is judged by Hampel alone.
  if (span > 8 * length + 100_000) return hampelOutliers(values, length);
  const positionAt = new Int32Array(span).fill(-1);
  for (let i = 0; i < length; i++) positionAt[gridIndex[i]! - first] = i;
  const valueAt = (g: number) => {
    const offset = g - first;
    if (offset < 0 || offset >= span) return Number.NaN;
    const position = positionAt[offset]!;
    return position < 0 ? Number.NaN : values[position]!;
  };
  // The zone's UTC offset in grid steps at each index of the span, so that "the same time of day"
  // stays the same local time across daylight-saving changes.
  let east: Float64Array | null = null;
  if (stepsEastOfUtc && daily) {
    east = new Float64Array(span);
    for (let k = 0; k < span; k++) east[k] = stepsEastOfUtc(first + k);
  }
  /** The grid index `by` steps from g at the same local time (by is whole days or weeks). */
  const sameLocalTime = (g: number, by: number) => {
    const naive = g + by;
    if (!east || naive < first || naive >= first + span) return naive;
    return naive + Math.round(east[g - first]! - east[naive - first]!);
  };
  const around = new Float64Array(2 * Math.max(shapeDefaults.days, shapeDefaults.weeks));
  /** Median of x at the same local time step·1..reach either side of g, or NaN with fewer than two present. */
  const profile = (g: number, step: number, reach: number) => {
    let count = 0;
    for (let k = 1; k <= reach; k++) {
      const before = valueAt(sameLocalTime(g, -k * step));
      const after = valueAt(sameLocalTime(g, k * step));
      if (!Number.isNaN(before)) around[count++] = before;
      if (!Number.isNaN(after)) around[count++] = after;
    }
    return count < fewestNeighbours ? Number.NaN : median(around.subarray(0, count).sort());
  };

  // Residuals from the daily profile, for the readings whose profile is known.
  const judged: number[] = [];
  const residuals: number[] = [];
  for (let i = 0; i < length; i++) {
    const expected = profile(gridIndex[i]!, period, shapeDefaults.days);
    if (Number.isNaN(expected)) continue;
    judged.push(i);
    residuals.push(values[i]! - expected);
  }
  // Too little history for a shape (a day or two): the Hampel identifier on the readings decides.
  if (judged.length < Math.max(2 * h + 1, length / 2)) return hampelOutliers(values, length);

  const r = Float64Array.from(residuals);
  const flagged: number[] = [];
  const window = new Float64Array(2 * h + 1);
  // A spike also stands out from the readings beside it in time, at Pearson's k = 3.
  const standsOut = new Set(hampelOutliers(values, length, { k: shapeDefaults.localK }));
  for (const j of hampelOutliers(r, r.length, { k: shapeDefaults.k })) {
    const i = judged[j]!;
    if (!standsOut.has(i)) continue;
    if (daily) {
      // The same time of week in the weeks around explains a weekly shape (a Sunday morning).
      const weekly = profile(gridIndex[i]!, 7 * period, shapeDefaults.weeks);
      if (!Number.isNaN(weekly)) {
        const from = Math.max(0, Math.min(j - h, r.length - window.length));
        for (let k = 0; k < window.length; k++) window[k] = r[from + k]!;
        window.sort();
        const centre = median(window);
        const deviations = window.map((value) => Math.abs(value - centre)).sort();
        if (Math.abs(values[i]! - weekly) <= shapeDefaults.k * madToSigma * median(deviations)) continue;
      }
    }
    flagged.push(i);
  }
  return flagged;
}

/** Median of sorted values. */
function median(sorted: Float64Array): number {
  const n = sorted.length;
  return n % 2 === 1 ? sorted[n >> 1]! : (sorted[(n >> 1) - 1]! + sorted[n >> 1]!) / 2;
}
