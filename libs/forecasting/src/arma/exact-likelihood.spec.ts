// Checks of the exact Gaussian log-likelihood.
// Sources: fixtures/reference/ref/{lh,LakeHuron}.json (R 4.2.2): arma["p,q"].ml.{default,tight} and
// ml_ar[p].tight are `arima(x, order = c(p, 0, q), method = "ML", …)` fits; R's loglik there is the
// exact likelihood (Kalman filter) at its coefficients with σ² = S/n. The AR(1) closed form
// ℓ = −(n/2)log(2πσ²) + ½log(1 − φ²) − [(1 − φ²)w₁² + Σ_{t≥2}(w_t − φw_{t−1})²]/(2σ²) is
// Brockwell & Davis (2016) §5.2, Example 5.2.4 / Box et al. (2016) §7.4 (exact AR(1) likelihood).
import { describe, expect, it } from 'vitest';
import { ForecastingError } from '../core/errors';
import { loadReference, loadSeries, type ReferenceSeries } from '../core/spec-support';
import { autocovariances, exactLogLikelihood } from './exact-likelihood';

describe('exactLogLikelihood against R arima(method = "ML")', () => {
  for (const name of ['lh', 'LakeHuron'] as ReferenceSeries[]) {
    const x = loadSeries(name);
    const reference = loadReference(name);
    // eslint-disable-next-line @typescript-eslint/no-explicit-any -- reference JSON of documented layout; specs index it freely
    const fits: Array<{ label: string; fit: any; p: number; q: number }> = [];
    for (const order of ['1,1', '2,1', '1,2']) {
      const [p, q] = order.split(',').map(Number);
      for (const variant of ['default', 'tight'])
        fits.push({ label: `ARMA(${order}) ${variant}`, fit: reference.arma[order].ml[variant], p, q });
    }
    for (const p of ['1', '2', '3']) fits.push({ label: `AR(${p}) tight`, fit: reference.ml_ar[p].tight, p: Number(p), q: 0 });
    for (const { label, fit, p, q } of fits) {
      it(`${name} ${label}: reproduces R's loglik at R's estimates (1e-10 relative)`, () => {
        // Same likelihood by another algorithm (innovations vs Kalman filter): agreement is limited by
        // the 15 stored digits of the coefficients and σ² (observed ~1e-13 relative).
        const coef = fit.coef_names.map((key: string) => fit.coef[key] as number);
        const value = exactLogLikelihood(x, { ar: coef.slice(0, p), ma: coef.slice(p, p + q), mean: coef[p + q], sigma2: fit.sigma2 });
        expect(Math.abs(value - fit.loglik) / Math.abs(fit.loglik)).toBeLessThan(1e-10);
      });
    }
  }
});

describe('exactLogLikelihood closed forms', () => {
  it('equals the exact AR(1) likelihood', () => {
    const x = loadSeries('lh');
    const [phi, mean, sigma2] = [0.57, 2.41, 0.2];
    const w = x.map((v) => v - mean);
    let squares = (1 - phi * phi) * w[0] * w[0];
    for (let t = 1; t < w.length; t++) squares += (w[t] - phi * w[t - 1]) ** 2;
    const closed = -(w.length / 2) * Math.log(2 * Math.PI * sigma2) + 0.5 * Math.log(1 - phi * phi) - squares / (2 * sigma2);
    expect(exactLogLikelihood(x, { ar: [phi], ma: [], mean, sigma2 })).toBeCloseTo(closed, 12);
  });

  it('is the iid normal likelihood for ARMA(0,0)', () => {
    const x = [1, -0.5, 2, 0.25];
    const direct = x.reduce((s, v) => s - 0.5 * Math.log(2 * Math.PI * 1.5) - (v - 0.5) ** 2 / (2 * 1.5), 0);
    expect(exactLogLikelihood(x, { ar: [], ma: [], mean: 0.5, sigma2: 1.5 })).toBeCloseTo(direct, 13);
  });

  it('gives ARMA(1,1) autocovariances γ(0) = (1 + 2φθ + θ²)/(1 − φ²), γ(1) = (1 + φθ)(φ + θ)/(1 − φ²)', () => {
    // Brockwell & Davis (2016) §3.2, Example 3.2.1 (σ² = 1).
    const [phi, theta] = [0.6, 0.3];
    const gamma = autocovariances([phi], [theta], 3);
    expect(gamma[0]).toBeCloseTo((1 + 2 * phi * theta + theta * theta) / (1 - phi * phi), 13);
    expect(gamma[1]).toBeCloseTo(((1 + phi * theta) * (phi + theta)) / (1 - phi * phi), 13);
    expect(gamma[2]).toBeCloseTo(phi * gamma[1], 13);
  });

  it('refuses a non-stationary AR part and a non-positive σ²', () => {
    expect(() => exactLogLikelihood([1, 2, 3], { ar: [1.2], ma: [], mean: 0, sigma2: 1 })).toThrow(ForecastingError);
    expect(() => exactLogLikelihood([1, 2, 3], { ar: [0.2], ma: [], mean: 0, sigma2: 0 })).toThrow(/σ² must be positive/);
  });
});
