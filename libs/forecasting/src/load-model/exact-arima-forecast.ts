/**
 * Exact finite-sample forecasts of an ARMA model, optionally on a seasonally differenced series, by the
 * Kalman filter with the stationary initial state: the predictor that R's `predict` on an `arima` fit
 * computes.
 *
 * Model: w_t = x_t − x_{t−s} (or w = x without differencing) with
 * (w_t − μ) = Σ φ_i (w_{t−i} − μ) + e_t + Σ θ_j e_{t−j} (R `arima` sign convention), e_t ~ N(0, σ²).
 *
 * Method: Harvey's state-space form with r = max(p, q + 1) (Harvey 1989, Forecasting, Structural Time
 * Series Models and the Kalman Filter, §3.4; Brockwell & Davis 2016 §9.1), initial state covariance from
 * the Lyapunov equation P = TPTᵀ + RRᵀ solved by the doubling algorithm (Anderson & Moore 1979, Optimal
 * Filtering, §6.7), Kalman filter over w, then forecasts from the filtered state. With differencing the
 * forecast error of x_{n+h} is g_hᵀ(α_{n+1} − a_{n+1}) + Σ_{j=0}^{h−2} ψ*_j e_{n+h−j}, where ψ* are the
 * ψ-weights of φ(B)(1 − B^s) (differencing multiplied into the AR polynomial) and g_h sums the state
 * loadings of w_{n+h}, w_{n+h−s}, …: the ψ-weight formula plus the uncertainty of the end-of-sample state,
 * which the conditional (zero pre-sample error) recursion leaves out. The first s values of x are taken
 * as given, equivalent to R's diffuse prior on the differencing states in the limit (R: κ = 10⁶).
 *
 * Conventions: exact Gaussian conditioning on all of w (no conditioning on the first p values); σ² as
 * given. Cost O(n r²) for the filter; fine for r up to a few hundred.
 *
 * @throws ForecastingError 'non-stationary' when the AR part has a root on or inside the unit circle;
 *   'too-few-observations' when the series is not longer than the lag.
 *
 * References: Harvey (1989) §3.4; Gardner, Harvey & Phillips (1980), Applied Statistics 29(3), AS 154;
 * Brockwell & Davis (2016) §6.4 (forecasting ARIMA) and §9.1; R `stats` arima.R / KalmanForecast.
 */
import { ForecastingError, assertFinite } from '../core/errors';
import type { ArmaParameters } from '../core/types';
import { integrateSeasonalDifference, seasonalDifference } from '../seasonal/seasonal-difference';

const FN = 'exactArimaForecast';

/** Means and standard errors of the h = 1..horizon forecasts of x. */
export interface ExactForecast {
  mean: Float64Array;
  se: Float64Array;
}

/** Forecasts x (seasonally differenced at `lag` when given) h = 1..horizon steps ahead, exactly. */
export function exactArimaForecast(model: ArmaParameters, x: ArrayLike<number>, lag: number | null, horizon: number): ExactForecast {
  assertFinite(FN, x);
  const w = lag ? seasonalDifference(x, lag) : Float64Array.from(x);
  const r = Math.max(model.ar.length, model.ma.length + 1);
  const phi = new Float64Array(r);
  phi.set(model.ar);
  const loading = new Float64Array(r); // R = (1, θ_1, …, θ_{r−1})
  loading[0] = 1;
  loading.set(model.ma, 1);

  const { a, P } = filterState(w, model.mean, phi, loading);
  // ℓ_k = first row of T^k: the loading of w_{n+1+k} on the state α_{n+1}.
  const rows: Float64Array[] = [];
  let row: Float64Array = new Float64Array(r);
  row[0] = 1;
  for (let k = 0; k < horizon; k++) {
    rows.push(row);
    row = timesT(row, phi);
  }
  const wMean = rows.map((l) => model.mean + dot(l, a));
  const mean = lag ? integrateSeasonalDifference(x, wMean, lag) : Float64Array.from(wMean);
  const se = new Float64Array(horizon);
  let futureSum = 0; // Σ_{j=0}^{h−2} ψ*_j²
  for (let h = 1; h <= horizon; h++) {
    const g = new Float64Array(r);
    for (let m = h; m >= 1; m -= lag ?? Infinity) for (let i = 0; i < r; i++) g[i] += rows[m - 1][i];
    const stateVariance = dot(g, matVec(P, g));
    se[h - 1] = Math.sqrt(model.sigma2 * (stateVariance + futureSum));
    const psiStar = dot(g, loading); // ψ*_{h−1} = g_h · R
    futureSum += psiStar * psiStar;
  }
  return { mean, se };
}

