import { ForecastingError } from '../core/errors';
import { forecastArma } from '../forecast/forecast-arma';
import { predictionIntervals, type PredictionInterval } from '../forecast/intervals';
import { psiWeights } from '../forecast/psi-weights';
import { arWithSeasonalDifference } from '../seasonal/lag-polynomial';
import { localCalendar } from '../seasonal/local-calendar';
import { backTransformLog, backTransformLogBound } from '../seasonal/log-transform';
import { integrateSeasonalDifference } from '../seasonal/seasonal-difference';
import { profileSlots } from '../seasonal/seasonal-profile';
import { HOUR_MS } from './fit-load-model';
import type { FittedLoadModel, FutureInputs, LoadForecast } from './load-model-spec';
import { regressorColumns } from './regressor-columns';
import { forecastSeasonalNaive } from './seasonal-naive-model';

const FN = 'forecastLoadModel';

/**
 * Forecasts the hours 1..horizon after the training data and reassembles them on the load scale:
 * ARMA part (forecastArma: conditional means, ψ-weight standard errors), plus the regression on the
 * future regressors (degree-hours from `future.temperature`, day types and holidays of the future local
 * dates), then the seasonal step: add the additive profile, multiply by the multiplicative one (se too),
 * or integrate the seasonal differences x̂_{n+h} = x̂_{n+h−s} + ŵ_{n+h} with standard errors from the
 * ψ-weights of φ(B)(1 − B^s) (differencing multiplied into the AR polynomial; Brockwell & Davis 2016
 * §6.4). Intervals are Gaussian on the modelling scale.
 *
 * With `log`: the model forecasts m ± s for log load. `mean` is the bias-adjusted lognormal mean
 * exp(m + s²/2) (hourly means add up to energy), `median` is exp(m), `se` the lognormal standard deviation,
 * and every interval bound is back-transformed quantile by quantile, exp(m ± z·s), so intervals surround
 * the median.
 *
 * Uncertainty left out (as R's predict on an arima fit with regressors): estimation error of β, the profile
 * and the ARMA parameters, and the error of the future temperatures, which are taken as known.
 *
 * @throws ForecastingError 'invalid-argument' for a bad horizon or levels, or missing future temperatures.
 */
export function forecastLoadModel(model: FittedLoadModel, future: FutureInputs, horizon: number, levels: number[]): LoadForecast {
  if (!Number.isInteger(horizon) || horizon < 1) {
    throw new ForecastingError('invalid-argument', FN, `horizon must be a positive number of hours, got ${horizon}`);
  }
  const timestamps = Float64Array.from({ length: horizon }, (_, h) => model.lastTimestamp + (h + 1) * HOUR_MS);
  const { mean, se } = model.seasonalNaive
    ? forecastSeasonalNaive(model.transformed, { ...model.seasonalNaive, errors: model.residuals }, horizon)
    : forecastModelScale(model, future, timestamps);
  const gaussian = predictionIntervals({ mean, se }, levels);
  if (!model.spec.log) return { timestamps, mean, se, median: mean, intervals: gaussian, modelScale: { mean, se } };
  const back = backTransformLog(mean, se);
  const intervals: PredictionInterval[] = gaussian.map((interval) => ({
    level: interval.level,
    lower: backTransformLogBound(interval.lower),
    upper: backTransformLogBound(interval.upper),
  }));
  return { timestamps, mean: back.mean, se: back.se, median: back.median, intervals, modelScale: { mean, se } };
}

/** Mean and se on the modelling scale (after log, before back-transform). */
function forecastModelScale(
  model: FittedLoadModel,
  future: FutureInputs,
  timestamps: Float64Array,
): { mean: Float64Array; se: Float64Array } {
  const { spec, arma } = model;
  if (!arma) throw new ForecastingError('invalid-argument', FN, 'the model has neither an ARMA part nor a seasonal-naive part');
  const horizon = timestamps.length;
  const calendar = localCalendar(timestamps, spec.timeZone);
  const futureColumns = regressorColumns(spec, calendar, future.temperature).columns;
  const beta = model.regression.coefficients;
  const part = forecastArma(arma, model.remainder, horizon, arma.residuals);
  const mean = new Float64Array(horizon);
  const se = Float64Array.from(part.se);
  const seasonal = spec.seasonal;

  if (seasonal.kind === 'difference') {
    const lag = seasonal.lag;
    const n = model.transformed.length;
    const differenced = new Float64Array(horizon);
    for (let h = 0; h < horizon; h++) {
      let regression = 0;
      for (let j = 0; j < beta.length; j++) {
        const back = h - lag < 0 ? model.regressors[j][n + h - lag] : futureColumns[j][h - lag];
        regression += beta[j] * (futureColumns[j][h] - back);
      }
      differenced[h] = regression + part.mean[h];
    }
    mean.set(integrateSeasonalDifference(model.transformed, differenced, lag));
    const psi = psiWeights(arWithSeasonalDifference(arma.ar, lag), arma.ma, horizon);
    let sum = 0;
    for (let h = 0; h < horizon; h++) {
      sum += psi[h] * psi[h];
      se[h] = Math.sqrt(arma.sigma2 * sum);
    }
    return { mean, se };
  }

  for (let h = 0; h < horizon; h++) {
    let regression = 0;
    for (let j = 0; j < beta.length; j++) regression += beta[j] * futureColumns[j][h];
    mean[h] = regression + part.mean[h];
  }
  const profile = model.profile;
  if (profile) {
    const slots = profileSlots(calendar, profile.slot);
    for (let h = 0; h < horizon; h++) {
      const effect = profile.effect[slots[h]];
      if (profile.form === 'additive') {
        mean[h] += effect;
      } else {
        mean[h] *= effect;
        se[h] *= effect;
      }
    }
  }
  return { mean, se };
}
