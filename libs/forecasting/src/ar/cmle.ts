/**
 * AR(p) by conditional maximum likelihood: ordinary least squares of x_t on 1, x_{t−1}, …, x_{t−p}.
 *
 * Model: (x_t − μ) = Σ_{i=1..p} φ_i (x_{t−i} − μ) + e_t, e_t iid N(0, σ²) (R `arima` sign convention),
 * written as the regression x_t = c + Σ φ_i x_{t−i} + e_t with intercept c = μ(1 − Σ φ_i).
 *
 * Method: conditional on x_1..x_p the Gaussian likelihood is maximised by least squares
 * (Box, Jenkins, Reinsel & Ljung 2016, Time Series Analysis, 5th ed., §7.1.2 and §7.3;
 * Hamilton 1994, Time Series Analysis, §5.2), solved by a Householder QR decomposition of the
 * design matrix (ml-matrix QrDecomposition), never by the normal equations, whose condition number
 * is the square of the design's (Golub & Van Loan 2013, Matrix Computations, 4th ed., §5.3).
 *
 * Conventions:
 * - Rows t = p+1..n, m = n − p of them; μ = ĉ/(1 − Σ φ̂).
 * - σ² = RSS/(n − p), the conditional MLE (= R `ar.ols` var.pred, `arima(method = "CSS")` sigma2).
 * - Coefficient standard errors as ordinary least squares reports them, from s²(XᵀX)⁻¹ with the
 *   unbiased s² = RSS/(n − 2p − 1) (= R `summary(lm)`); the standard error of μ by the delta method
 *   on μ = c/(1 − Σφ) with that covariance.
 * - Residuals are the regression residuals for t > p; the first p are 0 (conditioned on).
 * - loglik = −((n − p)/2)(log(2πσ²) + 1), k = p + 2 parameters for AIC, AICc, BIC
 *   (core/information-criteria.ts).
 *
 * @throws ForecastingError('too-few-observations') when n < 2p + 2 (the unbiased s² needs
 *   m > p + 1); ('constant-series') for a constant series; ('singular-matrix') when the lagged
 *   columns are collinear or the fit is exact; ('non-stationary') when φ̂(z) has a root on or
 *   inside the unit circle; ('non-finite-input'); ('invalid-argument') unless p is an integer ≥ 0.
 *
 * References: Box et al. (2016) §7.1–7.3; Hamilton (1994) §5.2; R `stats::ar.ols` and `lm`.
 */
import { Matrix, QrDecomposition } from 'ml-matrix';
import { isStationaryAr } from '../core/ar-stationarity';
import { assertFinite, assertLength, ForecastingError } from '../core/errors';
import { conditionalInformationCriteria } from '../core/information-criteria';
import type { FitResult } from '../core/types';

/** A conditional-MLE AR fit, with the regression intercept it was estimated through. */
export interface CmleFit extends FitResult {
  method: 'cmle';
  /** c = μ(1 − Σφ), the regression intercept. */
  intercept: number;
  /** OLS standard error of c, with s² = RSS/(n − 2p − 1). */
  interceptStderr: number;
}

/** Relative size below which a diagonal entry of R counts as zero (rank deficiency). */
const rankTolerance = 1e-12;

/** Inverse of an upper-triangular matrix by back substitution. */
function invertUpperTriangular(r: Matrix): Matrix {
  const k = r.rows;
  const inv = Matrix.zeros(k, k);
  for (let j = 0; j < k; j++) {
    inv.set(j, j, 1 / r.get(j, j));
    for (let i = j - 1; i >= 0; i--) {
      let sum = 0;
      for (let l = i + 1; l <= j; l++) sum += r.get(i, l) * inv.get(l, j);
      inv.set(i, j, -sum / r.get(i, i));
    }
  }
  return inv;
}

