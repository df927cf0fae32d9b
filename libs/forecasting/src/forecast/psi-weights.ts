/**
 * ψ-weights of a causal ARMA(p, q): the coefficients of its MA(∞) representation.
 *
 * (x_t − μ) = Σ_{j≥0} ψ_j e_{t−j} with ψ_0 = 1 and ψ_j = θ_j + Σ_{i=1..min(j,p)} φ_i ψ_{j−i}
 * (θ_j = 0 for j > q), for the model (x_t − μ) = Σ φ_i (x_{t−i} − μ) + e_t + Σ θ_j e_{t−j}.
 *
 * Method: Brockwell & Davis (2016), Introduction to Time Series and Forecasting, 3rd ed., §3.1,
 * eq. (3.1.7); Box, Jenkins, Reinsel & Ljung (2016), Time Series Analysis, 5th ed., §5.2.
 *
 * Conventions: returns ψ_0..ψ_{count−1}; no causality check (callers forecasting from fitted,
 * stationary models get decaying weights).
 *
 * @throws ForecastingError('invalid-argument') unless count is a positive integer;
 *   ('non-finite-input') for non-finite coefficients.
 *
 * References: Brockwell & Davis (2016) §3.1; R `stats::ARMAtoMA` (which omits ψ_0).
 */
import { nonZeroTerms } from '../core/arma-filter';
import { assertFinite, ForecastingError } from '../core/errors';

/** ψ_0..ψ_{count−1} of the ARMA model with coefficients φ and θ. */
export function psiWeights(ar: ArrayLike<number>, ma: ArrayLike<number>, count: number): Float64Array {
  if (!Number.isInteger(count) || count < 1)
    throw new ForecastingError('invalid-argument', 'psiWeights', `needs a positive integer count, got ${count}`);
  assertFinite('psiWeights', ar, 'ar coefficients');
  assertFinite('psiWeights', ma, 'ma coefficients');
  const psi = new Float64Array(count);
  psi[0] = 1;
  // Non-zero φ only, in order (the same sums): seasonal and wide-lag AR polynomials are mostly zeros.
  const { lags, coefficients } = nonZeroTerms(ar);
  for (let j = 1; j < count; j++) {
    let value = j <= ma.length ? ma[j - 1] : 0;
    for (let k = 0; k < lags.length && lags[k] <= j; k++) value += coefficients[k] * psi[j - lags[k]];
    psi[j] = value;
  }
  return psi;
}
