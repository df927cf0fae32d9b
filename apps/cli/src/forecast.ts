/**
 * `loadwright forecast <fit options> --horizon H [--levels 80,95]`: fits, then prints conditional-mean
 * forecasts, their standard errors and central prediction intervals.
 */
import { forecastArma, predictionIntervals } from '@loadwright/forecasting';
import { loadInputSeries, parseOptions, type Command } from './command-context';
import { fitJson } from './fit-json';
import { fitOptionConfig, fitSeries, readFitSpec } from './fit-options';
import { integerOption, levelsOption } from './option-values';

/** Runs `forecast`. */
export const forecastCommand: Command = async (context) => {
  const values = parseOptions(context.args, { ...fitOptionConfig, horizon: { type: 'string' }, levels: { type: 'string' } });
  const spec = readFitSpec(values);
  const horizon = integerOption('horizon', values.horizon, 1);
  const levels = levelsOption(values.levels);
  const series = await loadInputSeries(values.input, context);
  const fit = fitSeries(series.values, spec);
  // The fit's own residuals carry the MA terms, as the estimator computed them.
  const forecast = forecastArma(fit, series.values, horizon, fit.residuals);
  const intervals: Record<string, { lower: number[]; upper: number[] }> = {};
  for (const interval of predictionIntervals(forecast, levels)) {
    intervals[String(interval.level)] = { lower: Array.from(interval.lower), upper: Array.from(interval.upper) };
  }
  return { fit: fitJson(fit), mean: Array.from(forecast.mean), se: Array.from(forecast.se), intervals };
};
