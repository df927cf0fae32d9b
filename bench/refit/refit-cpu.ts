/**
 * CPU of the refit's computing half per series, side by side with earlier versions of it, and the nightly
 * time it implies for 10,000 series on this 2-core machine.
 *
 * What is timed: fitSeriesModel (the `auto` choice, diagnostics, the 168-hour forecast and its bands) with
 * the refit's default settings on windows of real hourly load, PJM East 2002 (fixtures/reference/data/
 * pjm-east-2002.json names the source): 8 windows of 8,592 hours (358 days; the nightly default is 365
 * days, which this one-year fixture cannot give 8 times) ending at the last 8 midnights of 2002. Each
 * version runs in a process of its own (bench/support/refit-cpu-child.ts) from a checkout of its commit,
 * after eight untimed warm-up fits (one of each window), since a worker fits thousands of series in one warm
 * process: what the nightly run pays is the steady state, and two warm-ups left the larger code half-compiled. The
 * versions take turns, round after round, so machine load falls on all of them alike; ratios are of
 * medians over rounds. CPU time (process.cpuUsage) is used, not wall time: other work on the shared
 * cores inflates wall time, far less CPU time.
 *
 * Projection: 10,000 × (CPU ms per series, scaled linearly from 8,592 to 8,760 hours) / 2 cores. The
 * database's and the job's own work (read, write) come on top: bench/refit/nightly-refit.ts measures those.
 *
 * Versions (REFIT_CPU_REFERENCES=<commit>[,<commit>…] replaces the list): c7c65e0, the `auto` before the
 * fixed candidate set (three candidates within a 130 ms CPU budget, 3 backtest origins, Gaussian bands);
 * 362b3aa, the fixed seven-candidate set with calibrated bands as first built; and this tree.
 * REFIT_CPU_ROUNDS sets the rounds (default 3), REFIT_CPU_REPEATS the timed fits of each window per round (default 3).
 */
import { execFileSync, spawn } from 'node:child_process';
import { mkdtempSync, rmSync, symlinkSync } from 'node:fs';
import { loadavg, tmpdir } from 'node:os';
import { join, resolve } from 'node:path';
import type { Benchmark, BenchReport } from '../support/harness';
import type { WindowTiming } from '../support/refit-cpu-child';

const repoRoot = resolve(import.meta.dirname, '../..');
const WINDOW_HOURS = 8592;
const NIGHTLY_HOURS = 8760;
const ENDS = Array.from({ length: 8 }, (_, k) => NIGHTLY_HOURS - 24 * (7 - k));
const GOAL_SERIES = 10_000;
const GOAL_MINUTES = 15;
const CORES = 2;
/** Untimed fits before the timed ones: one of each window. */
const WARMUP_FITS = 8;
/** Timed fits of each window per round, averaged (REFIT_CPU_REPEATS; default 3): steadier than one. */
const TIMED_FITS = Math.max(1, Number(process.env['REFIT_CPU_REPEATS'] ?? 3));

/** A version of the refit to time. */
interface Version {
  name: string;
  meaning: string;
  tree: string;
}

/** Earlier versions side by side, with what each one was. */
const knownReferences: Record<string, string> = {
  c7c65e0: 'auto before the fixed candidate set (130 ms budget, Gaussian bands)',
  '362b3aa': 'fixed seven-candidate set, calibrated bands, before the cost cuts',
};

/** Extracts the libraries of `commit` into a temporary tree that shares this checkout's node_modules. */
function checkout(commit: string): string {
  const tree = mkdtempSync(join(tmpdir(), `loadwright-refit-${commit}-`));
  const archive = execFileSync('git', ['archive', commit, 'libs', 'tsconfig.json', 'package.json'], { cwd: repoRoot, maxBuffer: 1 << 28 });
  execFileSync('tar', ['-x', '-C', tree], { input: archive });
  symlinkSync(join(repoRoot, 'node_modules'), join(tree, 'node_modules'));
  return tree;
}

/** Runs one timed pass of `version` in a child process. */
function timePass(version: Version): Promise<WindowTiming[]> {
  const child = spawn(
    process.execPath,
    [
      '--import',
      'tsx',
      join(repoRoot, 'bench/support/refit-cpu-child.ts'),
      String(WINDOW_HOURS),
      ENDS.join(','),
      String(WARMUP_FITS),
      String(TIMED_FITS),
    ],
    { cwd: version.tree, stdio: ['ignore', 'pipe', 'inherit'] },
  );
  let out = '';
  child.stdout.on('data', (chunk: Buffer) => (out += chunk.toString()));
  return new Promise((done, fail) => {
    child.once('exit', (code) => {
      if (code !== 0) return fail(new Error(`${version.name}: the timing process exited with ${code}`));
      done((JSON.parse(out.trim().split('\n').at(-1)!) as { timings: WindowTiming[] }).timings);
    });
  });
}

/** Median of a list. */
function median(values: number[]): number {
  const sorted = [...values].sort((a, b) => a - b);
  const middle = sorted.length >> 1;
  return sorted.length % 2 ? sorted[middle]! : (sorted[middle - 1]! + sorted[middle]!) / 2;
}

