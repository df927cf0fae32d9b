// Checks of the Hannan-Rissanen starting values.
// Sources: fixtures/reference/ref/lh.json ols[p].lm_ols (R 4.2.2 `lm(E[, 1] ~ E[, -1])` on
// `embed(x, p + 1)`): with q = 0 the method is exactly conditional least squares; simulation
// recovery with known parameters (seeded, ../core/simulate-arma.ts) for q > 0, where Hannan & Rissanen
// (1982) show the estimates are consistent.
import { describe, expect, it } from 'vitest';
import { ForecastingError } from '../core/errors';
import { loadReference, loadSeries } from '../core/spec-support';
import { hannanRissanen } from './hannan-rissanen';
import { isInvertible, isStationary } from './polynomial-roots';
import { normalGenerator } from '../core/random';
import { simulateArma } from '../core/simulate-arma';

describe('hannanRissanen', () => {
  it('is least squares on the lags when q = 0 (lh, R lm, 1e-9 relative)', () => {
    const x = loadSeries('lh');
    for (const p of [1, 2, 3]) {
      const lm = loadReference('lh').ols[String(p)].lm_ols;
      const start = hannanRissanen(x, p, 0);
      start.ar.forEach((phi, i) => expect(Math.abs(phi - lm.ar[i]) / Math.abs(lm.ar[i])).toBeLessThan(1e-9));
      expect(Math.abs(start.mean - lm.implied_mean)).toBeLessThan(1e-9);
      expect(Math.abs(start.sigma2 - lm.sigma2_divisor_n_minus_p) / lm.sigma2_divisor_n_minus_p).toBeLessThan(1e-9);
    }
  });

  it('lands near the truth of a long simulated ARMA(1,1) and ARMA(2,2)', () => {
    // Starting values only: n = 20000 puts the sampling error near 0.01; 0.05 leaves room for the
    // method's own finite-m bias.
    const models = [
      { mean: 3, ar: [0.7], ma: [0.4], sigma2: 1 },
      { mean: 0, ar: [0.9, -0.2], ma: [0.5, 0.2], sigma2: 4 },
    ];
    models.forEach((model, index) => {
      const x = simulateArma(model, 20000, 31 + index);
      const start = hannanRissanen(x, model.ar.length, model.ma.length);
      [...start.ar, ...start.ma].forEach((value, i) => expect(Math.abs(value - [...model.ar, ...model.ma][i])).toBeLessThan(0.05));
      expect(Math.abs(start.sigma2 - model.sigma2) / model.sigma2).toBeLessThan(0.05);
    });
  });

  it('always returns a stationary, invertible model', () => {
    // A random walk pushes the AR estimate to the unit circle.
    const normal = normalGenerator(4);
    const walk = new Float64Array(500);
    for (let t = 1; t < walk.length; t++) walk[t] = walk[t - 1] + normal();
    const start = hannanRissanen(walk, 1, 1);
    expect(isStationary(start.ar)).toBe(true);
    expect(isInvertible(start.ma)).toBe(true);
  });

  it('refuses orders that are not non-negative integers and series too short for step 2', () => {
    expect(() => hannanRissanen([1, 2, 3, 4, 5, 6], -1, 0)).toThrow(ForecastingError);
    expect(() => hannanRissanen(loadSeries('lh').slice(0, 12), 2, 2)).toThrow(/hannanRissanen: needs/);
  });
});
