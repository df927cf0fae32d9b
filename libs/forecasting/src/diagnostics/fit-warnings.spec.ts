import { readFileSync } from 'node:fs';
import { describe, expect, it } from 'vitest';
import { cmleAr } from '../ar/cmle';
import { nlsArma } from '../arma/nls';
import { normalGenerator } from '../core/random';
import type { FitResult } from '../core/types';
import { estimatorWarnings, largestReciprocalRoot } from './fit-warnings';

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
