import { ForecastingError, assertFinite } from '../core/errors';

/** Seasonal differencing w_t = x_t − x_{t−s} for t = s..n−1 (length n − s); s = 24 or 168 for hourly load. */
export function seasonalDifference(x: ArrayLike<number>, lag: number): Float64Array {
  const fn = 'seasonalDifference';
  checkLag(fn, lag);
  assertFinite(fn, x);
  if (x.length <= lag) {
    throw new ForecastingError('too-few-observations', fn, `needs more than lag = ${lag} observations, got ${x.length}`);
  }
  const out = new Float64Array(x.length - lag);
  for (let t = lag; t < x.length; t++) out[t - lag] = x[t] - x[t - lag];
  return out;
}

/**
 * Inverse of seasonal differencing for forecasts: x̂_{n+h} = x̂_{n+h−s} + ŵ_{n+h}, where x̂ on the
 * right is the observed value while n + h − s ≤ n (integration of forecasts, Brockwell & Davis 2016 §6.4).
 *
 * @throws ForecastingError when fewer than `lag` history values are given.
 */
export function integrateSeasonalDifference(history: ArrayLike<number>, differenced: ArrayLike<number>, lag: number): Float64Array {
  const fn = 'integrateSeasonalDifference';
  checkLag(fn, lag);
  if (history.length < lag) {
    throw new ForecastingError('too-few-observations', fn, `needs the last ${lag} observed values, got ${history.length}`);
  }
  const n = history.length;
  const out = new Float64Array(differenced.length);
  for (let h = 0; h < differenced.length; h++) {
    const back = h - lag;
    out[h] = (back >= 0 ? out[back] : history[n + back]) + differenced[h];
  }
  return out;
}

/** Lags must be positive integers. */
function checkLag(fn: string, lag: number): void {
  if (!Number.isInteger(lag) || lag < 1) {
    throw new ForecastingError('invalid-argument', fn, `lag must be a positive integer (24 or 168 for hourly load), got ${lag}`);
  }
}
