/**
 * Lasso AR checks.
 * - λ = 0 against R: fixtures/reference/ref/lh.json `ols["3"].lm_ols` (call `E <- embed(as.numeric(x), 4);
 *   lm(E[, 1] ~ E[, -1])`, R 4.2.2). Coordinate descent at λ = 0 is Gauss-Seidel on the normal equations and stops
 *   when no standardised coefficient moves by 1e-12·sd(y), so 1e-8 is comfortably met.
 * - KKT conditions of (1/(2m))‖y − Zβ‖² + λ‖β‖₁ (Tibshirani 1996; Friedman, Hastie & Tibshirani 2010 §2):
 *   |Z_jᵀr|/m ≤ λ for benched lags, = λ·sign(β_j) for kept ones; tolerance 1e-9·sd(y) from the stopping rule.
 * - Sparse recovery on a simulated AR with lags {1, 2, 24} (coefficients 0.5, 0.2, 0.25 chosen here; Σ|φ| < 1
 *   so the process is stationary): BIC (Zou, Hastie & Tibshirani 2007 df) keeps 1, 2, 24 and benches most others.
 */
import { readFileSync } from 'node:fs';
import { describe, expect, it } from 'vitest';
import { lassoAr, lassoLambdaMax, lassoPath, softThreshold } from './lasso';
import { buildLaggedDesign } from './lagged-design';
import { ridgeAr } from './ridge';
import { simulateSparseAr } from './simulated-ar.testing';

const root = new URL('../../../../fixtures/reference/', import.meta.url);
const lhData = JSON.parse(readFileSync(new URL('data/lh.json', root), 'utf8')) as { values: number[] };
const lhRef = JSON.parse(readFileSync(new URL('ref/lh.json', root), 'utf8'));

/** Standardised coefficients and gradient Z_jᵀ(y − Zβ)/m, recomputed here from the raw series and the fit. */
function kktGradient(x: ArrayLike<number>, lags: number[], ar: number[]): { beta: number[]; gradient: number[]; sdY: number } {
  const maxLag = Math.max(...lags);
  const m = x.length - maxLag;
  const y = Array.from({ length: m }, (_, r) => x[maxLag + r]);
  const yMean = y.reduce((s, v) => s + v, 0) / m;
  const z = lags.map((lag) => {
    const column = Array.from({ length: m }, (_, r) => x[maxLag + r - lag]);
    const mean = column.reduce((s, v) => s + v, 0) / m;
    const sd = Math.sqrt(column.reduce((s, v) => s + (v - mean) ** 2, 0) / m);
    return { values: column.map((v) => (v - mean) / sd), sd };
  });
  const beta = lags.map((lag, j) => ar[lag - 1] * z[j].sd);
  const residual = y.map((v, r) => v - yMean - z.reduce((s, c, j) => s + beta[j] * c.values[r], 0));
  const gradient = z.map((c) => c.values.reduce((s, v, r) => s + v * residual[r], 0) / m);
  const sdY = Math.sqrt(y.reduce((s, v) => s + (v - yMean) ** 2, 0) / m);
  return { beta, gradient, sdY };
}

describe('lassoPath', () => {
  it('works from the Gram matrix of lag shifts without making the standardised columns (3 MB for lags 1–48, 168 of a year)', () => {
    const x = simulateSparseAr({ 1: 0.5, 2: 0.2, 24: 0.2 }, 3000, 5);
    const design = buildLaggedDesign('test', x, [1, 2, 3, 24, 168]);
    const guarded = new Proxy(design, {
      get(target, property, receiver) {
        if (property === 'columns') throw new Error('the columns were made');
        return Reflect.get(target, property, receiver);
      },
    });
    const path = lassoPath(guarded, [lassoLambdaMax(design) / 2, lassoLambdaMax(design) / 20], {}, x);
    expect(path.map((s) => s.df)).toEqual([...path.map((s) => s.df)].sort((a, b) => a - b));
    expect(path[1].df).toBeGreaterThan(0);
  });
});

