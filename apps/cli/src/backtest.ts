/**
 * `loadwright backtest <fit options> [--season S] --horizon H --origins K [--step S] [--levels 80,95]`:
 * refits at K rolling origins, forecasts H steps from each and prints the accuracy metrics against the
 * seasonal-naive benchmark.
 */
import { forecastArma, predictionIntervals, rollingOriginBacktest } from '@loadwright/forecasting';
import { loadInputSeries, parseOptions, type Command } from './command-context';
import { fitOptionConfig, fitSeries, readFitSpec } from './fit-options';
import { integerOption, levelsOption } from './option-values';

/** Runs `backtest`. */
export const backtestCommand: Command = async (context) => {
  const values = parseOptions(context.args, {
    ...fitOptionConfig,
    horizon: { type: 'string' },
    origins: { type: 'string' },
    season: { type: 'string' },
    step: { type: 'string' },
    'min-train': { type: 'string' },
    levels: { type: 'string' },
  });
  const spec = readFitSpec(values);
  const horizon = integerOption('horizon', values.horizon, 1);
  const origins = integerOption('origins', values.origins, 1);
  const season = integerOption('season', values.season, 1, 1);
  const step = values.step === undefined ? undefined : integerOption('step', values.step, 1);
  const minTrain = values['min-train'] === undefined ? undefined : integerOption('min-train', values['min-train'], 2);
  const levels = levelsOption(values.levels);
  const series = await loadInputSeries(values.input, context);
  const result = rollingOriginBacktest(series.values, {
    origins,
    horizon,
    step,
    minTrain,
    season,
    forecaster: (train, h) => {
      const fit = fitSeries(train, spec);
      const forecast = forecastArma(fit, train, h, fit.residuals);
      return { mean: forecast.mean, intervals: predictionIntervals(forecast, levels) };
    },
  });
  return {
    method: spec.method,
    p: spec.p,
    q: spec.q,
    horizon: result.horizon,
    step: result.step,
    season: result.season,
    origins: result.origins,
    overall: result.overall,
    perHorizon: result.perHorizon,
  };
};
