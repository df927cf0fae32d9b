import { describe, expect, it } from 'vitest';
import { mulberry32, normalGenerator } from './random';
import { simulateArma } from './simulate-arma';

describe('mulberry32 and normalGenerator', () => {
  it('repeat a stream for the same seed and differ across seeds', () => {
    const a = mulberry32(42);
    const b = mulberry32(42);
    const c = mulberry32(43);
    const first = Array.from({ length: 5 }, a);
    expect(Array.from({ length: 5 }, b)).toEqual(first);
    expect(Array.from({ length: 5 }, c)).not.toEqual(first);
    for (const u of first) expect(u >= 0 && u < 1).toBe(true);
  });

  it('gives standard normal moments within 4 standard errors over 200,000 draws', () => {
    const normal = normalGenerator(7);
    const n = 200_000;
    let sum = 0;
    let sumSquares = 0;
    let beyond196 = 0;
    for (let i = 0; i < n; i++) {
      const z = normal();
      sum += z;
      sumSquares += z * z;
      if (Math.abs(z) > 1.96) beyond196++;
    }
    // SE of the mean 1/√n, of the second moment √(2/n), of a 5 % proportion √(0.05·0.95/n).
    expect(Math.abs(sum / n)).toBeLessThan(4 / Math.sqrt(n));
    expect(Math.abs(sumSquares / n - 1)).toBeLessThan(4 * Math.sqrt(2 / n));
    expect(Math.abs(beyond196 / n - 0.05)).toBeLessThan(4 * Math.sqrt(0.0475 / n));
  });
});

describe('simulateArma', () => {
  it('is reproducible and has the AR(1) stationary variance σ²/(1 − φ²) (Brockwell & Davis 2016, §2.2)', () => {
    const model = { mean: 5, ar: [0.5], ma: [], sigma2: 3 };
    const x = simulateArma(model, 100_000, 11);
    expect(Array.from(simulateArma(model, 10, 11))).toEqual(Array.from(x.subarray(0, 10)));
    const mean = x.reduce((s, v) => s + v, 0) / x.length;
    const variance = x.reduce((s, v) => s + (v - mean) ** 2, 0) / x.length;
    // Var(x̄) ≈ σ²/(n(1 − φ)²) = 12/n; the sample variance of an AR(1) has relative SE ≈ √(2(1 + φ²)/(n(1 − φ²))) ≈ 0.0058.
    expect(Math.abs(mean - 5)).toBeLessThan(4 * Math.sqrt(12 / x.length));
    expect(Math.abs(variance / 4 - 1)).toBeLessThan(4 * 0.0058);
  });

  it('refuses a non-causal AR polynomial', () => {
    expect(() => simulateArma({ mean: 0, ar: [1.1], ma: [], sigma2: 1 }, 10, 1)).toThrow(
      expect.objectContaining({ code: 'non-stationary' }),
    );
  });
});
