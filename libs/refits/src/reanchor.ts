/**
 * Carries a fitted load model forward over later actuals with its parameters held fixed, so it can
 * forecast from a later origin without refitting: the short backtest of `auto` forecasts from three
 * origins this way, and the chosen model is carried to the last actual before the real forecast.
 */
import {
  armaResiduals,
  assertFinite,
  calendarOf,
  type FittedLoadModel,
  type LoadSeriesData,
  logTransform,
  profileSlots,
  regressorColumns,
  sliceCalendar,
} from '@loadwright/forecasting';

/** A model whose parameters were estimated on the first hours of `data`, extended to all of it. */
export interface ExtendedModel {
  /** The model as fitted. */
  fitted: FittedLoadModel;
  /** Hours the parameters were estimated on. */
  estimatedOn: number;
  data: LoadSeriesData;
  /** Transformed series, regressor columns, remainder and residuals over all of `data` (the residuals made on first use). */
  transformed: Float64Array;
  regressors: Float64Array[];
  remainder: Float64Array;
  residuals: Float64Array;
  /** Hours cut from the front of the remainder by seasonal differencing. */
  remainderOffset: number;
}

/**
 * Extends an ARMA-based load model (not seasonal naive) fitted on data[0..m) over all of `data`: the
 * regressors, seasonal step and regression of the extra hours are computed with the fitted β and profile,
 * and the one-step residuals recomputed with the fitted ARMA parameters (the residual filter is causal,
 * so its first m values are those of the fit's own remainder).
 */
export function extendModel(fitted: FittedLoadModel, data: LoadSeriesData): ExtendedModel {
  const arma = fitted.arma;
  if (!arma) throw new Error('extendModel needs a model with an ARMA part');
  const { spec } = fitted;
  const m = fitted.transformed.length;
  const n = data.values.length;
  const transformed = new Float64Array(n);
  transformed.set(fitted.transformed);
  const extra = n - m;
  let regressors = fitted.regressors;
  let remainder = fitted.remainder;
  const remainderOffset = m - fitted.remainder.length;
  if (extra > 0) {
    const tail = spec.log ? logTransform(data.values.subarray(m)) : data.values.subarray(m);
    transformed.set(tail, m);
    const calendar = calendarOf(data, spec.timeZone, m);
    const tailColumns = regressorColumns(spec, calendar, data.temperature?.subarray(m)).columns;
    regressors = fitted.regressors.map((column, j) => {
      const joined = new Float64Array(n);
      joined.set(column);
      joined.set(tailColumns[j], m);
      return joined;
    });
    const beta = fitted.regression.coefficients;
    const profile = fitted.profile;
    const seasonal = spec.seasonal;
    const slots = profile ? profileSlots(calendar, profile.slot) : null;
    const tailRemainder = new Float64Array(extra);
    for (let k = 0; k < extra; k++) {
      const t = m + k;
      let target: number;
      if (seasonal.kind === 'difference') {
        target = transformed[t] - transformed[t - seasonal.lag];
        for (let j = 0; j < beta.length; j++) target -= beta[j] * (regressors[j][t] - regressors[j][t - seasonal.lag]);
      } else {
        target = transformed[t];
        if (profile && slots && profile.form === 'multiplicative') target /= profile.effect[slots[k]];
        for (let j = 0; j < beta.length; j++) target -= beta[j] * regressors[j][t];
        if (profile && slots && profile.form === 'additive') target -= profile.effect[slots[k]];
      }
      tailRemainder[k] = target;
    }
    remainder = new Float64Array(fitted.remainder.length + extra);
    remainder.set(fitted.remainder);
    remainder.set(tailRemainder, fitted.remainder.length);
  }
  // The extra hours' remainder is checked now, so the residuals, made on first use (a pure AR's backtest never
  // reads them: only an MA part forecasts from past shocks), cannot fail later.
  assertFinite('extendModel', remainder.subarray(fitted.remainder.length), 'remainder of the extra hours');
  let residuals: Float64Array | null = null;
  const extended = { fitted, estimatedOn: m, data, transformed, regressors, remainder, remainderOffset } as ExtendedModel;
  Object.defineProperty(extended, 'residuals', {
    enumerable: true,
    get: () => (residuals ??= armaResiduals(remainder, arma.mean, arma.ar, arma.ma)),
  });
  return extended;
}

/** The extended model cut at `origin` hours, ready for forecastLoadModel to forecast hours origin+1…. */
export function modelAtOrigin(extended: ExtendedModel, origin: number): FittedLoadModel {
  const { fitted } = extended;
  const cut = origin - extended.remainderOffset;
  const residuals = extended.residuals.slice(0, cut);
  return {
    ...fitted,
    lastTimestamp: extended.data.timestamps[origin - 1],
    arma: { ...fitted.arma!, residuals },
    residuals,
    transformed: extended.transformed.slice(0, origin),
    regressors: extended.regressors.map((column) => column.slice(0, origin)),
    remainder: extended.remainder.slice(0, cut),
  };
}

/** The first m hours of the data (with its calendar, when it carries one). */
export function sliceData(data: LoadSeriesData, m: number): LoadSeriesData {
  return {
    timestamps: data.timestamps.subarray(0, m),
    values: data.values.subarray(0, m),
    temperature: data.temperature?.subarray(0, m),
    calendar: data.calendar && sliceCalendar(data.calendar, 0, m),
  };
}