/** Fits AR(p) to x by conditional maximum likelihood (least squares via QR). */
export function cmleAr(x: ArrayLike<number>, p: number): CmleFit {
  const fn = 'cmleAr';
  if (!Number.isInteger(p) || p < 0) throw new ForecastingError('invalid-argument', fn, `needs an integer order p ≥ 0, got ${p}`);
  assertFinite(fn, x);
  assertLength(fn, x, 2 * p + 2, `2p + 2 = ${2 * p + 2} for an AR(${p}) with mean and its standard errors`);
  const n = x.length;
  let constant = true;
  for (let t = 1; t < n && constant; t++) constant = x[t] === x[0];
  if (constant) throw new ForecastingError('constant-series', fn, 'the series is constant; an AR model needs some variation');

  const m = n - p;
  const k = p + 1;
  const rows: Float64Array[] = new Array(m);
  const y = new Float64Array(m);
  for (let r = 0; r < m; r++) {
    const t = r + p;
    const row = new Float64Array(k);
    row[0] = 1;
    for (let i = 1; i <= p; i++) row[i] = x[t - i];
    rows[r] = row;
    y[r] = x[t];
  }
  const design = new Matrix(rows);
  const qr = new QrDecomposition(design);
  const upper = qr.upperTriangularMatrix;
  let largest = 0;
  for (let i = 0; i < k; i++) largest = Math.max(largest, Math.abs(upper.get(i, i)));
  for (let i = 0; i < k; i++) {
    if (!(Math.abs(upper.get(i, i)) > rankTolerance * largest)) {
      throw new ForecastingError('singular-matrix', fn, `the lagged values are collinear (column ${i} of [1, x_{t−1}, …, x_{t−p}]); try a lower order`);
    }
  }
  const beta = qr.solve(Matrix.columnVector(Array.from(y))).getColumn(0);
  const intercept = beta[0];
  const ar = beta.slice(1);
  if (!isStationaryAr(ar)) {
    throw new ForecastingError('non-stationary', fn, `the least-squares AR(${p}) polynomial has a root on or inside the unit circle; difference the series or remove its trend`);
  }

  const residuals = new Float64Array(n);
  let rss = 0;
  for (let r = 0; r < m; r++) {
    let fitted = 0;
    const row = rows[r];
    for (let i = 0; i < k; i++) fitted += row[i] * beta[i];
    const e = y[r] - fitted;
    residuals[r + p] = e;
    rss += e * e;
  }
  if (!(rss > 0)) throw new ForecastingError('singular-matrix', fn, 'the residual sum of squares is 0: the series follows an exact AR recursion');

  const sigma2 = rss / m;
  const unbiased = rss / (m - k);
  const rInverse = invertUpperTriangular(upper.subMatrix(0, k - 1, 0, k - 1));
  // Cov(β̂) = s² (XᵀX)⁻¹ = s² R⁻¹ R⁻ᵀ.
  const covariance = rInverse.mmul(rInverse.transpose()).mul(unbiased);
  const persistence = 1 - ar.reduce((s, v) => s + v, 0);
  const mean = intercept / persistence;
  // Delta method: ∂μ/∂c = 1/(1 − Σφ), ∂μ/∂φ_i = c/(1 − Σφ)² = μ/(1 − Σφ).
  const gradient = [1 / persistence, ...ar.map(() => mean / persistence)];
  let meanVariance = 0;
  for (let i = 0; i < k; i++) for (let j = 0; j < k; j++) meanVariance += gradient[i] * covariance.get(i, j) * gradient[j];
  const criteria = conditionalInformationCriteria(n, p, 0, sigma2);

  return {
    method: 'cmle',
    p,
    q: 0,
    n,
    mean,
    ar,
    ma: [],
    sigma2,
    intercept,
    interceptStderr: Math.sqrt(covariance.get(0, 0)),
    stderr: { ar: ar.map((_, i) => Math.sqrt(covariance.get(i + 1, i + 1))), ma: [], mean: Math.sqrt(meanVariance) },
    loglik: criteria.loglik,
    aic: criteria.aic,
    aicc: criteria.aicc,
    bic: criteria.bic,
    converged: null,
    iterations: null,
    residuals,
  };
}
