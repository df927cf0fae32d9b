/**
 * The computing half of one series' refit, with no database: choose or fit the model, check its
 * residuals, forecast the horizon with the interval levels. Phase times are measured here.
 */
import type { FitDiagnostics, FitSelection, FittedMethod, ForecastBands, ModelSettingsRequest } from '@loadwright/contracts';
import {
  autocorrelation,
  cmleAr,
  estimatorWarnings,
  fitLoadModel,
  forecastLoadModel,
  ljungBox,
  localCalendar,
  yuleWalker,
  type FitResult,
  type FittedLoadModel,
  type HolidaySpec,
  type LoadForecast,
  type LoadModelSpec,
  type LoadSeriesData,
} from '@loadwright/forecasting';
import { autoSelect, cpuMilliseconds, fitAsCandidate, yuleWalkerOrderByAic, type AutoOptions } from './auto-select';
import { calibrateForecast, heldOutModel } from './calibrate-bands';
import { modelDesign, regularisedLags, seasonalNaiveSpec, type ModelDesign } from './model-plan';
import type { RefitInputs } from './series-window';

/** Largest lag of the residual checks. */
const DIAGNOSTIC_LAGS = 48;

/** What the computing half produced. */
export interface SeriesModelOutcome {
  model: FittedLoadModel;
  method: FittedMethod;
  selection: FitSelection | null;
  diagnostics: FitDiagnostics;
  forecast: LoadForecast;
  /** Which kind of band the forecast carries (calibrated on the series' own errors, or Gaussian) and why. */
  bands: ForecastBands;
  /** The training data as used (for the data hash and the fit's window). */
  data: LoadSeriesData;
  /** Wall milliseconds of each phase, and the CPU milliseconds of the fit (unaffected by other load). */
  timings: { fit: number; fitCpu: number; diagnose: number; forecast: number };
}

/** Fits, diagnoses and forecasts one series from what was read for it. */
export function fitSeriesModel(inputs: RefitInputs, holidays: HolidaySpec | null, autoOptions: AutoOptions = {}): SeriesModelOutcome {
  const { settings, window, temperature, series } = inputs;
  const useTemperature = temperature.usable;
  const design = modelDesign(settings, series.timeZone, useTemperature ? temperature.station.unit : null, holidays);
  const data: LoadSeriesData = {
    timestamps: window.timestamps,
    values: window.values,
    temperature: useTemperature ? temperature.training : undefined,
    // Made once: every candidate, the backtests and the band calibration read the same hours' calendar.
    calendar: localCalendar(window.timestamps, series.timeZone),
  };

  let at = performance.now();
  const cpuAt = cpuMilliseconds();
  const chosen =
    settings.method === 'auto'
      ? autoSelect(design, data, {
          maxArOrder: settings.maxArOrder,
          maxDifferencedArOrder: settings.maxArOrder,
          dayTypes: settings.dayTypes,
          ...autoOptions,
        })
      : fitFixedMethod(settings, design, data);
  const fitMs = performance.now() - at;
  const fitCpu = cpuMilliseconds() - cpuAt;

  at = performance.now();
  const warnings: FitDiagnostics['warnings'] = [];
  if (!temperature.usable && temperature.fallback) warnings.push({ code: 'temperature-fallback', message: temperature.reason });
  if (window.bridgedHours > 0)
    warnings.push({
      code: 'bridged-hours',
      message: `${window.bridgedHours} missing or excluded hours of the training window were bridged by straight lines`,
    });
  if (chosen.model.arma) {
    for (const w of estimatorWarnings(chosen.model.arma, chosen.model.remainder))
      warnings.push({ code: w.code, message: w.message, suggestion: w.suggestion });
  }
  const diagnostics: FitDiagnostics = {
    ...residualChecks(chosen.model),
    temperature: !temperature.usable
      ? { used: false, reason: temperature.reason }
      : chosen.model.spec.temperature
        ? {
            used: true,
            reason: `degree-hours from ${temperature.station.name}${temperature.forecastIssue ? `; ${temperature.forecastIssue.description}` : ''}`,
            ...(temperature.forecastIssue && { forecastIssuedAt: temperature.forecastIssue.issuedAt.toISOString() }),
          }
        : { used: false, reason: 'the chosen model (seasonal naive) uses no regressors' },
    warnings,
  };
  const diagnoseMs = performance.now() - at;

  at = performance.now();
  const levels = [...new Set([...settings.levels, 80, 95])].sort((a, b) => a - b);
  const gaussian = forecastLoadModel(
    chosen.model,
    { temperature: useTemperature ? temperature.future : undefined },
    settings.horizonHours,
    levels,
  );
  const heldOut = heldOutModel(chosen.model, data, settings.method === 'auto' ? fitAsCandidate : undefined);
  const { forecast, bands } = calibrateForecast(chosen.model, heldOut, data, gaussian);
  const forecastMs = performance.now() - at;
  return {
    model: chosen.model,
    method: chosen.method,
    selection: chosen.selection,
    diagnostics: { ...diagnostics, bands },
    forecast,
    bands,
    data,
    timings: { fit: fitMs, fitCpu, diagnose: diagnoseMs, forecast: forecastMs },
  };
}

