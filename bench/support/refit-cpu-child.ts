/**
 * One timed pass of the refit's computing half (fitSeriesModel: `auto`, diagnostics, forecast, bands) over
 * windows of the real PJM East 2002 load, in a process of its own, for bench/refit/refit-cpu.ts. The tree
 * whose refit is timed is the working directory (a checkout of an earlier commit, or this one), so an older
 * `auto` runs with its own engine and defaults. Prints one JSON line: CPU milliseconds per window and what
 * each window chose.
 *
 * Arguments: <window hours> <comma-separated window ends (hour index, exclusive)> <warm-up fits> [<timed fits per window>].
 * Each window is timed that many times (default 1) and its mean reported: one fit is short enough that a
 * garbage collection landing in it or not moves a window's time by a third.
 */
import { createHash } from 'node:crypto';
import { resolve } from 'node:path';
import { pathToFileURL } from 'node:url';
import { realHourlyLoad } from '../../libs/refits/src/evaluation/real-load.testing';

/** What the child reports for one window. */
export interface WindowTiming {
  end: number;
  /** CPU milliseconds (user + system) of fitSeriesModel. */
  cpuMs: number;
  /** CPU milliseconds of its fit phase alone (the model choice: `auto`'s candidates and backtest), as fitSeriesModel records it. */
  fitCpuMs: number;
  /** The chosen candidate's label (or the method). */
  chosen: string;
  /** SHA-256 of the forecast's mean and bounds, to see whether two trees forecast the same numbers. */
  digest: string;
}

/** The subset of the refits library the child calls; every measured tree has it in this shape. */
interface RefitsModule {
  fitSeriesModel: (
    inputs: unknown,
    holidays: unknown,
  ) => {
    method: string;
    selection: { candidates: Array<{ label: string; chosen: boolean }> } | null;
    forecast: { mean: Float64Array; intervals: Array<{ lower: Float64Array; upper: Float64Array }> };
    timings: { fitCpu: number };
  };
}

const [windowArg, endsArg, warmupArg, repeatsArg] = process.argv.slice(2);
const windowHours = Number(windowArg);
const ends = endsArg!.split(',').map(Number);
const warmup = Number(warmupArg ?? 2);
const repeats = Math.max(1, Number(repeatsArg ?? 1));
const tree = process.cwd();
const { fitSeriesModel } = (await import(pathToFileURL(resolve(tree, 'libs/refits/src/fit-series-model.ts')).href)) as RefitsModule;
const { defaultModelSettings } = (await import(pathToFileURL(resolve(tree, 'libs/refits/src/model-settings.ts')).href)) as {
  defaultModelSettings: Record<string, unknown>;
};
const { data } = realHourlyLoad();
// The refit's defaults with no weather station (the data has none), US holidays, as bench/refit/real-load-accuracy.ts.
const settings = { ...defaultModelSettings, temperature: { enabled: false, heatingBase: null, coolingBase: null } };
const holidays = { country: 'US', extraDates: [] };

/** The refit's inputs for the window ending (exclusive) at hour `end`. */
function inputsEndingAt(end: number) {
  return {
    series: { id: 1, key: 'pjm-east', name: 'PJM East', unit: 'MW', intervalMinutes: 60, timeZone: 'UTC', temperatureSeriesId: null },
    settings,
    window: {
      timestamps: data.timestamps.subarray(end - windowHours, end),
      values: data.values.subarray(end - windowHours, end),
      bridgedHours: 0,
    },
    temperature: { usable: false, station: null, reason: 'no temperature in this data', fallback: false },
  };
}

/** CPU milliseconds of this process so far. */
function cpu(): number {
  const { user, system } = process.cpuUsage();
  return (user + system) / 1000;
}

for (let i = 0; i < warmup; i++) fitSeriesModel(inputsEndingAt(ends[i % ends.length]!), holidays);
const timings: WindowTiming[] = [];
for (const end of ends) {
  const at = cpu();
  let outcome = fitSeriesModel(inputsEndingAt(end), holidays);
  let fitCpu = outcome.timings.fitCpu;
  for (let i = 1; i < repeats; i++) {
    outcome = fitSeriesModel(inputsEndingAt(end), holidays);
    fitCpu += outcome.timings.fitCpu;
  }
  const cpuMs = (cpu() - at) / repeats;
  const hash = createHash('sha256');
  const bytes = (a: Float64Array) => new Uint8Array(a.buffer, a.byteOffset, a.byteLength);
  hash.update(bytes(outcome.forecast.mean));
  for (const band of outcome.forecast.intervals) {
    hash.update(bytes(band.lower));
    hash.update(bytes(band.upper));
  }
  const chosen = outcome.selection?.candidates.find((c) => c.chosen)?.label ?? outcome.method;
  timings.push({ end, cpuMs, fitCpuMs: fitCpu / repeats, chosen, digest: hash.digest('hex').slice(0, 12) });
}
console.log(JSON.stringify({ timings }));
