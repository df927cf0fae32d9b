/**
 * A 1,000,000-row upload through the product end to end (API in one process, worker in another, the
 * steward's steps over HTTP: upload, confirm the proposed mapping, poll until done), against the
 * import job's own code run directly on the same file (import-one-file.ts), measured side by side and
 * alternated (direct, API, direct, API) so both see the same machine load. Then the database's own
 * pace for the same readings: the seed's plain insert into observations, and the same insert with the
 * table's primary key and reference checks removed (their upkeep is the difference).
 *
 * Reports where the end-to-end time goes, stage by stage: the steward's steps around the import
 * (upload receipt, confirm, job hand-off, noticing "done") and the import's own stages as the worker
 * records them (read = parse and convert, screen, validate = the rules, write = insert with index
 * upkeep, findings), each as a share of the end-to-end time.
 *
 * `npm run bench -- import-through-api`
 */
import { execFileSync } from 'node:child_process';
import { fileURLToPath } from 'node:url';
import type { Benchmark, BenchReport } from '../support/harness';

const apiScript = fileURLToPath(new URL('./api-import-one-file.ts', import.meta.url));
const directScript = fileURLToPath(new URL('./import-one-file.ts', import.meta.url));
const rows = 1_000_000;

/** Seconds per stage of the import, as the import records them. */
interface Stages {
  read: number;
  screen: number;
  validate: number;
  write: number;
  findings: number;
}

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
  stages: Stages;
}

/** What import-one-file.ts prints (the fields read here). */
interface DirectRun {
  rows: number;
  stored: number;
  seconds: number;
  rowsPerSecond: number;
  stages: Stages | null;
}

function child<T>(script: string, extra: string[] = [], mode?: string): T {
  const output = execFileSync(
    process.execPath,
    ['--import', 'tsx', ...extra, script, '--rows', String(rows), ...(mode ? ['--mode', mode] : [])],
    { encoding: 'utf8', stdio: ['ignore', 'pipe', 'inherit'] },
  );
  return JSON.parse(output.trim().split('\n').pop()!) as T;
}

const median = (values: number[]) => {
  const sorted = [...values].sort((a, b) => a - b);
  const middle = Math.floor(sorted.length / 2);
  return sorted.length % 2 ? sorted[middle]! : (sorted[middle - 1]! + sorted[middle]!) / 2;
};
const round1 = (value: number) => Math.round(value * 10) / 10;
const stageNames: Array<keyof Stages> = ['read', 'screen', 'validate', 'write', 'findings'];

/** The benchmark. */
export const bench: Benchmark = {
  name: 'import-through-api',
  description:
    '1M-row CSV upload through the API and a worker process end to end, against the import code run directly, alternated; where the time goes, stage by stage, beside the plain insert with and without index upkeep',
  onlyWhenNamed: true,
  run(): BenchReport {
    const direct: DirectRun[] = [];
    const api: ApiRun[] = [];
    for (let i = 0; i < 2; i++) {
      direct.push(child<DirectRun>(directScript, ['--expose-gc']));
      api.push(child<ApiRun>(apiScript));
    }
    const plain = child<DirectRun>(directScript, ['--expose-gc'], 'reference');
    const unindexed = child<DirectRun>(directScript, ['--expose-gc'], 'reference-unindexed');

    const directRate = Math.round(median(direct.map((r) => r.rowsPerSecond)));
    const apiRate = Math.round(median(api.map((r) => r.rowsPerSecond)));
    const importRate = Math.round(median(api.map((r) => r.importRowsPerSecond)));
    const step = (key: keyof ApiRun) => round1(median(api.map((r) => r[key] as number)));
    const apiStage = (stage: keyof Stages) => median(api.map((r) => r.stages[stage]));
    const directStage = (stage: keyof Stages) => median(direct.map((r) => r.stages?.[stage] ?? Number.NaN));
    const endToEnd = median(api.map((r) => r.seconds));
    const share = (seconds: number) => `${Math.round((seconds / endToEnd) * 100)} %`;
    const stageRow = (name: string, seconds: number, what: string, directSeconds?: number) => ({
      run: `stage: ${name}`,
      seconds: round1(seconds),
      'share of end to end': share(seconds),
      'direct s': directSeconds === undefined ? '—' : round1(directSeconds),
      what,
    });
    const stageWords: Record<keyof Stages, string> = {
      read: 'stream the file: CSV fields, timestamps, numbers, units, daylight-saving placement',
      screen: 'duplicates, off-grid and future readings, stored intervals in gaps',
      validate: 'the validation rules (spikes, flat lines, gaps) and estimates',
      write: 'insert into observations, primary-key upkeep and reference checks included',
      findings: 'store the findings and the upload row',
    };
    // What the index and checks cost the database alone, per million readings.
    const upkeep = plain.seconds - unindexed.seconds;
    const writeSeconds = apiStage('write');
    const aroundImport = step('uploadSeconds') + step('confirmSeconds') + step('queuedSeconds') + step('noticedSeconds');
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
        { run: 'plain insert of the same readings', seconds: round1(plain.seconds), 'rows/s': plain.rowsPerSecond },
        { run: 'plain insert without primary key and checks', seconds: round1(unindexed.seconds), 'rows/s': unindexed.rowsPerSecond },
        stageRow('upload receipt', step('uploadSeconds'), 'multipart body to disk, SHA-256, sniff with sampled interval, proposal'),
        stageRow('confirm', step('confirmSeconds'), 'plan check, job enqueued with the status change'),
        stageRow('job hand-off', step('queuedSeconds'), 'waiting until a worker polls the queue and starts'),
        ...stageNames.map((stage) => stageRow(stage, apiStage(stage), stageWords[stage], directStage(stage))),
        stageRow('noticing "done"', step('noticedSeconds'), "the steward's next poll (every 250 ms)"),
      ],
      notes: [
        `End to end through the API: ${apiRate} rows/s, ${Math.round((apiRate / directRate) * 100)} % of the direct import's ${directRate} rows/s measured alternately in this run; the worker's import step alone ran at ${importRate} rows/s.`,
        `The steps around the import (upload receipt, confirm, job hand-off, noticing "done") take ${round1(aroundImport)} s of the ${round1(endToEnd)} s (${share(aroundImport)}); the rest is the import itself.`,
        `Inside the import: reading ${share(apiStage('read'))}, screening ${share(apiStage('screen'))}, the rules ${share(apiStage('validate'))}, writing ${share(writeSeconds)}, findings ${share(apiStage('findings'))} (writing one series overlaps validating the next, so stages may add up to more than the import).`,
        `The database alone took ${round1(plain.seconds)} s for the same million readings (${plain.rowsPerSecond} rows/s), of which the primary key and reference checks ${round1(upkeep)} s (${Math.round((upkeep / plain.seconds) * 100)} %, against ${round1(unindexed.seconds)} s without them): the write stage (${round1(writeSeconds)} s) is ${(writeSeconds / plain.seconds).toFixed(2)}× that plain insert.`,
        'Rows per second depend on what else the two cores do: compare ratios within one run, never numbers from runs at different times (the 204k rows/s of intake-import came from a quiet machine).',
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
      data: { direct, api, plain, unindexed },
    };
  },
};
