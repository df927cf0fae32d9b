/**
 * A deterministic, load-like hourly series for benchmarks: one year (8,760 hours) of an ARMA(2,1)
 * around 1,200 MW with hour-to-hour persistence typical of system load after its daily and weekly
 * shape is removed (reciprocal AR roots 0.8 and 0.75, MA 0.3, innovations σ = 15 MW), rounded to the
 * kilowatt like metered data. Same seed, same series on every machine.
 */
import { mkdtempSync, writeFileSync } from 'node:fs';
import { tmpdir } from 'node:os';
import { join } from 'node:path';
import { simulateArma } from '../../libs/forecasting/src/core/simulate-arma';

/** The true parameters the series is simulated from. */
export const loadLikeModel = { mean: 1200, ar: [1.55, -0.6], ma: [0.3], sigma2: 225 };

/** n hourly values (MW, three decimals), deterministic for a given seed. */
export function loadLikeSeries(n = 8760, seed = 20260101): number[] {
  return Array.from(simulateArma(loadLikeModel, n, seed), (value) => Math.round(value * 1000) / 1000);
}

/** Writes the series to a fresh temporary CSV with a `value` header; returns its path. */
export function writeSeriesCsv(values: ArrayLike<number>): string {
  const path = join(mkdtempSync(join(tmpdir(), 'loadwright-bench-')), 'series.csv');
  writeFileSync(path, `value\n${Array.from(values, (v) => v.toFixed(3)).join('\n')}\n`);
  return path;
}
