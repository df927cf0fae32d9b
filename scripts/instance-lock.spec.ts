import { existsSync, mkdtempSync, writeFileSync } from 'node:fs';
import { tmpdir } from 'node:os';
import { join } from 'node:path';
import { describe, expect, it } from 'vitest';
import { AlreadyRunningError, acquireInstanceLock } from './instance-lock';

const lockIn = () => join(mkdtempSync(join(tmpdir(), 'lw-lock-')), 'instance.json');

describe('acquireInstanceLock', () => {
  it('refuses a second holder while the first process lives, naming where it runs', () => {
    const path = lockIn();
    // The parent process of this test is alive, so it stands in for a running `npm start`.
    writeFileSync(path, JSON.stringify({ pid: process.ppid, url: 'http://127.0.0.1:4280', startedAt: '2026-12-01T06:00:00.000Z' }));
    const attempt = () =>
      acquireInstanceLock(path, { pid: process.pid, url: 'http://127.0.0.1:4280', startedAt: new Date().toISOString() });
    expect(attempt).toThrow(AlreadyRunningError);
    expect(attempt).toThrow(/already running from this folder \(process \d+.*at http:\/\/127\.0\.0\.1:4280/);
  });

  it('takes over a lock left by a process that died', () => {
    const path = lockIn();
    writeFileSync(path, JSON.stringify({ pid: 2 ** 22 + 12345, url: 'x', startedAt: 'x' })); // above Linux's pid_max default
    const release = acquireInstanceLock(path, { pid: process.pid, url: 'http://127.0.0.1:1', startedAt: 'now' });
    expect(existsSync(path)).toBe(true);
    release();
    expect(existsSync(path)).toBe(false);
  });
});
