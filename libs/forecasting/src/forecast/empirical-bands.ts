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
import { selectOrderStatistics } from './order-statistics';

/** Upper ends (inclusive, hours ahead) of the horizon bands; the last is open. */
export const HORIZON_BANDS = [24, 48, 96, 168] as const;
/** Hours of day per block (six blocks). */
const BLOCK_HOURS = 4;
/** Hour-of-day blocks per horizon band, and cells in all. */
const BLOCKS = 24 / BLOCK_HOURS;
const CELLS = HORIZON_BANDS.length * BLOCKS;
/** Cell mark of a non-finite score. */
const LEFT_OUT = 255;
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

/** Index of the horizon band of hour h (1-based); hours past the last upper end (or not a number) fall in the last band. */
export function horizonBand(h: number): number {
  let band = 0;
  while (band < HORIZON_BANDS.length - 1 && !(h <= HORIZON_BANDS[band])) band++;
  return band;
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

/** conformalQuantiles of scores already sorted in increasing order. */
function sortedConformalQuantiles(sorted: Float64Array, level: number): { lower: number; upper: number } | null {
  const ranks = conformalRanks(sorted.length, level);
  return ranks && { lower: sorted[ranks.lower], upper: sorted[ranks.upper] };
}

/** The 0-based ranks of the conformal quantiles among n scores at `level`, or null when n is too small for them. */
function conformalRanks(n: number, level: number): { lower: number; upper: number } | null {
  // (n + 1)·α/2 with α/2 = (100 − level)/200, guarded against rounding (20 × 0.1 must give 2, not 1.999…).
  const tail = (n + 1) * ((100 - level) / 200);
  const lo = Math.floor(tail + 1e-9);
  const hi = Math.ceil(n + 1 - tail - 1e-9);
  if (lo < 1 || hi > n) return null;
  return { lower: lo - 1, upper: hi - 1 };
}

/**
 * Calibrates the bands at `levels` from the scores, or returns null when even all of them together are
 * too few (the caller keeps the Gaussian ψ-weight band).
 */
export function calibrateBands(scores: readonly BandScore[], levels: readonly number[]): BandCalibration | null {
  checkLevels('calibrateBands', levels);
  const z = new Float64Array(scores.length);
  const horizon = new Float64Array(scores.length);
  const hourOfDay = new Float64Array(scores.length);
  for (let i = 0; i < scores.length; i++) {
    z[i] = scores[i].z;
    horizon[i] = scores[i].horizon;
    hourOfDay[i] = scores[i].hourOfDay;
  }
  return calibrateBandColumns(z, horizon, hourOfDay, levels);
}

/**
 * calibrateBands on scores given column by column: score i is z[i] at horizon[i] hours ahead (1-based)
 * and local hour of day hourOfDay[i]. Non-finite scores are left out.
 *
 * Cost: each score is placed once into its cell, and a pool's quantiles are its order statistics at the
 * levels' ranks, found by selection in place (order-statistics.ts) rather than by sorting it: the cells
 * always, a horizon band (its cells side by side) or all scores only when a cell has to pool them. Whether
 * all scores suffice depends on their number alone.
 *
 * @throws ForecastingError 'invalid-argument' for a level outside (0, 100), an hour of day outside 0..23, or
 *   columns of different lengths.
 */
export function calibrateBandColumns(
  z: ArrayLike<number>,
  horizon: ArrayLike<number>,
  hourOfDay: ArrayLike<number>,
  levels: readonly number[],
): BandCalibration | null {
  const fn = 'calibrateBandColumns';
  checkLevels(fn, levels);
  const n = z.length;
  if (horizon.length !== n || hourOfDay.length !== n)
    throw new ForecastingError(
      'invalid-argument',
      fn,
      `needs as many horizons and hours of day as scores (${n}), got ${horizon.length} and ${hourOfDay.length}`,
    );
  // Count the finite scores of each cell (cell = band · BLOCKS + block), then place them cell by cell.
  const cellOf = new Uint8Array(n);
  const offsets = new Int32Array(CELLS + 1);
  for (let i = 0; i < n; i++) {
    if (!Number.isFinite(z[i])) {
      cellOf[i] = LEFT_OUT;
      continue;
    }
    const block = Math.floor(hourOfDay[i] / BLOCK_HOURS);
    if (!(block >= 0 && block < BLOCKS))
      throw new ForecastingError('invalid-argument', fn, `hour of day must lie in 0..23, got ${hourOfDay[i]} at index ${i}`);
    const cell = horizonBand(horizon[i]) * BLOCKS + block;
    cellOf[i] = cell;
    offsets[cell + 1]++;
  }
  for (let cell = 0; cell < CELLS; cell++) offsets[cell + 1] += offsets[cell];
  const total = offsets[CELLS];
  const placed = new Float64Array(total);
  const next = offsets.slice(0, CELLS);
  for (let i = 0; i < n; i++) if (cellOf[i] !== LEFT_OUT) placed[next[cellOf[i]]++] = z[i];

  // Quantiles of placed[from..to). Selection reorders inside the range only, so the cells are done first,
  // then the bands that a cell has to pool (each inside its own range), then all scores if still needed.
  const fit = (from: number, to: number): BandQuantiles[] | null => {
    const ranks = poolRanks(to - from, levels);
    if (!ranks) return null;
    const wanted = [...new Set(ranks.flatMap((r) => [r.lower, r.upper]))].sort((a, b) => a - b);
    const values = selectOrderStatistics(placed.subarray(from, to), wanted);
    const at = (rank: number) => values[wanted.indexOf(rank)];
    return levels.map((level, li) => ({ level, lower: at(ranks[li].lower), upper: at(ranks[li].upper) }));
  };
  if (!poolRanks(total, levels)) return null;
  const own = Array.from({ length: CELLS }, (_, cell) => fit(offsets[cell], offsets[cell + 1]));
  const bandQuantiles = HORIZON_BANDS.map((_, band) =>
    own.slice(band * BLOCKS, (band + 1) * BLOCKS).every(Boolean) ? null : fit(offsets[band * BLOCKS], offsets[(band + 1) * BLOCKS]),
  );
  let overall: BandQuantiles[] | null = null;
  const cells: BandCalibration['cells'] = [];
  for (let band = 0; band < HORIZON_BANDS.length; band++) {
    const inBand = offsets[(band + 1) * BLOCKS] - offsets[band * BLOCKS];
    const pooledBand = bandQuantiles[band];
    const row: BandCalibration['cells'][number] = [];
    for (let block = 0; block < BLOCKS; block++) {
      const cell = band * BLOCKS + block;
      const quantiles = own[cell];
      if (quantiles) row.push({ quantiles, scores: offsets[cell + 1] - offsets[cell], pooled: 'cell' });
      else if (pooledBand) row.push({ quantiles: pooledBand, scores: inBand, pooled: 'band' });
      else row.push({ quantiles: (overall ??= fit(0, total)!), scores: total, pooled: 'all' });
    }
    cells.push(row);
  }
  return { levels: [...levels], cells, scores: total };
}

/** The ranks of every level's quantiles in a pool of n scores, or null when the pool is too small for a cell. */
function poolRanks(n: number, levels: readonly number[]): Array<{ lower: number; upper: number }> | null {
  if (n < MIN_CELL_SCORES) return null;
  const ranks: Array<{ lower: number; upper: number }> = [];
  for (const level of levels) {
    const r = conformalRanks(n, level);
    if (!r) return null;
    ranks.push(r);
  }
  return ranks;
}

/** Throws unless every level lies strictly between 0 and 100 percent. */
function checkLevels(fn: string, levels: readonly number[]): void {
  for (const level of levels) {
    if (!(level > 0 && level < 100)) throw new ForecastingError('invalid-argument', fn, `level must lie in (0, 100), got ${level}`);
  }
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
