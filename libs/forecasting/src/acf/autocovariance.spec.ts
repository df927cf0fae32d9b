import { describe, expect, it } from 'vitest';
import { ForecastingError } from '../core/errors';
import { expectRelative, loadReference, loadSeries, referenceSeries } from '../core/spec-support';
import { autocorrelation, autocovariance } from './autocovariance';

describe('autocovariance and autocorrelation', () => {
  // Source: fixtures/reference/ref/<series>.json, acf.call_covariance = 'acf(x, lag.max = 20, type = "covariance",
  // demean = TRUE, plot = FALSE)' and acf.call_correlation, R 4.2.2. Stored to 15 significant digits; the sums are
  // well conditioned, so 1e-10 relative (the engine's agreed tolerance for moments) holds with room.
  for (const name of referenceSeries) {
    it(`matches R acf() on ${name} at lags 0..20`, () => {
      const x = loadSeries(name);
      const reference = loadReference(name).acf;
      expectRelative(autocovariance(x, 20), reference.autocovariance, 1e-10, `${name} autocovariance`);
      expectRelative(autocorrelation(x, 20), reference.autocorrelation, 1e-10, `${name} autocorrelation`);
    });
  }

  it('uses divisor n at every lag (hand computation on 1, 2, 3, 4: mean 2.5, deviations −1.5, −0.5, 0.5, 1.5)', () => {
    // γ(0) = (2.25 + 0.25 + 0.25 + 2.25)/4 = 1.25; γ(1) = (0.75 − 0.25 + 0.75)/4 = 0.3125; γ(3) = −2.25/4.
    expect(Array.from(autocovariance([1, 2, 3, 4], 3))).toEqual([1.25, 0.3125, -0.375, -0.5625]);
  });

  it('agrees with the direct double sum at every lag up to n − 1 (the blocked loop has tails to get right)', () => {
    const x = [0.3, -1.2, 2.5, 0.7, -0.4, 1.9, -2.2, 0.05, 1.1];
    const n = x.length;
    const mean = x.reduce((s, v) => s + v, 0) / n;
    const gamma = autocovariance(x, n - 1);
    for (let k = 0; k < n; k++) {
      let sum = 0;
      for (let t = 0; t + k < n; t++) sum += (x[t] - mean) * (x[t + k] - mean);
      expect(gamma[k]).toBeCloseTo(sum / n, 14);
    }
  });

  it('refuses a constant series for autocorrelation, a lag ≥ n and non-finite values', () => {
    expect(() => autocorrelation([3, 3, 3], 1)).toThrow(expect.objectContaining({ code: 'constant-series' }));
    expect(Array.from(autocovariance([3, 3, 3], 1))).toEqual([0, 0]);
    expect(() => autocovariance([1, 2, 3], 3)).toThrow(ForecastingError);
    expect(() => autocovariance([1, Infinity, 3], 1)).toThrow(expect.objectContaining({ code: 'non-finite-input' }));
  });
});
