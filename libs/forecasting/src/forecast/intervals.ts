/**
 * Gaussian prediction intervals at any coverage levels around point forecasts.
 *
 * [f_h − z·se_h, f_h + z·se_h] with z = Φ⁻¹(1/2 + level/200) for a level in percent.
 *
 * Method: Brockwell & Davis (2016), Introduction to Time Series and Forecasting, 3rd ed., §5.4
 * (large-sample prediction bounds under Gaussian innovations); Box, Jenkins, Reinsel & Ljung (2016)
 * §5.2.4.
 *
 * Conventions: levels in percent, 0 < level < 100, symmetric intervals; z from the full-precision
 * normal quantile (core/normal.ts), as R's `qnorm`.
 *
 * @throws ForecastingError('invalid-argument') for a level outside (0, 100) or mean and se of
 *   different lengths.
 *
 * References: Brockwell & Davis (2016) §5.4; Chatfield (1993), J. Bus. Econ. Stat. 11(2).
 */
import { ForecastingError } from '../core/errors';
import { normalQuantile } from '../core/normal';
import type { PointForecast } from './forecast-arma';

/** A central interval with `level` percent coverage, element h − 1 for horizon h. */
export interface PredictionInterval {
  /** Nominal coverage in percent. */
  level: number;
  /** f_h − z·se_h. */
  lower: Float64Array;
  /** f_h + z·se_h. */
  upper: Float64Array;
}

/** Central Gaussian intervals for each level (in percent). */
export function predictionIntervals(f: PointForecast, levels: number[]): PredictionInterval[] {
  if (f.mean.length !== f.se.length) {
    throw new ForecastingError('invalid-argument', 'predictionIntervals', `mean has ${f.mean.length} values, se ${f.se.length}`);
  }
  return levels.map((level) => {
    if (!(level > 0 && level < 100)) {
      throw new ForecastingError(
        'invalid-argument',
        'predictionIntervals',
        `levels are percentages strictly between 0 and 100, got ${level}`,
      );
    }
    const z = normalQuantile(0.5 + level / 200);
    const lower = new Float64Array(f.mean.length);
    const upper = new Float64Array(f.mean.length);
    for (let h = 0; h < f.mean.length; h++) {
      lower[h] = f.mean[h] - z * f.se[h];
      upper[h] = f.mean[h] + z * f.se[h];
    }
    return { level, lower, upper };
  });
}
