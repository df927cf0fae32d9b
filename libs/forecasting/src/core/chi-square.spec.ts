import { describe, expect, it } from 'vitest';
import lh from '../../../../fixtures/reference/ref/lh.json';
import { chiSquareSurvival } from './chi-square';
import { ForecastingError } from './errors';
import { logGamma, regularizedGammaP, regularizedGammaQ } from './incomplete-gamma';

const relative = (actual: number, expected: number) => Math.abs(actual - expected) / Math.abs(expected);

describe('chiSquareSurvival', () => {
  it('reproduces the p-values of R Box.test stored in fixtures/reference/ref/lh.json (box_test.*) from their statistic and df', () => {
    // The file holds 15 significant digits; 1e-13 leaves room for the last stored digit.
    for (const fit of [lh.box_test.ar2_ml, lh.box_test.arma11_css]) {
      for (const test of [fit.lag10, fit.lag20]) {
        expect(relative(chiSquareSurvival(test.statistic, test.df), test.p_value)).toBeLessThan(1e-13);
      }
    }
  });

  it('matches R 4.2.2 pchisq(lower.tail = FALSE) on both tails and at large df', () => {
    // Rscript -e 'print(c(pchisq(0.01, 1, lower.tail = FALSE), pchisq(500, 400, lower.tail = FALSE), pchisq(3, 7, lower.tail = FALSE)), digits = 17)'
    expect(relative(chiSquareSurvival(0.01, 1), 0.92034432544594202)).toBeLessThan(1e-13);
    expect(relative(chiSquareSurvival(500, 400), 4.8221275959343349e-4)).toBeLessThan(1e-12);
    expect(relative(chiSquareSurvival(3, 7), 0.88500223164315062)).toBeLessThan(1e-13);
  });

  it('equals the closed form e^{−x/2} for two degrees of freedom (Abramowitz & Stegun 26.4.21)', () => {
    for (const x of [0.1, 1, 7.5, 60]) expect(relative(chiSquareSurvival(x, 2), Math.exp(-x / 2))).toBeLessThan(1e-14);
  });

  it('returns 1 at x ≤ 0 and refuses df ≤ 0', () => {
    expect(chiSquareSurvival(0, 3)).toBe(1);
    expect(chiSquareSurvival(-1, 3)).toBe(1);
    expect(() => chiSquareSurvival(1, 0)).toThrow(ForecastingError);
  });
});

describe('regularised incomplete gamma', () => {
  it('P + Q = 1 on both sides of the series / continued-fraction switch', () => {
    for (const [a, x] of [
      [0.5, 0.2],
      [3, 2.5],
      [3, 5],
      [40.5, 30],
      [40.5, 60],
    ]) {
      expect(regularizedGammaP(a, x) + regularizedGammaQ(a, x)).toBeCloseTo(1, 14);
    }
  });

  it('logGamma matches known values: Γ(5) = 24, Γ(1/2) = √π, and Lanczos at 2.3 (R 4.2.2: lgamma(2.3) = 0.15418945495963057)', () => {
    expect(logGamma(5)).toBeCloseTo(Math.log(24), 14);
    expect(logGamma(0.5)).toBeCloseTo(0.5 * Math.log(Math.PI), 14);
    expect(relative(logGamma(2.3), 0.15418945495963057)).toBeLessThan(1e-13);
  });
});
