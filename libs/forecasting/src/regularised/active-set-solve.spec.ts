/**
 * Exact active-set solve, hand case with an orthonormal design (G = I): the lasso solution is then
 * soft-thresholding of c, β_j = S(c_j, λ) (Tibshirani 1996, §2.2, orthonormal case).
 */
import { describe, expect, it } from 'vitest';
import { moveActiveSet, solveActiveSet } from './active-set-solve';

describe('solveActiveSet', () => {
  const identity = Float64Array.from([1, 0, 0, 0, 1, 0, 0, 0, 1]);
  const c = Float64Array.from([0.9, -0.5, 0.1]);

  it('returns soft-thresholded c for G = I when the signs are right', () => {
    // λ = 0.3: S(0.9) = 0.6, S(−0.5) = −0.2, S(0.1) = 0; gradient c − β = [0.3, −0.3, 0.1], |0.1| ≤ 0.3.
    const result = solveActiveSet(identity, 3, c, Float64Array.from([0.5, -0.1, 0]), 0.3, 1e-12)!;
    expect(Array.from(result.beta).map((v) => +v.toFixed(12))).toEqual([0.6, -0.2, 0]);
    expect(Array.from(result.gradient).map((v) => +v.toFixed(12))).toEqual([0.3, -0.3, 0.1]);
  });

  it('refuses a wrong active set or wrong signs', () => {
    // Lag 2 benched wrongly: its gradient −0.5 exceeds λ = 0.3 in size.
    expect(solveActiveSet(identity, 3, c, Float64Array.from([0.5, 0, 0]), 0.3, 1e-12)).toBeNull();
    // Lag 3 active with the wrong sign: S would need 0.1 − 0.3·1 = −0.2 < 0 against sign +.
    expect(solveActiveSet(identity, 3, c, Float64Array.from([0.5, -0.1, 0.05]), 0.3, 1e-12)).toBeNull();
    expect(solveActiveSet(identity, 3, c, new Float64Array(3), 0.3, 1e-12)).toBeNull();
  });

  it('moves from a wrong active set to the solution by dropping flipped signs and adding the worst KKT break', () => {
    // Start: lag 1 active with the wrong sign and lag 2 benched. Soft-thresholding at λ = 0.3 gives [0.6, −0.2, 0].
    const moved = moveActiveSet(identity, 3, c, Float64Array.from([-0.4, 0, 0.2]), 0.3, 1e-12, 6)!;
    expect(Array.from(moved.beta).map((v) => +v.toFixed(12))).toEqual([0.6, -0.2, 0]);
    // Above λ_max = max |c_j| = 0.9 every lag is benched: β = 0 with gradient c.
    const none = moveActiveSet(identity, 3, c, Float64Array.from([0.5, 0, 0]), 0.95, 1e-12, 6)!;
    expect(Array.from(none.beta)).toEqual([0, 0, 0]);
    expect(Array.from(none.gradient)).toEqual(Array.from(c));
    // Too few moves to reach it: null, so the caller falls back to coordinate descent.
    expect(moveActiveSet(identity, 3, c, Float64Array.from([-0.4, 0, 0.2]), 0.3, 1e-12, 1)).toBeNull();
  });
});
