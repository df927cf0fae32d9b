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
    throw new ForecastingError(
      'too-few-observations',
      FN,
      `needs a long autoregression of order ≥ ${p + q}, the series (n = ${n}) allows ${m}`,
    );
  }
  const innovations = longAutoregressionResiduals(y, m);
  const first = m + q;
  const rows = n - first;
  const k = p + q;
  if (rows <= k + 1) {
    throw new ForecastingError(
      'too-few-observations',
      FN,
      `step 2 needs more than ${k + 1} rows, has ${rows} (n = ${n}, long AR order ${m})`,
    );
  }
  // Regressors as shifted views: column i is y_{t−1−i}, column p + j is ê_{t−1−j}, t = first..n−1.
  const columns: Array<Float64Array | null> = [];
  for (let i = 0; i < p; i++) columns.push(y.subarray(first - 1 - i, n - 1 - i));
  for (let j = 0; j < q; j++) columns.push(innovations.subarray(first - 1 - j, n - 1 - j));
  const { beta, rss } = columnLeastSquares(columns, y.subarray(first));
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
  const columns: Array<Float64Array | null> = [];
  for (let i = 0; i < p; i++) columns.push(y.subarray(p - 1 - i, n - 1 - i));
  columns.push(null);
  const { beta, rss } = columnLeastSquares(columns, y.subarray(p));
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
  const firstRow = laggedProducts(y, m);
  for (let j = 0; j <= m; j++) {
    c[j] = firstRow[j];
    c[j * size] = firstRow[j];
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
  // Four independent partial sums: the dependent chain of one accumulator, not the arithmetic,
  // limits a long dot product.
  const blocked = m - (m % 4);
  for (let t = m; t < n; t++) {
    let r0 = y[t];
    let r1 = 0;
    let r2 = 0;
    let r3 = 0;
    let i = 0;
    for (; i < blocked; i += 4) {
      r0 -= coef[i] * y[t - 1 - i];
      r1 -= coef[i + 1] * y[t - 2 - i];
      r2 -= coef[i + 2] * y[t - 3 - i];
      r3 -= coef[i + 3] * y[t - 4 - i];
    }
    for (; i < m; i++) r0 -= coef[i] * y[t - 1 - i];
    residuals[t] = r0 + r1 + r2 + r3;
  }
  return residuals;
}

/** Σ_{t=m..n−1} y_t y_{t−j} for j = 0..m, four lags per sweep so the sums run independently. */
function laggedProducts(y: Float64Array, m: number): Float64Array {
  const n = y.length;
  const sums = new Float64Array(m + 1);
  let j = 0;
  for (; j + 3 <= m; j += 4) {
    let s0 = 0;
    let s1 = 0;
    let s2 = 0;
    let s3 = 0;
    for (let t = m; t < n; t++) {
      const yt = y[t];
      s0 += yt * y[t - j];
      s1 += yt * y[t - j - 1];
      s2 += yt * y[t - j - 2];
      s3 += yt * y[t - j - 3];
    }
    sums[j] = s0;
    sums[j + 1] = s1;
    sums[j + 2] = s2;
    sums[j + 3] = s3;
  }
  for (; j <= m; j++) {
    let s0 = 0;
    for (let t = m; t < n; t++) s0 += y[t] * y[t - j];
    sums[j] = s0;
  }
  return sums;
}

/**
 * Least squares of `target` on `columns` (null stands for a column of ones) by the normal equations;
 * XᵀX and Xᵀy are column dot products, and RSS = yᵀy − βᵀXᵀy at the solution.
 */
function columnLeastSquares(columns: Array<Float64Array | null>, target: Float64Array): { beta: Float64Array; rss: number } {
  const k = columns.length;
  const xtx = new Float64Array(k * k);
  const xty = new Float64Array(k);
  const product = (a: Float64Array | null, b: Float64Array | null): number =>
    a === null ? (b === null ? target.length : sum(b)) : b === null ? sum(a) : dot(a, b);
  for (let a = 0; a < k; a++) {
    xty[a] = product(columns[a], target);
    for (let b = a; b < k; b++) {
      const value = product(columns[a], columns[b]);
      xtx[a * k + b] = value;
      xtx[b * k + a] = value;
    }
  }
  const beta = solveNormalEquations(xtx, xty, k);
  let explained = 0;
  for (let a = 0; a < k; a++) explained += beta[a] * xty[a];
  return { beta, rss: Math.max(dot(target, target) - explained, 0) };
}

/** Σ a_t b_t with four independent partial sums. */
function dot(a: Float64Array, b: Float64Array): number {
  const n = a.length;
  const blocked = n - (n % 4);
  let s0 = 0;
  let s1 = 0;
  let s2 = 0;
  let s3 = 0;
  let t = 0;
  for (; t < blocked; t += 4) {
    s0 += a[t] * b[t];
    s1 += a[t + 1] * b[t + 1];
    s2 += a[t + 2] * b[t + 2];
    s3 += a[t + 3] * b[t + 3];
  }
  for (; t < n; t++) s0 += a[t] * b[t];
  return s0 + s1 + s2 + s3;
}

/** Σ a_t. */
function sum(a: Float64Array): number {
  let total = 0;
  for (let t = 0; t < a.length; t++) total += a[t];
  return total;
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
