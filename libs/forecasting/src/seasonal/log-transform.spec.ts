import { describe, expect, it } from 'vitest';
import { ForecastingError } from '../core/errors';
import { backTransformLog, backTransformLogBound, logTransform } from './log-transform';

/** E[g(Z)] for Z ~ N(m, s²) by the trapezoid rule on ±12 s (independent of the closed forms). */
function gaussianExpectation(g: (x: number) => number, m: number, s: number): number {
  const steps = 200_000;
  const a = m - 12 * s;
  const dx = (24 * s) / steps;
  let sum = 0;
  for (let i = 0; i <= steps; i++) {
    const x = a + i * dx;
    const w = i === 0 || i === steps ? 0.5 : 1;
    sum += w * g(x) * Math.exp(-0.5 * ((x - m) / s) ** 2);
  }
  return (sum * dx) / (s * Math.sqrt(2 * Math.PI));
}

describe('log transform', () => {
  it('round-trips and refuses non-positive values', () => {
    const y = [1, 10, 1000];
    expect(Array.from(backTransformLogBound(logTransform(y))).map((v) => Math.round(v * 1e9) / 1e9)).toEqual(y);
    expect(() => logTransform([1, 0])).toThrow(ForecastingError);
  });

  it('gives the lognormal median, mean and standard deviation (checked by quadrature)', () => {
    const m = 7.2;
    const s = 0.35;
    const out = backTransformLog([m], [s]);
    const mean = gaussianExpectation(Math.exp, m, s);
    const second = gaussianExpectation((x) => Math.exp(2 * x), m, s);
    // Trapezoid error on a smooth integrand over ±12 s is far below 1e-9 relative.
    expect(out.median[0]).toBeCloseTo(Math.exp(m), 9);
    expect(Math.abs(out.mean[0] / mean - 1)).toBeLessThan(1e-9);
    expect(Math.abs(out.se[0] / Math.sqrt(second - mean * mean) - 1)).toBeLessThan(1e-7);
  });
});
