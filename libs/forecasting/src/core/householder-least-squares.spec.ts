import { describe, expect, it } from 'vitest';
import { householderLeastSquares } from './householder-least-squares';

describe('householderLeastSquares', () => {
  it('fits a straight line by hand: y = 1, 3, 4 on x = 0, 1, 2 gives slope 1.5, intercept 7/6 and RSS 1/6', () => {
    // Normal-equation arithmetic by hand: x̄ = 1, ȳ = 8/3, Sxy = 3, Sxx = 2 → b = 1.5, a = 8/3 − 1.5 = 7/6.
    const design = Float64Array.from([1, 1, 1, 0, 1, 2]);
    const fit = householderLeastSquares('test', design, 3, 2, [1, 3, 4]);
    expect(fit.coefficients[0]).toBeCloseTo(7 / 6, 14);
    expect(fit.coefficients[1]).toBeCloseTo(1.5, 14);
    expect(fit.rss).toBeCloseTo(1 / 6, 14);
    // (XᵀX)⁻¹ = [[5/6, −1/2], [−1/2, 1/2]] for XᵀX = [[3, 3], [3, 5]].
    expect(Array.from(fit.unscaledCovariance).map((v) => Number(v.toFixed(12)))).toEqual([0.833333333333, -0.5, -0.5, 0.5]);
  });

  it('stays accurate where the normal equations lose half the digits (Läuchli matrix, Björck 1996, §2.4.1)', () => {
    // X = [[1, 1], [δ, 0], [0, δ]] with δ = 1e-7: XᵀX = [[1 + δ², 1], [1, 1 + δ²]] rounds to singular in doubles.
    const delta = 1e-7;
    const design = Float64Array.from([1, delta, 0, 1, 0, delta]);
    // y = X·(1, 2) exactly, so β̂ = (1, 2).
    const fit = householderLeastSquares('test', design, 3, 2, [3, delta, 2 * delta]);
    expect(fit.coefficients[0]).toBeCloseTo(1, 8);
    expect(fit.coefficients[1]).toBeCloseTo(2, 8);
  });

  it('reports collinear columns as singular-matrix', () => {
    const design = Float64Array.from([1, 1, 1, 2, 2, 2]);
    expect(() => householderLeastSquares('test', design, 3, 2, [1, 2, 3])).toThrow(expect.objectContaining({ code: 'singular-matrix' }));
  });
});
