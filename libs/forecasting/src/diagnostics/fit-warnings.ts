/**
 * Warnings about a fitted ARMA part that a planner or analyst must see before trusting its forecasts:
 * an iterative estimator that did not converge, an AR part at (or next to) a unit root, an MA part at
 * the edge of invertibility, and a process mean far outside the data (with a root next to 1 the mean is
 * not identified: Box, Jenkins, Reinsel & Ljung 2016 §4.1 on nonstationary models; Brockwell & Davis
 * 2016 §6.1). Each carries a suggestion: a near-unit root means the series should be differenced (the
 * usual remedy, Box et al. 2016 §4.1.1; Hyndman & Athanasopoulos 2021, Forecasting: Principles and
 * Practice, 3rd ed., §9.1), an MA root on the circle often means it was differenced once too often.
 *
 * The root moduli are those of the reciprocal roots λ of φ(z) = 1 − Σ φ_i z^i and θ(z) = 1 + Σ θ_j z^j
 * (stationary/invertible iff every |λ| < 1), so 0.99 means a root at |z| = 1/0.99 ≈ 1.01.
 */
import { reciprocalRoots } from '../arma/polynomial-roots';
import { isCausalAr } from '../core/ar-stationarity';
import type { FitResult } from '../core/types';

/** Largest reciprocal-root modulus counted as "next to the unit circle". */
export const NEAR_UNIT_MODULUS = 0.99;

/** One warning, with what to do about it. */
export interface EstimatorWarning {
  code: 'not-converged' | 'near-unit-root' | 'ma-near-boundary' | 'mean-outside-data';
  message: string;
  suggestion: string;
}

/** Largest |λ| of the reciprocal roots of 1 − Σ c_i z^i (0 without coefficients). */
export function largestReciprocalRoot(c: ArrayLike<number>): number {
  let k = c.length;
  while (k > 0 && c[k - 1] === 0) k--;
  if (k === 0) return 0;
  return Math.max(...reciprocalRoots(Array.from(c).slice(0, k)).map(([re, im]) => Math.hypot(re, im)));
}

/**
 * largestReciprocalRoot when it is at least NEAR_UNIT_MODULUS, else 0. Every reciprocal root of 1 − Σ c_i z^i is
 * below τ exactly when 1 − Σ c_i τ^{−i} z^i (roots scaled by τ) is causal, which the O(p²) step-down test answers.
 * So the largest modulus is found by bisection on τ between NEAR_UNIT_MODULUS and the bound max(1, Σ|c_i|)
 * (for |λ| > 1, |λ|^p = |Σ c_i λ^{p−i}| ≤ Σ|c_i|·|λ|^{p−1}), to a relative 1e-12: about 40 step-downs, several
 * times cheaper than the root finder at degree 168 (a weekly lag), which stays as the fallback.
 */
export function nearUnitRoot(c: ArrayLike<number>): number {
  if (rootsBelow(c, NEAR_UNIT_MODULUS)) return 0;
  let bound = 0;
  for (let i = 0; i < c.length; i++) bound += Math.abs(c[i]);
  let lo = NEAR_UNIT_MODULUS;
  let hi = Math.max(1, bound) * (1 + 1e-9);
  if (!rootsBelow(c, hi)) return largestReciprocalRoot(c);
  while (hi - lo > 1e-12 * hi) {
    const mid = (lo + hi) / 2;
    if (rootsBelow(c, mid)) hi = mid;
    else lo = mid;
  }
  return hi;
}

/** True when every reciprocal root of 1 − Σ c_i z^i has modulus below τ. */
function rootsBelow(c: ArrayLike<number>, tau: number): boolean {
  const scaled = new Float64Array(c.length);
  let power = 1;
  for (let i = 0; i < c.length; i++) {
    power *= tau;
    scaled[i] = c[i] / power;
  }
  return isCausalAr(scaled);
}

/** The warnings of `fit` on the series `x` it was fitted to (the remainder, for a load model). */
export function estimatorWarnings(fit: FitResult, x: ArrayLike<number>): EstimatorWarning[] {
  const warnings: EstimatorWarning[] = [];
  const name = fit.method === 'nls' ? 'Nonlinear least squares' : 'The estimator';
  if (fit.converged === false) {
    warnings.push({
      code: 'not-converged',
      message: `${name} did not converge in ${fit.iterations ?? '?'} iterations; the estimates are the best point it reached, not an optimum.`,
      suggestion:
        'Difference the series (weekly or daily), or choose lower orders; forecasts from this fit are refused unless asked for explicitly.',
    });
  }
  const ar = nearUnitRoot(fit.ar);
  if (ar >= NEAR_UNIT_MODULUS) {
    warnings.push({
      code: 'near-unit-root',
      message: `The AR part has a root next to the unit circle (largest reciprocal root ${ar.toPrecision(6)}): the series behaves like a random walk or a trend, and the model's mean and long-range forecasts are not reliable.`,
      suggestion: 'Difference the series (a weekly or daily seasonal difference, or a first difference for a trend) and fit again.',
    });
  }
  const ma = nearUnitRoot(Array.from(fit.ma, (theta) => -theta));
  if (ma >= NEAR_UNIT_MODULUS) {
    warnings.push({
      code: 'ma-near-boundary',
      message: `The MA part is at the edge of invertibility (largest reciprocal root ${ma.toPrecision(6)}).`,
      suggestion: 'This often follows one difference too many: difference less, or lower the MA order.',
    });
  }
  let min = Infinity;
  let max = -Infinity;
  for (let i = 0; i < x.length; i++) {
    min = Math.min(min, x[i]);
    max = Math.max(max, x[i]);
  }
  const range = max - min;
  if (x.length > 0 && (fit.mean < min - range || fit.mean > max + range)) {
    warnings.push({
      code: 'mean-outside-data',
      message: `The fitted mean ${fit.mean.toPrecision(5)} lies far outside the data (${min.toPrecision(4)} to ${max.toPrecision(4)}): with a root this close to 1 the mean is not identified.`,
      suggestion: 'Difference the series and fit again.',
    });
  }
  return warnings;
}
