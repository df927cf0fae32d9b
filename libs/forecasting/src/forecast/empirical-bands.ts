/**
 * Prediction bands calibrated on a series' own out-of-sample errors (split conformal with normalised
 * scores), by horizon band and hour of day.
 *
 * Scores: z = (y − ŷ) / s, the error of a rolling-origin forecast divided by the model's own standard
 * error at that horizon, on the modelling scale (log load for a model on logs). Normalising by s makes
 * one set of quantiles serve every horizon inside a band (locally weighted split conformal: Lei, G'Sell,
 * Rinaldo, Tibshirani & Wasserman 2018, JASA 113(523), §5.2; Papadopoulos et al. 2002 for the
 * normalised nonconformity score). The band at level L has lower and upper limits ŷ + q_lo·s and
 * ŷ + q_hi·s, with q_lo and q_hi the finite-sample conformal quantiles of the scores at α/2 and
 * 1 − α/2 (α = 1 − L/100): the ⌈(n + 1)(1 − α/2)⌉-th smallest score above and the ⌊(n + 1)·α/2⌋-th
 * smallest below (Lei et al. 2018, Lemma 2; separate tails, since load errors are skewed). Both are
 * finite only when n ≥ 2/α − 1, so a cell needs enough scores for the highest level.
 *
 * Cells: horizon bands 1–24, 25–48, 49–96, 97–168 hours (and beyond), each split into six 4-hour blocks
 * of the local hour of day; a cell with too few scores takes its horizon band's scores over all hours,
 * and a band with too few takes every score. Caveat: conformal coverage assumes exchangeable scores;
 * successive days of load are not, so the coverage is checked on held-out days (rolling-origin tests),
 * not promised.
 */
import { ForecastingError } from '../core/errors';
import type { PredictionInterval } from './intervals';

/** Upper ends (inclusive, hours ahead) of the horizon bands; the last is open. */
export const HORIZON_BANDS = [24, 48, 96, 168] as const;
/** Hours of day per block (six blocks). */
const BLOCK_HOURS = 4;
/** Fewest scores a cell may be calibrated on. */
export const MIN_CELL_SCORES = 80;

/** One rolling-origin error, normalised. */
export interface BandScore {
  /** Hours ahead, 1-based. */
  horizon: number;
  /** Local hour of day of the forecast hour, 0..23. */
  hourOfDay: number;
  /** (actual − centre) / se on the modelling scale. */
  z: number;
}

/** Quantiles of one cell for one level. */
export interface BandQuantiles {
  level: number;
  lower: number;
  upper: number;
}

/** The calibration: quantiles per horizon band and hour block, and how many scores each rests on. */
export interface BandCalibration {
  levels: number[];
  /** cells[band][block]: the quantiles and the number of scores they came from (pooled cells say so). */
  cells: Array<Array<{ quantiles: BandQuantiles[]; scores: number; pooled: 'cell' | 'band' | 'all' }>>;
  /** Every score used. */
  scores: number;
}

/** Index of the horizon band of hour h (1-based). */
export function horizonBand(h: number): number {
  const i = HORIZON_BANDS.findIndex((upper) => h <= upper);
  return i < 0 ? HORIZON_BANDS.length - 1 : i;
}

/**
 * The split-conformal quantiles of `z` (any order) for a two-sided band at `level` percent: the
 * ⌊(n + 1)α/2⌋-th and ⌈(n + 1)(1 − α/2)⌉-th smallest, or null when n is too small for them.
 */
export function conformalQuantiles(z: ArrayLike<number>, level: number): { lower: number; upper: number } | null {
  if (!(level > 0 && level < 100))
    throw new ForecastingError('invalid-argument', 'conformalQuantiles', `level must lie in (0, 100), got ${level}`);
  return sortedConformalQuantiles(Float64Array.from(z).sort(), level);
}

