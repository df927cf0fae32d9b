import { describe, expect, it } from 'vitest';
import { creepingBias, trackingSignal } from './creeping-bias';
import type { HourPoint } from './hour-point';
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

  it('sums only the errors inside the trailing window', () => {
    // Window of 3 hours, e = 2, 2, 2, −1. At the fourth hour the first error has left:
    // Σe = 2 + 2 − 1 = 3, Σ|e| = 5, MAD = 5/3, TS = 3 / (5/3) = 1.8.
    const signal = [...trackingSignal(hours('2026-06-01T00:00:00Z', [102, 102, 102, 99], { forecast: 100 }), 3).values()];
    expect(signal).toEqual([1, 2, 3, expect.closeTo(1.8, 12)]);
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

  it('covers the hours the signal is beyond the limit, and ends once the biased hours leave the window', () => {
    // Six hours 10 kW low (e = +10), then forty hours alternating e = −1, +1. Window 24 hours, limit 4, k = 1.
    // Hour 3: TS = 4 (quiet, not beyond); hour 4: TS = 5, the first hour beyond.
    // Hour 28: the window holds hours 5–28, one +10 and 23 alternating errors (twelve −1, eleven +1):
    //   Σe = 10 − 1 = 9, Σ|e| = 33, TS = 9 · 24 / 33 = 6.545 (beyond).
    // Hour 29: the window holds hours 6–29, twelve −1 and twelve +1: Σe = 0, TS = 0. The miss is hours 4–28.
    // A running sum from the start of the data would stay beyond to the last hour (Σe stays 59 or 60).
    const errors = [...Array<number>(6).fill(10), ...Array.from({ length: 40 }, (_, j) => (j % 2 ? 1 : -1))];
    const points: HourPoint[] = hours(
      '2026-06-01T00:00:00Z',
      errors.map((e) => 100 + e),
      { forecast: 100 },
    );
    const limit = rule('creeping_bias', { threshold: 4, hours: 1 });
    const hits = creepingBias(points, limit, kW);
    expect(hits).toHaveLength(1);
    expect(hits[0]!.start.toISOString()).toBe('2026-06-01T04:00:00.000Z');
    expect(hits[0]!.end.toISOString()).toBe('2026-06-02T05:00:00.000Z');
    expect(hits[0]!.evidence).toHaveLength(25);
    expect(trackingSignal(points).get(Date.parse('2026-06-02T04:00:00Z'))).toBeCloseTo((9 * 24) / 33, 12);
  });

  it('gives an hour the same signal whenever detection runs: earlier hours feed the window but are not judged', () => {
    const errors = [...Array<number>(6).fill(10), ...Array.from({ length: 40 }, (_, j) => (j % 2 ? 1 : -1))];
    const points = hours(
      '2026-06-01T00:00:00Z',
      errors.map((e) => 100 + e),
      { forecast: 100 },
    );
    const limit = rule('creeping_bias', { threshold: 4, hours: 1 });
    // Judged from hour 20: the run is hours 20–28, the same hours as in the whole-data run above.
    const [hit] = creepingBias(points, limit, kW, new Date('2026-06-01T20:00:00Z'));
    expect(hit!.start.toISOString()).toBe('2026-06-01T20:00:00.000Z');
    expect(hit!.end.toISOString()).toBe('2026-06-02T05:00:00.000Z');
  });
});
