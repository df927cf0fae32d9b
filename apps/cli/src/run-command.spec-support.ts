/**
 * Test-only: runs the real `loadwright` command (apps/cli/bin/loadwright.mjs under this Node) and
 * loads the lh reference series and R values from fixtures/reference/.
 */
import { spawnSync } from 'node:child_process';
import { readFileSync } from 'node:fs';
import { fileURLToPath } from 'node:url';

const bin = fileURLToPath(new URL('../bin/loadwright.mjs', import.meta.url));
const fixtures = new URL('../../../fixtures/reference/', import.meta.url);

/** Exit status, standard output and standard error of one run. */
export interface CommandRun {
  /** Exit status (null when killed by a signal). */
  status: number | null;
  /** Everything written to standard output. */
  stdout: string;
  /** Everything written to standard error. */
  stderr: string;
}

/** Runs `loadwright …args` with `stdin` piped in (empty when absent). */
export function runLoadwright(args: string[], stdin = ''): CommandRun {
  const run = spawnSync(process.execPath, [bin, ...args], { input: stdin, encoding: 'utf8', timeout: 60_000 });
  return { status: run.status, stdout: run.stdout, stderr: run.stderr };
}

/** The lh series (R datasets::lh) from fixtures/reference/data/lh.json. */
export function lhValues(): number[] {
  return JSON.parse(readFileSync(new URL('data/lh.json', fixtures), 'utf8')).values as number[];
}

/** R reference values for lh from fixtures/reference/ref/lh.json (layout in fixtures/reference/README.md). */
// The file's layout is documented in its README; specs read the keys they need.
// eslint-disable-next-line @typescript-eslint/no-explicit-any -- reference JSON of documented layout; specs index it freely
export function lhReference(): any {
  return JSON.parse(readFileSync(new URL('ref/lh.json', fixtures), 'utf8'));
}

/** Largest relative difference between two lists (infinite when their lengths differ). */
export function maxRelativeDifference(actual: readonly number[], expected: readonly number[]): number {
  if (actual.length !== expected.length) return Number.POSITIVE_INFINITY;
  return Math.max(...actual.map((v, i) => Math.abs(v - expected[i]) / Math.abs(expected[i])));
}
