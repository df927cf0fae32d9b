/**
 * Rolling-origin evaluation of the refit itself on a long series: at each daily origin the refit's
 * computing half (fitSeriesModel) is run on the training window that ends there, exactly as the
 * nightly refit would run it, and its forecast of the next `horizon` hours is compared with what
 * happened. Scores: MAPE, MAE, the error of each day's peak, and the share of hours inside the 80 % and
 * 95 % bands (achieved against nominal coverage; Gneiting & Raftery 2007 §6 for interval forecasts).
 */
import type { FitSelection, FittedMethod, ModelSettingsRequest } from '@loadwright/contracts';
import type { HolidaySpec, LoadSeriesData } from '@loadwright/forecasting';
import type { AutoOptions } from '../auto-select';
import { fitSeriesModel } from '../fit-series-model';
import type { RefitInputs } from '../series-window';

/** How the evaluation runs. */
export interface RollingOriginOptions {
  /** Number of daily origins, the last one `horizon` hours before the end of the data. */
  origins: number;
  /** Hours scored after each origin (24: day ahead). */
  horizon: number;
  /** Hours between origins (24: daily). */
  step?: number;
  holidays: HolidaySpec | null;
  timeZone: string;
  /** Passed to `auto` (e.g. `only` to score one candidate alone). */
  autoOptions?: AutoOptions;
}

/** The scores of one configuration over every origin. */
export interface RollingOriginScores {
  /** Mean absolute percentage error, percent. */
  mape: number;
  mae: number;
  /** Mean absolute error of each day's peak (max forecast against max actual), series' unit. */
  peakMae: number;
  /** Share of hours inside the 80 % and 95 % bands, percent. */
  coverage80: number;
  coverage95: number;
  hours: number;
  /** What the refit chose at each origin (the method, and for `auto` the winning candidate's label). */
  chosen: string[];
  /** Which kind of band the forecasts carried (e.g. 'empirical', 'gaussian'), counted over origins. */
  bands: Record<string, number>;
  /** CPU milliseconds of the fits, per origin. */
  fitCpuMs: number[];
}

/** Runs the refit at each origin with `settings` and scores its forecasts. */
export function rollingOriginEvaluation(
  data: LoadSeriesData,
  settings: ModelSettingsRequest,
  options: RollingOriginOptions,
): RollingOriginScores {
  const step = options.step ?? 24;
  const window = settings.trainingWindowDays * 24;
  const n = data.values.length;
  const last = n - options.horizon;
  const origins = Array.from({ length: options.origins }, (_, i) => last - (options.origins - 1 - i) * step);
  if (origins[0] - window < 0)
    throw new Error(`the data hold ${n} hours: too few for ${options.origins} origins after a ${window}-hour window`);

  let absPct = 0;
  let abs = 0;
  let inside80 = 0;
  let inside95 = 0;
  let peakAbs = 0;
  let hours = 0;
  const chosen: string[] = [];
  const bands: Record<string, number> = {};
  const fitCpuMs: number[] = [];
  for (const origin of origins) {
    const inputs: RefitInputs = {
      series: {
        id: 1,
        key: 'evaluation',
        name: 'Evaluation',
        unit: 'MW',
        intervalMinutes: 60,
        timeZone: options.timeZone,
        temperatureSeriesId: null,
      },
      settings: { ...settings, horizonHours: Math.max(settings.horizonHours, options.horizon) },
      window: {
        timestamps: data.timestamps.subarray(origin - window, origin),
        values: data.values.subarray(origin - window, origin),
        bridgedHours: 0,
      },
      temperature: { usable: false, station: null, reason: 'no temperature in the evaluation', fallback: false },
    };
    const outcome = fitSeriesModel(inputs, options.holidays, options.autoOptions);
    fitCpuMs.push(outcome.timings.fitCpu);
    chosen.push(choiceLabel(outcome.method, outcome.selection));
    const kind = outcome.bands?.kind ?? 'gaussian';
    bands[kind] = (bands[kind] ?? 0) + 1;
    const band80 = outcome.forecast.intervals.find((i) => i.level === 80)!;
    const band95 = outcome.forecast.intervals.find((i) => i.level === 95)!;
    for (let h = 0; h < options.horizon; h += 24) {
      let peakActual = -Infinity;
      let peakForecast = -Infinity;
      for (let k = h; k < Math.min(h + 24, options.horizon); k++) {
        const actual = data.values[origin + k];
        const mean = outcome.forecast.mean[k];
        absPct += Math.abs((actual - mean) / actual);
        abs += Math.abs(actual - mean);
        if (actual >= band80.lower[k] && actual <= band80.upper[k]) inside80++;
        if (actual >= band95.lower[k] && actual <= band95.upper[k]) inside95++;
        peakActual = Math.max(peakActual, actual);
        peakForecast = Math.max(peakForecast, mean);
        hours++;
      }
      peakAbs += Math.abs(peakForecast - peakActual);
    }
  }
  const days = hours / 24;
  return {
    mape: (100 * absPct) / hours,
    mae: abs / hours,
    peakMae: peakAbs / days,
    coverage80: (100 * inside80) / hours,
    coverage95: (100 * inside95) / hours,
    hours,
    chosen,
    bands,
    fitCpuMs,
  };
}

/** The method, or the winning candidate's label when `auto` chose. */
function choiceLabel(method: FittedMethod, selection: FitSelection | null): string {
  return selection?.candidates.find((c) => c.chosen)?.label ?? method;
}
