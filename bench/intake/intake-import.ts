/**
 * Intake speed and memory: a long CSV file of 12 hourly load series is imported end to end through
 * the import job's own code (stream, parse, convert, validate, estimate, one-transaction merge into
 * observations) at 250,000 and 1,000,000 rows, each in a fresh process and a fresh database, with
 * the resident set size sampled every 20 ms. Reference measured side by side: the plain batched
 * insert of the seed (libs/db insertObservations) of the same 1,000,000 readings, i.e. what the
 * database alone accepts on this machine at this moment.
 *
 * `npm run bench -- intake`
 */
import { execFileSync } from 'node:child_process';
import { fileURLToPath } from 'node:url';
import type { Benchmark, BenchReport } from '../support/harness';

const script = fileURLToPath(new URL('./import-one-file.ts', import.meta.url));

/** What one child run prints. */
interface RunResult {
  rows: number;
  fileBytes: number;
  seconds: number;
  rowsPerSecond: number;
  stored: number;
  findings: number;
  baselineRssMiB: number;
  peakRssMiB: number;
  rssGrowthMiB: number;
  peakHeapMiB: number;
}

function runChild(rows: number, mode: 'import' | 'reference'): RunResult {
  const output = execFileSync(process.execPath, ['--import', 'tsx', '--expose-gc', script, '--rows', String(rows), '--mode', mode], {
    encoding: 'utf8',
    stdio: ['ignore', 'pipe', 'inherit'],
  });
  return JSON.parse(output.trim().split('\n').pop()!) as RunResult;
}

/** The benchmark. */
export const bench: Benchmark = {
  name: 'intake-import',
  description:
    'CSV upload import end to end (12 series, 250k and 1M rows): rows/s and peak RSS, against the plain insert of the same readings',
  run(): BenchReport {
    const small = runChild(250_000, 'import');
    const large = runChild(1_000_000, 'import');
    const reference = runChild(1_000_000, 'reference');
    const row = (name: string, r: RunResult) => ({
      run: name,
      rows: r.rows,
      'file MB': Math.round(r.fileBytes / 1e5) / 10,
      seconds: Math.round(r.seconds * 10) / 10,
      'rows/s': r.rowsPerSecond,
      'baseline RSS MiB': r.baselineRssMiB,
      'peak RSS MiB': r.peakRssMiB,
      'RSS growth MiB': r.rssGrowthMiB,
      'peak heap MiB': r.peakHeapMiB,
    });
    const growthRatio = large.rssGrowthMiB / Math.max(1, small.rssGrowthMiB);
    return {
      rows: [row('import 250k', small), row('import 1M', large), row('reference: plain insert 1M', reference)],
      notes: [
        `1M-row import runs at ${Math.round((large.rowsPerSecond / reference.rowsPerSecond) * 100)} % of the plain insert measured side by side (${reference.rowsPerSecond} rows/s).`,
        `Four times the rows raised the peak RSS growth ${growthRatio.toFixed(2)}× (${small.rssGrowthMiB} → ${large.rssGrowthMiB} MiB) while the file grew ${(large.fileBytes / small.fileBytes).toFixed(1)}×: the file is streamed; what stays is 20 bytes per reading in typed arrays until the transaction writes them.`,
        'The gap to the reference is the reading, conversion and validation of the file in JavaScript before the transaction (parsing and garbage collection dominate a CPU profile); the database side runs at about the reference rate.',
      ],
      checks: [
        {
          name: 'every row stored',
          passed: large.stored === 1_000_000 && small.stored === 250_000,
          detail: `${small.stored} and ${large.stored} observations`,
        },
        {
          name: 'at least 100,000 rows/s end to end at 1M rows',
          passed: large.rowsPerSecond >= 100_000,
          detail: `${large.rowsPerSecond} rows/s`,
        },
        {
          name: 'memory flat in the file size (RSS growth at 1M under 2× that at 250k)',
          passed: growthRatio < 2,
          detail: `${growthRatio.toFixed(2)}×`,
        },
      ],
      data: { small, large, reference },
    };
  },
};
