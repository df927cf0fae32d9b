import { describe, expect, it } from 'vitest';
import { nextRestartDelay, restartPolicy } from './child-processes';

describe('nextRestartDelay', () => {
  it('waits one second before the first restart', () => {
    expect(nextRestartDelay(null, 50)).toBe(1_000);
  });

  it('doubles while the child keeps failing soon after starting, and stops at 60 s', () => {
    // 1, 2, 4, 8, 16, 32, then capped at 60 (64 would exceed the cap).
    const waits: number[] = [];
    let delay: number | null = null;
    for (let i = 0; i < 8; i++) waits.push((delay = nextRestartDelay(delay, 2_000)));
    expect(waits).toEqual([1_000, 2_000, 4_000, 8_000, 16_000, 32_000, 60_000, 60_000]);
  });

  it('starts again from one second after a run of five minutes or more', () => {
    expect(nextRestartDelay(60_000, restartPolicy.healthyRunMs)).toBe(1_000);
    expect(nextRestartDelay(60_000, restartPolicy.healthyRunMs - 1)).toBe(60_000);
  });
});
