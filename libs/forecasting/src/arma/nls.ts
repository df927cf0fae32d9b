/**
 * ARMA(p, q) by nonlinear least squares on the conditional sum of squares (CSS), with μ estimated jointly.
 *
 * Model: (x_t − μ) = Σ_{i=1..p} φ_i (x_{t−i} − μ) + e_t + Σ_{j=1..q} θ_j e_{t−j},  e_t ~ iid N(0, σ²)
 * (R's `arima` sign convention).
 *
 * Method: minimise CSS(φ, θ, μ) = Σ_{t=p+1..n} e_t² (Box, Jenkins, Reinsel & Ljung 2016, Time Series
 * Analysis, 5th ed., §7.1.2 conditional likelihood, §7.2 nonlinear estimation) from Hannan-Rissanen
 * starting values (Hannan & Rissanen 1982) by Levenberg-Marquardt steps (Levenberg 1944; Marquardt
 * 1963, J. SIAM 11(2): damping λ·diag(JᵀJ)). Steps start as Gauss-Newton (JᵀJ); when Gauss-Newton
 * slows down (the predicted decrease shrinks by less than 10× per step, as on near-redundant models
 * where it can crawl for a hundred steps) they switch to Newton on half the exact Hessian
 * JᵀJ + Σ e_t ∇²e_t wherever that is positive definite (quadratic convergence). J and ∇²e come
 * analytically from the recursive-filtering derivatives of ./css.ts. Convergence: the relative offset of
 * Bates & Watts (1981, Technometrics 23(2); Bates & Watts 1988, Nonlinear Regression Analysis §2.2.3) —
 * the predicted decrease relative to the residual scale — below `tolerance`, or a predicted decrease
 * below 1e-14·CSS, which double precision cannot resolve.
 *
 * Stationarity and invertibility: enforced by root reflection, not by reparametrisation. A trial step
 * whose AR (MA) polynomial has a zero inside the unit circle has that reciprocal root λ replaced by
 * 1/λ̄ before the sum of squares is evaluated, and the step is kept only if the sum still decreases;
 * a root on the unit circle rejects the step. Why: the Gaussian model is unchanged by reflection
 * (same autocorrelations, Brockwell & Davis 2016 §3.1), the parameters stay the natural ones so the
 * analytic derivatives and the Gauss-Newton standard errors need no chain rule through a
 * partial-autocorrelation map, and away from the boundary (the usual case) no step is altered at all.
 *
 * Conventions: conditional on the first p observations (e_1..e_p = 0, returned as 0), pre-sample
 * innovations 0, as R's `arima(method = "CSS")` with n.cond = p.
 * σ² = CSS/(n − p) (the conditional MLE, as R). Standard errors: Gauss-Newton, cov = σ²·(JᵀJ)⁻¹ at the
 * optimum. R instead inverts a numerical Hessian of ½·log(CSS/(n − p)) times n, which is
 * (n − p)/n times `observedCovariance` (σ² times the inverse of the exact half Hessian, also reported).
 * The Gauss-Newton errors drop the curvature term Σ e_t ∇²e_t: within a few per cent of R's on
 * well-identified models, but e.g. 2.5 times smaller for LakeHuron ARMA(2,1), a near-redundant model. Conditional Gaussian log-likelihood ℓ = −((n − p)/2)(log(2πσ²) + 1) over
 * the n − p residuals; R's CSS "loglik" is −(n/2)(log(2πσ²) + 1) with n counting ALL observations
 * (the conditioned ones too), so the two differ by (p/2)(log(2πσ²) + 1).
 * With K = p + q + 2 parameters (φ, θ, μ and σ²; K = p + q + 1 without a mean) and m = n − p
 * residuals: AIC = −2ℓ + 2K, AICc = AIC + 2K(K + 1)/(m − K − 1) (Hurvich & Tsai 1989, Biometrika
 * 76(2), with the conditional sample size m), BIC = −2ℓ + K·log(m) (Schwarz 1978).
 *
 * @throws ForecastingError: 'invalid-argument' (orders or options), 'non-finite-input',
 * 'too-few-observations' (needs n − p ≥ p + q + 2 with a mean), 'constant-series', 'singular-matrix'
 * (a model that fits exactly, σ² = 0). A fit that does not converge is returned with
 * `converged: false` (best point found) so the caller can fall back; 'no-convergence' is thrown only
 * when no finite sum of squares was reached at all.
 *
 * References: Box, Jenkins, Reinsel & Ljung (2016) §7.1–7.2; Brockwell & Davis (2016) §5.2;
 * Marquardt (1963); Bates & Watts (1988); R `stats` arima.R / arima.c (ARIMA_CSS).
 */
