/**
 * Stationarity of an AR polynomial 1 − φ_1 z − … − φ_p z^p by the step-down (Schur-Cohn) recursion.
 *
 * Model: (x_t − μ) = Σ φ_i (x_{t−i} − μ) + e_t (R's arima sign convention).
 * Method: run the Durbin-Levinson recursion backwards from φ^(p) = φ: the partial autocorrelation at step k is
 *   κ_k = φ^(k)_k and φ^(k−1)_j = (φ^(k)_j + κ_k φ^(k)_{k−j}) / (1 − κ_k²); the process is causal (all roots of
 *   the AR polynomial outside the unit circle) iff |κ_k| < 1 for every k (Barndorff-Nielsen & Schou 1973,
 *   J. Multivariate Anal. 3(4); Monahan 1984, Biometrika 71(2)). O(p²), so it suits lag 168 without root finding.
 * Conventions: trailing zeros (benched lags) are harmless; a margin keeps near-unit roots out (default 1e-8).
 * References: Barndorff-Nielsen & Schou (1973); Monahan (1984); Brockwell & Davis (2016) §3.1 (causality).
 */

/** True when the AR polynomial has every root strictly outside the unit circle (|κ_k| < 1 − margin for all k). */
export function isStationaryAr(ar: ArrayLike<number>, margin = 1e-8): boolean {
  let p = ar.length;
  while (p > 0 && ar[p - 1] === 0) p--;
  let phi = Float64Array.from({ length: p }, (_, i) => ar[i]);
  for (let k = p; k >= 1; k--) {
    const kappa = phi[k - 1];
    if (!(Math.abs(kappa) < 1 - margin)) return false;
    const denominator = 1 - kappa * kappa;
    const next = new Float64Array(k - 1);
    for (let j = 0; j < k - 1; j++) next[j] = (phi[j] + kappa * phi[k - 2 - j]) / denominator;
    phi = next;
  }
  return true;
}
