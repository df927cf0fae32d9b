/**
 * The seasonal and regression options of `fit` and `forecast` (`--seasonal`, `--period`,
 * `--profile-form`, `--log`, `--temperature-column`, `--heating-base`, `--cooling-base`,
 * `--day-types`, `--holidays`, `--time-zone`), which route the series through the engine's load-model
 * pipeline instead of a plain ARMA fit.
 */
import type { ParseArgsConfig } from 'node:util';
import { DEFAULT_COOLING_BASE_C, DEFAULT_HEATING_BASE_C, type LoadModelSpec, type SeasonalSpec } from '@loadwright/forecasting';
import type { FitSpec } from './fit-options';
import { InputError } from './input-error';
import { choiceOption, numberOption } from './option-values';

/** parseArgs options of the load-model pipeline. */
export const loadModelOptionConfig = {
  seasonal: { type: 'string' },
  period: { type: 'string' },
  'profile-form': { type: 'string' },
  log: { type: 'boolean' },
  'temperature-column': { type: 'string' },
  'heating-base': { type: 'string' },
  'cooling-base': { type: 'string' },
  'day-types': { type: 'boolean' },
  holidays: { type: 'string' },
  'time-zone': { type: 'string' },
} as const satisfies ParseArgsConfig['options'];

/** True when any load-model option was given (or the method only the pipeline offers). */
export function wantsLoadModel(values: Record<string, string | boolean | undefined>): boolean {
  return Object.keys(loadModelOptionConfig).some((name) => values[name] !== undefined) || values['method'] === 'seasonal-naive';
}

/** Builds the pipeline's spec from the model options and the load-model options. */
export function readLoadModelSpec(values: Record<string, string | boolean | undefined>, fit: FitSpec | null): LoadModelSpec {
  const text = (name: string) => values[name] as string | undefined;
  const kind = choiceOption('seasonal', text('seasonal'), ['none', 'profile', 'difference'] as const, 'none');
  const period = kind === 'none' ? undefined : (Number(choiceOption('period', text('period'), ['24', '168'] as const, '168')) as 24 | 168);
  if (kind !== 'profile' && text('profile-form') !== undefined) throw new InputError('--profile-form applies to --seasonal profile only');
  const seasonal: SeasonalSpec =
    kind === 'none'
      ? { kind: 'none' }
      : kind === 'profile'
        ? {
            kind: 'profile',
            period: period!,
            form: choiceOption('profile-form', text('profile-form'), ['additive', 'multiplicative'] as const, 'additive'),
          }
        : { kind: 'difference', lag: period! };
  const temperatureColumn = text('temperature-column');
  if (temperatureColumn === undefined && (text('heating-base') !== undefined || text('cooling-base') !== undefined)) {
    throw new InputError('--heating-base and --cooling-base need --temperature-column');
  }
  const temperature =
    temperatureColumn === undefined
      ? null
      : {
          heatingBase: numberOption('heating-base', text('heating-base'), Number.NEGATIVE_INFINITY) ?? DEFAULT_HEATING_BASE_C,
          coolingBase: numberOption('cooling-base', text('cooling-base'), Number.NEGATIVE_INFINITY) ?? DEFAULT_COOLING_BASE_C,
        };
  const holidaysText = text('holidays');
  const holidays = holidaysText === undefined ? null : parseHolidays(holidaysText);
  return {
    method: fit ? fit.method : 'seasonal-naive',
    p: fit ? fit.p : 0,
    q: fit ? fit.q : 0,
    lags: fit?.lags,
    lambda: fit?.lambda,
    select: fit?.select,
    seasonal,
    log: values['log'] === true,
    temperature,
    dayTypes: values['day-types'] === true,
    holidays,
    timeZone: text('time-zone') ?? 'UTC',
  };
}

/** "US" or "US:TX" → a holiday calendar spec. */
function parseHolidays(raw: string): LoadModelSpec['holidays'] {
  const match = /^([A-Za-z]{2})(?::([A-Za-z0-9-]+))?$/.exec(raw.trim());
  if (!match) throw new InputError(`--holidays must be a country code with an optional region, e.g. "US" or "US:TX", got "${raw}"`);
  return { country: match[1].toUpperCase(), region: match[2], extraDates: [] };
}
