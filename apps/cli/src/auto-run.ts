/**
 * `--method auto`: the nightly refit's own computing half (fitSeriesModel of @loadwright/refits) on the
 * input series, with the refit's default settings (defaultModelSettings) changed only by the options
 * given, so an analyst reproduces any refit's model, forecast and bands from the same hours:
 * the last `--training-days` (default 365) of the input, the hour-of-week profile with calendar
 * regressors unless --seasonal says otherwise, temperature from --temperature-column (°C balance points
 * 15.5 and 22 unless given), holidays from --holidays, levels 80 and 95 always included.
 */
import type { ParseArgsConfig } from 'node:util';
import type { ModelSettingsRequest, SeasonalTreatment } from '@loadwright/contracts';
import type { HolidaySpec } from '@loadwright/forecasting';
import { defaultModelSettings, fitSeriesModel, type RefitInputs, type SeriesModelOutcome } from '@loadwright/refits';
import { loadInputSeries, type CommandContext } from './command-context';
import type { InputSeries } from './parse-series';
import { InputError } from './input-error';
import { loadModelJson } from './load-model-run';
import { choiceOption, integerOption, numberOption } from './option-values';

/** Options only `--method auto` reads. */
export const autoOptionConfig = {
  'training-days': { type: 'string' },
} as const satisfies ParseArgsConfig['options'];

/** The input and settings of an auto run, read once. */
export interface AutoInput {
  series: InputSeries;
  settings: ModelSettingsRequest;
  timeZone: string;
  holidays: HolidaySpec | null;
  temperatureColumn: string | undefined;
}

/** The refit's outcome on the input, and what it ran on. */
export interface AutoRun extends AutoInput {
  outcome: SeriesModelOutcome;
}

/** Reads the input and settings of `--method auto`. */
export async function readAutoInput(
  values: Record<string, string | boolean | undefined>,
  context: CommandContext,
  forecast: { horizon?: number; levels?: number[] } = {},
): Promise<AutoInput> {
  const text = (name: string) => values[name] as string | undefined;
  for (const name of ['p', 'q', 'lags', 'lambda', 'select']) {
    if (text(name) !== undefined) throw new InputError(`--${name} does not apply to --method auto: it chooses the orders itself`);
  }
  const settings = autoSettings(values, forecast);
  const temperatureColumn = text('temperature-column');
  const series = await loadInputSeries(text('input'), context, { temperatureColumn });
  if (!series.timestamps) throw new InputError('--method auto needs CSV input with an hourly "timestamp" column');
  return { series, settings, timeZone: text('time-zone') ?? 'UTC', holidays: holidaysOption(text('holidays')), temperatureColumn };
}

/** Runs the refit's computing half on the input with the refit's default settings and the options given. */
export async function runAuto(
  values: Record<string, string | boolean | undefined>,
  context: CommandContext,
  forecast: { horizon?: number; levels?: number[] } = {},
): Promise<AutoRun> {
  return runAutoOn(await readAutoInput(values, context, forecast));
}

/**
 * The refit on the first `prefix` hours of the input (all of them by default), forecasting `horizon` hours (the
 * settings' horizon by default); with a prefix, the observed temperatures after it stand in for the forecast.
 */
