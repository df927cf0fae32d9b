/**
 * Conjugate normal update against fixtures/reference/ref/bayes-gaussian-mean.json (closed form, exact rational
 * arithmetic then float: prior N(0, 4), noise variance 2, N = 1, 10, 100), to 1e-15 relative; and the issue's
 * rounded check values 4/3, 0.1905, 0.0199 to their printed digits.
 */
import { readFileSync } from 'node:fs';
import { describe, expect, it } from 'vitest';
import { conjugateNormalUpdate } from './conjugate-normal';

const reference = JSON.parse(readFileSync(new URL('../../../../fixtures/reference/ref/bayes-gaussian-mean.json', import.meta.url), 'utf8'));
const prior = { mean: reference.prior_mean as number, variance: reference.prior_variance as number };

describe('conjugateNormalUpdate', () => {
  for (const row of reference.values) {
    it(`matches the closed form after ${row.N} observations`, () => {
      const ybar = 3.7; // any sample mean: the posterior mean is w·ȳ + (1 − w)·0
      const posterior = conjugateNormalUpdate(prior, { n: row.N, mean: ybar }, reference.noise_variance);
      expect(Math.abs(posterior.variance / row.posterior_variance - 1)).toBeLessThan(1e-15);
      expect(Math.abs(posterior.precision / row.posterior_precision - 1)).toBeLessThan(1e-15);
      expect(Math.abs(posterior.weightOnSample / row.weight_on_sample_mean - 1)).toBeLessThan(1e-15);
      expect(posterior.mean).toBeCloseTo(row.weight_on_sample_mean * ybar, 14);
    });
  }

  it('gives the issue’s check values 4/3, 0.1905 and 0.0199', () => {
    const variance = (n: number) => conjugateNormalUpdate({ mean: 0, variance: 4 }, { n, mean: 1 }, 2).variance;
    expect(variance(1)).toBeCloseTo(4 / 3, 15);
    expect(variance(10)).toBeCloseTo(0.1905, 4);
    expect(variance(100)).toBeCloseTo(0.0199, 4);
  });

  it('is a precision-weighted average of prior and sample means', () => {
    // prior N(10, 1), σ² = 4, n = 4, ȳ = 20: precisions 1 and 4/4 = 1, so the mean is (10 + 20)/2 = 15, variance 1/2.
    const posterior = conjugateNormalUpdate({ mean: 10, variance: 1 }, { n: 4, mean: 20 }, 4);
    expect(posterior.mean).toBeCloseTo(15, 14);
    expect(posterior.variance).toBeCloseTo(0.5, 15);
  });

  it('returns the prior before any observation and refuses bad variances', () => {
    expect(conjugateNormalUpdate({ mean: 5, variance: 2 }, { n: 0, mean: Number.NaN }, 1)).toEqual({
      mean: 5,
      variance: 2,
      precision: 0.5,
      weightOnSample: 0,
    });
    expect(() => conjugateNormalUpdate({ mean: 0, variance: 0 }, { n: 1, mean: 1 }, 1)).toThrowError(
      expect.objectContaining({ code: 'invalid-argument' }),
    );
    expect(() => conjugateNormalUpdate({ mean: 0, variance: 1 }, { n: 1, mean: 1 }, -1)).toThrowError(
      expect.objectContaining({ code: 'invalid-argument' }),
    );
    expect(() => conjugateNormalUpdate({ mean: 0, variance: 1 }, { n: 1.5, mean: 1 }, 1)).toThrowError(
      expect.objectContaining({ code: 'invalid-argument' }),
    );
  });
});
