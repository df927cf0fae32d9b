/**
 * Causality (stationarity) test for an AR polynomial φ(z) = 1 − φ_1 z − … − φ_p z^p.
 *
 * The AR part of (x_t − μ) = Σ φ_i (x_{t−i} − μ) + e_t + … is causal and stationary iff every
 * root of φ(z) lies outside the unit circle.
 *
 * Method: the step-down (inverse Durbin-Levinson, Schur-Cohn) recursion recovers the partial
 * autocorrelations φ_kk from φ_p1..φ_pp; the roots lie outside the unit circle iff every
 * |φ_kk| < 1 (Barndorff-Nielsen & Schou 1973, J. Multivariate Anal. 3; Monahan 1984,
 * J. Time Series Anal. 5(3)).
 *
 * Conventions: no root finding, O(p²); a coefficient vector of length 0 is stationary.
 *
 * References: Brockwell & Davis (2016), Introduction to Time Series and Forecasting, 3rd ed.,
 * §3.1 (causality) and §2.5.3 (Durbin-Levinson).
 */

/** The partial autocorrelations implied by φ_1..φ_p, or null when some |φ_kk| ≥ 1. */
export function arToPartialAutocorrelations(ar: ArrayLike<number>): Float64Array | null {
  const p = ar.length;
  // Two buffers used in turn: the step-down runs p times per call and a penalty path calls it per λ.
  let a = Float64Array.from(ar);
  let lower = new Float64Array(p);
  const pacf = new Float64Array(p);
  for (let k = p; k >= 1; k--) {
    const kappa = a[k - 1];
    if (!(Math.abs(kappa) < 1)) return null;
    pacf[k - 1] = kappa;
    const scale = 1 - kappa * kappa;
    for (let j = 1; j < k; j++) lower[j - 1] = (a[j - 1] + kappa * a[k - j - 1]) / scale;
    [a, lower] = [lower, a];
  }
  return pacf;
}

/** True when φ(z) = 1 − Σ φ_i z^i has all its roots outside the unit circle. */
export function isCausalAr(ar: ArrayLike<number>): boolean {
  // Σ|φ_i| < 1 is enough (|φ(z)| ≥ 1 − Σ|φ_i| > 0 on the closed unit disc) and costs O(p), not O(p²).
  let sum = 0;
  for (let i = 0; i < ar.length; i++) sum += Math.abs(ar[i]);
  if (sum < 1) return true;
  return arToPartialAutocorrelations(ar) !== null;
}
