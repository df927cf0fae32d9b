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
export function armaResiduals(x: ArrayLike<number>, mean: number, ar: ArrayLike<number>, ma: ArrayLike<number>): Float64Array {
  assertFinite('armaResiduals', x);
  assertFinite('armaResiduals', ar, 'ar coefficients');
  assertFinite('armaResiduals', ma, 'ma coefficients');
  if (!Number.isFinite(mean)) throw new ForecastingError('non-finite-input', 'armaResiduals', `mean is ${mean}`);
  const w = new Float64Array(x.length);
  for (let t = 0; t < x.length; t++) w[t] = x[t] - mean;
  return prewhiten(w, ar, ma);
}

/**
 * armaResiduals of a series already centred (mean 0) and known to be finite: the CSS recursion without the checks
 * and the centring copy, as the GLS steps prewhiten their own columns many times per fit.
 */
export function prewhiten(w: Float64Array, ar: ArrayLike<number>, ma: ArrayLike<number>): Float64Array {
  const n = w.length;
  const p = ar.length;
  const q = ma.length;
  const theta = Float64Array.from(ma);
  const e = new Float64Array(n);
  // Only the non-zero φ_i, in order: a wide-lag AR (lags 1–48 and 168 of 168) is mostly zeros, and skipping an
  // exact zero leaves every sum bit for bit as it was.
  const { lags, coefficients: phi } = nonZeroTerms(ar);
  const terms = lags.length;
  // AR part u_t = w_t − Σ φ_i w_{t−i} first: it is not recursive, so four t share each φ_i.
  let t = p;
  for (; t + 3 < n; t += 4) {
    let u0 = w[t];
    let u1 = w[t + 1];
    let u2 = w[t + 2];
    let u3 = w[t + 3];
    for (let i = 0; i < terms; i++) {
      const c = phi[i];
      const base = t - lags[i];
      u0 -= c * w[base];
      u1 -= c * w[base + 1];
      u2 -= c * w[base + 2];
      u3 -= c * w[base + 3];
    }
    e[t] = u0;
    e[t + 1] = u1;
    e[t + 2] = u2;
    e[t + 3] = u3;
  }
  for (; t < n; t++) {
    let u = w[t];
    for (let i = 0; i < terms; i++) u -= phi[i] * w[t - lags[i]];
    e[t] = u;
  }
  // MA part e_t = u_t − Σ θ_j e_{t−j}, recursive; e before t = p is 0 (conditioned on or pre-sample).
  if (q > 0) {
    for (let s = p; s < n; s++) {
      let value = e[s];
      const reach = Math.min(q, s - p);
      for (let j = 0; j < reach; j++) value -= theta[j] * e[s - j - 1];
      e[s] = value;
    }
  }
  return e;
}

/** The lags (1-based) and values of the non-zero coefficients, in increasing lag order. */
export function nonZeroTerms(coefficients: ArrayLike<number>): { lags: Int32Array; coefficients: Float64Array } {
  let count = 0;
  for (let i = 0; i < coefficients.length; i++) if (coefficients[i] !== 0) count++;
  const lags = new Int32Array(count);
  const values = new Float64Array(count);
  for (let i = 0, k = 0; i < coefficients.length; i++) {
    if (coefficients[i] === 0) continue;
    lags[k] = i + 1;
    values[k++] = coefficients[i];
  }
  return { lags, coefficients: values };
}