export function runAutoOn(input: AutoInput, horizon = input.settings.horizonHours, prefix?: number): AutoRun {
  const { series, timeZone, temperatureColumn } = input;
  const settings = { ...input.settings, horizonHours: horizon };
  const n = prefix ?? series.values.length;
  const window = Math.min(n, settings.trainingWindowDays * 24);
  const start = n - window;
  const station = { id: 0, key: 'input', name: `column ${temperatureColumn ?? ''} of the input`, unit: 'degC' };
  let temperature: RefitInputs['temperature'] = {
    usable: false,
    station: null,
    reason: 'no --temperature-column was given',
    fallback: false,
  };
  if (temperatureColumn !== undefined) {
    const future = prefix === undefined ? series.futureTemperature : series.temperature!.subarray(n);
    temperature =
      future && future.length >= horizon
        ? { usable: true, station, training: series.temperature!.subarray(start, n), future: future.subarray(0, horizon) }
        : {
            usable: false,
            station,
            reason: `the input has ${future?.length ?? 0} future temperature rows; ${horizon} are needed`,
            fallback: true,
          };
  }
  const inputs: RefitInputs = {
    series: { id: 0, key: 'input', name: 'input', unit: '', intervalMinutes: 60, timeZone, temperatureSeriesId: null },
    settings,
    window: { timestamps: series.timestamps!.subarray(start, n), values: series.values.subarray(start, n), bridgedHours: 0 },
    temperature,
  };
  return { ...input, settings, outcome: fitSeriesModel(inputs, input.holidays) };
}

/** The refit's default settings with the options given applied. */
export function autoSettings(
  values: Record<string, string | boolean | undefined>,
  forecast: { horizon?: number; levels?: number[] } = {},
): ModelSettingsRequest {
  const text = (name: string) => values[name] as string | undefined;
  let seasonal: SeasonalTreatment = defaultModelSettings.seasonal;
  if (text('seasonal') !== undefined) {
    const kind = choiceOption('seasonal', text('seasonal'), ['none', 'profile', 'difference'] as const);
    const period = Number(choiceOption('period', text('period'), ['24', '168'] as const, '168')) as 24 | 168;
    seasonal =
      kind === 'none'
        ? { kind: 'none' }
        : kind === 'difference'
          ? { kind: 'difference', lag: period }
          : {
              kind: 'profile',
              slot: period === 24 ? 'hour-of-day' : 'hour-of-week',
              form: choiceOption('profile-form', text('profile-form'), ['additive', 'multiplicative'] as const, 'additive'),
            };
  }
  const levels = [...new Set([...(forecast.levels ?? []), ...defaultModelSettings.levels])].sort((a, b) => a - b);
  return {
    ...defaultModelSettings,
    method: 'auto',
    seasonal,
    log: values['log'] === true,
    temperature: {
      enabled: text('temperature-column') !== undefined,
      heatingBase: numberOption('heating-base', text('heating-base'), Number.NEGATIVE_INFINITY) ?? null,
      coolingBase: numberOption('cooling-base', text('cooling-base'), Number.NEGATIVE_INFINITY) ?? null,
    },
    trainingWindowDays: integerOption('training-days', text('training-days'), 7, defaultModelSettings.trainingWindowDays),
    horizonHours: forecast.horizon ?? defaultModelSettings.horizonHours,
    levels: levels.slice(0, 6),
  };
}

/** What `fit --method auto` prints: the chosen model in the load-model layout, what auto compared, warnings and bands. */
export function autoFitJson(outcome: SeriesModelOutcome): Record<string, unknown> {
  const chosen = outcome.selection?.candidates.find((c) => c.chosen);
  return {
    method: 'auto',
    chosen: chosen?.label ?? outcome.method,
    fittedMethod: outcome.method,
    ...loadModelJson(outcome.model),
    selection: outcome.selection,
    warnings: outcome.diagnostics.warnings,
    ljungBox: outcome.diagnostics.ljungBox,
    bands: outcome.bands,
  };
}

/** "US" or "US:TX" → a holiday calendar, or null. */
function holidaysOption(raw: string | undefined): HolidaySpec | null {
  if (raw === undefined) return null;
  const match = /^([A-Za-z]{2})(?::([A-Za-z0-9-]+))?$/.exec(raw.trim());
  if (!match) throw new InputError(`--holidays must be a country code with an optional region, e.g. "US" or "US:TX", got "${raw}"`);
  return { country: match[1].toUpperCase(), ...(match[2] ? { region: match[2] } : {}), extraDates: [] };
}
