/**
 * Upper tail of the χ² distribution, P(X > x) for X ~ χ²(df).
 *
 * P(χ²_df > x) = Q(df/2, x/2), the regularised upper incomplete gamma function.
 *
 * Method: Q by series or continued fraction, whichever converges (Press et al. 2007, Numerical
 * Recipes, 3rd ed., §6.2 and §6.14.8), so small p-values keep their relative accuracy.
 *
 * Conventions: df may be any positive real; x ≤ 0 gives 1.
 *
 * @throws ForecastingError('invalid-argument') when df ≤ 0 or either argument is NaN.
 *
 * References: Abramowitz & Stegun (1964) 26.4.19.
 */
import { ForecastingError } from './errors';
import { regularizedGammaQ } from './incomplete-gamma';

/** P(X > x) for X ~ χ²(df). */
export function chiSquareSurvival(x: number, df: number): number {
  if (!(df > 0) || !Number.isFinite(df)) {
    throw new ForecastingError('invalid-argument', 'chiSquareSurvival', `needs degrees of freedom > 0, got ${df}`);
  }
  if (Number.isNaN(x)) throw new ForecastingError('invalid-argument', 'chiSquareSurvival', 'statistic is NaN');
  if (x <= 0) return 1;
  return regularizedGammaQ(df / 2, x / 2);
}
