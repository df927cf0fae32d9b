/**
 * `npm start` as a person runs it: it comes up with the demo data and says where; a second start says
 * the first is running; Ctrl-C stops what it started; a PostgreSQL left behind by a killed start is
 * reused, not duplicated; a worker killed outright is started again while the API keeps serving. Runs
 * the real script against its own data folder and ports.
 */
import { spawn, type ChildProcess } from 'node:child_process';
import { chmodSync, mkdtempSync, rmSync } from 'node:fs';
import { createServer } from 'node:net';
import { tmpdir } from 'node:os';
import { join, resolve } from 'node:path';
import { afterAll, describe, expect, it } from 'vitest';
import { defaultLocation, stopPostgres } from '../../scripts/postgres';

const repoRoot = resolve(import.meta.dirname, '../..');
const dataDir = mkdtempSync(join(tmpdir(), 'lw-start-'));
chmodSync(dataDir, 0o755); // PostgreSQL runs as its own OS user when we are root, and must reach its folder
let env: NodeJS.ProcessEnv;

async function freePort(): Promise<number> {
  const server = createServer();
  await new Promise<void>((done) => server.listen(0, '127.0.0.1', done));
  const { port } = server.address() as { port: number };
  await new Promise<void>((done) => server.close(() => done()));
  return port;
}

/** Runs `npm start`'s script and collects its output. */
function start(): { child: ChildProcess; output: () => string; exited: Promise<number | null> } {
  let text = '';
  const { DATABASE_URL: _ignored, ...rest } = process.env;
  const child = spawn(process.execPath, ['--import', 'tsx', 'scripts/start.ts'], {
    cwd: repoRoot,
    env: { ...rest, ...env },
    stdio: ['ignore', 'pipe', 'pipe'],
  });
  child.stdout!.on('data', (chunk) => (text += chunk));
  child.stderr!.on('data', (chunk) => (text += chunk));
  const exited = new Promise<number | null>((done) => child.once('exit', (code) => done(code)));
  return { child, output: () => text, exited };
}

async function waitFor(condition: () => boolean | Promise<boolean>, what: string, ms = 180_000): Promise<void> {
  const deadline = Date.now() + ms;
  while (Date.now() < deadline) {
    if (await condition()) return;
    await new Promise((r) => setTimeout(r, 250));
  }
  throw new Error(`timed out waiting for ${what}`);
}

/** The part of the health report these checks read. */
interface Health {
  status: string;
  workers?: { processes: Array<{ name: string; pid: number; live: boolean }> };
}

async function healthOf(port: number): Promise<Health | null> {
  try {
    const response = await fetch(`http://127.0.0.1:${port}/api/health`);
    return (await response.json()) as Health;
  } catch {
    return null;
  }
}

afterAll(async () => {
  await stopPostgres(defaultLocation({ LOADWRIGHT_DATA_DIR: dataDir }));
  rmSync(dataDir, { recursive: true, force: true });
});

describe('npm start', () => {
  it('runs with demo data, refuses a second start, reuses a PostgreSQL left by a killed start, and stops on Ctrl-C', async () => {
    const port = await freePort();
    env = { LOADWRIGHT_DATA_DIR: dataDir, LOADWRIGHT_PG_PORT: String(await freePort()), PORT: String(port), LOG_LEVEL: 'warn' };

    const first = start();
    await waitFor(() => first.output().includes('Loadwright is running at') || first.child.exitCode !== null, 'the first start');
    expect(first.output()).toContain('Loadwright is running at');
    expect(first.output()).toContain('PostgreSQL started on 127.0.0.1');
    expect(first.output()).toContain('Seeded the demo cooperative.');
    expect(first.output()).toMatch(/planner\s+planner@tallowmere\.example/);
    await waitFor(async () => (await healthOf(port))?.status === 'ok', 'a healthy API');
    const page = await fetch(`http://127.0.0.1:${port}/`);
    expect(await page.text()).toContain('<title>Loadwright</title>');
    // The first start refits every demo series once a worker is up, instead of waiting for the nightly hour.
    await waitFor(() => /Started the first refit of every demo series \(run \d+\)/.test(first.output()), 'the first refit to start');

    const second = start();
    expect(await second.exited).toBe(1);
    expect(second.output()).toMatch(/Loadwright is already running from this folder \(process \d+/);

    // A start killed outright: its API and worker follow it, PostgreSQL stays behind.
    first.child.kill('SIGKILL');
    await first.exited;
    await waitFor(async () => (await healthOf(port)) === null, 'the API to stop with its parent', 20_000);

    const third = start();
    await waitFor(() => third.output().includes('Loadwright is running at'), 'the third start');
    expect(third.output()).toContain('already running on 127.0.0.1');
    expect(third.output()).not.toContain('Seeded the demo cooperative.');
    await waitFor(async () => (await healthOf(port))?.status === 'ok', 'a healthy API again');

    // A worker killed outright is started again (after 1 s, restartPolicy) and nothing else stops.
    const liveWorkers = async () => ((await healthOf(port))?.workers?.processes ?? []).filter((w) => w.live);
    const [killed] = await liveWorkers();
    expect(killed?.name).toBe('worker-1');
    process.kill(killed!.pid, 'SIGKILL');
    await waitFor(
      () => third.output().includes('The worker 1 process was killed (SIGKILL); starting it again in 1 s.'),
      'the restart notice',
      20_000,
    );
    await waitFor(async () => (await liveWorkers()).some((w) => w.pid !== killed!.pid), 'a new live worker', 60_000);
    expect(third.child.exitCode).toBeNull();
    expect(third.output()).not.toContain('stopping the rest');
    expect((await fetch(`http://127.0.0.1:${port}/`)).status).toBe(200);

    third.child.kill('SIGINT');
    expect(await third.exited).toBe(0);
    expect(third.output()).toContain('Stopped.');
    expect(await healthOf(port)).toBeNull();
  }, 480_000);
});
