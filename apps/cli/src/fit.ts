/**
 * `loadwright fit --method M --p P [--q Q]`: fits one model and prints its parameters, standard
 * errors, likelihood and criteria. With seasonal or regression options the series goes through the
 * load-model pipeline and the output is `{fit, loadModel}`.
 */
import { loadInputSeries, parseOptions, type Command } from './command-context';
import { fitJson } from './fit-json';
import { fitOptionConfig, fitSeries, readFitSpec } from './fit-options';
import { loadModelOptionConfig, wantsLoadModel } from './load-model-options';
import { loadModelJson, runLoadModel } from './load-model-run';

/** Runs `fit`. */
export const fitCommand: Command = async (context) => {
  const values = parseOptions(context.args, { ...fitOptionConfig, ...loadModelOptionConfig });
  if (wantsLoadModel(values)) return loadModelJson((await runLoadModel(values, context)).model);
  const spec = readFitSpec(values);
  const series = await loadInputSeries(values.input, context);
  return fitJson(fitSeries(series.values, spec));
};
