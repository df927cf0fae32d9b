/**
 * Hannan-Rissanen starting values for an ARMA(p, q) model: a long autoregression estimates the
 * innovations, then a regression on lagged values and lagged estimated innovations gives φ and θ.
 *
 * Model: (x_t − μ) = Σ_{i=1..p} φ_i (x_{t−i} − μ) + e_t + Σ_{j=1..q} θ_j e_{t−j}  (R's `arima` signs).
 *
 * Method: Hannan & Rissanen (1982), Biometrika 69(1), 81–94, the first two steps; as presented in
 * Brockwell & Davis (2016), Introduction to Time Series and Forecasting, 3rd ed., §5.1.4.
 * Step 1: AR(m) by least squares on the demeaned series y_t = x_t − x̄ for t = m+1..n, giving
 * ê_t = y_t − Σ a_i y_{t−i}. Step 2: least squares of y_t on y_{t−1..t−p} and ê_{t−1..t−q} for
 * t = m+q+1..n. With q = 0 step 2 alone runs: least squares of y_t on 1 and y_{t−1..t−p} for
 * t = p+1..n (the conditional least-squares AR fit), μ = x̄ + c/(1 − Σφ).
 *
 * Conventions: m = max(p + q, min(⌊(ln n)²⌋, 30)), at most ⌊n/4⌋ (⌊(ln n)²⌋ is statsmodels'
 * `hannan_rissanen` default, common practice; the cap of 30 is ours: these are only starting values
 * and the cap cuts the cost on a year of hourly data by two thirds). The step-1 cross products Σ y_{t−i} y_{t−j} are
 * updated along diagonals (each is the previous one plus the entering and minus the leaving term), so
 * step 1 costs O(n·m + m³) rather than O(n·m²). Normal equations by Cholesky on demeaned data are
 * accurate enough here: these are starting values, polished by the NLS fit. μ is x̄ (q > 0).
 * σ² = RSS/(rows of step 2). The result is made stationary and invertible by root reflection.
 *
 * @throws ForecastingError('invalid-argument') for bad orders, ('too-few-observations') when a
 * regression would have no more rows than unknowns, ('singular-matrix') when a regression is singular,
 * ('non-finite-input') for non-finite data.
 *
 * References: Hannan & Rissanen (1982); Brockwell & Davis (2016) §5.1.4.
 */
import { assertFinite, ForecastingError } from '../core/errors';
import type { ArmaParameters } from '../core/types';
import { choleskyFactor, choleskySolve } from './cholesky';
import { stabilise } from './polynomial-roots';

const FN = 'hannanRissanen';
/** Upper bound on the long-AR order: enough for starting values, and keeps step 1 cheap on long series. */
const LONG_AR_CAP = 30;

/** Hannan-Rissanen estimates of an ARMA(p, q) model, stationary and invertible. */
export function hannanRissanen(x: ArrayLike<number>, p: number, q: number): ArmaParameters {
  if (!Number.isInteger(p) || !Number.isInteger(q) || p < 0 || q < 0) {
    throw new ForecastingError('invalid-argument', FN, `orders must be non-negative integers, got p = ${p}, q = ${q}`);
  }
  assertFinite(FN, x);
  const n = x.length;
  let mean = 0;
  for (let t = 0; t < n; t++) mean += x[t];
  mean /= n;
  const y = new Float64Array(n);
  for (let t = 0; t < n; t++) y[t] = x[t] - mean;

  if (q === 0) return autoregression(y, mean, p);

  const m = Math.min(Math.max(p + q, Math.min(Math.floor(Math.log(n) ** 2), LONG_AR_CAP)), Math.floor(n / 4));
  if (m < p + q || m < 1) {
    throw new ForecastingError('too-few-observations', FN, `needs a long autoregression of order ≥ ${p + q}, the series (n = ${n}) allows ${m}`);
  }
  const innovations = longAutoregressionResiduals(y, m);
  const first = m + q;
  const rows = n - first;
  const k = p + q;
  if (rows <= k + 1) {
    throw new ForecastingError('too-few-observations', FN, `step 2 needs more than ${k + 1} rows, has ${rows} (n = ${n}, long AR order ${m})`);
  }
  const xtx = new Float64Array(k * k);
  const xty = new Float64Array(k);
  const row = new Float64Array(k);
  for (let t = first; t < n; t++) {
    for (let i = 0; i < p; i++) row[i] = y[t - 1 - i];
    for (let j = 0; j < q; j++) row[p + j] = innovations[t - 1 - j];
    accumulate(xtx, xty, row, y[t], k);
  }
  const beta = solveNormalEquations(xtx, xty, k);
  let rss = 0;
  for (let t = first; t < n; t++) {
    let r = y[t];
    for (let i = 0; i < p; i++) r -= beta[i] * y[t - 1 - i];
    for (let j = 0; j < q; j++) r -= beta[p + j] * innovations[t - 1 - j];
    rss += r * r;
  }
  const ar = stabilise(Array.from(beta.subarray(0, p)));
  // θ(z) = 1 + Σ θ_j z^j is stable when 1 − Σ(−θ_j) z^j is.
  const ma = stabilise(Array.from(beta.subarray(p), (theta) => -theta)).map((c) => -c);
  return { mean, ar, ma, sigma2: rss / rows };
}

