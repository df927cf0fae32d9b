/**
 * One `npm start` per checkout: a lock file holding the running instance's PID and URL. A second start
 * reads it and says where the first one is; a lock left by a killed start (dead PID) is taken over.
 */
import { existsSync, mkdirSync, readFileSync, rmSync, writeFileSync } from 'node:fs';
import { dirname } from 'node:path';

/** What the lock file records about the running instance. */
export interface InstanceInfo {
  pid: number;
  url: string;
  startedAt: string;
}

/** Thrown when another instance holds the lock. */
export class AlreadyRunningError extends Error {
  override readonly name = 'AlreadyRunningError';
  constructor(readonly holder: InstanceInfo) {
    super(
      `Loadwright is already running from this folder (process ${holder.pid}, started ${holder.startedAt}) at ${holder.url}.\nOpen that address, or stop it first with Ctrl-C in its terminal (or: kill ${holder.pid}).`,
    );
  }
}

function isAlive(pid: number): boolean {
  try {
    process.kill(pid, 0);
    return true;
  } catch (error) {
    return (error as NodeJS.ErrnoException).code === 'EPERM';
  }
}

/** Takes the lock or throws AlreadyRunningError; returns a function that releases it. */
export function acquireInstanceLock(path: string, info: InstanceInfo): () => void {
  if (existsSync(path)) {
    let holder: InstanceInfo | undefined;
    try {
      holder = JSON.parse(readFileSync(path, 'utf8')) as InstanceInfo;
    } catch {
      holder = undefined; // unreadable: a crash mid-write; take it over
    }
    if (holder && holder.pid !== info.pid && isAlive(holder.pid)) throw new AlreadyRunningError(holder);
  }
  mkdirSync(dirname(path), { recursive: true });
  writeFileSync(path, JSON.stringify(info), { flag: 'w' });
  return () => {
    try {
      const current = JSON.parse(readFileSync(path, 'utf8')) as InstanceInfo;
      if (current.pid === info.pid) rmSync(path);
    } catch {
      // already gone
    }
  };
}
