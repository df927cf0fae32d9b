/**
 * `loadwright forecast <fit options> --horizon H [--levels 80,95] [--accept-unconverged]`: fits, then
 * prints conditional-mean forecasts, their standard errors and central prediction intervals, with the
 * fit's `warnings`. A fit that did not converge is refused (exit status 2) unless --accept-unconverged
 * asks for its forecast anyway. With seasonal or regression options the forecasts come from the
 * load-model pipeline, reassembled on the load scale, with their timestamps; future temperatures are the
 * trailing CSV rows that have no value. `--method auto` forecasts exactly as the nightly refit does
 * (same model, same calibrated bands; see auto-run.ts) and names the chosen candidate.
 */
import {
  estimatorWarnings,
  forecastArma,
  forecastLoadModel,
  predictionIntervals,
  type EstimatorWarning,
  type FitResult,
  type PredictionInterval,
} from '@loadwright/forecasting';
import { autoFitJson, autoOptionConfig, runAuto } from './auto-run';
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

/** Refuses a fit that did not converge unless the caller accepted it explicitly. */
function refuseUnconverged(fit: FitResult | null, warnings: EstimatorWarning[], accepted: boolean): void {
  if (!fit || fit.converged !== false || accepted) return;
  const advice = warnings.find((w) => w.code === 'not-converged')?.suggestion ?? '';
  throw new InputError(
    `the ${fit.method} fit did not converge in ${fit.iterations ?? '?'} iterations, so its forecast is not given; ${advice} To forecast from it anyway, add --accept-unconverged.`,
  );
}

/** Runs `forecast`. */
export const forecastCommand: Command = async (context) => {
  const values = parseOptions(context.args, {
    ...fitOptionConfig,
    ...loadModelOptionConfig,
    ...autoOptionConfig,
    horizon: { type: 'string' },
    levels: { type: 'string' },
    'accept-unconverged': { type: 'boolean' },
  });
  const horizon = integerOption('horizon', values.horizon, 1);
  const levels = levelsOption(values.levels);
  const accepted = values['accept-unconverged'] === true;
  if (values.method === 'auto') {
    const { outcome } = await runAuto(values, context, { horizon, levels });
    refuseUnconverged(
      outcome.model.arma,
      outcome.model.arma ? estimatorWarnings(outcome.model.arma, outcome.model.remainder) : [],
      accepted,
    );
    const forecast = outcome.forecast;
    return {
      ...autoFitJson(outcome),
      timestamps: Array.from(forecast.timestamps, (t) => new Date(t).toISOString()),
      mean: Array.from(forecast.mean),
      median: Array.from(forecast.median),
      se: Array.from(forecast.se),
      intervals: intervalsJson(forecast.intervals.filter((i) => levels.includes(i.level))),
    };
  }
  if (wantsLoadModel(values)) {
    const { model, series } = await runLoadModel(values, context);
    const warnings = model.arma ? estimatorWarnings(model.arma, model.remainder) : [];
    refuseUnconverged(model.arma, warnings, accepted);
    const future = series.futureTemperature;
    if (model.spec.temperature && (!future || future.length < horizon)) {
      throw new InputError(
        `temperature forecasts needed: add ${horizon} rows after the last observation with an empty value and the temperature (found ${future?.length ?? 0})`,
      );
    }
    const forecast = forecastLoadModel(model, { temperature: future ?? undefined }, horizon, levels);
    return {
      ...loadModelJson(model),
      warnings,
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
  const warnings = estimatorWarnings(fit, series.values);
  refuseUnconverged(fit, warnings, accepted);
  // The fit's own residuals carry the MA terms, as the estimator computed them.
  const forecast = forecastArma(fit, series.values, horizon, fit.residuals);
  return {
    fit: fitJson(fit),
    warnings,
    mean: Array.from(forecast.mean),
    se: Array.from(forecast.se),
    intervals: intervalsJson(predictionIntervals(forecast, levels)),
  };
};