/** Conditional least squares of y_t on 1, y_{t−1..t−p} (t = p+1..n), y demeaned by `mean`. */
function autoregression(y: Float64Array, mean: number, p: number): ArmaParameters {
  const n = y.length;
  const k = p + 1;
  const rows = n - p;
  if (rows <= k) {
    throw new ForecastingError('too-few-observations', FN, `AR(${p}) needs more than ${k + p} observations, got ${n}`);
  }
  const xtx = new Float64Array(k * k);
  const xty = new Float64Array(k);
  const row = new Float64Array(k);
  row[p] = 1;
  for (let t = p; t < n; t++) {
    for (let i = 0; i < p; i++) row[i] = y[t - 1 - i];
    accumulate(xtx, xty, row, y[t], k);
  }
  const beta = solveNormalEquations(xtx, xty, k);
  let rss = 0;
  for (let t = p; t < n; t++) {
    let r = y[t] - beta[p];
    for (let i = 0; i < p; i++) r -= beta[i] * y[t - 1 - i];
    rss += r * r;
  }
  const ar = stabilise(Array.from(beta.subarray(0, p)));
  const oneMinusSum = 1 - ar.reduce((s, phi) => s + phi, 0);
  return { mean: mean + beta[p] / oneMinusSum, ar, ma: [], sigma2: rss / rows };
}

/** Residuals of the least-squares AR(m) fit of y (no intercept), t = m+1..n; earlier entries 0. */
function longAutoregressionResiduals(y: Float64Array, m: number): Float64Array {
  const n = y.length;
  // c[i*(m+1)+j] = Σ_{t=m..n−1} y_{t−i} y_{t−j}, filled along diagonals from the first row.
  const size = m + 1;
  const c = new Float64Array(size * size);
  for (let j = 0; j <= m; j++) {
    let s = 0;
    for (let t = m; t < n; t++) s += y[t] * y[t - j];
    c[j] = s;
    c[j * size] = s;
  }
  for (let i = 0; i < m; i++) {
    for (let j = i; j < m; j++) {
      const next = c[i * size + j] + y[m - 1 - i] * y[m - 1 - j] - y[n - 1 - i] * y[n - 1 - j];
      c[(i + 1) * size + (j + 1)] = next;
      c[(j + 1) * size + (i + 1)] = next;
    }
  }
  const a = new Float64Array(m * m);
  const b = new Float64Array(m);
  for (let i = 0; i < m; i++) {
    b[i] = c[(i + 1) * size];
    for (let j = 0; j < m; j++) a[i * m + j] = c[(i + 1) * size + (j + 1)];
  }
  const coef = solveNormalEquations(a, b, m);
  const residuals = new Float64Array(n);
  for (let t = m; t < n; t++) {
    let r = y[t];
    for (let i = 0; i < m; i++) r -= coef[i] * y[t - 1 - i];
    residuals[t] = r;
  }
  return residuals;
}

/** Adds one regression row to XᵀX (upper and lower) and Xᵀy. */
function accumulate(xtx: Float64Array, xty: Float64Array, row: Float64Array, target: number, k: number): void {
  for (let a = 0; a < k; a++) {
    xty[a] += row[a] * target;
    for (let b = 0; b < k; b++) xtx[a * k + b] += row[a] * row[b];
  }
}

/** Solves XᵀX β = Xᵀy by Cholesky; throws 'singular-matrix' when XᵀX is not positive definite. */
function solveNormalEquations(xtx: Float64Array, xty: Float64Array, k: number): Float64Array {
  const factor = new Float64Array(k * k);
  if (!choleskyFactor(xtx, k, factor)) {
    throw new ForecastingError('singular-matrix', FN, 'the regression matrix is singular (is the series constant or too short?)');
  }
  const beta = Float64Array.from(xty);
  choleskySolve(factor, k, beta);
  return beta;
}
