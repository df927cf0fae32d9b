/**
 * Scores for interval and quantile forecasts: empirical coverage, the Winkler interval score and the pinball
 * (quantile) loss.
 *
 * Method: for a central (1 − α) interval [l, u] and outcome y, Winkler (1972), JASA 67(337):
 *   W = (u − l) + (2/α)(l − y) if y < l;  (u − l) if l ≤ y ≤ u;  (u − l) + (2/α)(y − u) if y > u
 *   (the interval score of Gneiting & Raftery 2007, JASA 102(477), §6.2). Pinball loss of a τ-quantile forecast q:
 *   L = τ(y − q) if y ≥ q, (1 − τ)(q − y) otherwise (Koenker & Bassett 1978, Econometrica 46(1); used for load by
 *   Hong et al. 2016, Int. J. Forecasting 32(3), GEFCom2014). Coverage = share of y with l ≤ y ≤ u.
 * Conventions: levels in percent (80 for an 80 % interval), as predictionIntervals takes them; τ in (0, 1);
 *   every score is the mean over points; endpoints count as covered.
 * @throws ForecastingError 'too-few-observations' (empty), 'invalid-argument' (unequal lengths, lower > upper,
 *   level outside (0, 100), τ outside (0, 1)), 'non-finite-input'.
 * References: Winkler (1972); Gneiting & Raftery (2007); Koenker & Bassett (1978); Hong et al. (2016).
 */
import { ForecastingError } from '../core/errors';
import { checkAligned } from './paired-input';

/** Throws when some lower bound exceeds its upper bound. */
function checkOrdered(fn: string, lower: ArrayLike<number>, upper: ArrayLike<number>): void {
  for (let i = 0; i < lower.length; i++) {
    if (lower[i] > upper[i])
      throw new ForecastingError('invalid-argument', fn, `lower[${i}] = ${lower[i]} exceeds upper[${i}] = ${upper[i]}`);
  }
}

/** Share of actuals inside [lower, upper], endpoints included. */
export function coverage(actual: ArrayLike<number>, lower: ArrayLike<number>, upper: ArrayLike<number>): number {
  const fn = 'coverage';
  const n = checkAligned(fn, { actual, lower, upper });
  checkOrdered(fn, lower, upper);
  let inside = 0;
  for (let i = 0; i < n; i++) if (actual[i] >= lower[i] && actual[i] <= upper[i]) inside++;
  return inside / n;
}

/** Mean Winkler score of central intervals at `level` percent (lower is better). */
export function winkler(actual: ArrayLike<number>, lower: ArrayLike<number>, upper: ArrayLike<number>, level: number): number {
  const fn = 'winkler';
  const n = checkAligned(fn, { actual, lower, upper });
  checkOrdered(fn, lower, upper);
  if (!(level > 0 && level < 100)) throw new ForecastingError('invalid-argument', fn, `level must lie in (0, 100) percent, got ${level}`);
  const alpha = 1 - level / 100;
  let s = 0;
  for (let i = 0; i < n; i++) {
    let score = upper[i] - lower[i];
    if (actual[i] < lower[i]) score += (2 / alpha) * (lower[i] - actual[i]);
    else if (actual[i] > upper[i]) score += (2 / alpha) * (actual[i] - upper[i]);
    s += score;
  }
  return s / n;
}

/** Mean pinball loss of τ-quantile forecasts (lower is better). */
export function pinball(actual: ArrayLike<number>, quantile: ArrayLike<number>, tau: number): number {
  const fn = 'pinball';
  const n = checkAligned(fn, { actual, quantile });
  if (!(tau > 0 && tau < 1)) throw new ForecastingError('invalid-argument', fn, `tau must lie in (0, 1), got ${tau}`);
  let s = 0;
  for (let i = 0; i < n; i++) {
    const d = actual[i] - quantile[i];
    s += d >= 0 ? tau * d : (tau - 1) * d;
  }
  return s / n;
}
