/** Starts the product's processes as children and stops them together. */
import { spawn, type ChildProcess } from 'node:child_process';
import { resolve } from 'node:path';

const repoRoot = resolve(import.meta.dirname, '..');

/** A running child process with a name for messages. */
export interface NamedChild {
  name: string;
  process: ChildProcess;
}

/** Runs a TypeScript entry point with tsx so the PID we hold is the program's own (not a wrapper's). */
export function startTypeScript(name: string, entry: string, env: NodeJS.ProcessEnv): NamedChild {
  // Standard input stays an open pipe: when this process dies, even by SIGKILL, the child sees it close and stops.
  const child = spawn(process.execPath, ['--import', 'tsx', resolve(repoRoot, entry)], {
    cwd: repoRoot,
    env: { ...env, LOADWRIGHT_SUPERVISED: '1' },
    stdio: ['pipe', 'inherit', 'inherit'],
  });
  return { name, process: child };
}

/** Resolves with the first child to exit on its own, so the caller can stop the rest. */
export function firstExit(children: NamedChild[]): Promise<{ name: string; code: number | null }> {
  return new Promise((done) => {
    for (const { name, process: child } of children) child.once('exit', (code) => done({ name, code }));
  });
}

/** Sends SIGTERM to every child still running and waits (at most `graceMs`) before SIGKILL. */
export async function stopAll(children: NamedChild[], graceMs = 10_000): Promise<void> {
  await Promise.all(
    children.map(({ process: child }) => {
      if (child.exitCode !== null || child.signalCode !== null) return Promise.resolve();
      return new Promise<void>((done) => {
        const timer = setTimeout(() => child.kill('SIGKILL'), graceMs);
        child.once('exit', () => {
          clearTimeout(timer);
          done();
        });
        child.kill('SIGTERM');
      });
    }),
  );
}

/**
 * When a supervised child that stopped on its own is started again: after 1 s, then 2, 4, 8 … doubling
 * up to 60 s between attempts, for as long as it keeps failing (it is never given up on: a worker that
 * cannot reach its database comes back when the database does). A run that lasted 5 minutes counts as
 * healthy and the next failure waits 1 s again.
 */
export const restartPolicy = { firstDelayMs: 1_000, maxDelayMs: 60_000, healthyRunMs: 300_000 };

/** The wait before the next start, given the previous wait (null for none yet) and how long the last run lasted. */
export function nextRestartDelay(previousDelayMs: number | null, ranForMs: number, policy = restartPolicy): number {
  if (previousDelayMs === null || ranForMs >= policy.healthyRunMs) return policy.firstDelayMs;
  return Math.min(policy.maxDelayMs, previousDelayMs * 2);
}

/** A child that is started again whenever it stops on its own. */
export interface SupervisedChild {
  name: string;
  /** The process running now (undefined while waiting to restart). */
  current(): ChildProcess | undefined;
  /** Stops restarting and stops the child (SIGTERM, then SIGKILL after `graceMs`). */
  stop(graceMs?: number): Promise<void>;
}

/** Runs `start()` now and again after each exit not asked for, waiting as {@link nextRestartDelay} says. */
export function supervise(name: string, start: () => ChildProcess, log: (line: string) => void, policy = restartPolicy): SupervisedChild {
  let child: ChildProcess | undefined;
  let stopping = false;
  let delay: number | null = null;
  let timer: NodeJS.Timeout | undefined;

  const run = () => {
    const startedAt = Date.now();
    child = start();
    child.once('exit', (code, signal) => {
      child = undefined;
      if (stopping) return;
      delay = nextRestartDelay(delay, Date.now() - startedAt, policy);
      const how = signal ? `was killed (${signal})` : `stopped unexpectedly (exit code ${code})`;
      log(`The ${name} process ${how}; starting it again in ${delay / 1000} s. The API keeps serving meanwhile.`);
      timer = setTimeout(run, delay);
    });
  };
  run();
  return {
    name,
    current: () => child,
    async stop(graceMs = 10_000) {
      stopping = true;
      clearTimeout(timer);
      if (child) await stopAll([{ name, process: child }], graceMs);
    },
  };
}
