/**
 * Fits the engine's load-model pipeline from parsed command options and input, and the JSON shape
 * of what it estimated.
 */
import { fitLoadModel, type FittedLoadModel } from '@loadwright/forecasting';
import { loadInputSeries, type CommandContext } from './command-context';
import { fitJson, type FitJson } from './fit-json';
import { readFitSpec } from './fit-options';
import { InputError } from './input-error';
import { readLoadModelSpec } from './load-model-options';
import type { InputSeries } from './parse-series';

/** The fitted pipeline and the input it came from. */
export interface LoadModelRun {
  model: FittedLoadModel;
  series: InputSeries;
}

/** Reads the input and fits the load model the options describe. */
export async function runLoadModel(values: Record<string, string | boolean | undefined>, context: CommandContext): Promise<LoadModelRun> {
  const naive = values['method'] === 'seasonal-naive';
  if (naive && (values['p'] !== undefined || values['q'] !== undefined)) throw new InputError('seasonal-naive takes no --p or --q');
  const spec = readLoadModelSpec(values, naive ? null : readFitSpec(values));
  const temperatureColumn = values['temperature-column'] as string | undefined;
  const series = await loadInputSeries(values['input'] as string | undefined, context, { temperatureColumn });
  if (!series.timestamps) {
    throw new InputError('seasonal, log, temperature and calendar options need CSV input with an hourly "timestamp" column');
  }
  const model = fitLoadModel(spec, {
    timestamps: series.timestamps,
    values: series.values,
    temperature: series.temperature ?? undefined,
  });
  return { model, series };
}

/** What the load model printed: the ARMA part (null for seasonal naive) and the pipeline's own estimates. */
export function loadModelJson(model: FittedLoadModel): { fit: FitJson | null; loadModel: Record<string, unknown> } {
  const { spec } = model;
  return {
    fit: model.arma ? fitJson(model.arma) : null,
    loadModel: {
      method: spec.method,
      seasonal: spec.seasonal,
      log: spec.log,
      timeZone: spec.timeZone,
      temperature: spec.temperature,
      dayTypes: spec.dayTypes,
      holidays: spec.holidays,
      regression: model.regression,
      profile: model.profile ? { ...model.profile, effect: Array.from(model.profile.effect), count: Array.from(model.profile.count) } : null,
      seasonalNaive: model.seasonalNaive,
      lastTimestamp: new Date(model.lastTimestamp).toISOString(),
    },
  };
}
