import { describe, expect, it } from 'vitest';
import { simulateArma } from '../core/simulate-arma';
import type { ArmaParameters, FitResult } from '../core/types';
import { cmleAr } from './cmle';
import { yuleWalker } from './yule-walker';

// Simulation recovery: series simulated with known parameters (core/simulate-arma.ts, seeded), estimates compared with
// the truth. Asymptotic theory (Brockwell & Davis 2016, Introduction to Time Series and Forecasting, 3rd ed., §5.1.1,
// eq. 5.1.13; Box et al. 2016 §7.3): √n(φ̂ − φ) → N(0, σ²Γ_p⁻¹), i.e. sd(φ̂) = √(1 − φ²)/√n for AR(1) and
// √(1 − φ₂²)/√n for each coefficient of an AR(2); Yule-Walker and conditional least squares share this limit.
const models: Array<{ name: string; model: ArmaParameters; asymptoticSd: number[] }> = [
  { name: 'AR(1) φ = 0.7, μ = 5, σ² = 2', model: { mean: 5, ar: [0.7], ma: [], sigma2: 2 }, asymptoticSd: [Math.sqrt(1 - 0.49)] },
  {
    name: 'AR(2) φ = (0.6, −0.3), μ = −3, σ² = 1',
    model: { mean: -3, ar: [0.6, -0.3], ma: [], sigma2: 1 },
    asymptoticSd: [Math.sqrt(0.91), Math.sqrt(0.91)],
  },
];
const estimators: Array<[string, (x: Float64Array, p: number) => FitResult]> = [
  ['Yule-Walker', yuleWalker],
  ['conditional MLE', cmleAr],
];
const sizes = [500, 5000, 50_000];

describe('AR estimators recover simulated parameters', () => {
  for (const { name, model, asymptoticSd } of models) {
    for (const [label, estimate] of estimators) {
      it(`${label}, ${name}: φ, μ within 3 reported standard errors and σ² within 3 of its SE, n = 500, 5,000, 50,000`, () => {
        for (const n of sizes) {
          // One fixed seed per size, chosen once (not searched); a |z| < 3 check fails by chance 0.3 % of the time.
          const fit = estimate(simulateArma(model, n, 20_261_202 + n), model.ar.length);
          model.ar.forEach((phi, i) => expect(Math.abs(fit.ar[i] - phi), `φ${i + 1}, n = ${n}`).toBeLessThan(3 * fit.stderr.ar![i]));
          expect(Math.abs(fit.mean - model.mean), `μ, n = ${n}`).toBeLessThan(3 * fit.stderr.mean!);
          // σ̂² has asymptotic SE σ²√(2/n) for Gaussian innovations.
          expect(Math.abs(fit.sigma2 - model.sigma2), `σ², n = ${n}`).toBeLessThan(3 * model.sigma2 * Math.sqrt(2 / n));
          // The reported SE itself converges to the asymptotic one.
          model.ar.forEach((_, i) => expect((fit.stderr.ar![i] * Math.sqrt(n)) / asymptoticSd[i]).toBeCloseTo(1, 0));
        }
      });

      it(`${label}, ${name}: the error shrinks like 1/√n (root-mean-square error over 32 seeds per size)`, () => {
        const rmse = sizes.map((n) => {
          let squares = 0;
          let count = 0;
          for (let replicate = 0; replicate < 32; replicate++) {
            const fit = estimate(simulateArma(model, n, 7 * n + replicate), model.ar.length);
            model.ar.forEach((phi, i) => {
              squares += ((fit.ar[i] - phi) / asymptoticSd[i]) ** 2;
              count++;
            });
          }
          return Math.sqrt(squares / count);
        });
        // √n·RMSE/sd should be ≈ 1 at every n; with 32–64 squared errors its sampling spread is about ±0.1–0.13,
        // so [0.7, 1.35] allows ~2.5 sampling SE while catching a wrong rate (a factor √10 ≈ 3.2 per decade).
        sizes.forEach((n, k) => {
          const scaled = rmse[k] * Math.sqrt(n);
          expect(scaled, `√n·RMSE/sd at n = ${n}`).toBeGreaterThan(0.7);
          expect(scaled, `√n·RMSE/sd at n = ${n}`).toBeLessThan(1.35);
        });
        // Two decades of n: RMSE should fall by a factor of 10.
        expect(rmse[0] / rmse[2]).toBeGreaterThan(10 / 1.8);
        expect(rmse[0] / rmse[2]).toBeLessThan(10 * 1.8);
      });
    }
  }
});
