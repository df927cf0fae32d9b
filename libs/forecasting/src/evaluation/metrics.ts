/**
 * Point-forecast accuracy: MAE, RMSE, MAPE, sMAPE and MASE, for actuals y_t and forecasts f_t with errors
 * e_t = y_t − f_t.
 *
 * Method: Hyndman & Koehler (2006), Int. J. Forecasting 22(4), §3: MAE = mean|e|, RMSE = √mean(e²),
 *   MAPE = mean|100 e/y|, sMAPE = mean(200|e|/(|y| + |f|)), MASE = MAE / Q with the scale
 *   Q = mean_{t=m+1..T}|y_t − y_{t−m}| taken from the TRAINING part (the in-sample seasonal-naive MAE at period m;
 *   m = 1 gives the non-seasonal naive scaling).
 * Conventions: percentages are in percent (as R's forecast::accuracy); sMAPE uses absolute values in the
 *   denominator, as the M4 competition did (Makridakis, Spiliotis & Assimakopoulos 2020, Int. J. Forecasting
 *   36(1)), so it stays in [0, 200] even for negative net load. Zero denominators give a documented null, never NaN or Infinity: MAPE when some actual is 0,
 *   sMAPE when some actual and forecast are both 0, MASE when the training part has no seasonal variation.
 *   R's forecast::accuracy takes m from frequency() of its test argument; here m is always explicit.
 * @throws ForecastingError 'too-few-observations' (empty input, or training part not longer than m),
 *   'invalid-argument' (unequal lengths, m not a positive integer), 'non-finite-input'.
 * References: Hyndman & Koehler (2006); Hyndman & Athanasopoulos (2021), Forecasting: Principles and Practice,
 *   3rd ed., §5.8; Makridakis, Spiliotis & Assimakopoulos (2020).
 */
import { ForecastingError, assertFinite, assertLength } from '../core/errors';
import { checkAligned } from './paired-input';

/** Mean absolute error mean|y − f|. */
export function mae(actual: ArrayLike<number>, forecast: ArrayLike<number>): number {
  const n = checkAligned('mae', { actual, forecast });
  let s = 0;
  for (let i = 0; i < n; i++) s += Math.abs(actual[i] - forecast[i]);
  return s / n;
}

/** Root mean squared error √mean((y − f)²). */
export function rmse(actual: ArrayLike<number>, forecast: ArrayLike<number>): number {
  const n = checkAligned('rmse', { actual, forecast });
  let s = 0;
  for (let i = 0; i < n; i++) s += (actual[i] - forecast[i]) ** 2;
  return Math.sqrt(s / n);
}

/** Mean absolute percentage error in percent, or null when some actual is zero. */
export function mape(actual: ArrayLike<number>, forecast: ArrayLike<number>): number | null {
  const n = checkAligned('mape', { actual, forecast });
  let s = 0;
  for (let i = 0; i < n; i++) {
    if (actual[i] === 0) return null;
    s += Math.abs((100 * (actual[i] - forecast[i])) / actual[i]);
  }
  return s / n;
}

/** Symmetric MAPE 200|y − f|/(|y| + |f|) averaged, in percent, or null when some y and f are both zero. */
export function smape(actual: ArrayLike<number>, forecast: ArrayLike<number>): number | null {
  const n = checkAligned('smape', { actual, forecast });
  let s = 0;
  for (let i = 0; i < n; i++) {
    const denominator = Math.abs(actual[i]) + Math.abs(forecast[i]);
    if (denominator === 0) return null;
    s += (200 * Math.abs(actual[i] - forecast[i])) / denominator;
  }
  return s / n;
}

/** In-sample seasonal-naive MAE of the training part, mean|y_t − y_{t−m}|: the MASE scale. */
export function maseScale(training: ArrayLike<number>, period: number): number {
  const fn = 'maseScale';
  if (!Number.isInteger(period) || period < 1)
    throw new ForecastingError('invalid-argument', fn, `period must be a positive integer, got ${period}`);
  assertLength(fn, training, period + 1, `period ${period} plus one`);
  assertFinite(fn, training, 'training');
  let s = 0;
  for (let t = period; t < training.length; t++) s += Math.abs(training[t] - training[t - period]);
  return s / (training.length - period);
}

/** Mean absolute scaled error with seasonal-naive scaling at `period` from `training`, or null when the scale is 0. */
export function mase(actual: ArrayLike<number>, forecast: ArrayLike<number>, training: ArrayLike<number>, period: number): number | null {
  const scale = maseScale(training, period);
  const error = mae(actual, forecast);
  return scale === 0 ? null : error / scale;
}
