import { inverse, Matrix } from 'ml-matrix';
import { describe, expect, it } from 'vitest';
import { loadSeries } from '../core/spec-support';
import { autocovariance } from './autocovariance';
import { toeplitzInverseDiagonal } from './toeplitz-inverse';

describe('toeplitzInverseDiagonal', () => {
  it('equals the diagonal of the explicitly inverted autocovariance matrix (ml-matrix LU inverse as the independent check)', () => {
    const gamma = autocovariance(loadSeries('LakeHuron'), 12);
    for (const p of [1, 2, 5, 12]) {
      const toeplitz = Matrix.zeros(p, p);
      for (let i = 0; i < p; i++) for (let j = 0; j < p; j++) toeplitz.set(i, j, gamma[Math.abs(i - j)]);
      const expected = inverse(toeplitz).diag();
      const actual = toeplitzInverseDiagonal(gamma, p);
      // Both are backward-stable O(ε·cond) computations; LakeHuron's Γ_12 has cond ≈ 1e2.
      for (let i = 0; i < p; i++) expect(Math.abs(actual[i] - expected[i]) / expected[i]).toBeLessThan(1e-11);
    }
  });

  it('gives 1/γ(0)·1/(1 − ρ²) on both diagonal entries for p = 2 (closed form of a 2×2 inverse)', () => {
    const d = toeplitzInverseDiagonal([2, 1], 2);
    expect(d[0]).toBeCloseTo(2 / 3, 15);
    expect(d[1]).toBeCloseTo(2 / 3, 15);
  });
});
