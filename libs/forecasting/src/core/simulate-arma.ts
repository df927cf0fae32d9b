/**
 * Simulates a Gaussian ARMA(p, q) series for recovery tests and demo data.
 *
 * (x_t − μ) = Σ φ_i (x_{t−i} − μ) + e_t + Σ θ_j e_{t−j}, e_t iid N(0, σ²) (R `arima` sign convention).
 *
 * Method: run the recursion from zeros and discard a burn-in so the start-up transient has decayed
 * (Brockwell & Davis 2016, Introduction to Time Series and Forecasting, 3rd ed., §3.1; the approach
 * of R's `arima.sim` with its `n.start`).
 *
 * Conventions: deterministic for a given seed (core/random.ts); default burn-in 1,000 steps, enough
 * for AR roots up to modulus ~0.99 to decay below 1e-4.
 *
 * @throws ForecastingError('non-stationary') when φ is not causal; ('invalid-argument') for n < 1,
 *   σ² ≤ 0 or a negative burn-in.
 *
 * References: Brockwell & Davis (2016) §3.1; R `stats::arima.sim`.
 */
import { isCausalAr } from './ar-stationarity';
import { ForecastingError } from './errors';
import { normalGenerator } from './random';
import type { ArmaParameters } from './types';

/** n values of the ARMA process with the given parameters, from the seeded normal stream. */
export function simulateArma(model: ArmaParameters, n: number, seed: number, burnIn = 1000): Float64Array {
  const fn = 'simulateArma';
  if (!Number.isInteger(n) || n < 1) throw new ForecastingError('invalid-argument', fn, `needs a positive integer length, got ${n}`);
  if (!Number.isInteger(burnIn) || burnIn < 0)
    throw new ForecastingError('invalid-argument', fn, `needs a non-negative integer burn-in, got ${burnIn}`);
  if (!(model.sigma2 > 0)) throw new ForecastingError('invalid-argument', fn, `needs σ² > 0, got ${model.sigma2}`);
  if (!isCausalAr(model.ar)) throw new ForecastingError('non-stationary', fn, 'the AR polynomial has a root on or inside the unit circle');
  const p = model.ar.length;
  const q = model.ma.length;
  const sigma = Math.sqrt(model.sigma2);
  const normal = normalGenerator(seed);
  const total = n + burnIn;
  const w = new Float64Array(total);
  const e = new Float64Array(total);
  for (let t = 0; t < total; t++) {
    e[t] = sigma * normal();
    let value = e[t];
    for (let i = 1; i <= p && i <= t; i++) value += model.ar[i - 1] * w[t - i];
    for (let j = 1; j <= q && j <= t; j++) value += model.ma[j - 1] * e[t - j];
    w[t] = value;
  }
  const x = new Float64Array(n);
  for (let t = 0; t < n; t++) x[t] = model.mean + w[burnIn + t];
  return x;
}
