/**
 * Reconciliation: the minimum-trace weights on a case worked by hand, bottom-up and top-down closed forms,
 * sums holding at every hour and level of a simulated three-level hierarchy with remainders, ordered bands,
 * and MinT's defining property (smallest total reconciled variance among unbiased G).
 */
import { Matrix } from 'ml-matrix';
import { describe, expect, it } from 'vitest';
import { normalGenerator } from '../core/random';
import { reconcileForecasts, reconciliationMethods } from './reconcile-forecasts';
import { bottomUpMatrix, minTraceMatrix, topDownMatrix } from './reconciliation-matrix';
import { summingStructure, type HierarchyNode } from './summing-matrix';

const parentAndTwo = summingStructure([
  { key: 'P', parentKey: null, remainder: false },
  { key: 'A', parentKey: 'P' },
  { key: 'B', parentKey: 'P' },
]);

describe('minTraceMatrix', () => {
  it('gives the weights worked by hand for a parent and two children with W = diag(2, 1, 1)', () => {
    // S = [[1, 1], [1, 0], [0, 1]] (rows P, A, B), W⁻¹ = diag(1/2, 1, 1).
    // Sᵀ W⁻¹ = [[1/2, 1, 0], [1/2, 0, 1]];  Sᵀ W⁻¹ S = [[3/2, 1/2], [1/2, 3/2]], determinant 9/4 − 1/4 = 2,
    // so (Sᵀ W⁻¹ S)⁻¹ = (1/2)[[3/2, −1/2], [−1/2, 3/2]] = [[3/4, −1/4], [−1/4, 3/4]].
    // G row A = 3/4·(1/2, 1, 0) − 1/4·(1/2, 0, 1) = (1/4, 3/4, −1/4);
    // G row B = −1/4·(1/2, 1, 0) + 3/4·(1/2, 0, 1) = (1/4, −1/4, 3/4).
    const g = minTraceMatrix(parentAndTwo.s, Matrix.diag([2, 1, 1]));
    const expected = [
      [1 / 4, 3 / 4, -1 / 4],
      [1 / 4, -1 / 4, 3 / 4],
    ];
    for (let i = 0; i < 2; i++) for (let j = 0; j < 3; j++) expect(g.get(i, j)).toBeCloseTo(expected[i][j], 14);
    // Unbiasedness: G S = I (Wickramasuriya et al. 2019, eq. 6).
    const gs = g.mmul(parentAndTwo.s).to2DArray().flat();
    [1, 0, 0, 1].forEach((v, k) => expect(gs[k]).toBeCloseTo(v, 12));
  });

  it('splits the gap in proportion to the error variances: P = 10, A = 4, B = 5 → 9.5, 4.25, 5.25', () => {
    // Gap 10 − (4 + 5) = 1; variances 2, 1, 1 (sum 4): P gives up 2/4, A and B gain 1/4 each.
    // By G: Ã = 10/4 + 3·4/4 − 5/4 = 4.25; B̃ = 10/4 − 4/4 + 3·5/4 = 5.25; P̃ = 9.5.
    const g = minTraceMatrix(parentAndTwo.s, Matrix.diag([2, 1, 1]));
    const y = parentAndTwo.s.mmul(g).mmul(Matrix.columnVector([10, 4, 5]));
    expect(y.getColumn(0).map((v) => Math.round(v * 1e12) / 1e12)).toEqual([9.5, 4.25, 5.25]);
  });
});

describe('reconcileForecasts with errorScale', () => {
  it('uses the given scales with the errors’ correlation: uncorrelated errors and scales √2, 1, 1 give the hand case above', () => {
    // The three error series are pairwise orthogonal (1·1 − 1·1 + 2·2 − 2·2 = 0, 2 + 2 − 2 − 2 = 0, 2 − 2 − 2 + 2 = 0),
    // so λ = 1, R* = I and W = diag(√2², 1², 1²) = diag(2, 1, 1): the same G, hence 9.5, 4.25, 5.25.
    const errors = [
      [1, -1, 2, -2],
      [1, 1, 2, 2],
      [2, -2, -1, 1],
    ];
    const result = reconcileForecasts(
      parentAndTwo,
      { mean: [[10], [4], [5]], se: [[1], [1], [1]], errors, errorScale: [Math.SQRT2, 1, 1] },
      'min-trace',
    );
    expect(result.lambda).toBe(1);
    expect(result.mean.map((m) => Math.round(m[0]! * 1e12) / 1e12)).toEqual([9.5, 4.25, 5.25]);
  });
});

describe('bottomUpMatrix and topDownMatrix', () => {
  it('bottom-up keeps the children and sums them; its band adds variances: √(3² + 4²) = 5', () => {
    const result = reconcileForecasts(parentAndTwo, { mean: [[10], [4], [5]], se: [[1], [3], [4]] }, 'bottom-up', [95]);
    expect(bottomUpMatrix(parentAndTwo).to2DArray()).toEqual([
      [0, 1, 0],
      [0, 0, 1],
    ]);
    expect(Array.from(result.mean, (m) => m[0])).toEqual([9, 4, 5]);
    expect(result.se[0][0]).toBeCloseTo(5, 14); // independent children (no errors given): variances add
    // 95 % band: 9 ± 1.959964 · 5 (z from R: qnorm(0.975) = 1.959964).
    expect(result.intervals[0][0].lower[0]).toBeCloseTo(9 - 1.959964 * 5, 5);
  });

  it('top-down splits the root by proportions of the historical averages, remainder included', () => {
    // History P = (10, 20), A = (4, 8), B = (5, 10), so the unmetered remainder is (1, 2).
    // Proportions: A 12/30 = 0.4, B 15/30 = 0.5, remainder 3/30 = 0.1; the root's 50 splits 20, 25, 5.
    const withRemainder = summingStructure([
      { key: 'P', parentKey: null },
      { key: 'A', parentKey: 'P' },
      { key: 'B', parentKey: 'P' },
    ]);
    const history = [
      [10, 20],
      [4, 8],
      [5, 10],
      [1, 2],
    ];
    expect(topDownMatrix(withRemainder, history).getColumn(0)).toEqual([0.4, 0.5, 0.1]);
    const result = reconcileForecasts(withRemainder, { mean: [[50], [30], [30], [9]], se: [[2], [1], [1], [1]], history }, 'top-down');
    expect(result.mean.map((m) => Math.round(m[0] * 1e12) / 1e12)).toEqual([50, 20, 25, 5]);
  });
});

