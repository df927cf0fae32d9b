/**
 * `loadwright fit --method M --p P [--q Q]`: fits one model and prints its parameters, standard
 * errors, likelihood and criteria, and a `warnings` array (non-convergence, a near-unit root, an MA
 * root at the boundary, a mean outside the data), each with a suggestion. With seasonal or regression
 * options the series goes through the load-model pipeline and the output is `{fit, loadModel,
 * warnings}`. `--method auto` runs the nightly refit's own choice (see auto-run.ts).
 */
import { estimatorWarnings } from '@loadwright/forecasting';
import { autoFitJson, autoOptionConfig, runAuto } from './auto-run';
import { loadInputSeries, parseOptions, type Command } from './command-context';
import { fitJson } from './fit-json';
import { fitOptionConfig, fitSeries, readFitSpec } from './fit-options';
import { loadModelOptionConfig, wantsLoadModel } from './load-model-options';
import { loadModelJson, runLoadModel } from './load-model-run';

/** Runs `fit`. */
export const fitCommand: Command = async (context) => {
  const values = parseOptions(context.args, { ...fitOptionConfig, ...loadModelOptionConfig, ...autoOptionConfig });
  if (values.method === 'auto') return autoFitJson((await runAuto(values, context)).outcome);
  if (wantsLoadModel(values)) {
    const { model } = await runLoadModel(values, context);
    return { ...loadModelJson(model), warnings: model.arma ? estimatorWarnings(model.arma, model.remainder) : [] };
  }
  const spec = readFitSpec(values);
  const series = await loadInputSeries(values.input, context);
  const fit = fitSeries(series.values, spec);
  return { ...fitJson(fit), warnings: estimatorWarnings(fit, series.values) };
};