/** Kalman filter over w; returns the one-step-ahead state a_{n+1|n} and its covariance (units of σ²). */
function filterState(w: Float64Array, mu: number, phi: Float64Array, loading: Float64Array): { a: Float64Array; P: Float64Array[] } {
  const r = phi.length;
  let P = stationaryCovariance(phi, loading);
  let a: Float64Array = new Float64Array(r);
  for (let t = 0; t < w.length; t++) {
    const f = P[0][0];
    const v = w[t] - mu - a[0];
    const column = Float64Array.from(P, (rowP) => rowP[0]);
    if (f > 0) {
      for (let i = 0; i < r; i++) a[i] += (column[i] * v) / f;
      for (let i = 0; i < r; i++) for (let j = 0; j < r; j++) P[i][j] -= (column[i] * column[j]) / f;
    }
    a = timesTColumn(a, phi);
    P = propagate(P, phi, loading);
  }
  return { a, P };
}

/** Solves P = TPTᵀ + RRᵀ by doubling: P ← P + A P Aᵀ, A ← A², until A vanishes. */
function stationaryCovariance(phi: Float64Array, loading: Float64Array): Float64Array[] {
  const r = phi.length;
  let P: Float64Array[] = Array.from({ length: r }, (_, i) => Float64Array.from(loading, (v) => v * loading[i]));
  let A: Float64Array[] = Array.from({ length: r }, (_, i) => {
    const rowA = new Float64Array(r);
    rowA[0] = phi[i];
    if (i + 1 < r) rowA[i + 1] = 1;
    return rowA;
  });
  for (let pass = 0; pass < 64; pass++) {
    P = add(P, multiply(multiply(A, P), transpose(A)));
    A = multiply(A, A);
    let size = 0;
    for (const rowA of A) for (const v of rowA) size = Math.max(size, Math.abs(v));
    if (size < 1e-18) return P;
    if (!Number.isFinite(size) || size > 1e150) break;
  }
  throw new ForecastingError('non-stationary', FN, 'the AR part has a root on or inside the unit circle: difference the series instead');
}

/** T P Tᵀ + RRᵀ in O(r²) using the companion structure of T (first column φ, ones above the diagonal). */
function propagate(P: Float64Array[], phi: Float64Array, loading: Float64Array): Float64Array[] {
  const r = phi.length;
  const M = Array.from({ length: r }, (_, i) => Float64Array.from(P[0], (p0, j) => phi[i] * p0 + (i + 1 < r ? P[i + 1][j] : 0)));
  return Array.from({ length: r }, (_, i) =>
    Float64Array.from({ length: r }, (_, j) => M[i][0] * phi[j] + (j + 1 < r ? M[i][j + 1] : 0) + loading[i] * loading[j]),
  );
}

/** Row vector times T: (ℓT)_0 = Σ ℓ_i φ_i, (ℓT)_j = ℓ_{j−1} (T_i0 = φ_i, T_{i,i+1} = 1). */
function timesT(row: Float64Array, phi: Float64Array): Float64Array {
  const out = new Float64Array(phi.length);
  out[0] = dot(row, phi);
  for (let j = 1; j < phi.length; j++) out[j] = row[j - 1];
  return out;
}

/** T times a column vector. */
function timesTColumn(a: Float64Array, phi: Float64Array): Float64Array {
  const r = phi.length;
  return Float64Array.from(a, (_, i) => phi[i] * a[0] + (i + 1 < r ? a[i + 1] : 0));
}

/** Inner product. */
function dot(u: ArrayLike<number>, v: ArrayLike<number>): number {
  let s = 0;
  for (let i = 0; i < u.length; i++) s += u[i] * v[i];
  return s;
}

/** Matrix times vector. */
function matVec(M: Float64Array[], v: Float64Array): Float64Array {
  return Float64Array.from(M, (rowM) => dot(rowM, v));
}

/** Dense product of small square matrices. */
function multiply(A: Float64Array[], B: Float64Array[]): Float64Array[] {
  const r = A.length;
  return A.map((rowA) => {
    const out = new Float64Array(r);
    for (let k = 0; k < r; k++) {
      const v = rowA[k];
      if (v !== 0) for (let j = 0; j < r; j++) out[j] += v * B[k][j];
    }
    return out;
  });
}

/** Transpose. */
function transpose(A: Float64Array[]): Float64Array[] {
  return A.map((_, i) => Float64Array.from(A, (rowA) => rowA[i]));
}

/** Element-wise sum. */
function add(A: Float64Array[], B: Float64Array[]): Float64Array[] {
  return A.map((rowA, i) => rowA.map((v, j) => v + B[i][j]));
}
