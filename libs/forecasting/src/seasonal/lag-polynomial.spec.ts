import { describe, expect, it } from 'vitest';
import { arWithSeasonalDifference, multiplyArPolynomials, multiplyMaPolynomials } from './lag-polynomial';

describe('lag polynomials', () => {
  it('multiplies (1 − B^s) into the AR polynomial', () => {
    // (1 − 0.5B)(1 − B²) = 1 − 0.5B − B² + 0.5B³  ⇒  φ* = (0.5, 1, −0.5) (hand expansion).
    expect(arWithSeasonalDifference([0.5], 2)).toEqual([0.5, 1, -0.5]);
    // No AR part: (1 − B^24) ⇒ φ*_24 = 1.
    const pure = arWithSeasonalDifference([], 24);
    expect(pure).toHaveLength(24);
    expect(pure[23]).toBe(1);
    expect(pure.slice(0, 23).every((c) => c === 0)).toBe(true);
  });

  it('expands a seasonal MA as (1 + θB)(1 + ΘB^s)', () => {
    // USAccDeaths ARIMA(1,0,1)(0,1,1)[12]: θ = −0.407…, Θ = −0.604… ⇒ lag 13 coefficient θΘ.
    const ma = multiplyMaPolynomials([-0.4], [-0.6], 12);
    expect(ma).toHaveLength(13);
    expect(ma[0]).toBeCloseTo(-0.4, 15);
    expect(ma[11]).toBeCloseTo(-0.6, 15);
    expect(ma[12]).toBeCloseTo(0.24, 15);
  });

  it('expands a seasonal AR as (1 − φB)(1 − ΦB^s)', () => {
    // (1 − 0.5B)(1 − 0.3B³) = 1 − 0.5B − 0.3B³ + 0.15B⁴.
    expect(multiplyArPolynomials([0.5], [0.3], 3)).toEqual([0.5, 0, 0.3, -0.15]);
  });
});
