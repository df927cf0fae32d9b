/**
 * The exact Gaussian log-likelihood of a stationary ARMA(p, q) model, for reporting (the fits in this
 * folder maximise the conditional one).
 *
 * Model: (x_t − μ) = Σ_{i=1..p} φ_i (x_{t−i} − μ) + e_t + Σ_{j=1..q} θ_j e_{t−j}, e_t ~ iid N(0, σ²)
 * (R's `arima` sign convention).
 *
 * Method: the innovations algorithm applied to the transformed process W_t = σ⁻¹X_t (t ≤ m),
 * W_t = σ⁻¹φ(B)X_t (t > m), m = max(p, q), whose covariances κ(i, j) are banded (Brockwell & Davis
 * 2016, Introduction to Time Series and Forecasting, 3rd ed., §3.3, eqs. 3.3.3–3.3.10): one-step
 * predictions X̂_t with mean squared errors σ²r_{t−1} give
 *   ℓ = −(n/2) log(2πσ²) − ½ Σ log r_{t−1} − Σ (X_t − X̂_t)²/(2σ² r_{t−1})    (§5.2, eq. 5.2.9).
 * The autocovariances γ(0..p) solve the linear system of §3.2.3 (the "third method"), with ψ-weights
 * from §3.1, eq. 3.1.7; higher lags by the AR recursion. O(n·q²) after the first m steps.
 *
 * Conventions: X_t = x_t − μ with μ as given (not estimated); σ² as given. With σ² = S/n (the
 * concentrated maximum) this is the value R's `arima(method = "ML")` reports as loglik; R gets it by
 * a Kalman filter, which is the same likelihood.
 *
 * @throws ForecastingError('non-stationary') when the AR part is not stationary (no stationary
 * covariances exist); ('invalid-argument') when σ² ≤ 0 or the series is empty; ('non-finite-input').
 *
 * References: Brockwell & Davis (2016) §3.2.3, §3.3, §5.2; Ansley (1979), Biometrika 66(1).
 */
import { Matrix, solve } from 'ml-matrix';
import { assertFinite, ForecastingError } from '../core/errors';
import type { ArmaParameters } from '../core/types';
import { isStationary } from './polynomial-roots';

const FN = 'exactLogLikelihood';

/** The exact Gaussian log-likelihood of x under the ARMA parameters (μ, φ, θ, σ²). */
export function exactLogLikelihood(x: ArrayLike<number>, params: ArmaParameters): number {
  const { ar, ma, mean, sigma2 } = params;
  assertFinite(FN, x);
  assertFinite(FN, ar, 'ar coefficients');
  assertFinite(FN, ma, 'ma coefficients');
  if (!Number.isFinite(mean)) throw new ForecastingError('non-finite-input', FN, `mean is ${mean}`);
  if (!(sigma2 > 0) || !Number.isFinite(sigma2))
    throw new ForecastingError('invalid-argument', FN, `σ² must be positive and finite, got ${sigma2}`);
  if (x.length === 0) throw new ForecastingError('invalid-argument', FN, 'the series is empty');
  if (!isStationary(ar))
    throw new ForecastingError('non-stationary', FN, 'the AR part is not stationary, so the process has no stationary covariances');
  const { sumLogR, weightedSquares } = innovations(x, mean, ar, ma);
  const n = x.length;
  return -(n / 2) * Math.log(2 * Math.PI * sigma2) - sumLogR / 2 - weightedSquares / (2 * sigma2);
}

