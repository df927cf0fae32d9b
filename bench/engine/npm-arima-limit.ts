/**
 * The longest series the npm package `arima` 0.2.8 (our second outside reference) can fit before its
 * WebAssembly build traps with "memory access out of bounds", found by bisection. Each probe runs in a
 * fresh child process, because after a trap the module is unusable in that process.
 *
 * The series is the benchmark's load-like hourly series (bench/support/load-like-series.ts), truncated.
 */
import { fitWithNpmArima } from '../../libs/forecasting/src/arma/npm-arima-reference';
import type { Benchmark, BenchReport } from '../support/harness';
import { loadLikeSeries } from '../support/load-like-series';

/** Configurations probed: the package's method numbers as in its code (2 = CSS, 0 = CSS-ML). */
const configurations = [
  { label: 'CSS ARMA(2,1)', p: 2, q: 1, method: 2 },
  { label: 'CSS ARMA(1,1)', p: 1, q: 1, method: 2 },
  { label: 'CSS-ML ARMA(2,1) (its default method)', p: 2, q: 1, method: 0 },
];

/** Largest n in [low, high) for which the fit works, assuming it works at `low` and fails at `high`. */
function bisect(x: number[], p: number, q: number, method: number, low: number, high: number): { longestOk: number; probes: number } {
  let probes = 0;
  while (high - low > 1) {
    const middle = Math.floor((low + high) / 2);
    probes++;
    if (fitWithNpmArima(x.slice(0, middle), p, q, method).ok) low = middle;
    else high = middle;
  }
  return { longestOk: low, probes };
}

export const bench: Benchmark = {
  name: 'npm-arima-limit',
  description: 'longest series the npm arima package fits before it traps (bisection, one child process per probe)',
  run(): BenchReport {
    const x = loadLikeSeries(20000);
    const rows: BenchReport['rows'] = [];
    const checks: BenchReport['checks'] = [];
    const results: Array<Record<string, unknown>> = [];
    for (const { label, p, q, method } of configurations) {
      const low = 1000;
      const high = x.length;
      const okAtLow = fitWithNpmArima(x.slice(0, low), p, q, method);
      const atHigh = fitWithNpmArima(x, p, q, method);
      if (!okAtLow.ok || atHigh.ok) {
        rows.push({ model: label, longest_ok: null, first_trap: null, probes: 2 });
        checks.push({ name: `${label}: bracket`, passed: false, detail: `expected success at ${low} and a trap at ${high}; got ${okAtLow.ok} and ${atHigh.ok}` });
        continue;
      }
      const { longestOk, probes } = bisect(x, p, q, method, low, high);
      const trap = fitWithNpmArima(x.slice(0, longestOk + 1), p, q, method);
      rows.push({ model: label, longest_ok: longestOk, first_trap: longestOk + 1, probes: probes + 3 });
      results.push({ label, p, q, method, longestOk, firstTrap: longestOk + 1, trapMessage: trap.ok ? null : trap.message });
    }
    return {
      rows,
      notes: ['the limit is the package’s, not ours: an 8,760-point year of hourly data is beyond it, so it serves as a reference on short series only'],
      checks,
      data: { configurations: results },
    };
  },
};
