/**
 * Schäfer–Strimmer shrinkage toward the diagonal on a case small enough to work by hand, and its limits.
 */
import { describe, expect, it } from 'vitest';
import { shrinkCovariance } from './shrink-covariance';

describe('shrinkCovariance', () => {
  it('matches a two-series case worked by hand: λ = 5/21, off-diagonal 4/3', () => {
    // e1 = (1, −1, 2, −2), e2 = (1, 0, 2, −1), T = 4.
    // Ŵ11 = (1 + 1 + 4 + 4)/4 = 2.5; Ŵ22 = (1 + 0 + 4 + 1)/4 = 1.5; Ŵ12 = (1 + 0 + 4 + 2)/4 = 1.75.
    // r² = 1.75² / (2.5 · 1.5) = 3.0625 / 3.75 = 49/60.
    // Σ x1² x2² = Σ e1² e2² / 3.75 = (1 + 0 + 16 + 4)/3.75 = 5.6; (Σ x1 x2)²/T = (7² / 3.75)/4 = 49/15.
    // Var(r) = (5.6 − 49/15) / (4 · 3) = (35/15)/12 = 7/36.  λ = (7/36)/(49/60) = 420/1764 = 5/21.
    // W*12 = (1 − 5/21) · 1.75 = (16/21)(7/4) = 4/3; the diagonal stays 2.5 and 1.5.
    const { covariance, lambda, sample } = shrinkCovariance([
      [1, -1, 2, -2],
      [1, 0, 2, -1],
    ]);
    expect(sample.get(0, 1)).toBeCloseTo(1.75, 15);
    expect(lambda).toBeCloseTo(5 / 21, 15);
    expect(covariance.get(0, 1)).toBeCloseTo(4 / 3, 14);
    expect(covariance.get(1, 0)).toBeCloseTo(4 / 3, 14);
    expect(covariance.get(0, 0)).toBeCloseTo(2.5, 15);
    expect(covariance.get(1, 1)).toBeCloseTo(1.5, 15);
  });

  it('keeps only the diagonal (λ = 1) when the errors are uncorrelated', () => {
    // e1 · e2 = 1 − 1 + 4 − 4 = 0, so every r_ij = 0 and the target is all there is.
    const { covariance, lambda } = shrinkCovariance([
      [1, -1, 2, -2],
      [1, 1, 2, 2],
    ]);
    expect(lambda).toBe(1);
    expect(covariance.get(0, 1)).toBe(0);
  });

  it('shrinks little when many errors pin the correlation down (λ → 0 as T grows)', () => {
    // e2 = e1 + small noise: r ≈ 1 and Var(r) = O(1/T), so λ is small for T = 2000.
    const e1 = Array.from({ length: 2000 }, (_, t) => Math.sin(t * 0.7) + Math.cos(t * 1.3));
    const e2 = e1.map((v, t) => v + 0.1 * Math.sin(t * 2.9));
    expect(shrinkCovariance([e1, e2]).lambda).toBeLessThan(0.01);
  });

  it('refuses a series of only zero errors (W would be singular)', () => {
    expect(() =>
      shrinkCovariance([
        [1, 2, 3],
        [0, 0, 0],
      ]),
    ).toThrow(/series 1 has only zero errors/);
  });
});
