/**
 * One-step residuals of an ARMA(p, q) model by the conditional-sum-of-squares recursion.
 *
 * Model: (x_t − μ) = Σ_{i=1..p} φ_i (x_{t−i} − μ) + e_t + Σ_{j=1..q} θ_j e_{t−j}.
 * With w_t = x_t − μ: e_t = w_t − Σ φ_i w_{t−i} − Σ θ_j e_{t−j} for t = p+1..n.
 *
 * Method: the conditional least-squares recursion (Box, Jenkins, Reinsel & Ljung 2016, Time Series
 * Analysis, 5th ed., §7.1.2; Brockwell & Davis 2016, §5.2).
 *
 * Conventions: conditions on the first p observations, whose residuals are returned as 0;
 * pre-sample errors are 0; identical to R's `arima(method = "CSS")` residuals for a series
 * without differencing (n.cond = p).
 *
 * @throws ForecastingError('non-finite-input') for non-finite data or coefficients.
 *
 * References: R `stats` arima.c, ARIMA_CSS; Box et al. (2016) §7.1.
 */
import { assertFinite, ForecastingError } from './errors';

/** The CSS residuals e_1..e_n of x under (μ, φ, θ); e_1..e_p are 0. */
export function armaResiduals(
  x: ArrayLike<number>,
  mean: number,
  ar: ArrayLike<number>,
  ma: ArrayLike<number>,
): Float64Array {
  assertFinite('armaResiduals', x);
  assertFinite('armaResiduals', ar, 'ar coefficients');
  assertFinite('armaResiduals', ma, 'ma coefficients');
  if (!Number.isFinite(mean)) throw new ForecastingError('non-finite-input', 'armaResiduals', `mean is ${mean}`);
  const n = x.length;
  const p = ar.length;
  const q = ma.length;
  const w = new Float64Array(n);
  for (let t = 0; t < n; t++) w[t] = x[t] - mean;
  const e = new Float64Array(n);
  for (let t = p; t < n; t++) {
    let value = w[t];
    for (let i = 0; i < p; i++) value -= ar[i] * w[t - i - 1];
    // e before t = p is 0 (conditioned on or pre-sample), so those terms drop out.
    const reach = Math.min(q, t - p);
    for (let j = 0; j < reach; j++) value -= ma[j] * e[t - j - 1];
    e[t] = value;
  }
  return e;
}
