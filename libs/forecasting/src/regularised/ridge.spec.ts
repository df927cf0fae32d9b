/**
 * Ridge AR checks.
 * - λ = 0 against R: fixtures/reference/ref/lh.json `ols["3"].lm_ols` (call `E <- embed(as.numeric(x), 4);
 *   lm(E[, 1] ~ E[, -1])`, R 4.2.2), data fixtures/reference/data/lh.json. R stores 15 significant digits and
 *   both sides solve the same least-squares problem (R by QR, here by SVD), so 1e-10 absolute / 1e-8 relative.
 * - λ = 0 against a QR least-squares fit computed below with ml-matrix, and against the engine's cmleAr, on a
 *   simulated AR(3), to 1e-8.
 * - Closed form (ZᵀZ + λI)⁻¹Zᵀy on a hand case, arithmetic in the comments, to 1e-12 (rounding only).
 */
import { readFileSync } from 'node:fs';
import { Matrix, QrDecomposition, inverse } from 'ml-matrix';
import { describe, expect, it } from 'vitest';
import { cmleAr } from '../ar/cmle';
import { ForecastingError } from '../core/errors';
import { ridgeAr } from './ridge';
import { simulateSparseAr } from './simulated-ar.testing';

const root = new URL('../../../../fixtures/reference/', import.meta.url);
const lhData = JSON.parse(readFileSync(new URL('data/lh.json', root), 'utf8')) as { values: number[] };
const lhRef = JSON.parse(readFileSync(new URL('ref/lh.json', root), 'utf8'));

/** Least squares of x_t on 1, x_{t−1..t−p} by Householder QR (ml-matrix), for comparison. */
function qrLeastSquaresAr(x: ArrayLike<number>, p: number): { intercept: number; ar: number[]; rss: number } {
  const rows = x.length - p;
  const a = new Matrix(rows, p + 1);
  const y = new Matrix(rows, 1);
  for (let r = 0; r < rows; r++) {
    a.set(r, 0, 1);
    for (let j = 1; j <= p; j++) a.set(r, j, x[p + r - j]);
    y.set(r, 0, x[p + r]);
  }
  const coef = new QrDecomposition(a).solve(y).getColumn(0);
  const residual = y.sub(a.mmul(Matrix.columnVector(coef)));
  return { intercept: coef[0], ar: coef.slice(1), rss: residual.getColumn(0).reduce((s, e) => s + e * e, 0) };
}

