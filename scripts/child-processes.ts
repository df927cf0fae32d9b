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