/** A fixed method from the settings; orders left empty are chosen by AIC on the design's remainder. */
function fitFixedMethod(
  settings: ModelSettingsRequest,
  design: ModelDesign,
  data: LoadSeriesData,
): { model: FittedLoadModel; method: FittedMethod; selection: null } {
  const method = settings.method;
  if (method === 'seasonal-naive') return { model: fitLoadModel(seasonalNaiveSpec(design), data), method, selection: null };
  if (method === 'ridge' || method === 'lasso') {
    const lags = regularisedLags(settings.arOrder ?? settings.maxArOrder, settings.extraLags);
    const spec: LoadModelSpec = { ...design, method, p: lags[lags.length - 1], q: 0, lags, select: 'bic' };
    return { model: fitLoadModel(spec, data), method, selection: null };
  }
  if (method === 'nls') {
    const p = settings.arOrder ?? Math.min(2, settings.maxArOrder);
    const q = settings.maOrder ?? Math.min(1, settings.maxMaOrder);
    return { model: fitLoadModel({ ...design, method: 'nls', p, q }, data), method, selection: null };
  }
  if (method === 'auto') throw new Error('fitFixedMethod is for fixed methods');
  if (settings.arOrder !== null)
    return { model: fitLoadModel({ ...design, method, p: settings.arOrder, q: 0 }, data), method, selection: null };
  // Order by AIC: the design is estimated once at the largest order, then the order chosen on its remainder by the
  // Yule-Walker AIC of one Levinson-Durbin pass (R's ar() criterion; no time budget, so the order never depends on
  // how busy the machine is), and the method fitted at that order.
  const model = fitLoadModel({ ...design, method, p: settings.maxArOrder, q: 0 }, data);
  const order = yuleWalkerOrderByAic(model.remainder, Math.min(settings.maxArOrder, Math.floor(model.remainder.length / 4)));
  const fit: FitResult = method === 'cmle' ? cmleAr(model.remainder, order) : yuleWalker(model.remainder, order);
  return { model: { ...model, spec: { ...model.spec, p: order }, arma: fit, residuals: fit.residuals }, method, selection: null };
}

/** Residual ACF with its band and Ljung-Box at up to 48 lags (seasonal naive: its own errors). */
function residualChecks(model: FittedLoadModel): Pick<FitDiagnostics, 'residualAcf' | 'acfBand' | 'ljungBox'> {
  const residuals = model.residuals;
  const fitdf = model.arma ? model.arma.ar.filter((phi) => phi !== 0).length + model.arma.q : 0;
  const lags = Math.min(DIAGNOSTIC_LAGS, Math.floor(residuals.length / 5));
  const acf = Array.from(autocorrelation(residuals, lags).slice(1), (r) => (Number.isFinite(r) ? r : 0));
  let test: FitDiagnostics['ljungBox'] = null;
  if (lags > fitdf) {
    try {
      const result = ljungBox(residuals, lags, fitdf);
      test = { lags, statistic: result.statistic, pValue: result.pValue, df: result.df };
    } catch {
      // Constant residuals (a perfect fit) have no autocorrelation to test.
    }
  }
  return { residualAcf: acf, acfBand: 1.96 / Math.sqrt(residuals.length), ljungBox: test };
}
