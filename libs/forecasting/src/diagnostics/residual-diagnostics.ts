/**
 * Residual checks of a fitted model: the residual ACF with its ±1.96/√n band and the Ljung-Box test.
 *
 * Under the white-noise hypothesis ρ̂(k) ≈ N(0, 1/n), so about 95 % of the lags should fall within
 * ±1.96/√n; Q uses the lags 1..maxLag with fitdf = p + q.
 *
 * Method: Brockwell & Davis (2016), Introduction to Time Series and Forecasting, 3rd ed., §1.6 and
 * §5.3 (diagnostic checking); Ljung & Box (1978), Biometrika 65(2).
 *
 * Conventions: the residuals are the fit's own (`FitResult.residuals`), leading conditioned-on zeros
 * included, as R's Box.test counts them; the band uses 1.96, the usual rounding of Φ⁻¹(0.975)
 * (common practice).
 *
 * @throws ForecastingError('invalid-argument') unless p + q < maxLag < n; ('constant-series') for
 *   constant residuals.
 *
 * References: Brockwell & Davis (2016) §1.6, §5.3; Box, Jenkins, Reinsel & Ljung (2016) §8.2.
 */
import { autocorrelation } from '../acf/autocovariance';
import type { FitResult } from '../core/types';
import { ljungBox, type LjungBoxResult } from './ljung-box';

/** Residual ACF (index 0 = lag 1), its band half-width and the Ljung-Box test at maxLag. */
export interface ResidualDiagnostics {
  /** Residual autocorrelations at lags 1..maxLag (index 0 = lag 1). */
  acf: Float64Array;
  /** Half-width 1.96/√n of the white-noise band. */
  band: number;
  /** Ljung-Box at maxLag with fitdf = p + q. */
  ljungBox: LjungBoxResult;
}

/** Residual ACF at lags 1..maxLag, the ±1.96/√n band and Ljung-Box with fitdf = p + q. */
export function residualDiagnostics(fit: FitResult, maxLag: number): ResidualDiagnostics {
  const test = ljungBox(fit.residuals, maxLag, fit.p + fit.q);
  const acf = autocorrelation(fit.residuals, maxLag).slice(1);
  return { acf, band: 1.96 / Math.sqrt(fit.residuals.length), ljungBox: test };
}
