/**
 * `loadwright forecast <fit options> --horizon H [--levels 80,95]`: fits, then prints conditional-mean
 * forecasts, their standard errors and central prediction intervals. With seasonal or regression
 * options the forecasts come from the load-model pipeline, reassembled on the load scale, with their
 * timestamps; future temperatures are the trailing CSV rows that have no value.
 */
import { forecastArma, forecastLoadModel, predictionIntervals, type PredictionInterval } from '@loadwright/forecasting';
import { loadInputSeries, parseOptions, type Command } from './command-context';
import { fitJson } from './fit-json';
import { fitOptionConfig, fitSeries, readFitSpec } from './fit-options';
import { InputError } from './input-error';
import { loadModelOptionConfig, wantsLoadModel } from './load-model-options';
import { loadModelJson, runLoadModel } from './load-model-run';
import { integerOption, levelsOption } from './option-values';

/** Intervals keyed by level, as printed. */
function intervalsJson(intervals: PredictionInterval[]): Record<string, { lower: number[]; upper: number[] }> {
  const json: Record<string, { lower: number[]; upper: number[] }> = {};
  for (const interval of intervals) json[String(interval.level)] = { lower: Array.from(interval.lower), upper: Array.from(interval.upper) };
  return json;
}

/** Runs `forecast`. */
export const forecastCommand: Command = async (context) => {
  const values = parseOptions(context.args, {
    ...fitOptionConfig,
    ...loadModelOptionConfig,
    horizon: { type: 'string' },
    levels: { type: 'string' },
  });
  const horizon = integerOption('horizon', values.horizon, 1);
  const levels = levelsOption(values.levels);
  if (wantsLoadModel(values)) {
    const { model, series } = await runLoadModel(values, context);
    const future = series.futureTemperature;
    if (model.spec.temperature && (!future || future.length < horizon)) {
      throw new InputError(
        `temperature forecasts needed: add ${horizon} rows after the last observation with an empty value and the temperature (found ${future?.length ?? 0})`,
      );
    }
    const forecast = forecastLoadModel(model, { temperature: future ?? undefined }, horizon, levels);
    return {
      ...loadModelJson(model),
      timestamps: Array.from(forecast.timestamps, (t) => new Date(t).toISOString()),
      mean: Array.from(forecast.mean),
      median: Array.from(forecast.median),
      se: Array.from(forecast.se),
      intervals: intervalsJson(forecast.intervals),
    };
  }
  const spec = readFitSpec(values);
  const series = await loadInputSeries(values.input, context);
  const fit = fitSeries(series.values, spec);
  // The fit's own residuals carry the MA terms, as the estimator computed them.
  const forecast = forecastArma(fit, series.values, horizon, fit.residuals);
  return {
    fit: fitJson(fit),
    mean: Array.from(forecast.mean),
    se: Array.from(forecast.se),
    intervals: intervalsJson(predictionIntervals(forecast, levels)),
  };
};
