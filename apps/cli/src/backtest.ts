/**
 * `loadwright backtest <fit options> [--season S] --horizon H --origins K [--step S] [--levels 80,95]`:
 * refits at K rolling origins, forecasts H steps from each and prints the accuracy metrics against the
 * seasonal-naive benchmark. With seasonal or regression options every origin refits the load-model
 * pipeline; future temperatures are then the observed ones (a perfect weather forecast, so the scores
 * are optimistic by the weather-forecast error), and daily-peak metrics are added from local days.
 */
import {
  forecastArma,
  forecastLoadModel,
  localCalendar,
  predictionIntervals,
  rollingOriginBacktest,
  type BacktestForecast,
  type DayLayout,
} from '@loadwright/forecasting';
import { loadInputSeries, parseOptions, type Command } from './command-context';
import { autoOptionConfig, readAutoInput, runAutoOn } from './auto-run';
import { fitOptionConfig, fitSeries, readFitSpec } from './fit-options';
import { loadModelOptionConfig, wantsLoadModel } from './load-model-options';
import { fitLoadModelPrefix, readLoadModelInput } from './load-model-run';
import { integerOption, levelsOption } from './option-values';

/** Hourly days starting at the first local midnight, for the daily-peak metrics. */
function dayLayout(timestamps: Float64Array, timeZone: string): DayLayout {
  const hours = localCalendar(timestamps.subarray(0, 24), timeZone).hourOfDay;
  const firstDayStart = hours.indexOf(0);
  return { periodsPerDay: 24, firstDayStart: firstDayStart < 0 ? 0 : firstDayStart };
}

/** Runs `backtest`. */
export const backtestCommand: Command = async (context) => {
  const values = parseOptions(context.args, {
    ...fitOptionConfig,
    ...loadModelOptionConfig,
    ...autoOptionConfig,
    horizon: { type: 'string' },
    origins: { type: 'string' },
    season: { type: 'string' },
    step: { type: 'string' },
    'min-train': { type: 'string' },
    levels: { type: 'string' },
  });
  const horizon = integerOption('horizon', values.horizon, 1);
  const origins = integerOption('origins', values.origins, 1);
  const season = integerOption('season', values.season, 1, 1);
  const step = values.step === undefined ? undefined : integerOption('step', values.step, 1);
  const minTrain = values['min-train'] === undefined ? undefined : integerOption('min-train', values['min-train'], 2);
  const levels = levelsOption(values.levels);

  let x: Float64Array;
  let forecaster: (train: Float64Array, h: number) => BacktestForecast;
  let day: DayLayout | undefined;
  let model: Record<string, unknown>;
  if (values.method === 'auto') {
    // Each origin runs the nightly refit's own choice on the hours before it (observed temperatures as the forecast).
    const input = await readAutoInput(values, context, { horizon, levels });
    x = input.series.values;
    day = dayLayout(input.series.timestamps!, input.timeZone);
    const chosen: string[] = [];
    forecaster = (train, h) => {
      const at = runAutoOn(input, h, train.length);
      chosen.push(at.outcome.selection?.candidates.find((c) => c.chosen)?.label ?? at.outcome.method);
      return { mean: at.outcome.forecast.mean, intervals: at.outcome.forecast.intervals.filter((i) => levels.includes(i.level)) };
    };
    model = { method: 'auto', chosen };
  } else if (wantsLoadModel(values)) {
    const input = await readLoadModelInput(values, context);
    x = input.series.values;
    day = dayLayout(input.series.timestamps, input.spec.timeZone);
    const temperature = input.series.temperature;
    forecaster = (train, h) => {
      const fitted = fitLoadModelPrefix(input, train.length);
      const future = temperature ? { temperature: temperature.subarray(train.length, train.length + h) } : {};
      const forecast = forecastLoadModel(fitted, future, h, levels);
      return { mean: forecast.mean, intervals: forecast.intervals };
    };
    model = {
      method: input.spec.method,
      p: input.spec.p,
      q: input.spec.q,
      seasonal: input.spec.seasonal,
      log: input.spec.log,
      weather: temperature ? 'observed' : null,
    };
  } else {
    const spec = readFitSpec(values);
    x = (await loadInputSeries(values.input, context)).values;
    forecaster = (train, h) => {
      const fit = fitSeries(train, spec);
      const forecast = forecastArma(fit, train, h, fit.residuals);
      return { mean: forecast.mean, intervals: predictionIntervals(forecast, levels) };
    };
    model = { method: spec.method, p: spec.p, q: spec.q };
  }
  const result = rollingOriginBacktest(x, { origins, horizon, step, minTrain, season, forecaster, day });
  return {
    ...model,
    horizon: result.horizon,
    step: result.step,
    season: result.season,
    origins: result.origins,
    overall: result.overall,
    perHorizon: result.perHorizon,
    peak: result.peak,
  };
};
