import { readFileSync } from 'node:fs';
import { describe, expect, it } from 'vitest';
import { cmleAr } from '../ar/cmle';
import { nlsArma } from '../arma/nls';
import { normalGenerator } from '../core/random';
import type { FitResult } from '../core/types';
import { estimatorWarnings, largestReciprocalRoot, nearUnitRoot } from './fit-warnings';

/** A fit with the given coefficients (the warnings read only these fields). */
function fitOf(ar: number[], ma: number[], mean = 0, converged: boolean | null = true): FitResult {
  return {
    method: 'nls',
    p: ar.length,
    q: ma.length,
    n: 100,
    mean,
    ar,
    ma,
    sigma2: 1,
    stderr: { ar: null, ma: null, mean: null },
    loglik: null,
    aic: null,
    aicc: null,
    bic: null,
    converged,
    iterations: 200,
    residuals: new Float64Array(100),
  };
}

describe('largestReciprocalRoot', () => {
  it('is 1 for φ = (1.5, −0.5): λ² − 1.5λ + 0.5 = (λ − 1)(λ − 0.5), a unit root (hand factorisation)', () => {
    expect(largestReciprocalRoot([1.5, -0.5])).toBeCloseTo(1, 10);
    expect(largestReciprocalRoot([0.5])).toBeCloseTo(0.5, 12);
    expect(largestReciprocalRoot([])).toBe(0);
  });
});

describe('nearUnitRoot', () => {
  /** A sparse AR polynomial on lags 1, 2, 24, 25 and 168, as the regularised weekly-lag fits give. */
  const weekly = (phi1: number, phi168: number): Float64Array => {
    const c = new Float64Array(168);
    c[0] = phi1;
    c[1] = -0.12;
    c[23] = 0.1;
    c[24] = -0.05;
    c[167] = phi168;
    return c;
  };

  it('finds by bisection the modulus the root finder finds, for roots beyond 0.99 (degree 2: (1 − 0.995z)(1 − 0.98z); degree 168, up to a unit root)', () => {
    for (const c of [[1.5, -0.5], [1.975, -0.9751], weekly(0.9, 0.1), weekly(0.6, 0.1), weekly(0.95, 0.12)]) {
      const roots = largestReciprocalRoot(c);
      expect(roots).toBeGreaterThanOrEqual(0.99);
      expect(Math.abs(nearUnitRoot(c) - roots)).toBeLessThan(1e-9 * roots);
    }
  });

  it('is 0 when every reciprocal root lies below 0.99', () => {
    expect(nearUnitRoot([0.5, 0.3])).toBe(0);
    const c = weekly(0.6, 0.001);
    expect(largestReciprocalRoot(c)).toBeLessThan(0.99);
    expect(nearUnitRoot(c)).toBe(0);
  });
});

describe('estimatorWarnings', () => {
  it('flags a unit AR root and an MA root at the circle, each with a suggestion to difference (or difference less)', () => {
    const warnings = estimatorWarnings(fitOf([1.5, -0.5], [-0.995]), [0, 1, 2]);
    expect(warnings.map((w) => w.code)).toEqual(['near-unit-root', 'ma-near-boundary']);
    expect(warnings[0].suggestion).toMatch(/Difference the series/);
    expect(warnings[1].suggestion).toMatch(/difference less/);
    expect(estimatorWarnings(fitOf([0.5], [0.3]), [0, 1, 2])).toEqual([]);
  });

  it('flags the near-unit root of a least-squares AR(1) fitted to a simulated random walk (φ = 1, 2,000 steps)', () => {
    const noise = normalGenerator(11);
    const walk = new Float64Array(2000);
    for (let t = 1; t < walk.length; t++) walk[t] = walk[t - 1] + noise();
    const fit = cmleAr(walk, 1);
    // The least-squares φ̂ of a random walk is 1 − O(1/n) (Dickey & Fuller 1979): well past 0.99 at n = 2,000.
    expect(fit.ar[0]).toBeGreaterThan(0.99);
    expect(estimatorWarnings(fit, walk).map((w) => w.code)).toContain('near-unit-root');
  });

  it('reports what NLS ARMA(1,1) does on the log of a trending quarterly consumption series (R datasets::UKgas)', () => {
    // UKgas: quarterly UK gas consumption 1960–1986 (fixtures/reference/data/UKgas.json); its log grows from 4.4 to 7.1.
    const data = JSON.parse(readFileSync(new URL('../../../../fixtures/reference/data/UKgas.json', import.meta.url), 'utf8')) as {
      values: number[];
    };
    const logged = data.values.map(Math.log);
    const fit = nlsArma(logged, 1, 1);
    // The AR root walks to the unit circle (it stays inside: roots are reflected, never crossed) and the mean is lost.
    expect(Math.abs(fit.ar[0])).toBeLessThan(1);
    expect(fit.ar[0]).toBeGreaterThan(0.999);
    const codes = estimatorWarnings(fit, logged).map((w) => w.code);
    expect(codes).toContain('near-unit-root');
    expect(codes).toContain('mean-outside-data');
    if (fit.converged === false) expect(codes).toContain('not-converged');
  });
});
