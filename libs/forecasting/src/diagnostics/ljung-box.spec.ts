import { describe, expect, it } from 'vitest';
import { expectRelative, loadReference, referenceSeries } from '../core/spec-support';
import { ljungBox } from './ljung-box';

describe('ljungBox', () => {
  // Source: fixtures/reference/ref/<series>.json, box_test.<fit>.lag10 / lag20 = 'Box.test(residuals(fit), lag = 10 | 20,
  // type = "Ljung-Box", fitdf = 2)' on the stored residuals of the exact-ML AR(2) and the CSS ARMA(1,1), R 4.2.2,
  // 15 significant digits. A sum of 20 squared correlations and one incomplete-gamma evaluation: 1e-10 relative.
  for (const name of referenceSeries) {
    it(`matches R Box.test on ${name} (AR(2) ML and ARMA(1,1) CSS residuals, lags 10 and 20)`, () => {
      const reference = loadReference(name).box_test;
      for (const fit of ['ar2_ml', 'arma11_css']) {
        for (const [lags, stored] of [
          [10, reference[fit].lag10],
          [20, reference[fit].lag20],
        ] as const) {
          const result = ljungBox(reference[fit].residuals, lags, 2);
          expect(result.df).toBe(stored.df);
          expectRelative([result.statistic], [stored.statistic], 1e-10, `${name} ${fit} lag ${lags} Q`);
          // Box.test computes PVAL <- 1 - pchisq(Q, df): absolute error of a few ulps of 1, so its tiny p-values
          // (USAccDeaths AR(2): 1.3e-11) are good to ~1e-16 absolute only; we compute the upper tail directly.
          expect(Math.abs(result.pValue - stored.p_value)).toBeLessThan(1e-15 + 1e-10 * stored.p_value);
        }
      }
    });
  }

  it('keeps relative accuracy for tiny p-values where R Box.test rounds (USAccDeaths AR(2), lag 20)', () => {
    // Rscript -e 'print(pchisq(90.1976752324915, 18, lower.tail = FALSE), digits = 17)' → 1.3306465119202656e-11,
    // against Box.test's stored 1 - pchisq(...) = 1.33064670393424e-11.
    const stored = loadReference('USAccDeaths').box_test.ar2_ml;
    const result = ljungBox(stored.residuals, 20, 2);
    expectRelative([result.pValue], [1.3306465119202656e-11], 1e-10, 'upper-tail p-value');
  });

  it('gives Q = n(n + 2)·ρ̂₁²/(n − 1) for one lag (Ljung & Box 1978, eq. 2.1)', () => {
    // x = 1, −1, 1, −1: mean 0, γ(0) = 1, γ(1) = −3/4, so ρ̂₁ = −0.75 and Q = 4·6·0.5625/3 = 4.5.
    expect(ljungBox([1, -1, 1, -1], 1, 0).statistic).toBeCloseTo(4.5, 14);
  });

  it('refuses lags ≥ n and fitdf ≥ lags', () => {
    expect(() => ljungBox([1, 2, 3], 3, 0)).toThrow(expect.objectContaining({ code: 'invalid-argument' }));
    expect(() => ljungBox([1, 2, 3, 4, 5], 2, 2)).toThrow(expect.objectContaining({ code: 'invalid-argument' }));
  });
});
