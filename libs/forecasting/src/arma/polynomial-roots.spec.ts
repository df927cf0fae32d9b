// Checks of the stationarity/invertibility tests and root reflection.
// Sources: the AR(2) stationarity triangle φ2 + φ1 < 1, φ2 − φ1 < 1, |φ2| < 1 (Box, Jenkins, Reinsel &
// Ljung 2016 §3.2.4, eq. 3.2.18); the MA(1) pair θ and 1/θ having the same autocorrelation
// ρ(1) = θ/(1 + θ²) (Brockwell & Davis 2016 §3.1, Example 3.1.2 discussion); closed-form roots of
// quadratics (common practice).
import { describe, expect, it } from 'vitest';
import {
  coefficientsFromReciprocalRoots,
  isInvertible,
  isStationary,
  reciprocalRoots,
  reflectAr,
  reflectMa,
  stabilise,
} from './polynomial-roots';

/** AR(2) stationarity by the textbook triangle. */
function triangle(phi1: number, phi2: number): boolean {
  return phi2 + phi1 < 1 && phi2 - phi1 < 1 && Math.abs(phi2) < 1;
}

describe('isStationary / isInvertible', () => {
  it('agrees with the AR(2) stationarity triangle on a grid that avoids its edges', () => {
    for (let phi1 = -2.07; phi1 <= 2.07; phi1 += 0.1) {
      for (let phi2 = -1.04; phi2 <= 1.04; phi2 += 0.1) {
        expect(isStationary([phi1, phi2]), `φ = (${phi1}, ${phi2})`).toBe(triangle(phi1, phi2));
      }
    }
  });

  it('treats AR(1) and MA(1) by |coefficient| < 1, and the empty polynomial as stable', () => {
    expect(isStationary([0.99])).toBe(true);
    expect(isStationary([-1])).toBe(false);
    expect(isStationary([])).toBe(true);
    expect(isInvertible([-0.8])).toBe(true);
    expect(isInvertible([1.25])).toBe(false);
    expect(isStationary([0.5, 0, 0])).toBe(true);
  });

  it('honours a margin and rejects non-finite coefficients', () => {
    expect(isStationary([0.995], 0.01)).toBe(false);
    expect(isStationary([Number.NaN])).toBe(false);
  });
});

describe('reciprocalRoots', () => {
  it('finds the reciprocal roots of 1 − 1.3z + 0.4z² (0.8 and 0.5) and of a complex pair', () => {
    const real = reciprocalRoots([1.3, -0.4])
      .map(([re]) => re)
      .sort((a, b) => a - b);
    expect(real[0]).toBeCloseTo(0.5, 12);
    expect(real[1]).toBeCloseTo(0.8, 12);
    // 1 − z + 0.5z²: λ² − λ + 0.5 = 0 gives λ = 0.5 ± 0.5i.
    const complex = reciprocalRoots([1, -0.5]);
    for (const [re, im] of complex) {
      expect(re).toBeCloseTo(0.5, 12);
      expect(Math.abs(im)).toBeCloseTo(0.5, 12);
    }
  });

  it('rebuilds the coefficients from the roots', () => {
    const c = [0.6, -0.1, -0.2, 0.05];
    const rebuilt = coefficientsFromReciprocalRoots(reciprocalRoots(c));
    rebuilt.forEach((value, i) => expect(value).toBeCloseTo(c[i], 12));
  });
});

describe('reflection', () => {
  it('maps MA(1) θ = 2 to 1/θ = 0.5, which has the same lag-1 autocorrelation', () => {
    const reflected = reflectMa([2])!;
    expect(reflected[0]).toBeCloseTo(0.5, 14);
    expect(reflected[0] / (1 + reflected[0] ** 2)).toBeCloseTo(2 / (1 + 4), 14);
  });

  it('reflects only the explosive root of an AR(2) and leaves stable polynomials alone', () => {
    // Reciprocal roots 2 and 0.5: 1 − 2.5z + z². Reflected: 0.5 and 0.5, i.e. 1 − z + 0.25z².
    const reflected = reflectAr([2.5, -1])!;
    expect(reflected[0]).toBeCloseTo(1, 12);
    expect(reflected[1]).toBeCloseTo(-0.25, 12);
    expect(isStationary(reflected)).toBe(true);
    expect(reflectAr([0.5, 0.2])).toEqual([0.5, 0.2]);
  });

  it('reflects a complex pair outside the circle to a stable pair', () => {
    // λ = 1.2(cos 0.7 ± i sin 0.7): φ1 = 2·1.2·cos 0.7, φ2 = −1.44.
    const ar = [2 * 1.2 * Math.cos(0.7), -1.44];
    expect(isStationary(ar)).toBe(false);
    const reflected = reflectAr(ar)!;
    expect(reflected[1]).toBeCloseTo(-1 / 1.44, 12);
    expect(reflected[0]).toBeCloseTo((2 * Math.cos(0.7)) / 1.2, 12);
  });

  it('gives up (null) on a unit root, where stabilise dampens instead', () => {
    expect(reflectAr([1])).toBeNull();
    const stable = stabilise([1]);
    expect(isStationary(stable)).toBe(true);
    expect(stable[0]).toBeCloseTo(0.98, 12);
  });
});
