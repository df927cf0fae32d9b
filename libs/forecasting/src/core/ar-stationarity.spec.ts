import { describe, expect, it } from 'vitest';
import { arToPartialAutocorrelations, isCausalAr } from './ar-stationarity';

describe('isCausalAr', () => {
  it('accepts the AR(2) stationarity triangle and rejects points outside it (Brockwell & Davis 2016, §3.1, Example 3.1.2)', () => {
    // AR(2) is causal iff φ1 + φ2 < 1, φ2 − φ1 < 1 and |φ2| < 1.
    expect(isCausalAr([0.5, 0.3])).toBe(true);
    expect(isCausalAr([1.5, -0.7])).toBe(true);
    expect(isCausalAr([0.5, 0.6])).toBe(false);
    expect(isCausalAr([-0.5, 0.6])).toBe(false);
    expect(isCausalAr([0, -1.01])).toBe(false);
    expect(isCausalAr([1])).toBe(false);
    expect(isCausalAr([])).toBe(true);
  });

  it('recovers the partial autocorrelations the Durbin-Levinson recursion started from', () => {
    // φ_11 = 0.6, φ_22 = −0.3: φ_21 = 0.6 − (−0.3)(0.6) = 0.78.
    const pacf = arToPartialAutocorrelations([0.78, -0.3])!;
    expect(pacf[0]).toBeCloseTo(0.6, 15);
    expect(pacf[1]).toBeCloseTo(-0.3, 15);
  });
});
