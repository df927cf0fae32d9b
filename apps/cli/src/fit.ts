/**
 * `loadwright fit --method M --p P [--q Q]`: fits one model and prints its parameters, standard
 * errors, likelihood and criteria.
 */
import { loadInputSeries, parseOptions, type Command } from './command-context';
import { fitJson } from './fit-json';
import { fitOptionConfig, fitSeries, readFitSpec } from './fit-options';

/** Runs `fit`. */
export const fitCommand: Command = async (context) => {
  const values = parseOptions(context.args, fitOptionConfig);
  const spec = readFitSpec(values);
  const series = await loadInputSeries(values.input, context);
  return fitJson(fitSeries(series.values, spec));
};