import { assertFinite, ForecastingError } from '../core/errors';
import type { ArmaParameters, FitResult } from '../core/types';
import { choleskyFactor, choleskyInverse, choleskySolve } from './cholesky';
import { cssNormalEquations, cssSumOfSquares, createCssWorkspace, type CssLayout } from './css';
import { hannanRissanen } from './hannan-rissanen';
import { isInvertible, isStationary, reflectAr, reflectMa } from './polynomial-roots';

const FN = 'nlsArma';
/** Consecutive accepted steps that each lower the sum by less than 1e-9 relative before giving up. */
const STALL_LIMIT = 5;

/** Options of nlsArma. */
export interface NlsOptions {
  /** Levenberg-Marquardt iterations (accepted steps) before giving up; default 200. */
  maxIterations?: number;
  /** Relative-offset convergence tolerance; default 1e-8. */
  tolerance?: number;
  /** Estimate μ jointly (default true); false fixes μ = 0. */
  includeMean?: boolean;
}

/** A CSS fit: the shared FitResult plus what only this estimator reports. */
export interface NlsFitResult extends FitResult {
  method: 'nls';
  /** The conditional sum of squares Σ_{t>p} e_t² at the estimate. */
  css: number;
  /** Gauss-Newton covariance σ²(JᵀJ)⁻¹ in the order [φ.., θ.., μ], or null when JᵀJ is singular. */
  covariance: number[][] | null;
  /**
   * Observed-information covariance σ²·(½∇²CSS)⁻¹ from the exact analytic Hessian, order [φ.., θ.., μ],
   * or null when the Hessian is not positive definite. Times (n − p)/n it is what R's `arima(method =
   * "CSS")` reports as var.coef (R differentiates numerically).
   */
  observedCovariance: number[][] | null;
  /** The Hannan-Rissanen (or fallback) starting values. */
  start: ArmaParameters;
}

