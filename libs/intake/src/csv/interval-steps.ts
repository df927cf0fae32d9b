/**
 * The interval between a file's readings, judged from steps between consecutive distinct times seen
 * in windows spread through the whole file (not only its first rows, which may be a stray start):
 * the most common step is the interval; a step that is a whole multiple of it is a gap, while a
 * shorter step, or one that is no multiple, is a second interval. When second intervals make up a
 * noticeable share of the steps, the file mixes intervals and says so instead of choosing quietly.
 */
import type { FileHandle } from 'node:fs/promises';
import { parse } from 'csv-parse/sync';
import { parseTimestamp } from './parse-timestamp';

/** Steps longer than a day are gaps or stray dates, never an interval. */
const longestInterval = 1440;

/** Share of steps at another interval from which a file counts as mixing intervals (common practice: a clear minority, not noise). */
export const mixedShare = 0.05;

/** Counts of steps in minutes. */
export type StepCounts = Map<number, number>;

/** Adds the steps between consecutive distinct times (epoch ms) of one run of rows. */
export function countSteps(times: readonly number[], into: StepCounts = new Map()): StepCounts {
  const distinct = [...new Set(times)].sort((a, b) => a - b);
  for (let i = 1; i < distinct.length; i++) {
    const minutes = (distinct[i]! - distinct[i - 1]!) / 60_000;
    if (Number.isInteger(minutes) && minutes > 0) into.set(minutes, (into.get(minutes) ?? 0) + 1);
  }
  return into;
}

/** What the steps say: the interval (null when none), and the steps at other intervals with their share. */
export interface IntervalJudgement {
  intervalMinutes: number | null;
  /** Steps that are neither the interval nor a gap of whole intervals, most common first. */
  otherIntervals: Array<{ minutes: number; share: number }>;
  /** True when other intervals make up at least `mixedShare` of the steps. */
  mixed: boolean;
}

/** Judges the interval from step counts: the most common step (the shorter on a tie). */
export function judgeInterval(steps: StepCounts): IntervalJudgement {
  let best: number | null = null;
  let total = 0;
  for (const [minutes, count] of steps) {
    total += count;
    if (minutes > longestInterval) continue;
    if (best === null || count > steps.get(best)! || (count === steps.get(best)! && minutes < best)) best = minutes;
  }
  if (best === null) return { intervalMinutes: null, otherIntervals: [], mixed: false };
  const others = [...steps]
    .filter(([minutes]) => minutes !== best && (minutes < best || minutes % best !== 0))
    .sort((a, b) => b[1] - a[1] || a[0] - b[0])
    .map(([minutes, count]) => ({ minutes, share: count / total }));
  const otherShare = others.reduce((sum, other) => sum + other.share, 0);
  return { intervalMinutes: best, otherIntervals: others.slice(0, 3), mixed: otherShare >= mixedShare };
}

/** Where the timestamps are and how to read them. */
export interface StepSampling {
  delimiter: string;
  timestampColumn: number;
  dayFirst: boolean;
}

/** Windows read through the file, and bytes in each. */
const windows = 32;
const windowBytes = 16 * 1024;

/**
 * Step counts of up to `windows` windows spread evenly through a UTF-8 file from `from` bytes on; each
 * window's steps are counted alone, so no step spans two windows. Windows whose rows do not parse
 * are skipped.
 */
export async function sampleSteps(handle: FileHandle, size: number, from: number, how: StepSampling): Promise<StepCounts> {
  const steps: StepCounts = new Map();
  // Windows never overlap, so no step is counted twice: a short rest of the file gets fewer of them.
  const count = Math.min(windows, Math.floor((size - from) / windowBytes));
  if (count === 0) return steps;
  const buffer = Buffer.alloc(windowBytes);
  const stride = count === 1 ? 0 : (size - from - windowBytes) / (count - 1);
  for (let k = 0; k < count; k++) {
    const { bytesRead } = await handle.read(buffer, 0, windowBytes, Math.floor(from + k * stride));
    const text = buffer.subarray(0, bytesRead).toString('utf8');
    // Whole lines only: drop the partial first and last lines; quoted fields spanning lines are rare in exports.
    const lines = text.slice(text.indexOf('\n') + 1, text.lastIndexOf('\n'));
    let rows: string[][];
    try {
      rows = parse(lines, { delimiter: how.delimiter, relax_column_count: true, skip_empty_lines: true, relax_quotes: true }) as string[][];
    } catch {
      continue;
    }
    const times: number[] = [];
    for (const row of rows) {
      const stamp = parseTimestamp(row[how.timestampColumn] ?? '', how.dayFirst);
      if (stamp) times.push(stamp.kind === 'instant' ? stamp.ms : stamp.wallMs);
    }
    countSteps(times, steps);
  }
  return steps;
}
