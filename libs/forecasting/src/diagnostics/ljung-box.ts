/**
 * Ljung-Box portmanteau test for residual autocorrelation.
 *
 * Q = n(n + 2) Σ_{k=1..h} ρ̂_k² / (n − k), compared with χ² on h − fitdf degrees of freedom, where
 * fitdf = p + q for residuals of a fitted ARMA(p, q).
 *
 * Method: Ljung & Box (1978), Biometrika 65(2), 297–303; Brockwell & Davis (2016), Introduction to
 * Time Series and Forecasting, 3rd ed., §1.6 (test (c)) and §5.3.2.
 *
 * Conventions: ρ̂ from acf/autocovariance.ts (demeaned, divisor n), n = every residual given,
 * including the zeros a conditional fit returns for the conditioned-on start, exactly as R's
 * `Box.test(residuals(fit), type = "Ljung-Box", fitdf)`.
 *
 * @throws ForecastingError('invalid-argument') unless 1 ≤ lags < n and 0 ≤ fitdf < lags;
 *   ('constant-series') when the residuals are constant; ('non-finite-input').
 *
 * References: Ljung & Box (1978); Box & Pierce (1970), JASA 65(332); R `stats::Box.test`.
 */
import { autocorrelation } from '../acf/autocovariance';
import { chiSquareSurvival } from '../core/chi-square';
import { ForecastingError } from '../core/errors';

/** The Ljung-Box statistic, its χ² degrees of freedom and p-value. */
export interface LjungBoxResult {
  /** Q = n(n + 2) Σ ρ̂_k²/(n − k). */
  statistic: number;
  /** lags − fitdf. */
  df: number;
  /** P(χ²_df > Q). */
  pValue: number;
}

/** Ljung-Box test of the first `lags` residual autocorrelations, with `fitdf` fitted parameters. */
export function ljungBox(residuals: ArrayLike<number>, lags: number, fitdf: number): LjungBoxResult {
  const fn = 'ljungBox';
  const n = residuals.length;
  if (!Number.isInteger(lags) || lags < 1 || lags >= n) {
    throw new ForecastingError('invalid-argument', fn, `needs an integer number of lags 1 ≤ lags < n = ${n}, got ${lags}`);
  }
  if (!Number.isInteger(fitdf) || fitdf < 0 || fitdf >= lags) {
    throw new ForecastingError(
      'invalid-argument',
      fn,
      `needs 0 ≤ fitdf < lags = ${lags} so that the χ² has degrees of freedom, got fitdf = ${fitdf}`,
    );
  }
  const rho = autocorrelation(residuals, lags);
  let sum = 0;
  for (let k = 1; k <= lags; k++) sum += (rho[k] * rho[k]) / (n - k);
  const statistic = n * (n + 2) * sum;
  const df = lags - fitdf;
  return { statistic, df, pValue: chiSquareSurvival(statistic, df) };
}