/** Fits ARMA(p, q) to x by nonlinear least squares on the conditional sum of squares. */
export function nlsArma(x: ArrayLike<number>, p: number, q: number, options: NlsOptions = {}): NlsFitResult {
  const maxIterations = options.maxIterations ?? 200;
  const tolerance = options.tolerance ?? 1e-8;
  const includeMean = options.includeMean ?? true;
  if (!Number.isInteger(p) || !Number.isInteger(q) || p < 0 || q < 0) {
    throw new ForecastingError('invalid-argument', FN, `orders must be non-negative integers, got p = ${p}, q = ${q}`);
  }
  if (!Number.isInteger(maxIterations) || maxIterations < 1) {
    throw new ForecastingError('invalid-argument', FN, `maxIterations must be a positive integer, got ${maxIterations}`);
  }
  if (!(tolerance > 0) || !Number.isFinite(tolerance)) {
    throw new ForecastingError('invalid-argument', FN, `tolerance must be a positive number, got ${tolerance}`);
  }
  assertFinite(FN, x);
  const layout: CssLayout = { p, q, includeMean };
  const k = p + q + (includeMean ? 1 : 0);
  // At least as many residuals after the p conditioned on as parameters (k coefficients and σ²).
  const minimum = p + k + 1;
  if (x.length < minimum) {
    throw new ForecastingError(
      'too-few-observations',
      FN,
      `needs at least ${minimum} observations for ARMA(${p},${q}) (${k + 1} residuals after the ${p} conditioned on, one per parameter), got ${x.length}`,
    );
  }
  const series = Float64Array.from(x);
  const n = series.length;
  if (series.every((value) => value === series[0])) {
    throw new ForecastingError('constant-series', FN, `the series is constant (every value is ${series[0]}); there is nothing to fit`);
  }
  const m = n - p;

  const start = startingValues(series, p, q, includeMean);
  const beta = new Float64Array(k);
  beta.set(start.ar, 0);
  beta.set(start.ma, p);
  if (includeMean) beta[p + q] = start.mean;

  const workspace = createCssWorkspace(n, layout);
  let jtj = new Float64Array(k * k);
  let gradient = new Float64Array(k);
  let hessian = new Float64Array(k * k);
  let trialJtj = new Float64Array(k * k);
  let trialGradient = new Float64Array(k);
  let trialHessian = new Float64Array(k * k);
  const damped = new Float64Array(k * k);
  const factor = new Float64Array(k * k);
  const step = new Float64Array(k);
  const trial = new Float64Array(k);

  // Gauss-Newton passes are about 2.5 times cheaper than passes with the Hessian; switch to Newton
  // only when Gauss-Newton converges slowly (predicted decrease shrinking by less than 10× a step).
  let newton = false;
  let css = cssNormalEquations(series, beta, workspace, jtj, gradient, null);
  if (!Number.isFinite(css)) {
    throw new ForecastingError('no-convergence', FN, 'the sum of squares is not finite at the starting values');
  }
  let lambda = 1e-12;
  let iterations = 0;
  let converged = k === 0;
  let stalled = 0;
  let previousPredicted = Infinity;
  while (!converged && iterations < maxIterations) {
    // Newton where half the Hessian is positive definite (near the optimum), Gauss-Newton elsewhere.
    let base = newton && choleskyFactor(hessian, k, factor) ? hessian : jtj;
    let predicted = predictedDecrease(base, gradient, k, factor, step);
    if (!newton && predicted !== null && predicted > 0.1 * previousPredicted) {
      newton = true;
      cssNormalEquations(series, beta, workspace, jtj, gradient, hessian);
      base = choleskyFactor(hessian, k, factor) ? hessian : jtj;
      predicted = predictedDecrease(base, gradient, k, factor, step);
    }
    if (predicted !== null) {
      const offset = Math.sqrt(predicted / k / (Math.max(css - predicted, 0) / Math.max(m - k, 1)));
      if (offset < tolerance || predicted <= 1e-14 * css) {
        converged = true;
        break;
      }
      previousPredicted = predicted;
    }
    let accepted = false;
    while (lambda <= 1e16) {
      for (let i = 0; i < k * k; i++) damped[i] = base[i];
      for (let i = 0; i < k; i++) damped[i * k + i] += lambda * Math.max(jtj[i * k + i], 1e-12);
      if (!choleskyFactor(damped, k, factor)) {
        lambda = Math.max(lambda * 10, 1e-6);
        continue;
      }
      for (let i = 0; i < k; i++) step[i] = -gradient[i];
      choleskySolve(factor, k, step);
      for (let i = 0; i < k; i++) trial[i] = beta[i] + step[i];
      if (!keepInsideRegion(trial, p, q)) {
        lambda = Math.max(lambda * 10, 1e-6);
        continue;
      }
      const trialCss = cssNormalEquations(series, trial, workspace, trialJtj, trialGradient, newton ? trialHessian : null);
      if (trialCss < css) {
        stalled = css - trialCss <= 1e-9 * css ? stalled + 1 : 0;
        beta.set(trial);
        css = trialCss;
        [jtj, trialJtj] = [trialJtj, jtj];
        [gradient, trialGradient] = [trialGradient, gradient];
        [hessian, trialHessian] = [trialHessian, hessian];
        lambda = Math.max(lambda / 10, 1e-12);
        accepted = true;
        break;
      }
      lambda = Math.max(lambda * 10, 1e-6);
    }
    if (!accepted || stalled >= STALL_LIMIT) {
      // No decrease is possible at any damping, or only tiny ones (< 1e-9 relative) for several
      // steps: a stationary point to working precision if the predicted Gauss-Newton decrease is
      // negligible; otherwise a failure (typically creeping along the stationarity boundary of a
      // near-saturated model).
      const predictedNow = predictedDecrease(jtj, gradient, k, factor, step);
      converged = predictedNow !== null && predictedNow <= 1e-10 * css;
      break;
    }
    iterations++;
  }
  // The Hessian at the estimate, for the observed-information covariance.
  if (!newton && k > 0) cssNormalEquations(series, beta, workspace, jtj, gradient, hessian);

  const residuals = new Float64Array(n);
  css = cssSumOfSquares(series, beta, layout, residuals);
  const sigma2 = css / m;
  if (!(sigma2 > 0)) {
    throw new ForecastingError('singular-matrix', FN, `ARMA(${p},${q}) fits the series exactly (σ² = 0); the likelihood is unbounded`);
  }
  return assemble(beta, layout, n, css, sigma2, jtj, hessian, residuals, start, converged, iterations);
}

