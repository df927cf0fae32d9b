/**
 * The contract every benchmark module follows, and the helpers they share: median timing, a plain-text
 * table, and writing bench/results/<name>.json (git-ignored).
 *
 * A benchmark module lives at bench/<area>/<name>.ts and exports `bench: Benchmark`; bench/run.ts finds
 * and runs every such module. Benchmarks print ratios against a reference measured side by side in the
 * same run, never against numbers from another machine.
 */
import { mkdirSync, writeFileSync } from 'node:fs';

/** One benchmark: a name (the results file name), what it measures, and how to run it. */
export interface Benchmark {
  name: string;
  description: string;
  /** Slow benchmarks run only when a filter names them, not on a bare `npm run bench`. */
  onlyWhenNamed?: boolean;
  run(): Promise<BenchReport> | BenchReport;
}

/** What a benchmark hands back: a table to print, notes, pass/fail checks, and raw data for the JSON file. */
export interface BenchReport {
  rows: Array<Record<string, string | number | null>>;
  notes: string[];
  /** Requirement checks; a failed one makes `npm run bench` exit non-zero. */
  checks: Array<{ name: string; passed: boolean; detail: string }>;
  data: Record<string, unknown>;
}

/** Timing summary of repeated runs, in milliseconds. */
export interface Timing {
  medianMs: number;
  minMs: number;
  maxMs: number;
  repetitions: number;
}

/** Runs `work` `warmup` times untimed, then `repetitions` times timed; returns the median and range. */
export function timeMedian(work: () => unknown, repetitions = 31, warmup = 5): Timing {
  for (let i = 0; i < warmup; i++) work();
  const times: number[] = [];
  for (let i = 0; i < repetitions; i++) {
    const start = performance.now();
    work();
    times.push(performance.now() - start);
  }
  return summarise(times);
}

/** Median, min and max of a list of times in milliseconds. */
export function summarise(times: number[]): Timing {
  const sorted = [...times].sort((a, b) => a - b);
  const middle = sorted.length >> 1;
  const medianMs = sorted.length % 2 === 1 ? sorted[middle] : (sorted[middle - 1] + sorted[middle]) / 2;
  return { medianMs, minMs: sorted[0], maxMs: sorted[sorted.length - 1], repetitions: sorted.length };
}

/** Formats rows as an aligned plain-text table (numbers right-aligned). */
export function formatTable(rows: Array<Record<string, string | number | null>>): string {
  if (rows.length === 0) return '(no rows)';
  const columns = [...new Set(rows.flatMap((row) => Object.keys(row)))];
  const cell = (value: string | number | null | undefined) =>
    value === null || value === undefined ? '–' : typeof value === 'number' ? formatNumber(value) : value;
  const cells = rows.map((row) => columns.map((column) => cell(row[column])));
  const widths = columns.map((column, i) => Math.max(column.length, ...cells.map((line) => line[i].length)));
  const numeric = columns.map((column) =>
    rows.every((row) => row[column] === null || row[column] === undefined || typeof row[column] === 'number'),
  );
  const pad = (text: string, i: number) => (numeric[i] ? text.padStart(widths[i]) : text.padEnd(widths[i]));
  return [columns.map(pad).join('  '), widths.map((w) => '-'.repeat(w)).join('  '), ...cells.map((line) => line.map(pad).join('  '))].join(
    '\n',
  );
}

/** Four significant digits, or exponent form for very small or large values. */
export function formatNumber(value: number): string {
  if (!Number.isFinite(value)) return String(value);
  if (value === 0) return '0';
  const magnitude = Math.abs(value);
  if (magnitude >= 1e6 || magnitude < 1e-3) return value.toExponential(3);
  return Number(value.toPrecision(4)).toString();
}

/** Writes the report to bench/results/<name>.json and returns the path. */
export function writeResult(name: string, report: BenchReport, extra: Record<string, unknown> = {}): string {
  const directory = new URL('../results/', import.meta.url);
  mkdirSync(directory, { recursive: true });
  const file = new URL(`${name}.json`, directory);
  writeFileSync(file, `${JSON.stringify({ name, ...extra, ...report }, null, 2)}\n`);
  return file.pathname;
}
