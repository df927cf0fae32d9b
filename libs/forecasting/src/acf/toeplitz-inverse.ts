/**
 * Diagonal of the inverse of the autocovariance matrix Γ_p = [γ(|i − j|)]_{i,j<p}, in O(p²).
 *
 * With the forward prediction errors e_k = x_k − Σ_{j=1..k} φ_kj x_{k−j} (k = 0..p−1) of a stationary
 * series, e = A x for a unit lower-triangular A with A[k][k−j] = −φ_kj, and the e_k are uncorrelated with
 * variances v_k, so A Γ_p Aᵀ = D = diag(v_0..v_{p−1}) and Γ_p⁻¹ = Aᵀ D⁻¹ A:
 * (Γ_p⁻¹)_ii = Σ_{k≥i} A[k][i]² / v_k.
 *
 * Method: the Durbin-Levinson recursion gives every order's φ_k· and v_k (Brockwell & Davis 2016,
 * Introduction to Time Series and Forecasting, 3rd ed., §2.5.3); the factorisation is the
 * Cholesky factorisation of Γ_p⁻¹ it implies (Golub & Van Loan 2013, Matrix Computations, 4th ed., §4.7.3).
 *
 * Conventions: γ(0..p−1) must be positive definite (as a sample autocovariance with divisor n is).
 *
 * @throws ForecastingError from levinsonDurbin when γ(0) ≤ 0 or the matrix is not positive definite.
 *
 * References: Brockwell & Davis (2016) §2.5.3; Golub & Van Loan (2013) §4.7.
 */
import { ForecastingError } from '../core/errors';

/** diag(Γ_p⁻¹) for Γ_p built from γ(0..p−1). */
export function toeplitzInverseDiagonal(gamma: ArrayLike<number>, p: number): Float64Array {
  if (!Number.isInteger(p) || p < 1 || p > gamma.length) {
    throw new ForecastingError('invalid-argument', 'toeplitzInverseDiagonal', `needs 1 ≤ p ≤ ${gamma.length}, got ${p}`);
  }
  if (!(gamma[0] > 0)) throw new ForecastingError('constant-series', 'toeplitzInverseDiagonal', 'γ(0) must be positive');
  const diagonal = new Float64Array(p);
  let phi = new Float64Array(p);
  let next = new Float64Array(p);
  let v = gamma[0];
  // Order 0: e_0 = x_0, A[0][0] = 1.
  diagonal[0] += 1 / v;
  for (let k = 1; k < p; k++) {
    let numerator = gamma[k];
    for (let j = 1; j < k; j++) numerator -= phi[j - 1] * gamma[k - j];
    const reflection = numerator / v;
    if (!(Math.abs(reflection) < 1)) {
      throw new ForecastingError(
        'non-stationary',
        'toeplitzInverseDiagonal',
        `the autocovariances are not positive definite (|φ_${k}${k}| ≥ 1)`,
      );
    }
    for (let j = 1; j < k; j++) next[j - 1] = phi[j - 1] - reflection * phi[k - j - 1];
    next[k - 1] = reflection;
    [phi, next] = [next, phi];
    v *= 1 - reflection * reflection;
    // Row k of A: 1 at column k, −φ_kj at column k − j.
    diagonal[k] += 1 / v;
    for (let j = 1; j <= k; j++) diagonal[k - j] += (phi[j - 1] * phi[j - 1]) / v;
  }
  return diagonal;
}
