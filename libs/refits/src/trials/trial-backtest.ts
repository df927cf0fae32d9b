/**
 * One side of a settings trial, free of the database: the refit's computing half (fitSeriesModel, `auto`
 * and calibrated bands included) run with one set of settings on the training window that ends at each
 * daily origin, exactly as the nightly refit would have run on that day, then scored by the engine's
 * rolling-origin backtest at the day-ahead and the week-ahead horizon.
 *
 * Method: rolling forecasting origin (Tashman 2000, Int. J. Forecasting 16(4); Hyndman & Athanasopoulos
 *   2021, FPP3 §5.10) with TRIAL_ORIGINS origins a day apart, the last one a week before the end of the
 *   history; both sides use these same origins. Each side is refitted at every origin (parameters and, for
 *   `auto`, the model choice re-estimated), and forecasts a week ahead; the day-ahead scores are the first
 *   24 hours of the same forecasts. MAE, RMSE, MAPE and MASE (Hyndman & Koehler 2006, scaled by the
 *   in-sample seasonal-naive MAE at 168 h, the same hour last week), coverage of the 80 % and 95 % bands
 *   (Gneiting & Raftery 2007 §6), and daily peak and time-of-peak errors (common practice; Hong & Fan
 *   2016, Int. J. Forecasting 32(3)) come from rollingOriginBacktest.
 * Conventions: temperatures over the forecast hours are the station's observations (an ex-post test: the
 *   weather forecast's own error is left out, the same for both sides). Days are 24 hours counted back from
 *   the history's end at a local midnight (a daylight-saving change inside the scored weeks shifts the days
 *   before it by one hour).
 * References: Tashman (2000); Hyndman & Koehler (2006); Gneiting & Raftery (2007); Hong & Fan (2016).
 */
import {
  modelMethodLabels,
  TRIAL_MIN_TRAINING_HOURS,
  TRIAL_ORIGINS,
  trialHorizons,
  type ModelSettingsRequest,
  type TrialScores,
  type TrialSide,
} from '@loadwright/contracts';
import { rollingOriginBacktest, type BacktestForecast, type BacktestResult, type HolidaySpec } from '@loadwright/forecasting';
import { describeDesign } from '../auto-select';
import { fitSeriesModel, type SeriesModelOutcome } from '../fit-series-model';
import type { RefitInputs } from '../series-window';
import type { TrialHistory } from './trial-history';

/** The seasonal period of MASE scaling and of the naive benchmark: the same hour last week. */
export const TRIAL_SEASON = 168;

/** The week-ahead forecast of one side from each origin (keyed by the origin's index), and what was fitted there. */
export interface SideForecasts {
  byOrigin: Map<number, BacktestForecast>;
  /** The model fitted at each origin, in origin order. */
  fitted: string[];
  /** Whether temperatures were used at the origins, and why not. */
  temperature: TrialSide['temperature'];
}

/** Indices of the trial's origins in a history of `n` hours: a day apart, the last a week before the end. */
export function trialOrigins(n: number): number[] {
  return Array.from({ length: TRIAL_ORIGINS }, (_, i) => n - trialHorizons.weekAhead - (TRIAL_ORIGINS - 1 - i) * 24);
}

/** Refits `settings` at every origin and forecasts a week ahead; `afterFit` runs after each (progress, and a pause for other work). */
export async function forecastFromOrigins(
  history: TrialHistory,
  settings: ModelSettingsRequest,
  holidays: HolidaySpec | null,
  afterFit: (origin: number) => Promise<void>,
): Promise<SideForecasts> {
  const byOrigin = new Map<number, BacktestForecast>();
  const fitted: string[] = [];
  const temperature = sideTemperature(history, settings);
  for (const origin of trialOrigins(history.values.length)) {
    const outcome = fitSeriesModel(inputsAtOrigin(history, settings, origin), holidays);
    const levels = [80, 95].map((level) => outcome.forecast.intervals.find((interval) => interval.level === level)!);
    byOrigin.set(origin, { mean: outcome.forecast.mean, intervals: levels });
    fitted.push(fittedLabel(outcome));
    await afterFit(origin);
  }
  return { byOrigin, fitted, temperature };
}

