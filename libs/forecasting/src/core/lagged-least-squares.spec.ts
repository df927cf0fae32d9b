import { describe, expect, it } from 'vitest';
import { householderLeastSquares } from './householder-least-squares';
import { laggedLeastSquares } from './lagged-least-squares';
import { simulateArma } from './simulate-arma';

/** The explicit lagged design, solved by the dense Householder QR: the reference for the fast path. */
function denseReference(x: Float64Array, p: number) {
  const n = x.length;
  const m = n - p;
  const k = p + 1;
  const design = new Float64Array(m * k);
  design.fill(1, 0, m);
  for (let i = 1; i <= p; i++) for (let r = 0; r < m; r++) design[i * m + r] = x[r + p - i];
  return householderLeastSquares('test', design, m, k, x.subarray(p));
}

/** Norm-wise relative difference ‖a − b‖∞ / ‖b‖∞ (Higham 2002, Accuracy and Stability of Numerical Algorithms, §1.2). */
function relativeGap(a: ArrayLike<number>, b: ArrayLike<number>): number {
  let gap = 0;
  let size = 0;
  for (let i = 0; i < a.length; i++) {
    gap = Math.max(gap, Math.abs(a[i] - b[i]));
    size = Math.max(size, Math.abs(b[i]));
  }
  return gap / size;
}

describe('laggedLeastSquares', () => {
  it('equals the dense Householder QR on a persistent hourly-like AR(24) with a large level', () => {
    // Level 900 with strong persistence: the case where uncentred normal equations lose digits.
    const noise = simulateArma({ mean: 0, ar: [0.9, -0.2, 0.05], ma: [], sigma2: 4 }, 8760, 11);
    const x = Float64Array.from(noise, (v, t) => 900 + 50 * Math.sin((2 * Math.PI * t) / 24) + v);
    const fast = laggedLeastSquares('test', x, 24);
    const dense = denseReference(x, 24);
    expect(relativeGap(fast.coefficients, dense.coefficients)).toBeLessThan(1e-10);
    expect(Math.abs(fast.rss - dense.rss) / dense.rss).toBeLessThan(1e-12);
    expect(relativeGap(fast.residuals, dense.residuals)).toBeLessThan(1e-6);
    expect(relativeGap(fast.unscaledCovariance, dense.unscaledCovariance)).toBeLessThan(1e-8);
  });

  it('equals the dense QR on a short series of low order', () => {
    const x = simulateArma({ mean: 0, ar: [0.5], ma: [], sigma2: 1 }, 40, 3);
    const fast = laggedLeastSquares('test', x, 2);
    const dense = denseReference(Float64Array.from(x), 2);
    expect(relativeGap(fast.coefficients, dense.coefficients)).toBeLessThan(1e-12);
    expect(relativeGap(fast.unscaledCovariance, dense.unscaledCovariance)).toBeLessThan(1e-12);
  });

  it('stays within QR accuracy on a random walk (near unit root, refined path)', () => {
    const steps = simulateArma({ mean: 0, ar: [], ma: [], sigma2: 1 }, 2000, 5);
    const x = new Float64Array(2000);
    for (let t = 1; t < 2000; t++) x[t] = x[t - 1] + steps[t];
    const fast = laggedLeastSquares('test', x, 6);
    const dense = denseReference(x, 6);
    expect(relativeGap(fast.coefficients, dense.coefficients)).toBeLessThan(1e-9);
  });

  it('hands an ill-conditioned design to the dense QR (identical answer)', () => {
    // A slow smooth wave with a trace of noise: neighbouring lags are almost the same column.
    const noise = simulateArma({ mean: 0, ar: [], ma: [], sigma2: 1e-14 }, 3000, 9);
    const x = Float64Array.from(noise, (v, t) => Math.sin((2 * Math.PI * t) / 700) + v);
    const fast = laggedLeastSquares('test', x, 8);
    const dense = denseReference(x, 8);
    expect(Array.from(fast.coefficients)).toEqual(Array.from(dense.coefficients));
  });
});