/** conformalQuantiles of scores already sorted in increasing order (one sort serves every level). */
function sortedConformalQuantiles(sorted: Float64Array, level: number): { lower: number; upper: number } | null {
  const n = sorted.length;
  // (n + 1)·α/2 with α/2 = (100 − level)/200, guarded against rounding (20 × 0.1 must give 2, not 1.999…).
  const tail = (n + 1) * ((100 - level) / 200);
  const lo = Math.floor(tail + 1e-9);
  const hi = Math.ceil(n + 1 - tail - 1e-9);
  if (lo < 1 || hi > n) return null;
  return { lower: sorted[lo - 1], upper: sorted[hi - 1] };
}

/**
 * Calibrates the bands at `levels` from the scores, or returns null when even all of them together are
 * too few (the caller keeps the Gaussian ψ-weight band).
 */
export function calibrateBands(scores: readonly BandScore[], levels: readonly number[]): BandCalibration | null {
  for (const level of levels) {
    if (!(level > 0 && level < 100))
      throw new ForecastingError('invalid-argument', 'calibrateBands', `level must lie in (0, 100), got ${level}`);
  }
  const blocks = 24 / BLOCK_HOURS;
  // One pass sorts the finite scores into their cells; each pool is then sorted once for every level.
  const all: number[] = [];
  const byBand: number[][] = HORIZON_BANDS.map(() => []);
  const byCell: number[][][] = HORIZON_BANDS.map(() => Array.from({ length: blocks }, () => []));
  for (const s of scores) {
    if (!Number.isFinite(s.z)) continue;
    const band = horizonBand(s.horizon);
    all.push(s.z);
    byBand[band].push(s.z);
    byCell[band][Math.floor(s.hourOfDay / BLOCK_HOURS)].push(s.z);
  }
  const fit = (z: number[]): BandQuantiles[] | null => {
    if (z.length < MIN_CELL_SCORES) return null;
    const sorted = Float64Array.from(z).sort();
    const out: BandQuantiles[] = [];
    for (const level of levels) {
      const q = sortedConformalQuantiles(sorted, level);
      if (!q) return null;
      out.push({ level, ...q });
    }
    return out;
  };
  const overall = fit(all);
  if (!overall) return null;
  const cells: BandCalibration['cells'] = [];
  for (let band = 0; band < HORIZON_BANDS.length; band++) {
    const inBand = byBand[band];
    const bandQuantiles = fit(inBand);
    const row: BandCalibration['cells'][number] = [];
    for (let block = 0; block < blocks; block++) {
      const inCell = byCell[band][block];
      const own = fit(inCell);
      if (own) row.push({ quantiles: own, scores: inCell.length, pooled: 'cell' });
      else if (bandQuantiles) row.push({ quantiles: bandQuantiles, scores: inBand.length, pooled: 'band' });
      else row.push({ quantiles: overall, scores: all.length, pooled: 'all' });
    }
    cells.push(row);
  }
  return { levels: [...levels], cells, scores: all.length };
}

/**
 * The calibrated bands around `centre` with the model's standard errors `se` (both on the modelling
 * scale), for forecast hours whose local hours of day are `hourOfDay`; `back` maps a bound to the load
 * scale (exp for a model on logs, identity otherwise).
 */
export function applyBands(
  calibration: BandCalibration,
  centre: ArrayLike<number>,
  se: ArrayLike<number>,
  hourOfDay: ArrayLike<number>,
  back: (value: number) => number = (v) => v,
): PredictionInterval[] {
  const horizon = centre.length;
  return calibration.levels.map((level, li) => {
    const lower = new Float64Array(horizon);
    const upper = new Float64Array(horizon);
    for (let h = 0; h < horizon; h++) {
      const cell = calibration.cells[horizonBand(h + 1)][Math.floor(hourOfDay[h] / BLOCK_HOURS)];
      const q = cell.quantiles[li];
      lower[h] = back(centre[h] + q.lower * se[h]);
      upper[h] = back(centre[h] + q.upper * se[h]);
    }
    return { level, lower, upper };
  });
}
