/**
 * The seasonal-naive model: each hour is forecast by the value one period (24 or 168 hours) earlier.
 *
 * Model: x_t = x_{t−m} + e_t, e_t ~ (0, σ²) (a seasonal random walk).
 *
 * Method: Hyndman & Athanasopoulos 2021, Forecasting: Principles and Practice, 3rd ed., §5.2 (method)
 * and §5.5 (benchmark forecast standard errors): x̂_{n+h} = x_{n+h−m(k+1)} and σ_h = σ̂·√(k + 1) with
 * k = ⌊(h − 1)/m⌋.
 *
 * Conventions: σ̂² = mean of the squared in-sample seasonal-naive errors x_t − x_{t−m}, t = m+1..n (divisor
 * n − m, no parameters estimated); the errors are returned with m leading zeros, as the conditioned-on
 * values of the ARMA fits.
 *
 * @throws ForecastingError 'too-few-observations' with fewer than m + 2 values; 'constant-series' when
 *   every seasonal-naive error is zero.
 *
 * References: Hyndman & Athanasopoulos (2021) §5.2, §5.5; Hyndman & Koehler (2006), Int. J. Forecasting
 * 22(4) (the same errors scale MASE).
 */
import { ForecastingError, assertFinite, assertLength } from '../core/errors';

const FN = 'seasonalNaiveModel';

/** A fitted seasonal-naive model. */
export interface SeasonalNaiveFit {
  period: number;
  sigma2: number;
  /** In-sample errors x_t − x_{t−m}; the first m are 0. */
  errors: Float64Array;
}

/** Estimates σ² of the seasonal-naive errors at period m. */
export function fitSeasonalNaive(x: ArrayLike<number>, period: number): SeasonalNaiveFit {
  assertFinite(FN, x);
  assertLength(FN, x, period + 2, `one period of ${period} plus two errors`);
  const errors = new Float64Array(x.length);
  let sum = 0;
  for (let t = period; t < x.length; t++) {
    errors[t] = x[t] - x[t - period];
    sum += errors[t] * errors[t];
  }
  const sigma2 = sum / (x.length - period);
  if (!(sigma2 > 0)) throw new ForecastingError('constant-series', FN, `the series repeats exactly every ${period} hours, so σ² = 0`);
  return { period, sigma2, errors };
}

/** Seasonal-naive forecasts and standard errors h = 1..horizon steps after the end of x. */
export function forecastSeasonalNaive(
  x: ArrayLike<number>,
  fit: SeasonalNaiveFit,
  horizon: number,
): { mean: Float64Array; se: Float64Array } {
  const m = fit.period;
  const n = x.length;
  const mean = new Float64Array(horizon);
  const se = new Float64Array(horizon);
  for (let h = 1; h <= horizon; h++) {
    const k = Math.floor((h - 1) / m);
    mean[h - 1] = x[n + h - m * (k + 1) - 1];
    se[h - 1] = Math.sqrt(fit.sigma2 * (k + 1));
  }
  return { mean, se };
}
