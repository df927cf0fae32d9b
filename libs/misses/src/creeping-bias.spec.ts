import { describe, expect, it } from 'vitest';
import { creepingBias, trackingSignal } from './creeping-bias';
import { hours, rule } from './spec-points';

const kW = { unit: 'kW' as const, timeZone: 'UTC' };

describe('trackingSignal', () => {
  it('equals the number of hours when every error has the same sign', () => {
    // Σe = n·c and MAD = c, so TS = n.
    const signal = trackingSignal(hours('2026-06-01T00:00:00Z', [101, 101, 101], { forecast: 100 }));
    expect([...signal.values()]).toEqual([1, 2, 3]);
  });

  it('matches a hand computation with mixed errors', () => {
    // e = 2, −1, 3, 2, 2, 1. After five: Σe = 8, Σ|e| = 10, MAD = 2, TS = 4.
    // After six: Σe = 9, Σ|e| = 11, MAD = 11/6, TS = 9·6/11 = 4.909…
    const signal = [...trackingSignal(hours('2026-06-01T00:00:00Z', [102, 99, 103, 102, 102, 101], { forecast: 100 })).values()];
    expect(signal[4]).toBe(4);
    expect(signal[5]).toBeCloseTo(54 / 11, 12);
  });
});

describe('creepingBias', () => {
  it('does not fire at exactly the limit and fires beyond it', () => {
    const limit = rule('creeping_bias', { threshold: 4, hours: 1 });
    expect(creepingBias(hours('2026-06-01T00:00:00Z', [102, 99, 103, 102, 102], { forecast: 100 }), limit, kW)).toEqual([]);
    const [hit] = creepingBias(hours('2026-06-01T00:00:00Z', [102, 99, 103, 102, 102, 101], { forecast: 100 }), limit, kW);
    expect(hit!.start.toISOString()).toBe('2026-06-01T05:00:00.000Z');
    expect(hit!.summary).toMatch(/^Forecast persistently low: tracking signal 4\.9 \(limit ±4\) for 1 hour/);
  });

  it('needs k consecutive hours beyond the limit', () => {
    // All errors +1: TS = 1, 2, …; beyond 4 from the fifth hour. k = 3 needs hours 5, 6 and 7.
    const k3 = rule('creeping_bias', { threshold: 4, hours: 3 });
    expect(creepingBias(hours('2026-06-01T00:00:00Z', Array(6).fill(101), { forecast: 100 }), k3, kW)).toEqual([]);
    expect(creepingBias(hours('2026-06-01T00:00:00Z', Array(7).fill(101), { forecast: 100 }), k3, kW)).toHaveLength(1);
  });

  it('reads a gap as the end of a run but keeps the running sums across it', () => {
    const k3 = rule('creeping_bias', { threshold: 4, hours: 3 });
    const gap = hours('2026-06-01T00:00:00Z', [101, 101, 101, 101, 101, 101, null, 101, 101], { forecast: 100 });
    // Beyond 4 at hours 5, 6 (run of 2, ended by the gap), then 8, 9 (TS 7, 8): no run of 3.
    expect(creepingBias(gap, k3, kW)).toEqual([]);
  });
});