/** Σ log r_{t−1} and Σ (X_t − X̂_t)²/r_{t−1} from the innovations algorithm (σ² = 1 scale). */
function innovations(x: ArrayLike<number>, mean: number, ar: number[], ma: number[]): { sumLogR: number; weightedSquares: number } {
  const n = x.length;
  const p = ar.length;
  const q = ma.length;
  const m = Math.max(p, q);
  const gamma = autocovariances(ar, ma, 2 * m + p + 1);
  const theta = (j: number) => (j === 0 ? 1 : j <= q ? ma[j - 1] : 0);
  // κ(i, j) of B&D eq. 3.3.3, 1-based, σ² = 1.
  const kappa = (i: number, j: number): number => {
    const lag = Math.abs(i - j);
    const low = Math.min(i, j);
    const high = Math.max(i, j);
    if (high <= m) return gamma[lag];
    if (low <= m && high <= 2 * m) {
      let value = gamma[lag];
      for (let r = 1; r <= p; r++) value -= ar[r - 1] * gamma[Math.abs(r - lag)];
      return value;
    }
    if (low > m) {
      if (lag > q) return 0;
      let value = 0;
      for (let r = 0; r + lag <= q; r++) value += theta(r) * theta(r + lag);
      return value;
    }
    return 0;
  };

  // rows[s][j − 1] = θ_{s,j}; for s ≥ m only j ≤ q can be non-zero (B&D §3.3).
  const rows: Float64Array[] = [];
  const v = new Float64Array(n);
  const X = new Float64Array(n);
  for (let t = 0; t < n; t++) X[t] = x[t] - mean;
  const innovation = new Float64Array(n);
  v[0] = kappa(1, 1);
  let sumLogR = Math.log(v[0]);
  innovation[0] = X[0];
  let weightedSquares = (X[0] * X[0]) / v[0];
  const width = (s: number) => (s < m ? s : Math.min(s, q));
  for (let s = 1; s < n; s++) {
    const row = new Float64Array(width(s));
    const first = s >= m ? Math.max(0, s - q) : 0;
    for (let k = first; k < s; k++) {
      // θ_{s,s−k} = (κ(s+1, k+1) − Σ_{j<k} θ_{k,k−j} θ_{s,s−j} v_j) / v_k.
      let value = kappa(s + 1, k + 1);
      for (let j = Math.max(first, 0); j < k; j++) {
        const rowK = rows[k - 1];
        const thetaK = k - j - 1 < (rowK?.length ?? 0) ? rowK[k - j - 1] : 0;
        value -= thetaK * row[s - j - 1] * v[j];
      }
      row[s - k - 1] = value / v[k];
    }
    let variance = kappa(s + 1, s + 1);
    for (let j = first; j < s; j++) variance -= row[s - j - 1] * row[s - j - 1] * v[j];
    v[s] = variance;
    rows.push(row);
    // One-step prediction of X_{s+1} (B&D eq. 3.3.9).
    let prediction = 0;
    if (s >= m) for (let i = 1; i <= p; i++) prediction += ar[i - 1] * X[s - i];
    for (let j = 1; j <= row.length; j++) prediction += row[j - 1] * innovation[s - j];
    innovation[s] = X[s] - prediction;
    sumLogR += Math.log(v[s]);
    weightedSquares += (innovation[s] * innovation[s]) / v[s];
  }
  return { sumLogR, weightedSquares };
}

/** γ(0..maxLag) of the ARMA process with σ² = 1 (B&D §3.2.3). */
export function autocovariances(ar: ArrayLike<number>, ma: ArrayLike<number>, maxLag: number): Float64Array {
  const p = ar.length;
  const q = ma.length;
  const theta = (j: number) => (j === 0 ? 1 : j <= q ? ma[j - 1] : 0);
  // ψ_0..ψ_q of the causal representation.
  const psi = new Float64Array(q + 1);
  for (let j = 0; j <= q; j++) {
    let value = theta(j);
    for (let i = 1; i <= Math.min(j, p); i++) value += ar[i - 1] * psi[j - i];
    psi[j] = value;
  }
  const rhs = (k: number) => {
    let value = 0;
    for (let j = k; j <= q; j++) value += theta(j) * psi[j - k];
    return value;
  };
  const gamma = new Float64Array(Math.max(maxLag, p, q) + 1);
  // γ(k) − Σ φ_i γ(|k − i|) = Σ_{j=k..q} θ_j ψ_{j−k}, k = 0..p: a linear system in γ(0..p).
  const system = Matrix.zeros(p + 1, p + 1);
  const right = Matrix.zeros(p + 1, 1);
  for (let k = 0; k <= p; k++) {
    system.set(k, k, system.get(k, k) + 1);
    for (let i = 1; i <= p; i++) system.set(k, Math.abs(k - i), system.get(k, Math.abs(k - i)) - ar[i - 1]);
    right.set(k, 0, rhs(k));
  }
  const solution = solve(system, right);
  for (let k = 0; k <= p; k++) gamma[k] = solution.get(k, 0);
  for (let k = p + 1; k < gamma.length; k++) {
    let value = rhs(k);
    for (let i = 1; i <= p; i++) value += ar[i - 1] * gamma[k - i];
    gamma[k] = value;
  }
  return gamma;
}
