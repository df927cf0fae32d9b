import { ForecastingError, assertFinite } from '../core/errors';
import type { FitResult } from '../core/types';
import type { RegularisedFit } from '../regularised/regularised-fit';
import { calendarOf } from '../seasonal/local-calendar';
import { logTransform } from '../seasonal/log-transform';
import { seasonalDifference } from '../seasonal/seasonal-difference';
import {
  estimateSeasonalProfile,
  profileSlots,
  removeSeasonalProfile,
  type ProfileSlot,
  type SeasonalProfile,
} from '../seasonal/seasonal-profile';
import { fitArmaPart } from './fit-arma-part';
import type { FittedLoadModel, LoadModelSpec, LoadSeriesData } from './load-model-spec';
import { fitRegressionArmaErrors, type SlotEffects } from './regression-arma-errors';
import { regressorColumns } from './regressor-columns';
import { fitSeasonalNaive } from './seasonal-naive-model';

const FN = 'fitLoadModel';
/** One hour in milliseconds. */
export const HOUR_MS = 3_600_000;

/**
 * Fits a load model: optional log transform, then the seasonal step (an additive profile estimated jointly
 * with the regressors, a multiplicative profile divided out first, or seasonal differencing of the series and
 * the regressors), then regression on degree-hours and calendar indicators with ARMA errors (iterated
 * feasible GLS, see regression-arma-errors.ts), the ARMA part by the spec's method (ridge/lasso choose λ on
 * the first GLS pass and keep it). 'seasonal-naive' skips
 * all of that and keeps the value one period back (period = the differencing lag, 168 with no seasonal step).
 *
 * @throws ForecastingError 'invalid-argument' for mismatched lengths, timestamps that are not hourly, or
 *   options seasonal naive cannot use; anything the steps throw ('no-convergence' from NLS lets the
 *   nightly worker fall back to an AR method).
 */
export function fitLoadModel(spec: LoadModelSpec, data: LoadSeriesData): FittedLoadModel {
  checkData(data);
  const transformed = spec.log ? logTransform(data.values) : Float64Array.from(data.values);
  const lastTimestamp = data.timestamps[data.timestamps.length - 1];
  if (spec.method === 'seasonal-naive') return fitSeasonalNaiveModel(spec, transformed, lastTimestamp);

  const calendar = calendarOf(data, spec.timeZone);
  const regressors = regressorColumns(spec, calendar, data.temperature);
  let target: Float64Array = transformed;
  let columns = regressors.columns;
  let slotEffects: SlotEffects | null = null;
  let profile: SeasonalProfile | null = null;
  const seasonal = spec.seasonal;
  if (seasonal.kind === 'profile') {
    const slot: ProfileSlot = seasonal.period === 24 ? 'hour-of-day' : 'hour-of-week';
    const slots = profileSlots(calendar, slot);
    if (seasonal.form === 'additive') {
      slotEffects = { slots, slot };
    } else {
      profile = estimateSeasonalProfile(transformed, slots, slot, 'multiplicative');
      target = removeSeasonalProfile(profile, transformed, slots);
    }
  } else if (seasonal.kind === 'difference') {
    target = seasonalDifference(transformed, seasonal.lag);
    columns = columns.map((column) => seasonalDifference(column, seasonal.lag));
  }

  // A regressor that is zero throughout (no hour below the heating base in a summer window) carries no
  // information: leave it out with coefficient 0 instead of failing the refit.
  const kept = columns.map((column) => column.some((v) => v !== 0));
  const fit = fitRegressionArmaErrors(
    target,
    columns.filter((_, j) => kept[j]),
    armaFitter(spec),
    slotEffects,
  );
  const coefficients: number[] = [];
  const stderr: Array<number | null> = [];
  let next = 0;
  for (let j = 0; j < columns.length; j++) {
    coefficients.push(kept[j] ? fit.beta[next] : 0);
    stderr.push(kept[j] ? fit.betaStderr[next] : null);
    if (kept[j]) next++;
  }
  return {
    spec,
    lastTimestamp,
    arma: fit.errors,
    regression: {
      names: regressors.names,
      coefficients,
      stderr,
      dropped: regressors.names.filter((_, j) => !kept[j]),
      iterations: fit.iterations,
      converged: fit.converged,
    },
    profile: profile ?? fit.profile,
    residuals: fit.errors.residuals,
    transformed,
    regressors: regressors.columns,
    remainder: fit.remainder,
    seasonalNaive: null,
  };
}

/**
 * The ARMA fitter for the GLS passes. Ridge and lasso choose λ on the first pass only and keep it
 * afterwards: the remainder barely changes between passes, and re-running the penalty path each pass
 * would multiply the cost of a lasso refit by the number of passes.
 */
function armaFitter(spec: LoadModelSpec): (u: Float64Array) => FitResult {
  if ((spec.method !== 'ridge' && spec.method !== 'lasso') || spec.lambda !== undefined) return (u) => fitArmaPart(spec, u);
  let chosen: number | null = null;
  return (u) => {
    const fit = fitArmaPart(chosen === null ? spec : { ...spec, lambda: chosen }, u) as RegularisedFit;
    chosen ??= fit.lambda;
    return fit;
  };
}

/** The seasonal-naive branch: no regressors or profile, period from the differencing lag or 168. */
function fitSeasonalNaiveModel(spec: LoadModelSpec, transformed: Float64Array, lastTimestamp: number): FittedLoadModel {
  if (spec.temperature || spec.dayTypes || spec.holidays || spec.seasonal.kind === 'profile') {
    throw new ForecastingError(
      'invalid-argument',
      FN,
      'seasonal naive uses no regressors or profile: set temperature and holidays to null, dayTypes to false and seasonal to none or difference{lag}',
    );
  }
  const period = spec.seasonal.kind === 'difference' ? spec.seasonal.lag : 168;
  const naive = fitSeasonalNaive(transformed, period);
  return {
    spec,
    lastTimestamp,
    arma: null,
    regression: { names: [], coefficients: [], stderr: [], dropped: [], iterations: 0, converged: true },
    profile: null,
    residuals: naive.errors,
    transformed,
    regressors: [],
    remainder: transformed,
    seasonalNaive: { period, sigma2: naive.sigma2 },
  };
}

/** Lengths agree, values are finite and the timestamps step by exactly one hour. */
function checkData(data: LoadSeriesData): void {
  const n = data.values.length;
  if (data.timestamps.length !== n) {
    throw new ForecastingError('invalid-argument', FN, `needs one timestamp per value, got ${data.timestamps.length} for ${n}`);
  }
  if (data.temperature && data.temperature.length !== n) {
    throw new ForecastingError('invalid-argument', FN, `needs one temperature per value, got ${data.temperature.length} for ${n}`);
  }
  assertFinite(FN, data.values);
  assertFinite(FN, data.timestamps, 'timestamps');
  for (let t = 1; t < n; t++) {
    if (data.timestamps[t] - data.timestamps[t - 1] !== HOUR_MS) {
      throw new ForecastingError(
        'invalid-argument',
        FN,
        `timestamps must be hourly without gaps (fill or impute first): step at index ${t} is ${(data.timestamps[t] - data.timestamps[t - 1]) / HOUR_MS} h`,
      );
    }
  }
}