/** What the refit reads at `origin`: the side's training window ending there and the temperatures of the week after. */
export function inputsAtOrigin(history: TrialHistory, settings: ModelSettingsRequest, origin: number): RefitInputs {
  const start = Math.max(0, origin - settings.trainingWindowDays * 24);
  const horizon = trialHorizons.weekAhead;
  const temperature = history.temperature;
  return {
    series: history.series,
    settings: { ...settings, horizonHours: horizon },
    window: { timestamps: history.timestamps.subarray(start, origin), values: history.values.subarray(start, origin), bridgedHours: 0 },
    temperature:
      settings.temperature.enabled && temperature.usable
        ? {
            usable: true,
            station: temperature.station,
            training: temperature.values.slice(start, origin),
            future: temperature.values.slice(origin, origin + horizon),
            forecastIssue: null,
          }
        : { usable: false, station: null, reason: sideTemperature(history, settings).reason, fallback: false },
  };
}

/** Scores one side's forecasts at both horizons (see the file comment). */
export function scoreSide(history: TrialHistory, forecasts: SideForecasts): TrialSide {
  const { dayAhead, weekAhead } = trialBacktests(history, forecasts);
  const fitted: Record<string, number> = {};
  for (const label of forecasts.fitted) fitted[label] = (fitted[label] ?? 0) + 1;
  return { dayAhead: scores(dayAhead), weekAhead: scores(weekAhead), fitted, temperature: forecasts.temperature };
}

/** The engine's backtests of one side at both horizons, from its stored forecasts. */
export function trialBacktests(history: TrialHistory, forecasts: SideForecasts): { dayAhead: BacktestResult; weekAhead: BacktestResult } {
  const n = history.values.length;
  // The history ends at a local midnight, so days are counted back from its end (the scored weeks lie there).
  const day = { periodsPerDay: 24, firstDayStart: n % 24 };
  // The forecaster hands back what was fitted at the origin the backtest asks for (the training length is the origin).
  const forecaster = (train: Float64Array): BacktestForecast => {
    const stored = forecasts.byOrigin.get(train.length);
    if (!stored) throw new Error(`no forecast was made at origin ${train.length}`);
    return stored;
  };
  const common = { origins: TRIAL_ORIGINS, step: 24, season: TRIAL_SEASON, minTrain: TRIAL_MIN_TRAINING_HOURS, forecaster, day };
  // Ending the day-ahead series six days earlier puts its origins on the same hours as the week-ahead ones.
  const dayAhead = rollingOriginBacktest(history.values.subarray(0, n - (trialHorizons.weekAhead - trialHorizons.dayAhead)), {
    ...common,
    horizon: trialHorizons.dayAhead,
  });
  const weekAhead = rollingOriginBacktest(history.values, { ...common, horizon: trialHorizons.weekAhead });
  return { dayAhead, weekAhead };
}

/** The stored scores of one backtest. */
function scores(result: BacktestResult): TrialScores {
  const overall = result.overall;
  const coverage = (level: number) => 100 * overall.intervals.find((interval) => interval.level === level)!.coverage;
  return {
    hours: overall.count,
    mae: overall.mae,
    rmse: overall.rmse,
    mape: overall.mape,
    mase: overall.mase,
    coverage80: coverage(80),
    coverage95: coverage(95),
    peakDays: result.peak?.days ?? 0,
    peakError: result.peak?.meanAbsoluteError ?? null,
    peakHourError: result.peak?.meanAbsoluteHours ?? null,
    naive: { mae: overall.benchmark.mae, mase: overall.benchmark.mase },
  };
}

/** What was fitted, as the model card says it: `auto`'s winning candidate, or the design and the fixed method. */
function fittedLabel(outcome: SeriesModelOutcome): string {
  const chosen = outcome.selection?.candidates.find((c) => c.chosen)?.label;
  if (chosen) return chosen;
  const method = modelMethodLabels[outcome.method];
  return outcome.method === 'seasonal-naive' ? method : `${describeDesign(outcome.model.spec)} + ${method}`;
}

/** Whether a side uses temperatures, and why not. */
function sideTemperature(history: TrialHistory, settings: ModelSettingsRequest): TrialSide['temperature'] {
  if (!settings.temperature.enabled) return { used: false, reason: 'temperature regressors are switched off in these settings' };
  if (!history.temperature.usable) return { used: false, reason: history.temperature.reason };
  return {
    used: true,
    reason: `degree-hours from the observed temperatures of ${history.temperature.station.name}, forecast hours included`,
  };
}