describe('lassoAr', () => {
  it('at λ = 0 reproduces R lm on lagged lh values (AR(3) least squares) to 1e-8', () => {
    const ref = lhRef.ols['3'].lm_ols;
    const fit = lassoAr(lhData.values, { lags: [1, 2, 3], lambda: 0 });
    fit.ar.forEach((phi, i) => expect(Math.abs(phi - ref.ar[i])).toBeLessThan(1e-8));
    expect(Math.abs(fit.intercept - ref.intercept)).toBeLessThan(1e-8);
    expect(Math.abs(fit.mean - ref.implied_mean)).toBeLessThan(1e-8);
    expect(Math.abs(fit.sigma2 / ref.sigma2_divisor_n_minus_p - 1)).toBeLessThan(1e-8);
    expect(fit.converged).toBe(true);
    expect(fit.df).toBe(3);
  });

  it('at λ = 0 agrees with ridge at λ = 0 on a wide simulated lag set to 1e-8', () => {
    const x = simulateSparseAr({ 1: 0.5, 2: 0.2, 24: 0.25 }, 1200, 5);
    const lags = [1, 2, 3, 4, 5, 6, 23, 24, 25];
    const lasso = lassoAr(x, { lags, lambda: 0 });
    const ridge = ridgeAr(x, { lags, lambda: 0 });
    lasso.ar.forEach((phi, i) => expect(Math.abs(phi - ridge.ar[i])).toBeLessThan(1e-8));
  });

  it('satisfies the KKT conditions at a fixed λ', () => {
    const x = simulateSparseAr({ 1: 0.5, 2: 0.2, 24: 0.25 }, 1500, 21);
    const lags = Array.from({ length: 30 }, (_, i) => i + 1);
    const lambda = 0.02;
    const fit = lassoAr(x, { lags, lambda });
    expect(fit.converged).toBe(true);
    expect(fit.kept.length).toBeGreaterThan(0);
    expect(fit.benched.length).toBeGreaterThan(0);
    const { beta, gradient, sdY } = kktGradient(x, lags, fit.ar);
    const tolerance = 1e-9 * sdY;
    lags.forEach((_, j) => {
      if (beta[j] === 0) expect(Math.abs(gradient[j])).toBeLessThanOrEqual(lambda + tolerance);
      else expect(Math.abs(gradient[j] - lambda * Math.sign(beta[j]))).toBeLessThan(tolerance);
    });
  });

  it('benches every lag at λ_max and none at tiny λ', () => {
    const x = simulateSparseAr({ 1: 0.5, 2: 0.2, 24: 0.25 }, 800, 8);
    const lags = [1, 2, 24];
    const lambdaMax = lassoLambdaMax(buildLaggedDesign('spec', x, lags));
    const none = lassoAr(x, { lags, lambda: lambdaMax });
    expect(none.kept).toEqual([]);
    expect(none.mean).toBeCloseTo(x.subarray(24).reduce((s, v) => s + v, 0) / (x.length - 24), 10);
    expect(lassoAr(x, { lags, lambda: lambdaMax * 1e-6 }).kept).toEqual([1, 2, 24]);
  });

  it('recovers the sparse lag set {1, 2, 24} by BIC and benches most other lags', () => {
    const x = simulateSparseAr({ 1: 0.5, 2: 0.2, 24: 0.25 }, 3000, 2024);
    const lags = Array.from({ length: 48 }, (_, i) => i + 1);
    const fit = lassoAr(x, { lags });
    expect(fit.selection).toBe('bic');
    expect(fit.kept).toEqual(expect.arrayContaining([1, 2, 24]));
    expect(fit.benched.length).toBeGreaterThanOrEqual(40);
    expect(fit.df).toBe(fit.kept.length);
    expect(fit.ar.length).toBe(48);
    expect(fit.ar[0]).toBeGreaterThan(0.4);
    expect(fit.ar[23]).toBeGreaterThan(0.15);
  });

  it('keeps the weekly lag 168 in the hourly lag set 1..48 and 168', () => {
    // Coefficients chosen here: 0.45, 0.15, 0.15, 0.2 at lags 1, 2, 24, 168 (Σ|φ| = 0.95 < 1, stationary).
    const x = simulateSparseAr({ 1: 0.45, 2: 0.15, 24: 0.15, 168: 0.2 }, 3000, 3);
    const lags = [...Array.from({ length: 48 }, (_, i) => i + 1), 168];
    const fit = lassoAr(x, { lags });
    expect(fit.kept).toEqual(expect.arrayContaining([1, 2, 24, 168]));
    expect(fit.benched.length).toBeGreaterThanOrEqual(40);
    expect(fit.ar.length).toBe(168);
    expect(fit.p).toBe(168);
  });

  it('recovers the sparse lag set by rolling-origin validation too', () => {
    const x = simulateSparseAr({ 1: 0.5, 2: 0.2, 24: 0.25 }, 3000, 99);
    const lags = Array.from({ length: 48 }, (_, i) => i + 1);
    const fit = lassoAr(x, { lags, select: 'validation', folds: 4 });
    expect(fit.selection).toBe('validation');
    expect(fit.kept).toEqual(expect.arrayContaining([1, 2, 24]));
    expect(fit.benched.length).toBeGreaterThanOrEqual(24);
  });

  it('throws non-stationary on an explosive series', () => {
    const x = Array.from({ length: 60 }, (_, t) => 1.05 ** t + (t % 3));
    expect(() => lassoAr(x, { lags: [1], lambda: 0 })).toThrowError(expect.objectContaining({ code: 'non-stationary' }));
  });

  it('soft-thresholds as S(u, λ) = sign(u)·max(|u| − λ, 0)', () => {
    expect(softThreshold(3, 1)).toBe(2);
    expect(softThreshold(-3, 1)).toBe(-2);
    expect(softThreshold(0.5, 1)).toBe(0);
  });
});
