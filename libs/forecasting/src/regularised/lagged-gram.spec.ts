/**
 * The Gram matrix from lag shifts against its definition, G = ZᵀZ/m and c = Zᵀy/m multiplied out column by column
 * from the standardised design (lagged-design.ts), on a simulated AR with lags {1, 2, 24} around a level of 1,000 (so
 * the centring matters) and on the wide lag set of the refit (1–48 and 168), where most pairs come from shifts.
 */
import { describe, expect, it } from 'vitest';
import { buildLaggedDesign } from './lagged-design';
import { laggedGram } from './lagged-gram';
import { lassoPath } from './lasso';
import { simulateSparseAr } from './simulated-ar.testing';

/** G and c multiplied out from the design's columns. */
function byDefinition(x: Float64Array, lags: number[]) {
  const design = buildLaggedDesign('test', x, lags);
  const k = lags.length;
  const dot = (a: Float64Array, b: Float64Array) => a.reduce((s, v, i) => s + v * b[i]!, 0);
  const gram = new Float64Array(k * k);
  for (let i = 0; i < k; i++) for (let j = 0; j < k; j++) gram[i * k + j] = dot(design.columns[i]!, design.columns[j]!) / design.rows;
  const covariance = Float64Array.from(design.columns, (column) => dot(column, design.response) / design.rows);
  return { design, gram, covariance };
}

describe('laggedGram', () => {
  const x = simulateSparseAr({ 1: 0.5, 2: 0.2, 24: 0.25 }, 2000, 11, 1000);
  for (const [name, lags] of [
    ['a few lags', [1, 2, 24]],
    ['lags 1–48 and 168', [...Array.from({ length: 48 }, (_, i) => i + 1), 168]],
  ] as const) {
    it(`equals ZᵀZ/m and Zᵀy/m for ${name}`, () => {
      const expected = byDefinition(x, [...lags]);
      const { gram, covariance } = laggedGram(expected.design, x);
      gram.forEach((g, i) => expect(Math.abs(g - expected.gram[i]!)).toBeLessThan(1e-11));
      covariance.forEach((c, i) => expect(Math.abs(c - expected.covariance[i]!)).toBeLessThan(1e-11));
    });
  }

  it('gives the lasso path the same solutions and residual sums of squares as the columns do', () => {
    const lags = [...Array.from({ length: 48 }, (_, i) => i + 1), 168];
    const design = buildLaggedDesign('test', x, lags);
    const lambdas = Array.from({ length: 30 }, (_, i) => 0.5 * 10 ** (-i / 10));
    const fromShifts = lassoPath(design, lambdas, {}, x);
    const fromColumns = lassoPath(design, lambdas);
    fromShifts.forEach((solution, s) => {
      expect(solution.df).toBe(fromColumns[s]!.df);
      solution.beta.forEach((b, j) => expect(Math.abs(b - fromColumns[s]!.beta[j]!)).toBeLessThan(1e-9));
      // The residual sum of squares from the Gram matrix, against the residuals themselves.
      const residual = Float64Array.from(design.response);
      design.columns.forEach((column, j) => column.forEach((v, r) => (residual[r] -= solution.beta[j]! * v)));
      const rss = residual.reduce((sum, v) => sum + v * v, 0);
      expect(Math.abs(solution.rss! / rss - 1)).toBeLessThan(1e-9);
    });
  });
});
