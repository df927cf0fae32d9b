/**
 * AR(p) by conditional maximum likelihood: ordinary least squares of x_t on 1, x_{t−1}, …, x_{t−p}.
 *
 * Model: (x_t − μ) = Σ_{i=1..p} φ_i (x_{t−i} − μ) + e_t, e_t iid N(0, σ²) (R `arima` sign convention),
 * written as the regression x_t = c + Σ φ_i x_{t−i} + e_t with intercept c = μ(1 − Σ φ_i).
 *
 * Method: conditional on x_1..x_p the Gaussian likelihood is maximised by least squares
 * (Box, Jenkins, Reinsel & Ljung 2016, Time Series Analysis, 5th ed., §7.1.2 and §7.3;
 * Hamilton 1994, Time Series Analysis, §5.2), never by the plain normal equations, whose condition
 * number is the square of the design's (Golub & Van Loan 2013, Matrix Computations, 4th ed., §5.3).
 * The solver (core/lagged-least-squares.ts) uses the lagged design's shift structure to form the
 * centred cross-products in O(np), takes R from their Cholesky factor, refines once by the corrected
 * semi-normal equations (Björck 1996 §2.5.3: QR-grade accuracy while cond(X)²·u < 1), and hands any
 * ill-conditioned design to a Householder QR of the explicit design (core/householder-least-squares.ts).
 * AR(24) on 8,760 points: ~0.5 ms this way against ~10 ms for the dense QR and ~260 ms for
 * ml-matrix's QrDecomposition; both paths agree to 1e-9 (lagged-least-squares.spec.ts).
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
import { isCausalAr } from '../core/ar-stationarity';
import { assertFinite, assertLength, ForecastingError } from '../core/errors';
import { laggedLeastSquares } from '../core/lagged-least-squares';
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
  const solution = laggedLeastSquares(fn, x, p);
  const intercept = solution.coefficients[0];
  const ar = Array.from(solution.coefficients.subarray(1));
  if (!isCausalAr(ar)) {
    throw new ForecastingError(
      'non-stationary',
      fn,
      `the least-squares AR(${p}) polynomial has a root on or inside the unit circle; difference the series or remove its trend`,
    );
  }
  const rss = solution.rss;
  if (!(rss > 0))
    throw new ForecastingError('singular-matrix', fn, 'the residual sum of squares is 0: the series follows an exact AR recursion');
  const residuals = new Float64Array(n);
  residuals.set(solution.residuals, p);

  const sigma2 = rss / m;
  const unbiased = rss / (m - k);
  // Cov(β̂) = s² (XᵀX)⁻¹.
  const covariance = (i: number, j: number) => unbiased * solution.unscaledCovariance[i * k + j];
  const persistence = 1 - ar.reduce((s, v) => s + v, 0);
  const mean = intercept / persistence;
  // Delta method: ∂μ/∂c = 1/(1 − Σφ), ∂μ/∂φ_i = c/(1 − Σφ)² = μ/(1 − Σφ).
  const gradient = [1 / persistence, ...ar.map(() => mean / persistence)];
  let meanVariance = 0;
  for (let i = 0; i < k; i++) for (let j = 0; j < k; j++) meanVariance += gradient[i] * covariance(i, j) * gradient[j];
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
    interceptStderr: Math.sqrt(covariance(0, 0)),
    stderr: { ar: ar.map((_, i) => Math.sqrt(covariance(i + 1, i + 1))), ma: [], mean: Math.sqrt(meanVariance) },
    loglik: criteria.loglik,
    aic: criteria.aic,
    aicc: criteria.aicc,
    bic: criteria.bic,
    converged: null,
    iterations: null,
    residuals,
  };
}