describe('ridgeAr', () => {
  it('at λ = 0 reproduces R lm on lagged lh values (AR(3) least squares)', () => {
    const ref = lhRef.ols['3'].lm_ols;
    const fit = ridgeAr(lhData.values, { lags: [1, 2, 3], lambda: 0 });
    fit.ar.forEach((phi, i) => expect(phi).toBeCloseTo(ref.ar[i], 10));
    expect(fit.intercept).toBeCloseTo(ref.intercept, 10);
    expect(fit.mean).toBeCloseTo(ref.implied_mean, 10);
    expect(Math.abs(fit.sigma2 / ref.sigma2_divisor_n_minus_p - 1)).toBeLessThan(1e-8);
    expect(fit.loglik!).toBeCloseTo(ref.cond_loglik_at_mle, 8);
    expect(fit.df).toBeCloseTo(3, 12);
    expect(fit.kept).toEqual([1, 2, 3]);
    expect(fit.benched).toEqual([]);
  });

  it('at λ = 0 matches a QR least-squares AR(3) on a simulated series to 1e-8', () => {
    const x = simulateSparseAr({ 1: 0.6, 2: -0.2, 3: 0.15 }, 400, 7, 50);
    const qr = qrLeastSquaresAr(x, 3);
    const fit = ridgeAr(x, { lags: [1, 2, 3], lambda: 0 });
    fit.ar.forEach((phi, i) => expect(Math.abs(phi - qr.ar[i])).toBeLessThan(1e-8));
    expect(Math.abs(fit.intercept - qr.intercept) / Math.abs(qr.intercept)).toBeLessThan(1e-8);
    expect(Math.abs(fit.sigma2 - qr.rss / (x.length - 3)) / fit.sigma2).toBeLessThan(1e-8);
    expect(fit.mean).toBeCloseTo(qr.intercept / (1 - qr.ar.reduce((s, v) => s + v, 0)), 8);
    const cmle = cmleAr(x, 3);
    fit.ar.forEach((phi, i) => expect(Math.abs(phi - cmle.ar[i])).toBeLessThan(1e-8));
    expect(Math.abs(fit.mean - cmle.mean)).toBeLessThan(1e-8);
    expect(Math.abs(fit.sigma2 / cmle.sigma2 - 1)).toBeLessThan(1e-8);
    expect(fit.loglik!).toBeCloseTo(cmle.loglik!, 8);
    // Residuals: the first maxLag are the conditioned-on zeros.
    expect(Array.from(fit.residuals.subarray(0, 3))).toEqual([0, 0, 0]);
  });

  it('matches the closed form on a one-lag hand case', () => {
    // x = [1, 3, 2, 5, 4], lag 1: rows t = 2..5, y = [3, 2, 5, 4], lagged = [1, 3, 2, 5].
    // Lagged mean 11/4 = 2.75, centred [−1.75, 0.25, −0.75, 2.25], Σ(centred²) = 8.75, scale² = 8.75/4 = 2.1875.
    // y mean 3.5, centred y = [−0.5, −1.5, 1.5, 0.5]; Σ centred·y = 0.875 − 0.375 − 1.125 + 1.125 = 0.5.
    // Standardised: zᵀz = 4, zᵀy = 0.5/scale, so β̃ = (0.5/scale)/(4 + λ); with λ = 4, φ = β̃/scale = 0.5/(8·2.1875) = 1/35.
    // Intercept c = 3.5 − (1/35)·2.75 = 3.5 − 11/140 = 479/140; μ = c/(1 − 1/35) = (479/140)·(35/34) = 479/136.
    const fit = ridgeAr([1, 3, 2, 5, 4], { lags: [1], lambda: 4 });
    expect(fit.ar[0]).toBeCloseTo(1 / 35, 14);
    expect(fit.intercept).toBeCloseTo(479 / 140, 13);
    expect(fit.mean).toBeCloseTo(479 / 136, 13);
    // df = d²/(d² + λ) with d² = zᵀz = 4: 4/8 = 0.5.
    expect(fit.df).toBeCloseTo(0.5, 14);
  });

  it('matches (ZᵀZ + λI)⁻¹Zᵀy on standardised lags 1 and 2', () => {
    const x = [2, 4, 3, 6, 5, 7, 4, 8, 6, 9, 7, 5];
    const lags = [1, 2];
    const lambda = 3;
    // Build the standardised design independently of lagged-design.ts.
    const rows = x.length - 2;
    const y = Array.from({ length: rows }, (_, r) => x[2 + r]);
    const yMean = y.reduce((s, v) => s + v, 0) / rows;
    const columns = lags.map((lag) => Array.from({ length: rows }, (_, r) => x[2 + r - lag]));
    const means = columns.map((c) => c.reduce((s, v) => s + v, 0) / rows);
    const scales = columns.map((c, j) => Math.sqrt(c.reduce((s, v) => s + (v - means[j]) ** 2, 0) / rows));
    const z = new Matrix(rows, 2);
    columns.forEach((c, j) => c.forEach((v, r) => z.set(r, j, (v - means[j]) / scales[j])));
    const yc = Matrix.columnVector(y.map((v) => v - yMean));
    const beta = inverse(z.transpose().mmul(z).add(Matrix.eye(2).mul(lambda)))
      .mmul(z.transpose())
      .mmul(yc)
      .getColumn(0);
    const fit = ridgeAr(x, { lags, lambda });
    expect(fit.ar[0]).toBeCloseTo(beta[0] / scales[0], 12);
    expect(fit.ar[1]).toBeCloseTo(beta[1] / scales[1], 12);
    expect(fit.intercept).toBeCloseTo(yMean - (beta[0] / scales[0]) * means[0] - (beta[1] / scales[1]) * means[1], 12);
  });

  it('shrinks as λ grows and selects by BIC with df = trace of the hat matrix', () => {
    const x = simulateSparseAr({ 1: 0.5, 2: 0.2, 24: 0.25 }, 1500, 11);
    const lags = Array.from({ length: 30 }, (_, i) => i + 1);
    const fit = ridgeAr(x, { lags });
    expect(fit.selection).toBe('bic');
    expect(fit.path.length).toBe(37);
    for (let i = 1; i < fit.path.length; i++) expect(fit.path[i].df).toBeGreaterThanOrEqual(fit.path[i - 1].df);
    const best = Math.min(...fit.path.filter((p) => p.bic !== null).map((p) => p.bic!));
    expect(fit.bic).toBeCloseTo(best, 8);
    expect(fit.df).toBeGreaterThan(0);
    expect(fit.df).toBeLessThanOrEqual(30);
    // The strong lags dominate the shrunken fit.
    expect(fit.ar[0]).toBeGreaterThan(0.3);
    expect(fit.ar[23]).toBeGreaterThan(0.15);
  });

  it('chooses λ by rolling-origin validation among stationary fits', () => {
    const x = simulateSparseAr({ 1: 0.5, 2: 0.2, 24: 0.25 }, 1500, 12);
    const fit = ridgeAr(x, { lags: [1, 2, 3, 24, 25], select: 'validation' });
    expect(fit.selection).toBe('validation');
    const chosen = fit.path.find((p) => p.lambda === fit.lambda)!;
    expect(chosen.stationary).toBe(true);
    // Every fit validating better than the chosen one was checked and found non-stationary.
    for (const p of fit.path) if (p.validationMse! < chosen.validationMse!) expect(p.stationary).toBe(false);
  });

  it('throws non-stationary on an explosive series rather than report an undefined mean', () => {
    const x = Array.from({ length: 60 }, (_, t) => 1.05 ** t + (t % 3));
    expect(() => ridgeAr(x, { lags: [1], lambda: 0 })).toThrowError(expect.objectContaining({ code: 'non-stationary' }));
  });

  it('refuses bad input with typed errors', () => {
    const x = simulateSparseAr({ 1: 0.5 }, 100, 3);
    const code = (f: () => unknown) => {
      try {
        f();
      } catch (e) {
        return e instanceof ForecastingError ? e.code : 'other';
      }
      return 'none';
    };
    expect(code(() => ridgeAr(x, { lags: [] }))).toBe('invalid-argument');
    expect(code(() => ridgeAr(x, { lags: [1, 1] }))).toBe('invalid-argument');
    expect(code(() => ridgeAr(x, { lags: [0] }))).toBe('invalid-argument');
    expect(code(() => ridgeAr(x, { lags: [1], lambda: -1 }))).toBe('invalid-argument');
    expect(code(() => ridgeAr(x, { lags: [1], lambda: 1, select: 'bic' }))).toBe('invalid-argument');
    expect(code(() => ridgeAr(x.subarray(0, 10), { lags: [1, 2, 3, 8] }))).toBe('too-few-observations');
    expect(code(() => ridgeAr([1, 2, Number.NaN, 4, 5, 6], { lags: [1] }))).toBe('non-finite-input');
    expect(code(() => ridgeAr(new Array(20).fill(3), { lags: [1] }))).toBe('constant-series');
  });
});
