/**
 * The longest series the npm package `arima` 0.2.8 (our second outside reference) can fit before its
 * WebAssembly build fails ("memory access out of bounds" and other traps), found by bisection and then
 * a point-by-point scan, because just above the limit it fails erratically. Each probe runs in a fresh
 * child process, because after a trap the module is unusable in that process.
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

/** Consecutive probes that settle a scan: so many successes below, or failures above, in a row. */
const SETTLE = 16;

/**
 * True when fitting the first n values fails for a reason other than a diverged optimiser: a trap, or
 * output without coefficients (both begin at the same length and come from the package's fixed buffers).
 */
function fails(x: number[], n: number, p: number, q: number, method: number): boolean {
  const fit = fitWithNpmArima(x.slice(0, n), p, q, method);
  return !fit.ok && fit.failure !== 'diverged';
}

/** Where fitting starts to fail, scanned one point at a time around a bisected boundary. */
interface LimitScan {
  /** Longest series with no failure at or below it (the safe limit). */
  longestReliable: number;
  /** From here on every probe failed, SETTLE of them in a row. */
  failsFrom: number;
  /** Lengths in between that still succeeded (erratic region). */
  sporadicSuccesses: number[];
  probes: number;
}

/**
 * Bisects between `low` (works) and `high` (fails), then, because the package fails erratically just
 * above its limit, walks down until SETTLE successes in a row and up until SETTLE failures in a row.
 */
function scanLimit(x: number[], p: number, q: number, method: number, low: number, high: number): LimitScan {
  let probes = 0;
  const probe = (n: number) => {
    probes++;
    return fails(x, n, p, q, method);
  };
  while (high - low > 1) {
    const middle = Math.floor((low + high) / 2);
    if (probe(middle)) high = middle;
    else low = middle;
  }
  let firstFailure = high;
  const successes = new Set<number>();
  for (let n = high - 1, run = 0; n > 0 && run < SETTLE; n--) {
    if (probe(n)) {
      firstFailure = n;
      run = 0;
    } else {
      successes.add(n);
      run++;
    }
  }
  let failsFrom = high;
  for (let n = high + 1, run = 0; run < SETTLE; n++) {
    if (probe(n)) run++;
    else {
      successes.add(n);
      failsFrom = n + 1;
      run = 0;
    }
  }
  const sporadicSuccesses = [...successes].filter((n) => n > firstFailure && n < failsFrom).sort((a, b) => a - b);
  return { longestReliable: firstFailure - 1, failsFrom, sporadicSuccesses, probes };
}

export const bench: Benchmark = {
  name: 'npm-arima-limit',
  // About 80 child processes per configuration: minutes on a busy machine.
  onlyWhenNamed: true,
  description: 'longest series the npm arima package fits reliably (bisection and scan, one child process per probe)',
  run(): BenchReport {
    const x = loadLikeSeries(20000);
    const rows: BenchReport['rows'] = [];
    const checks: BenchReport['checks'] = [];
    const results: Array<Record<string, unknown>> = [];
    for (const { label, p, q, method } of configurations) {
      const low = 1000;
      const high = x.length;
      if (fails(x, low, p, q, method) || !fails(x, high, p, q, method)) {
        rows.push({ model: label, longest_reliable: null, erratic_until: null, fails_from: null, probes: 2 });
        checks.push({ name: `${label}: bracket`, passed: false, detail: `expected a fit at ${low} points and a failure at ${high}` });
        continue;
      }
      const scan = scanLimit(x, p, q, method, low, high);
      rows.push({
        model: label,
        longest_reliable: scan.longestReliable,
        erratic_until: scan.failsFrom - 1,
        sporadic_successes: scan.sporadicSuccesses.length,
        fails_from: scan.failsFrom,
        probes: scan.probes + 2,
      });
      results.push({ label, p, q, method, ...scan });
    }
    return {
      rows,
      notes: [
        'the limit is the package’s, not ours: an 8,760-point year of hourly data is beyond it, so it serves as a reference on short series only',
        `failures: WebAssembly traps or output without coefficients; between the reliable limit and "fails_from" some lengths still fit (sporadic successes, not to be trusted); settled by ${SETTLE} consecutive probes`,
        'a diverged optimiser (non-finite objective, no coefficients) is not counted: it happens on some shorter series too',
      ],
      checks,
      data: { configurations: results },
    };
  },
};