/** Hannan-Rissanen starting values, or zeros with the sample mean when they cannot be computed. */
function startingValues(series: Float64Array, p: number, q: number, includeMean: boolean): ArmaParameters {
  let start: ArmaParameters;
  try {
    start = hannanRissanen(series, p, q);
  } catch (error) {
    if (!(error instanceof ForecastingError)) throw error;
    let mean = 0;
    for (const value of series) mean += value;
    mean /= series.length;
    let variance = 0;
    for (const value of series) variance += (value - mean) ** 2;
    start = { mean, ar: new Array<number>(p).fill(0), ma: new Array<number>(q).fill(0), sigma2: variance / series.length };
  }
  if (!includeMean) start = { ...start, mean: 0 };
  return start;
}

/**
 * gᵀA⁻¹g with A = JᵀJ (Gauss-Newton) or half the Hessian (Newton): the decrease of the sum of squares
 * the full step predicts; null when A is not positive definite.
 */
function predictedDecrease(jtj: Float64Array, gradient: Float64Array, k: number, factor: Float64Array, step: Float64Array): number | null {
  if (!choleskyFactor(jtj, k, factor)) return null;
  step.set(gradient);
  choleskySolve(factor, k, step);
  let decrease = 0;
  for (let i = 0; i < k; i++) decrease += gradient[i] * step[i];
  return decrease;
}

/** Reflects explosive AR or non-invertible MA roots of the trial point; false when a root is on the circle. */
function keepInsideRegion(trial: Float64Array, p: number, q: number): boolean {
  if (p > 0 && !isStationary(trial.subarray(0, p))) {
    const reflected = reflectAr(trial.subarray(0, p));
    if (reflected === null || !isStationary(reflected)) return false;
    trial.set(reflected, 0);
  }
  if (q > 0 && !isInvertible(trial.subarray(p, p + q))) {
    const reflected = reflectMa(trial.subarray(p, p + q));
    if (reflected === null || !isInvertible(reflected)) return false;
    trial.set(reflected, p);
  }
  return true;
}

/** Builds the result: information criteria, Gauss-Newton standard errors. */
function assemble(
  beta: Float64Array,
  layout: CssLayout,
  n: number,
  css: number,
  sigma2: number,
  jtj: Float64Array,
  hessian: Float64Array,
  residuals: Float64Array,
  start: ArmaParameters,
  converged: boolean,
  iterations: number,
): NlsFitResult {
  const { p, q, includeMean } = layout;
  const k = beta.length;
  const m = n - p;
  const loglik = -(m / 2) * (Math.log(2 * Math.PI * sigma2) + 1);
  const parameters = k + 1;
  const aic = -2 * loglik + 2 * parameters;
  const aicc = m - parameters - 1 > 0 ? aic + (2 * parameters * (parameters + 1)) / (m - parameters - 1) : null;
  const bic = -2 * loglik + parameters * Math.log(m);

  const covariance = scaledInverse(jtj, k, sigma2);
  const se = (i: number) => Math.sqrt(covariance![i][i]);
  return {
    method: 'nls',
    p,
    q,
    n,
    mean: includeMean ? beta[p + q] : 0,
    ar: Array.from(beta.subarray(0, p)),
    ma: Array.from(beta.subarray(p, p + q)),
    sigma2,
    stderr: {
      ar: covariance === null ? null : Array.from({ length: p }, (_, i) => se(i)),
      ma: covariance === null ? null : Array.from({ length: q }, (_, j) => se(p + j)),
      mean: covariance === null || !includeMean ? null : se(p + q),
    },
    loglik,
    aic,
    aicc,
    bic,
    converged,
    iterations,
    residuals,
    css,
    covariance,
    observedCovariance: scaledInverse(hessian, k, sigma2),
    start,
  };
}

/** scale·A⁻¹ as nested arrays, or null when A is singular or the result has a non-positive variance. */
function scaledInverse(a: Float64Array, k: number, scale: number): number[][] | null {
  const inverse = k > 0 ? choleskyInverse(a, k) : null;
  if (inverse === null) return null;
  const result: number[][] = [];
  for (let r = 0; r < k; r++) result.push(Array.from(inverse.subarray(r * k, r * k + k), (v) => v * scale));
  return result.some((row, r) => !(row[r] > 0) || row.some((v) => !Number.isFinite(v))) ? null : result;
}