/** See the file comment. */
export const bench: Benchmark = {
  name: 'refit-cpu',
  description: 'CPU per series of the refit (auto, diagnostics, forecast, bands) on real PJM load windows, beside earlier versions',
  onlyWhenNamed: true,
  async run(): Promise<BenchReport> {
    const rounds = Number(process.env['REFIT_CPU_ROUNDS'] ?? 3);
    const commits = (process.env['REFIT_CPU_REFERENCES'] ?? Object.keys(knownReferences).join(','))
      .split(',')
      .map((c) => c.trim())
      .filter(Boolean);
    const notes: string[] = [];
    const versions: Version[] = [];
    const made: string[] = [];
    for (const commit of commits) {
      try {
        const tree = checkout(commit);
        made.push(tree);
        versions.push({ name: commit, meaning: knownReferences[commit] ?? 'reference commit', tree });
      } catch (error) {
        notes.push(`${commit} left out: it could not be checked out (${(error as Error).message.split('\n')[0]})`);
      }
    }
    versions.push({ name: 'this tree', meaning: 'the working tree', tree: repoRoot });
    const passes = new Map<string, WindowTiming[][]>(versions.map((v) => [v.name, []]));
    const loads: number[] = [];
    try {
      for (let round = 0; round < rounds; round++) {
        loads.push(loadavg()[0]);
        // Rotate the order each round so no version always runs first (or last) in a quiet or busy spell.
        for (let i = 0; i < versions.length; i++) {
          const version = versions[(i + round) % versions.length]!;
          const timings = await timePass(version);
          passes.get(version.name)!.push(timings);
          const mean = timings.reduce((s, t) => s + t.cpuMs, 0) / timings.length;
          console.log(`  progress: round ${round + 1}/${rounds} ${version.name}: ${mean.toFixed(0)} ms CPU per series`);
        }
      }
    } finally {
      for (const tree of made) rmSync(tree, { recursive: true, force: true });
    }

    // Per version: the mean over windows of each round, then the median over rounds.
    const perSeries = (name: string, of: (t: WindowTiming) => number = (t) => t.cpuMs) =>
      median(passes.get(name)!.map((pass) => pass.reduce((s, t) => s + of(t), 0) / pass.length));
    const fitOnly = (t: WindowTiming) => t.fitCpuMs;
    const currentFit = perSeries('this tree', fitOnly);
    const projected = (ms: number) => (((ms * NIGHTLY_HOURS) / WINDOW_HOURS) * GOAL_SERIES) / CORES / 60_000;
    const current = perSeries('this tree');
    const rows = versions.map((v) => {
      const ms = perSeries(v.name);
      const chosen = new Map<string, number>();
      for (const t of passes.get(v.name)![0]!) chosen.set(t.chosen, (chosen.get(t.chosen) ?? 0) + 1);
      return {
        version: v.name,
        what: v.meaning,
        'CPU ms/series': Math.round(ms),
        'min round': Math.round(Math.min(...passes.get(v.name)!.map((p) => p.reduce((s, t) => s + t.cpuMs, 0) / p.length))),
        'this tree ÷ it': Number((current / ms).toFixed(2)),
        'fit CPU ms/series': Math.round(perSeries(v.name, fitOnly)),
        'fit: this tree ÷ it': Number((currentFit / perSeries(v.name, fitOnly)).toFixed(2)),
        [`${GOAL_SERIES} series min (2 cores)`]: Number(projected(ms).toFixed(1)),
        chose: [...chosen].map(([label, count]) => `${label} ×${count}`).join('; '),
      };
    });
    const digests = passes.get('this tree')!.map((pass) => pass.map((t) => t.digest).join(','));
    const stable = digests.every((d) => d === digests[0]);
    notes.push(
      `${ENDS.length} windows of ${WINDOW_HOURS} h of PJM East 2002 ending at hours ${ENDS[0]}–${ENDS.at(-1)}; refit defaults, no temperature, US holidays; ${rounds} rounds of ${TIMED_FITS} timed fits per window after ${WARMUP_FITS} untimed; 1-minute load average at each round: ${loads.map((l) => l.toFixed(1)).join(', ')}`,
      `projection: ${GOAL_SERIES} × CPU ms per series × ${NIGHTLY_HOURS}/${WINDOW_HOURS} / ${CORES} cores; the database and the job's reading and writing are not included (bench/refit/nightly-refit.ts)`,
      'CPU ms/series is the median over rounds of the mean over windows; "this tree ÷ it" is the ratio of those medians',
      'fit CPU = the fit phase alone as each version records it (timings.fitCpu: choosing and estimating the model, i.e. auto with its backtest); the rest of CPU ms/series is diagnostics, the 168 h forecast and, in this tree, the calibrated bands',
    );
    const goalMs = (GOAL_MINUTES * 60_000 * CORES) / GOAL_SERIES;
    return {
      rows,
      notes,
      checks: [
        {
          name: `${GOAL_SERIES} series within ${GOAL_MINUTES} minutes on ${CORES} cores (at most ${goalMs} ms CPU per series)`,
          passed: projected(current) <= GOAL_MINUTES,
          detail: `${current.toFixed(0)} ms per ${WINDOW_HOURS}-hour window: ${projected(current).toFixed(1)} min`,
        },
        ...(versions.some((v) => v.name === 'c7c65e0')
          ? [
              {
                name: "fit CPU per series no more than the older auto's (c7c65e0), medians over rounds",
                passed: currentFit <= perSeries('c7c65e0', fitOnly),
                detail: `${currentFit.toFixed(0)} ms against ${perSeries('c7c65e0', fitOnly).toFixed(0)} ms`,
              },
            ]
          : []),
        {
          name: 'the same forecasts (mean and bounds) in every round',
          passed: stable,
          detail: stable ? `${rounds} identical rounds` : `rounds differ: ${digests.join(' | ')}`,
        },
      ],
      data: { windowHours: WINDOW_HOURS, ends: ENDS, passes: Object.fromEntries(passes) },
    };
  },
};
