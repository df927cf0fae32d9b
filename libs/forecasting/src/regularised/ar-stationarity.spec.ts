/**
 * Stationarity by the step-down recursion, against the AR(2) stationarity triangle
 * φ_2 + φ_1 < 1, φ_2 − φ_1 < 1, |φ_2| < 1 (Brockwell & Davis 2016, Introduction to Time Series and Forecasting,
 * 3rd ed., §3.1, causality of AR(2); recalled from memory) and seasonal AR at lag 24 (root modulus |φ|^(−1/24)).
 */
import { describe, expect, it } from 'vitest';
import { isStationaryAr } from './ar-stationarity';

/** The AR(2) triangle, written out independently of the recursion. */
const inTriangle = (a: number, b: number) => a + b < 1 && b - a < 1 && Math.abs(b) < 1;

describe('isStationaryAr', () => {
  it('agrees with the AR(2) triangle on a grid', () => {
    // Offsets keep every grid point at least 0.01 from the triangle's edges.
    for (let i = 0; i <= 41; i++) {
      for (let j = 0; j <= 21; j++) {
        const a = -2.03 + 0.1 * i;
        const b = -1.04 + 0.1 * j;
        expect(isStationaryAr([a, b]), `φ = (${a}, ${b})`).toBe(inTriangle(a, b));
      }
    }
  });

  it('handles AR(1), the empty polynomial and benched trailing lags', () => {
    expect(isStationaryAr([0.99])).toBe(true);
    expect(isStationaryAr([1])).toBe(false);
    expect(isStationaryAr([-1.01])).toBe(false);
    expect(isStationaryAr([])).toBe(true);
    expect(isStationaryAr([0.5, 0, 0, 0])).toBe(true);
  });

  it('accepts a seasonal AR at lag 24 below one and rejects it at one', () => {
    const seasonal = (phi: number) => Array.from({ length: 24 }, (_, i) => (i === 23 ? phi : 0));
    expect(isStationaryAr(seasonal(0.9))).toBe(true);
    expect(isStationaryAr(seasonal(1))).toBe(false);
    // (1 − 0.5z)(1 − 0.9z^24) = 1 − 0.5z − 0.9z^24 + 0.45z^25: stationary; with 1.0 at 24 it has a unit root.
    const product = (s: number) => [0.5, ...new Array(22).fill(0), s, -0.5 * s];
    expect(isStationaryAr(product(0.9))).toBe(true);
    expect(isStationaryAr(product(1))).toBe(false);
  });
});
