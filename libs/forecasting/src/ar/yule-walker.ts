/**
 * AR(p) by Yule-Walker: the method of moments, solved by the Levinson-Durbin recursion.
 *
 * Model: (x_t − μ) = Σ_{i=1..p} φ_i (x_{t−i} − μ) + e_t, e_t iid N(0, σ²) (R `arima` sign convention).
 * Estimates solve Γ̂_p φ = γ̂_p with Γ̂_p = [γ̂(|i − j|)], and σ² = γ̂(0)·Π_{k=1..p}(1 − φ̂_kk²).
 *
 * Method: Brockwell & Davis (2016), Introduction to Time Series and Forecasting, 3rd ed., §5.1.1
 * (Yule-Walker estimation, eq. 5.1.7–5.1.8) with the Durbin-Levinson algorithm of §2.5.3.
 *
 * Conventions:
 * - μ = the sample mean; γ̂ demeaned with divisor n at every lag, so Γ̂_p is positive definite and
 *   the fitted model is always causal for a non-constant series.
 * - σ² is the plain Levinson-Durbin innovation variance, without small-sample rescaling. R's `ar.yw`
 *   reports var.pred = σ²·n/(n − p − 1) instead; statsmodels `yule_walker(method = 'mle')` and
 *   Brockwell & Davis report σ² as here.
 * - Standard errors are asymptotic: sqrt(diag(σ² Γ̂_p⁻¹)/n) (Brockwell & Davis 2016, §5.1.1,
 *   eq. 5.1.13); R's `asy.var.coef` is the same matrix scaled by n/(n − p − 1). The standard error of
 *   μ is the large-sample sqrt(σ²/(n(1 − Σφ)²)) (long-run variance of the mean, §2.4).
 * - Residuals e_t = (x_t − μ) − Σ φ_i (x_{t−i} − μ) for t > p; the first p are 0 (conditioned on).
 * - loglik, AIC, AICc, BIC from the concentrated conditional likelihood −((n − p)/2)(log(2πσ²) + 1)
 *   with this σ² and k = p + 2 parameters (core/information-criteria.ts).
 *
 * @throws ForecastingError('too-few-observations') when n < p + 2; ('constant-series') when the
 *   series is constant; ('non-finite-input') for NaN or infinite values; ('non-stationary') when the
 *   recursion meets |φ_kk| ≥ 1 (only through rounding on a near-unit-root series);
 *   ('invalid-argument') unless p is a non-negative integer.
 *
 * References: Yule (1927), Phil. Trans. R. Soc. A 226; Walker (1931), Proc. R. Soc. A 131;
 * Brockwell & Davis (2016) §5.1.1; R `stats::ar.yw` source (ar.R) for the rescaled variance.
 */
import { autocovariance } from '../acf/autocovariance';
import { levinsonDurbin } from '../acf/levinson-durbin';
import { toeplitzInverseDiagonal } from '../acf/toeplitz-inverse';
import { armaResiduals } from '../core/arma-filter';
import { assertFinite, assertLength, ForecastingError } from '../core/errors';
import { conditionalInformationCriteria } from '../core/information-criteria';
import type { FitResult } from '../core/types';

/** Fits AR(p) to x by Yule-Walker. */
export function yuleWalker(x: ArrayLike<number>, p: number): FitResult {
  const fn = 'yuleWalker';
  if (!Number.isInteger(p) || p < 0) throw new ForecastingError('invalid-argument', fn, `needs an integer order p ≥ 0, got ${p}`);
  assertFinite(fn, x);
  assertLength(fn, x, p + 2, `p + 2 = ${p + 2} for an AR(${p}) with mean`);
  const n = x.length;
  const gamma = autocovariance(x, p);
  if (!(gamma[0] > 0)) throw new ForecastingError('constant-series', fn, 'the series is constant; an AR model needs some variation');
  let mean = 0;
  for (let t = 0; t < n; t++) mean += x[t];
  mean /= n;

  const phi = p > 0 ? levinsonDurbin(gamma, p) : null;
  const ar = phi ? Array.from(phi.phi) : [];
  const sigma2 = phi ? phi.variances[p] : gamma[0];
  if (!(sigma2 > 0))
    throw new ForecastingError(
      'non-stationary',
      fn,
      'the innovation variance vanished; the series is (numerically) a perfect AR recursion',
    );

  const precision = p > 0 ? toeplitzInverseDiagonal(gamma, p) : new Float64Array(0);
  const arStderr = ar.map((_, i) => Math.sqrt((sigma2 * precision[i]) / n));
  const persistence = 1 - ar.reduce((s, v) => s + v, 0);
  const criteria = conditionalInformationCriteria(n, p, 0, sigma2);

  return {
    method: 'yule-walker',
    p,
    q: 0,
    n,
    mean,
    ar,
    ma: [],
    sigma2,
    stderr: { ar: arStderr, ma: [], mean: Math.sqrt(sigma2 / n) / Math.abs(persistence) },
    loglik: criteria.loglik,
    aic: criteria.aic,
    aicc: criteria.aicc,
    bic: criteria.bic,
    converged: null,
    iterations: null,
    residuals: armaResiduals(x, mean, ar, []),
  };
}
