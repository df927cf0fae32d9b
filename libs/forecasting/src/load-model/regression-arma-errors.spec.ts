import { describe, expect, it } from 'vitest';
import { ForecastingError } from '../core/errors';
import { fitArmaPart } from './fit-arma-part';
import { fitRegressionArmaErrors } from './regression-arma-errors';
import { seededNormal } from './synthetic-load.testing';

// Simulation recovery (the check Brockwell & Davis 2016 §6.6 use for the iterative GLS scheme):
// y_t = 3·z1_t − 2·z2_t + u_t with u ARMA(1,1), φ = 0.7, θ = 0.4, μ = 10, σ = 1; n = 6000, seeded.
// z1 is a smooth, autocorrelated regressor (like degree-hours), z2 a 0/1 indicator (like a holiday).
const n = 6000;
const normal = seededNormal(41);
const z1 = new Float64Array(n);
const z2 = new Float64Array(n);
const y = new Float64Array(n);
let u = 0;
let ePrev = 0;
for (let t = 0; t < n; t++) {
  z1[t] = 5 * Math.sin(t / 40) + (t > 0 ? 0.8 * (z1[t - 1] - 5 * Math.sin((t - 1) / 40)) : 0) + normal();
  z2[t] = Math.floor(t / 24) % 9 === 0 ? 1 : 0;
  const e = normal();
  u = 0.7 * u + e + 0.4 * ePrev;
  ePrev = e;
  y[t] = 10 + 3 * z1[t] - 2 * z2[t] + u;
}

describe('fitRegressionArmaErrors', () => {
  it('recovers β, φ and θ with ARMA(1,1) errors fitted by NLS (joint CSS by block descent)', () => {
    const fit = fitRegressionArmaErrors(y, [z1, z2], (r) => fitArmaPart({ method: 'nls', p: 1, q: 1 }, r));
    // 4 standard errors each (false alarm ~6e-5 per check under normality).
    expect(Math.abs(fit.beta[0] - 3)).toBeLessThan(4 * fit.betaStderr[0]);
    expect(Math.abs(fit.beta[1] + 2)).toBeLessThan(4 * fit.betaStderr[1]);
    expect(Math.abs(fit.errors.ar[0] - 0.7)).toBeLessThan(4 * fit.errors.stderr.ar![0]);
    expect(Math.abs(fit.errors.ma[0] - 0.4)).toBeLessThan(4 * fit.errors.stderr.ma![0]);
    expect(Math.abs(fit.errors.mean - 10)).toBeLessThan(4 * fit.errors.stderr.mean!);
    expect(fit.converged).toBe(true);
  });

  it('recovers β with AR errors by Cochrane-Orcutt prewhitening and reports the prewhitened σ²', () => {
    const fit = fitRegressionArmaErrors(y, [z1, z2], (r) => fitArmaPart({ method: 'cmle', p: 3, q: 0 }, r));
    // An AR(3) approximates the ARMA(1,1) errors (ψ-weights 1.1, 0.77, 0.54, …); β stays unbiased.
    expect(Math.abs(fit.beta[0] - 3)).toBeLessThan(4 * fit.betaStderr[0]);
    expect(Math.abs(fit.beta[1] + 2)).toBeLessThan(4 * fit.betaStderr[1]);
    // The prewhitening step leaves residuals with the fitted σ²; their mean square must match.
    const e = fit.errors.residuals;
    let ss = 0;
    for (let t = 3; t < n; t++) ss += e[t] * e[t];
    expect(ss / (n - 3)).toBeCloseTo(fit.errors.sigma2, 10);
  });

  it('with no regressors is the plain estimator fit', () => {
    const fit = fitRegressionArmaErrors(y, [], (r) => fitArmaPart({ method: 'yule-walker', p: 2, q: 0 }, r));
    const direct = fitArmaPart({ method: 'yule-walker', p: 2, q: 0 }, y);
    expect(fit.errors.ar).toEqual(direct.ar);
    expect(fit.iterations).toBe(1);
  });

  it('refuses linearly dependent regressors', () => {
    const twice = z1.map((v) => 2 * v);
    expect(() => fitRegressionArmaErrors(y, [z1, twice], (r) => fitArmaPart({ method: 'cmle', p: 1, q: 0 }, r))).toThrow(ForecastingError);
  });
});
