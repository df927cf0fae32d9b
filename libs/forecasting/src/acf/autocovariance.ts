/**
 * Sample autocovariance and autocorrelation of a series at lags 0..maxLag.
 *
 * γ̂(k) = (1/n) Σ_{t=1}^{n−k} (x_t − x̄)(x_{t+k} − x̄),   ρ̂(k) = γ̂(k) / γ̂(0).
 *
 * Method: the sample autocovariance function (Brockwell & Davis 2016, Introduction to Time Series
 * and Forecasting, 3rd ed., §1.4.1, Definition 1.4.4).
 *
 * Conventions: demeaned by the sample mean; divisor n at every lag (not n − k), which keeps the
 * autocovariance matrix non-negative definite (Brockwell & Davis 2016, §2.4) and matches R's
 * `acf(demean = TRUE)`.
 *
 * @throws ForecastingError('invalid-argument') unless 0 ≤ maxLag < n is an integer;
 *   ('non-finite-input') for NaN or infinite values; ('too-few-observations') for an empty series;
 *   ('constant-series') from autocorrelation when γ̂(0) = 0.
 *
 * References: Brockwell & Davis (2016) §1.4.1; Box, Jenkins, Reinsel & Ljung (2016) §2.1.4.
 */
import { assertFinite, assertLength, ForecastingError } from '../core/errors';

function checkLag(fn: string, n: number, maxLag: number): void {
  if (!Number.isInteger(maxLag) || maxLag < 0 || maxLag >= n) {
    throw new ForecastingError('invalid-argument', fn, `needs an integer lag 0 ≤ maxLag < n = ${n}, got ${maxLag}`);
  }
}

/** γ̂(0..maxLag), demeaned, divisor n; index k holds lag k. */
export function autocovariance(x: ArrayLike<number>, maxLag: number): Float64Array {
  assertLength('autocovariance', x, 1, 'a series');
  assertFinite('autocovariance', x);
  const n = x.length;
  checkLag('autocovariance', n, maxLag);
  let mean = 0;
  for (let t = 0; t < n; t++) mean += x[t];
  mean /= n;
  const w = new Float64Array(n);
  for (let t = 0; t < n; t++) w[t] = x[t] - mean;
  const gamma = new Float64Array(maxLag + 1);
  // Four lags per pass over the series (each w[t] loaded once for four products); the tail of
  // each lag beyond the shared range is added separately.
  let k = 0;
  for (; k + 3 <= maxLag; k += 4) {
    let s0 = 0;
    let s1 = 0;
    let s2 = 0;
    let s3 = 0;
    const shared = n - k - 3;
    for (let t = 0; t < shared; t++) {
      const a = w[t];
      s0 += a * w[t + k];
      s1 += a * w[t + k + 1];
      s2 += a * w[t + k + 2];
      s3 += a * w[t + k + 3];
    }
    for (let t = Math.max(shared, 0); t < n - k; t++) s0 += w[t] * w[t + k];
    for (let t = Math.max(shared, 0); t < n - k - 1; t++) s1 += w[t] * w[t + k + 1];
    for (let t = Math.max(shared, 0); t < n - k - 2; t++) s2 += w[t] * w[t + k + 2];
    gamma[k] = s0 / n;
    gamma[k + 1] = s1 / n;
    gamma[k + 2] = s2 / n;
    gamma[k + 3] = s3 / n;
  }
  for (; k <= maxLag; k++) {
    let sum = 0;
    for (let t = 0; t < n - k; t++) sum += w[t] * w[t + k];
    gamma[k] = sum / n;
  }
  return gamma;
}

/** ρ̂(0..maxLag) = γ̂(k)/γ̂(0); index k holds lag k, so index 0 is 1. */
export function autocorrelation(x: ArrayLike<number>, maxLag: number): Float64Array {
  const gamma = autocovariance(x, maxLag);
  const gamma0 = gamma[0];
  if (!(gamma0 > 0))
    throw new ForecastingError('constant-series', 'autocorrelation', 'the series is constant, so its autocorrelation is undefined');
  const rho = new Float64Array(maxLag + 1);
  for (let k = 0; k <= maxLag; k++) rho[k] = gamma[k] / gamma0;
  return rho;
}
