import { ForecastingError, assertFinite } from '../core/errors';
import { localCalendar } from '../seasonal/local-calendar';
import { profileSlots, type ProfileForm, type ProfileSlot } from '../seasonal/seasonal-profile';
import { degreeHours, type BalancePoints } from './degree-hours';
import type { FittedLoadModel } from './load-model-spec';

const FN = 'temperatureScenario';

/** The temperature terms of a fitted load model: what a change of the forecast temperatures moves. */
export interface TemperatureTerms {
  /** Coefficient of heating degree-hours on the modelling scale (load, or log load). */
  heating: number;
  /** Coefficient of cooling degree-hours on the modelling scale. */
  cooling: number;
  balance: BalancePoints;
  /** The model is fitted to log load. */
  log: boolean;
  /** A multiplicative seasonal profile scales the regression part; additive profiles and none leave it alone. */
  profile: { slot: ProfileSlot; form: ProfileForm; effect: ArrayLike<number> } | null;
  /** IANA zone of the series (profile slots are local). */
  timeZone: string;
}

/** The temperature terms of a fitted model, or null when it uses no temperature. */
export function temperatureTerms(model: FittedLoadModel): TemperatureTerms | null {
  const { spec, regression } = model;
  if (!spec.temperature || model.seasonalNaive) return null;
  const at = (name: string) => regression.coefficients[regression.names.indexOf(name)] ?? 0;
  return {
    heating: at('heating-degree-hours'),
    cooling: at('cooling-degree-hours'),
    balance: spec.temperature,
    log: spec.log,
    profile: model.profile ? { slot: model.profile.slot, form: model.profile.form, effect: model.profile.effect } : null,
    timeZone: spec.timeZone,
  };
}

/**
 * A forecast re-run with other temperatures for its hours: the values the fitted model gives when its
 * temperature inputs are `scenario` instead of the `assumed` temperatures it was forecast with.
 *
 * ## Method
 * The model is a regression on heating and cooling degree-hours with ARMA errors (regression-arma-errors.ts).
 * The ARMA part of an h-step forecast depends only on the past, so the future temperatures enter through the
 * regression alone, and on the modelling scale the forecast moves by
 *   Δ_h = π_h · [β_H (HDH(T'_h) − HDH(T_h)) + β_C (CDH(T'_h) − CDH(T_h))],
 * HDH(T) = max(0, heatingBase − T), CDH(T) = max(0, T − coolingBase) (degree-hours, Hong & Fan 2016), with
 * π_h the multiplicative profile's effect at hour h (1 otherwise). With seasonal differencing the differenced
 * regressors telescope when the differences are integrated back, x̂_{n+h} = x̂_{n+h−s} + ŵ_{n+h}, so the level
 * still moves by β·Δx_h. Standard errors do not depend on the temperatures, so every quantity on the load scale
 * moves alike: + Δ_h for a model of load, × exp(Δ_h) for a model of log load (mean, median and each bound of
 * the lognormal). forecastLoadModel run twice gives the same numbers (temperature-scenario.spec.ts).
 *
 * @param terms the model's temperature terms (temperatureTerms, or read back from a stored fit)
 * @param timestamps UTC epoch ms of the forecast hours
 * @param assumed the temperatures the forecast was made with, one per hour
 * @param scenario the temperatures of the scenario, one per hour
 * @param values forecast values on the load scale (mean, median or a bound), one per hour
 * @returns the values under the scenario
 * @throws ForecastingError 'invalid-argument' when lengths differ; 'non-finite-input' for a missing temperature or value.
 */
export function temperatureScenario(
  terms: TemperatureTerms,
  timestamps: ArrayLike<number>,
  assumed: ArrayLike<number>,
  scenario: ArrayLike<number>,
  values: ArrayLike<number>,
): Float64Array {
  const n = timestamps.length;
  if (assumed.length !== n || scenario.length !== n || values.length !== n) {
    throw new ForecastingError(
      'invalid-argument',
      FN,
      `needs one assumed temperature, one scenario temperature and one value per hour: got ${assumed.length}, ${scenario.length} and ${values.length} for ${n} hours`,
    );
  }
  assertFinite(FN, values, 'values');
  const before = degreeHours(assumed, terms.balance);
  const after = degreeHours(scenario, terms.balance);
  const profile = terms.profile?.form === 'multiplicative' ? terms.profile : null;
  const slots = profile ? profileSlots(localCalendar(timestamps, terms.timeZone), profile.slot) : null;
  const out = new Float64Array(n);
  for (let h = 0; h < n; h++) {
    const scale = profile && slots ? profile.effect[slots[h]] : 1;
    const change =
      scale * (terms.heating * (after.heating[h] - before.heating[h]) + terms.cooling * (after.cooling[h] - before.cooling[h]));
    out[h] = terms.log ? values[h] * Math.exp(change) : values[h] + change;
  }
  return out;
}
