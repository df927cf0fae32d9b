/**
 * CPU time used by processes, read from Linux's /proc/<pid>/stat (utime + stime, all threads), so a
 * benchmark can report CPU milliseconds per request: less sensitive to other work on a shared machine
 * than requests per second, which fall whenever another process takes the cores.
 */
import { execFileSync } from 'node:child_process';
import { readFileSync } from 'node:fs';

/** Clock ticks per second of /proc's counters (100 on nearly every Linux). */
const ticksPerSecond = Number(execFileSync('getconf', ['CLK_TCK'], { encoding: 'utf8' }).trim()) || 100;

/** CPU milliseconds one process has used so far; 0 when it is gone or /proc cannot be read. */
export function processCpuMs(pid: number): number {
  try {
    const stat = readFileSync(`/proc/${pid}/stat`, 'utf8');
    // Fields after the command name (which sits in parentheses and may hold spaces); utime and stime are fields 14 and 15.
    const fields = stat.slice(stat.lastIndexOf(')') + 2).split(' ');
    return ((Number(fields[11]) + Number(fields[12])) * 1000) / ticksPerSecond;
  } catch {
    return 0;
  }
}

/** CPU milliseconds of each of some processes, by pid. */
export function cpuSnapshot(pids: number[]): Map<number, number> {
  return new Map(pids.map((pid) => [pid, processCpuMs(pid)]));
}

/** CPU milliseconds used between two snapshots; a process missing from `before` counts from zero. */
export function cpuBetween(before: Map<number, number>, after: Map<number, number>): number {
  let total = 0;
  for (const [pid, ms] of after) total += ms - (before.get(pid) ?? 0);
  return total;
}
