/**
 * Sample partial autocorrelation function at lags 1..maxLag.
 *
 * α̂(k) = φ̂_kk, the last coefficient of the order-k Yule-Walker fit to the sample autocovariances.
 *
 * Method: Durbin-Levinson recursion on γ̂(0..maxLag) (Brockwell & Davis 2016, Introduction to Time
 * Series and Forecasting, 3rd ed., §3.2.3 and §2.5.3).
 *
 * Conventions: autocovariances demeaned with divisor n at every lag, as R's `pacf`; statsmodels'
 * default (`method = 'ywadjusted'`, divisor n − k) differs at the first or second digit.
 *
 * @throws ForecastingError('invalid-argument') unless 1 ≤ maxLag < n; ('constant-series') for a
 *   constant series; ('non-finite-input') for NaN or infinite values.
 *
 * References: Durbin (1960), Rev. Int. Stat. Inst. 28(3); Brockwell & Davis (2016) §3.2.3.
 */
import { autocovariance } from './autocovariance';
import { levinsonDurbin } from './levinson-durbin';

/** α̂(1..maxLag); index 0 holds lag 1. */
export function partialAutocorrelation(x: ArrayLike<number>, maxLag: number): Float64Array {
  return levinsonDurbin(autocovariance(x, maxLag), maxLag).pacf;
}
