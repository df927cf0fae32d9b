import { describe, expect, it } from 'vitest';
import { psiWeights } from './psi-weights';

describe('psiWeights', () => {
  it('ARMA(1,1): ψ_j = (φ + θ) φ^{j−1} for j ≥ 1 (Brockwell & Davis 2016, §3.1, Example 3.1.3)', () => {
    const psi = psiWeights([0.7], [0.4], 6);
    expect(psi[0]).toBe(1);
    for (let j = 1; j < 6; j++) expect(psi[j]).toBeCloseTo(1.1 * 0.7 ** (j - 1), 14);
  });

  it('MA(q): ψ = (1, θ_1, …, θ_q, 0, …)', () => {
    expect(Array.from(psiWeights([], [0.5, -0.2], 5))).toEqual([1, 0.5, -0.2, 0, 0]);
  });

  it('matches R 4.2.2 ARMAtoMA(ar = c(1.2, -0.5), ma = 0.3, lag.max = 5) (ψ_1..ψ_5; printed with digits = 15)', () => {
    // Rscript -e 'print(ARMAtoMA(ar = c(1.2, -0.5), ma = 0.3, lag.max = 5), digits = 15)'
    const expected = [1.5, 1.3, 0.81, 0.322, -0.0186];
    const psi = psiWeights([1.2, -0.5], [0.3], 6);
    for (let j = 1; j <= 5; j++) expect(psi[j]).toBeCloseTo(expected[j - 1], 13);
  });

  it('refuses a count below 1', () => {
    expect(() => psiWeights([0.5], [], 0)).toThrow(expect.objectContaining({ code: 'invalid-argument' }));
  });
});
