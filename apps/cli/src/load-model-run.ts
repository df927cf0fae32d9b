/**
 * Fits the engine's load-model pipeline from parsed command options and input, and the JSON shape
 * of what it estimated.
 */
import { fitLoadModel, type FittedLoadModel, type LoadModelSpec } from '@loadwright/forecasting';
import { loadInputSeries, type CommandContext } from './command-context';
import { fitJson, type FitJson } from './fit-json';
import { readFitSpec } from './fit-options';
import { InputError } from './input-error';
import { readLoadModelSpec } from './load-model-options';
import type { InputSeries } from './parse-series';

/** The pipeline's spec and the input it runs on (timestamps guaranteed). */
export interface LoadModelInput {
  /** What the pipeline fits. */
  spec: LoadModelSpec;
  /** The input series, with its timestamps. */
  series: InputSeries & { timestamps: Float64Array };
}

/** The fitted pipeline and the input it came from. */
export interface LoadModelRun extends LoadModelInput {
  /** The pipeline fitted on the whole input. */
  model: FittedLoadModel;
}

/** Reads the options and the input for the load-model pipeline. */
export async function readLoadModelInput(
  values: Record<string, string | boolean | undefined>,
  context: CommandContext,
): Promise<LoadModelInput> {
  const naive = values['method'] === 'seasonal-naive';
  if (naive && (values['p'] !== undefined || values['q'] !== undefined)) throw new InputError('seasonal-naive takes no --p or --q');
  const spec = readLoadModelSpec(values, naive ? null : readFitSpec(values));
  const temperatureColumn = values['temperature-column'] as string | undefined;
  const series = await loadInputSeries(values['input'] as string | undefined, context, { temperatureColumn });
  const timestamps = series.timestamps;
  if (!timestamps) {
    throw new InputError('seasonal, log, temperature and calendar options need CSV input with an hourly "timestamp" column');
  }
  return { spec, series: { ...series, timestamps } };
}

/** Fits the pipeline on the first `length` observations (all by default). */
export function fitLoadModelPrefix(input: LoadModelInput, length = input.series.values.length): FittedLoadModel {
  const { spec, series } = input;
  return fitLoadModel(spec, {
    timestamps: series.timestamps.subarray(0, length),
    values: series.values.subarray(0, length),
    temperature: series.temperature?.subarray(0, length),
  });
}

/** Reads the input and fits the load model the options describe. */
export async function runLoadModel(values: Record<string, string | boolean | undefined>, context: CommandContext): Promise<LoadModelRun> {
  const input = await readLoadModelInput(values, context);
  return { ...input, model: fitLoadModelPrefix(input) };
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
      profile: model.profile
        ? { ...model.profile, effect: Array.from(model.profile.effect), count: Array.from(model.profile.count) }
        : null,
      seasonalNaive: model.seasonalNaive,
      lastTimestamp: new Date(model.lastTimestamp).toISOString(),
    },
  };
}
