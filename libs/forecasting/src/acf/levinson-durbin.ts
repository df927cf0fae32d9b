/**
 * Levinson-Durbin recursion: solves the Yule-Walker equations Γ_k φ_k = γ_k for k = 1..p.
 *
 * For an AR(p) process (x_t − μ) = Σ φ_i (x_{t−i} − μ) + e_t the coefficients solve
 * Σ_j φ_j γ(|i − j|) = γ(i), i = 1..p, and the innovation variance is σ² = γ(0) − Σ φ_i γ(i).
 *
 * Method: Durbin-Levinson algorithm (Brockwell & Davis 2016, Introduction to Time Series and
 * Forecasting, 3rd ed., §2.5.3, Proposition 2.5.1): φ_kk = (γ(k) − Σ φ_{k−1,j} γ(k−j)) / v_{k−1},
 * φ_kj = φ_{k−1,j} − φ_kk φ_{k−1,k−j}, v_k = v_{k−1}(1 − φ_kk²).
 *
 * Conventions: v_k is the plain one-step prediction variance γ(0)·Π_{i≤k}(1 − φ_ii²), with no
 * small-sample rescaling; O(p²) operations.
 *
 * @throws ForecastingError('constant-series') when γ(0) ≤ 0; ('non-stationary') when some
 *   |φ_kk| ≥ 1, i.e. the autocovariances are not positive definite; ('invalid-argument') unless
 *   1 ≤ p < gamma.length.
 *
 * References: Levinson (1947), J. Math. Phys. 25; Durbin (1960), Rev. Int. Stat. Inst. 28(3).
 */
import { assertFinite, ForecastingError } from '../core/errors';

/** The order-p solution, the partial autocorrelations φ_11..φ_pp and variances v_0..v_p. */
export interface LevinsonDurbinResult {
  /** φ_p1..φ_pp, the AR(p) coefficients (index 0 = lag 1). */
  phi: Float64Array;
  /** φ_11..φ_pp, the partial autocorrelations (index 0 = lag 1). */
  pacf: Float64Array;
  /** v_0..v_p, the one-step prediction variances (index k = order k, v_0 = γ(0)). */
  variances: Float64Array;
}

/** Runs the Durbin-Levinson recursion on γ(0..p). */
export function levinsonDurbin(gamma: ArrayLike<number>, p: number): LevinsonDurbinResult {
  assertFinite('levinsonDurbin', gamma, 'autocovariances');
  if (!Number.isInteger(p) || p < 1 || p >= gamma.length) {
    throw new ForecastingError(
      'invalid-argument',
      'levinsonDurbin',
      `needs an order 1 ≤ p < ${gamma.length} (autocovariances given), got ${p}`,
    );
  }
  if (!(gamma[0] > 0)) throw new ForecastingError('constant-series', 'levinsonDurbin', 'γ(0) must be positive; the series is constant');
  let phi = new Float64Array(p);
  let previous = new Float64Array(p);
  const pacf = new Float64Array(p);
  const variances = new Float64Array(p + 1);
  variances[0] = gamma[0];
  for (let k = 1; k <= p; k++) {
    let numerator = gamma[k];
    for (let j = 1; j < k; j++) numerator -= previous[j - 1] * gamma[k - j];
    const reflection = numerator / variances[k - 1];
    if (!(Math.abs(reflection) < 1)) {
      throw new ForecastingError(
        'non-stationary',
        'levinsonDurbin',
        `partial autocorrelation at lag ${k} is ${reflection}; the autocovariances are not positive definite`,
      );
    }
    for (let j = 1; j < k; j++) phi[j - 1] = previous[j - 1] - reflection * previous[k - j - 1];
    phi[k - 1] = reflection;
    pacf[k - 1] = reflection;
    variances[k] = variances[k - 1] * (1 - reflection * reflection);
    [previous, phi] = [phi, previous];
  }
  // After the last swap the order-p solution sits in `previous`.
  return { phi: previous.slice(), pacf, variances };
}
