/**
 * Helpers of the fault tests: worker processes started (and killed) as `npm start` starts them, a
 * PostgreSQL server of the test's own that it may stop and start, and a load file big enough that an
 * import takes several seconds.
 */
import { spawn, type ChildProcess } from 'node:child_process';
import { chmodSync, mkdtempSync, rmSync } from 'node:fs';
import { createServer } from 'node:net';
import { tmpdir } from 'node:os';
import { join, resolve } from 'node:path';
import { migrate } from '@loadwright/db';
import { createDatabase, localUrl, startPostgres, stopPostgres, type PostgresLocation } from '../../scripts/postgres';

const repoRoot = resolve(import.meta.dirname, '../..');

/** A worker process and what it printed. */
export interface WorkerProcess {
  child: ChildProcess;
  output: () => string;
  exited: Promise<number | null>;
}

/**
 * Starts jobs/worker.ts as `npm start` does (node --import tsx, so the pid is the worker's own), beating
 * every second so a killed worker counts as dead after 3 s.
 */
export function startWorker(databaseUrl: string, name: string): WorkerProcess {
  let text = '';
  const child = spawn(process.execPath, ['--import', 'tsx', 'jobs/worker.ts'], {
    cwd: repoRoot,
    env: {
      ...process.env,
      DATABASE_URL: databaseUrl,
      WORKER_NAME: name,
      WORKER_HEARTBEAT_SECONDS: '1',
      WORKER_CONCURRENCY: '2',
      LOG_LEVEL: 'warn',
      REFIT_RETRY_DELAY_SECONDS: '2',
    },
    stdio: ['ignore', 'pipe', 'pipe'],
  });
  child.stdout!.on('data', (chunk) => (text += chunk));
  child.stderr!.on('data', (chunk) => (text += chunk));
  const exited = new Promise<number | null>((done) => child.once('exit', (code) => done(code)));
  return { child, output: () => text, exited };
}

/** Kills a worker outright (SIGKILL: no handler runs, no connection is closed politely). */
export async function killWorker(worker: WorkerProcess): Promise<void> {
  worker.child.kill('SIGKILL');
  await worker.exited;
}

/** Stops a worker that is still running, politely. */
export async function stopWorker(worker: WorkerProcess | undefined): Promise<void> {
  if (!worker || worker.child.exitCode !== null || worker.child.signalCode !== null) return;
  worker.child.kill('SIGTERM');
  await worker.exited;
}

/** Polls `check` every 100 ms until it returns a value other than undefined. */
export async function waitFor<T>(check: () => Promise<T | undefined> | T | undefined, what: string, timeoutMs = 60_000): Promise<T> {
  const deadline = Date.now() + timeoutMs;
  for (;;) {
    const value = await check();
    if (value !== undefined) return value;
    if (Date.now() > deadline) throw new Error(`timed out after ${timeoutMs} ms waiting for ${what}`);
    await new Promise((done) => setTimeout(done, 100));
  }
}

/** A free loopback port. */
export async function freePort(): Promise<number> {
  const server = createServer();
  await new Promise<void>((done) => server.listen(0, '127.0.0.1', done));
  const { port } = server.address() as { port: number };
  await new Promise<void>((done) => server.close(() => done()));
  return port;
}

/** A PostgreSQL server of this test's own, in a temporary folder on a free port, so stopping it stops no one else's. */
export interface OwnPostgres {
  /** URL of its migrated `loadwright` database. */
  url: string;
  stop(): Promise<void>;
  start(): Promise<void>;
  /** Stops the server and deletes its folder. */
  destroy(): Promise<void>;
}

/** Initialises, starts and migrates a server of the test's own (initdb takes a few seconds). */
export async function startOwnPostgres(): Promise<OwnPostgres> {
  const folder = mkdtempSync(join(tmpdir(), 'lw-faults-pg-'));
  chmodSync(folder, 0o755); // PostgreSQL runs as its own OS user when we are root, and must reach its folder
  const location: PostgresLocation = { dataDir: join(folder, 'postgres'), port: await freePort(), binDir: '/usr/lib/postgresql/15/bin' };
  await startPostgres(location);
  await createDatabase(localUrl(location, 'postgres'), 'loadwright');
  const url = localUrl(location, 'loadwright');
  await migrate(url);
  return {
    url,
    stop: () => stopPostgres(location),
    start: async () => {
      await startPostgres(location);
    },
    async destroy() {
      await stopPostgres(location);
      rmSync(folder, { recursive: true, force: true });
    },
  };
}

/** Series keys of the load file. */
export const loadFileSeries = Array.from({ length: 12 }, (_, i) => `fdr-${i + 1}`);

/**
 * A long-format hourly load file (timestamp, series, value_kw) of `hours` hours for each of the 12
 * series, from 2015-01-01T00:00Z, with a daily cycle and no gaps: `hours` × 12 readings, every one
 * distinct by (series, hour), so the stored count must equal that product exactly.
 */
export function loadFile(hours: number): Buffer {
  const lines = ['timestamp,series,value_kw'];
  const start = Date.UTC(2015, 0, 1);
  for (let h = 0; h < hours; h++) {
    const ts = new Date(start + h * 3_600_000).toISOString();
    const daily = Math.sin(((h % 24) / 24) * 2 * Math.PI - Math.PI / 2);
    for (let s = 1; s <= loadFileSeries.length; s++) lines.push(`${ts},fdr-${s},${(400 + 40 * s + 120 * daily).toFixed(1)}`);
  }
  return Buffer.from(lines.join('\n') + '\n', 'utf8');
}
