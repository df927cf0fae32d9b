/**
 * Young-series estimates.
 * - Against a dense solve of the same Gaussian linear model (posterior precision V₀⁻¹ + AᵀA/σ², built and inverted
 *   here with ml-matrix), to 1e-10: checks the arrow-matrix algebra.
 * - Reduces to the scalar closed form of fixtures/reference/ref/bayes-gaussian-mean.json (prior N(0, 4), σ² = 2)
 *   when the profile is pinned (slot prior variance 1e-12), to 1e-9.
 * - Moves from the peers to the series' own slot means as observations accrue (simulated, seeded).
 */
import { readFileSync } from 'node:fs';
import { Matrix, inverse } from 'ml-matrix';
import { describe, expect, it } from 'vitest';
import type { ProfilePrior } from './peer-prior';
import { coldStartEstimate } from './young-series-estimate';

const reference = JSON.parse(readFileSync(new URL('../../../../fixtures/reference/ref/bayes-gaussian-mean.json', import.meta.url), 'utf8'));

describe('coldStartEstimate', () => {
  const prior: ProfilePrior = {
    period: 3,
    level: { mean: 50, variance: 25 },
    profile: [
      { mean: -5, variance: 4 },
      { mean: 2, variance: 9 },
      { mean: 3, variance: 1 },
    ],
    noiseVariance: 6,
    peers: 5,
  };

  it('matches a dense Bayesian linear-model solve', () => {
    const young = { values: [44, 58, 51, 47, 60], offset: 1 }; // slots 1, 2, 0, 1, 2
    const estimate = coldStartEstimate(young, prior);
    const slots = young.values.map((_, i) => (1 + i) % 3);
    const a = new Matrix(young.values.length, 4);
    slots.forEach((k, i) => {
      a.set(i, 0, 1);
      a.set(i, 1 + k, 1);
    });
    const v0 = [25, 4, 9, 1];
    const m0 = [50, -5, 2, 3];
    const precision = a
      .transpose()
      .mmul(a)
      .div(6)
      .add(Matrix.diag(v0.map((v) => 1 / v)));
    const rhs = a
      .transpose()
      .mmul(Matrix.columnVector(young.values))
      .div(6)
      .add(Matrix.columnVector(m0.map((m, i) => m / v0[i])));
    const covariance = inverse(precision);
    const mean = covariance.mmul(rhs).getColumn(0);
    expect(estimate.level.mean).toBeCloseTo(mean[0], 10);
    expect(estimate.level.variance).toBeCloseTo(covariance.get(0, 0), 10);
    for (let k = 0; k < 3; k++) {
      expect(estimate.profile[k].mean).toBeCloseTo(mean[1 + k], 10);
      expect(estimate.profile[k].variance).toBeCloseTo(covariance.get(1 + k, 1 + k), 10);
      const sumVariance = covariance.get(0, 0) + covariance.get(1 + k, 1 + k) + 2 * covariance.get(0, 1 + k);
      expect(estimate.expected[k]).toBeCloseTo(mean[0] + mean[1 + k], 10);
      expect(estimate.expectedVariance[k]).toBeCloseTo(sumVariance, 10);
    }
  });

  it('returns the prior before any observation', () => {
    const estimate = coldStartEstimate({ values: [] }, prior);
    expect(estimate.level).toEqual(prior.level);
    expect(Array.from(estimate.expected)).toEqual([45, 52, 53]);
    expect(Array.from(estimate.dataWeight)).toEqual([0, 0, 0]);
  });

  it('reduces to the scalar conjugate update when the profile is pinned', () => {
    for (const row of reference.values) {
      const pinned: ProfilePrior = {
        period: 1,
        level: { mean: reference.prior_mean, variance: reference.prior_variance },
        profile: [{ mean: 0, variance: 1e-12 }],
        noiseVariance: reference.noise_variance,
        peers: 2,
      };
      const values = Array.from({ length: row.N }, (_, i) => 1 + ((i % 2) - 0.5)); // alternating 0.5, 1.5: sample mean 0.5 for N = 1, 1 for even N
      const ybar = values.reduce((s: number, v: number) => s + v, 0) / row.N;
      const estimate = coldStartEstimate({ values }, pinned);
      expect(Math.abs(estimate.level.variance / row.posterior_variance - 1)).toBeLessThan(1e-9);
      expect(estimate.level.mean).toBeCloseTo(row.weight_on_sample_mean * ybar, 9);
    }
  });

  it('moves from the peers to its own slot means as observations accrue', () => {
    // A young feeder whose true slot loads are [40, 60, 70] (prior expects [45, 52, 53]), noise sd √6.
    let state = 12345;
    const uniform = () => ((state = (state * 1103515245 + 12345) % 2147483648) + 0.5) / 2147483648;
    const normal = () => Math.sqrt(-2 * Math.log(uniform())) * Math.cos(2 * Math.PI * uniform());
    const truth = [40, 60, 70];
    const values = Array.from({ length: 3000 }, (_, i) => truth[i % 3] + Math.sqrt(6) * normal());
    let previousWeight = 0;
    let previousDistance = Infinity;
    for (const n of [3, 30, 300, 3000]) {
      const estimate = coldStartEstimate({ values: values.slice(0, n) }, prior);
      const ownMeans = truth.map((_, k) => {
        const own = values.slice(0, n).filter((_, i) => i % 3 === k);
        return own.reduce((s, v) => s + v, 0) / own.length;
      });
      const distance = Math.max(...ownMeans.map((m, k) => Math.abs(estimate.expected[k] - m)));
      expect(estimate.dataWeight[1]).toBeGreaterThan(previousWeight);
      expect(distance).toBeLessThan(previousDistance);
      previousWeight = estimate.dataWeight[1];
      previousDistance = distance;
    }
    expect(previousWeight).toBeGreaterThan(0.99);
    expect(previousDistance).toBeLessThan(0.05);
  });

  it('refuses a bad offset or noise variance', () => {
    expect(() => coldStartEstimate({ values: [1], offset: 3 }, prior)).toThrowError(expect.objectContaining({ code: 'invalid-argument' }));
    expect(() => coldStartEstimate({ values: [1] }, prior, { noiseVariance: 0 })).toThrowError(
      expect.objectContaining({ code: 'invalid-argument' }),
    );
  });
});