describe('reconcileForecasts on a simulated hierarchy', () => {
  // system → 3 zones → 2 feeders each, with a remainder under the system and under each zone (4 remainders).
  const nodes: HierarchyNode[] = [{ key: 'system', parentKey: null }];
  for (const zone of ['z1', 'z2', 'z3']) {
    nodes.push({ key: zone, parentKey: 'system' });
    for (const feeder of ['a', 'b']) nodes.push({ key: `${zone}${feeder}`, parentKey: zone });
  }
  const structure = summingStructure(nodes);
  const n = structure.keys.length;
  const horizon = 168;
  const sampleSize = 500;
  const draw = normalGenerator(20190612);
  // Bottom truth: a daily cycle around each series' own level; base forecasts = truth + independent noise,
  // so the base forecasts do not add up. Errors over a past window have the same noise scales.
  const bottomLevels = structure.bottomKeys.map((k) => (k.endsWith(':remainder') ? 2 : 20));
  const truth = (t: number) => {
    const b = bottomLevels.map((level) => level * (1 + 0.3 * Math.sin((2 * Math.PI * t) / 24)));
    return structure.s.mmul(Matrix.columnVector(b)).getColumn(0);
  };
  const noiseScale = structure.keys.map((k) => (structure.childrenOf.get(k)!.length > 0 ? 3 : 1));
  const mean = Array.from({ length: n }, () => new Float64Array(horizon));
  const se = Array.from({ length: n }, () => new Float64Array(horizon));
  for (let h = 0; h < horizon; h++) {
    const y = truth(sampleSize + h);
    for (let i = 0; i < n; i++) {
      mean[i][h] = y[i] + noiseScale[i] * draw();
      se[i][h] = noiseScale[i] * Math.sqrt(1 + h / 24);
    }
  }
  const errors = structure.keys.map((_, i) => Float64Array.from({ length: sampleSize }, () => noiseScale[i] * draw()));
  const history = Array.from({ length: n }, () => new Float64Array(sampleSize));
  for (let t = 0; t < sampleSize; t++) truth(t).forEach((v, i) => (history[i][t] = v));

  for (const method of reconciliationMethods) {
    it(`${method}: every parent equals the sum of its children (remainder included) at every hour, to rounding`, () => {
      const result = reconcileForecasts(structure, { mean, se, errors, history }, method);
      const row = new Map(structure.keys.map((k, i) => [k, i]));
      let parents = 0;
      for (const [key, children] of structure.childrenOf) {
        if (children.length === 0) continue;
        parents++;
        for (let h = 0; h < horizon; h++) {
          const sum = children.reduce((acc, child) => acc + result.mean[row.get(child)!][h], 0);
          expect(Math.abs(result.mean[row.get(key)!][h] - sum)).toBeLessThan(1e-9 * Math.abs(sum));
        }
      }
      expect(parents).toBe(4); // the system and three zones
    });

    it(`${method}: bands are ordered lower 95 ≤ lower 80 ≤ mean ≤ upper 80 ≤ upper 95 everywhere`, () => {
      const result = reconcileForecasts(structure, { mean, se, errors, history }, method, [80, 95]);
      for (let i = 0; i < n; i++) {
        const [b80, b95] = result.intervals[i];
        for (let h = 0; h < horizon; h++) {
          expect(b95.lower[h]).toBeLessThanOrEqual(b80.lower[h]);
          expect(b80.lower[h]).toBeLessThanOrEqual(result.mean[i][h]);
          expect(result.mean[i][h]).toBeLessThanOrEqual(b80.upper[h]);
          expect(b80.upper[h]).toBeLessThanOrEqual(b95.upper[h]);
          expect(b80.upper[h] - b80.lower[h]).toBeGreaterThan(0);
        }
      }
    });
  }

  it('min-trace has the smallest total reconciled variance of the unbiased methods (Wickramasuriya et al. 2019, Theorem 1)', () => {
    // Theorem 1 holds for the W used in G; the spec feeds the same errors to both, so the comparison is exact.
    const total = (method: 'bottom-up' | 'min-trace') =>
      reconcileForecasts(structure, { mean, se, errors }, method).se.reduce((acc, s) => acc + s[0] * s[0], 0);
    expect(total('min-trace')).toBeLessThan(total('bottom-up'));
  });

  it('refuses min-trace without errors and top-down without history, saying what is needed', () => {
    expect(() => reconcileForecasts(structure, { mean, se }, 'min-trace')).toThrow(/min-trace needs the in-sample errors/);
    expect(() => reconcileForecasts(structure, { mean, se }, 'top-down')).toThrow(/top-down needs the history/);
  });
});
