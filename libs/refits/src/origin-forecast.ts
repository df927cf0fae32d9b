/**
 * Forecasts of an extended model (reanchor.ts) from many origins inside its data, with the parameters held
 * fixed: what forecastLoadModel(modelAtOrigin(extended, origin), observed temperatures, horizon) returns on
 * the modelling scale, without copying the history or rebuilding calendars and regressors for every origin.
 * The backtest of `auto` forecasts 14 origins per candidate and the band calibration up to 182 origins of a
 * week, so this is where a refit would otherwise spend most of its time.
 *
 * Why it is the same forecast: over the data, the remainder is the transformed series less the profile and
 * the regression (extendModel), so the deterministic part of hour t is recovered from it — transformed_t −
 * remainder_t with an additive or no profile, transformed_t / s_t − remainder_t before multiplying by the
 * multiplicative profile s_t, and x_t − x_{t−L} − remainder_t (the differenced regression) under seasonal
 * differencing, which is then integrated from the origin as forecastLoadModel does. The ARMA part is
 * forecastArma's conditional means on the last values and residuals before the origin; the standard errors
 * come from the ψ-weights (of φ(B)(1 − B^L) with differencing), the same for every origin, so they are computed
 * once per forecaster (times the slot effect of each hour under a multiplicative profile). Equal to
 * forecastLoadModel to rounding (origin-forecast.spec.ts).
 */
import {
  armaMeanForecaster,
  arWithSeasonalDifference,
  calendarOf,
  forecastArmaSe,
  type LocalCalendar,
  profileSlots,
  psiWeights,
} from '@loadwright/forecasting';
import type { ExtendedModel } from './reanchor';

/**
 * Centre and standard error on the modelling scale (log load for a model on logs) of hours origin … origin + ahead − 1.
 * `se` may be a view shared by every origin: read it, never write it.
 */
export interface OriginForecast {
  mean: Float64Array;
  se: Float64Array;
}

/**
 * A function forecasting up to `horizon` hours from any origin of `extended`'s data (origin ≥ its estimation hours,
 * origin + ahead ≤ its length). `calendar`, the local calendar of `extended.data` from hour `extended.estimatedOn` on
 * (the hours it can forecast), saves rebuilding it when the caller has it.
 */
export function originForecaster(
  extended: ExtendedModel,
  horizon: number,
  calendar?: LocalCalendar,
): (origin: number, ahead: number) => OriginForecast {
  const { spec, arma, profile } = extended.fitted;
  if (!arma) throw new Error('originForecaster needs a model with an ARMA part');
  const { transformed, remainder, remainderOffset } = extended;
  // Past shocks matter only to an MA part; a pure AR never asks for the residuals (made on first use).
  const residuals = arma.ma.length > 0 ? extended.residuals : null;
  const seasonal = spec.seasonal;
  const lag = seasonal.kind === 'difference' ? seasonal.lag : 0;
  // Slots are read only for the hours it can forecast, so the calendar starts where the estimation ended.
  const first = extended.estimatedOn;
  const last = extended.data.timestamps.length;
  const slots = profile ? profileSlots(calendar ?? calendarOf(extended.data, spec.timeZone, first), profile.slot) : null;
  const multiplicative = profile !== null && profile.form === 'multiplicative';
  // The ARMA recursion needs only the last p values and the last q residuals.
  const reach = Math.max(arma.ar.length, arma.ma.length, 1);
  // The standard errors depend on the horizon only: of the ARMA part, or of φ(B)(1 − B^L) under differencing.
  let se: Float64Array;
  if (lag > 0) {
    const psi = psiWeights(arWithSeasonalDifference(arma.ar, lag), arma.ma, horizon);
    se = new Float64Array(horizon);
    let sum = 0;
    for (let h = 0; h < horizon; h++) {
      sum += psi[h] * psi[h];
      se[h] = Math.sqrt(arma.sigma2 * sum);
    }
  } else {
    se = forecastArmaSe(arma, horizon);
  }
  const armaMean = armaMeanForecaster(arma);
  return (origin, ahead) => {
    if (!(origin >= first && origin + ahead <= last))
      throw new RangeError(`origin ${origin} with ${ahead} hours ahead lies outside the hours ${first}..${last} it can forecast`);
    const cut = origin - remainderOffset;
    const from = Math.max(0, cut - reach);
    // The ARMA part's means become the centre in place: hour h reads its own part before writing it, and
    // only earlier, finished hours besides.
    const mean = armaMean(remainder.subarray(from, cut), ahead, residuals?.subarray(from, cut));
    if (lag > 0) {
      for (let h = 0; h < ahead; h++) {
        const t = origin + h;
        const regression = transformed[t] - transformed[t - lag] - remainder[cut + h];
        mean[h] = (h < lag ? transformed[t - lag] : mean[h - lag]) + regression + mean[h];
      }
      return { mean, se: se.subarray(0, ahead) };
    }
    if (multiplicative) {
      // The multiplicative profile scales the centre and the standard error of each hour by its slot effect.
      const scaled = new Float64Array(ahead);
      for (let h = 0; h < ahead; h++) {
        const t = origin + h;
        const effect = profile.effect[slots![t - first]];
        mean[h] = (transformed[t] / effect - remainder[cut + h] + mean[h]) * effect;
        scaled[h] = se[h] * effect;
      }
      return { mean, se: scaled };
    }
    // No profile, or an additive one: transformed − remainder is the profile plus the regression.
    for (let h = 0; h < ahead; h++) mean[h] = transformed[origin + h] - remainder[cut + h] + mean[h];
    return { mean, se: se.subarray(0, ahead) };
  };
}
