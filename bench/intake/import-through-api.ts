/**
 * A 1,000,000-row upload through the product end to end (API in one process, worker in another, the
 * steward's steps over HTTP: upload, confirm the proposed mapping, poll until done), against the
 * import job's own code run directly on the same file (import-one-file.ts), measured side by side and
 * alternated (direct, API, direct, API) so both see the same machine load. Reports each step of the
 * API path, so a gap shows where it comes from.
 *
 * `npm run bench -- import-through-api`
 */
import { execFileSync } from 'node:child_process';
import { fileURLToPath } from 'node:url';
import type { Benchmark, BenchReport } from '../support/harness';

const apiScript = fileURLToPath(new URL('./api-import-one-file.ts', import.meta.url));
const directScript = fileURLToPath(new URL('./import-one-file.ts', import.meta.url));
const rows = 1_000_000;

/** What api-import-one-file.ts prints. */
interface ApiRun {
  rows: number;
  stored: number;
  seconds: number;
  rowsPerSecond: number;
  uploadSeconds: number;
  confirmSeconds: number;
  queuedSeconds: number;
  importSeconds: number;
  noticedSeconds: number;
  importRowsPerSecond: number;
}

/** What import-one-file.ts prints (the fields read here). */
interface DirectRun {
  rows: number;
  stored: number;
  seconds: number;
  rowsPerSecond: number;
}

function child<T>(script: string, extra: string[] = []): T {
  const output = execFileSync(process.execPath, ['--import', 'tsx', ...extra, script, '--rows', String(rows)], {
    encoding: 'utf8',
    stdio: ['ignore', 'pipe', 'inherit'],
  });
  return JSON.parse(output.trim().split('\n').pop()!) as T;
}

const median = (values: number[]) => {
  const sorted = [...values].sort((a, b) => a - b);
  const middle = Math.floor(sorted.length / 2);
  return sorted.length % 2 ? sorted[middle]! : (sorted[middle - 1]! + sorted[middle]!) / 2;
};
const round1 = (value: number) => Math.round(value * 10) / 10;

/** The benchmark. */
export const bench: Benchmark = {
  name: 'import-through-api',
  description: '1M-row CSV upload through the API and a worker process end to end, against the import code run directly, alternated',
  onlyWhenNamed: true,
  run(): BenchReport {
    const direct: DirectRun[] = [];
    const api: ApiRun[] = [];
    for (let i = 0; i < 2; i++) {
      direct.push(child<DirectRun>(directScript, ['--expose-gc']));
      api.push(child<ApiRun>(apiScript));
    }
    const directRate = Math.round(median(direct.map((r) => r.rowsPerSecond)));
    const apiRate = Math.round(median(api.map((r) => r.rowsPerSecond)));
    const importRate = Math.round(median(api.map((r) => r.importRowsPerSecond)));
    const step = (key: keyof ApiRun) => round1(median(api.map((r) => r[key] as number)));
    return {
      rows: [
        ...direct.map((r, i) => ({ run: `direct import ${i + 1}`, seconds: round1(r.seconds), 'rows/s': r.rowsPerSecond })),
        ...api.map((r, i) => ({
          run: `through the API ${i + 1}`,
          seconds: round1(r.seconds),
          'rows/s': r.rowsPerSecond,
          'upload s': round1(r.uploadSeconds),
          'confirm s': round1(r.confirmSeconds),
          'queued s': round1(r.queuedSeconds),
          'import s': round1(r.importSeconds),
          'noticed s': round1(r.noticedSeconds),
        })),
      ],
      notes: [
        `End to end through the API: ${apiRate} rows/s, ${Math.round((apiRate / directRate) * 100)} % of the direct import's ${directRate} rows/s measured alternately in this run.`,
        `The worker's import step alone ran at ${importRate} rows/s (${Math.round((importRate / directRate) * 100)} % of direct): the same code, in its own process.`,
        `Steps around it (medians): upload ${step('uploadSeconds')} s (multipart body to disk, SHA-256, sniff, proposal), confirm ${step('confirmSeconds')} s, waiting in the queue ${step('queuedSeconds')} s, noticing "done" ${step('noticedSeconds')} s.`,
        'Rows per second depend on what else the two cores do: compare ratios within one run, never numbers from runs at different times.',
      ],
      checks: [
        {
          name: 'every row stored through the API',
          passed: api.every((r) => r.stored === rows),
          detail: api.map((r) => r.stored).join(', '),
        },
        {
          name: 'the API path keeps at least 75 % of the direct import rate',
          passed: apiRate >= 0.75 * directRate,
          detail: `${apiRate} vs ${directRate} rows/s`,
        },
      ],
      data: { direct, api },
    };
  },
};
