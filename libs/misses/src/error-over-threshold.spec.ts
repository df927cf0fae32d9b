import { describe, expect, it } from 'vitest';
import { errorOverThreshold } from './error-over-threshold';
import { hours, rule } from './spec-points';

const kW = { unit: 'kW' as const, timeZone: 'America/Chicago' };
const ape = rule('error_over_threshold', { hours: 3, threshold: 10, floorKw: 50 });

describe('errorOverThreshold', () => {
  it('does not fire at exactly the threshold', () => {
    // |100 − 90| / 100 = 10 % exactly, three hours running.
    expect(errorOverThreshold(hours('2026-06-01T00:00:00Z', [100, 100, 100], { forecast: 90 }), ape, kW)).toEqual([]);
  });

  it('fires just above it for k hours, and not for k−1', () => {
    // |100 − 89| / 100 = 11 %.
    const [hit] = errorOverThreshold(hours('2026-06-01T00:00:00Z', [100, 100, 100], { forecast: 89 }), ape, kW);
    expect(hit!.measures['worstPercentError']).toBeCloseTo(11, 12);
    expect(hit!.summary).toBe('Error above 10 % for 3 hours in a row (worst 11.0 %, forecast low by 11.0 kW on average).');
    // Third hour: |95 − 89| / 95 = 6.3 %, so only two hours run over.
    expect(errorOverThreshold(hours('2026-06-01T00:00:00Z', [100, 100, 95], { forecast: 89 }), ape, kW)).toEqual([]);
  });

  it('ignores hours below the floor, which also end a run', () => {
    // 40 against 30 is 25 % but both are below the 50 kW floor.
    expect(errorOverThreshold(hours('2026-06-01T00:00:00Z', [40, 40, 40], { forecast: 30 }), ape, kW)).toEqual([]);
    const mixed = hours('2026-06-01T00:00:00Z', [100, 100, 40, 100], { forecast: 80 });
    mixed[2]!.forecast = 30;
    expect(errorOverThreshold(mixed, ape, kW)).toEqual([]);
  });

  it('converts the floor in kW into the series unit', () => {
    // 50 kW is 0.05 MW: a 40 MW system is judged; a 0.04 MW reading is not.
    const mw = { unit: 'MW' as const, timeZone: 'UTC' };
    expect(errorOverThreshold(hours('2026-06-01T00:00:00Z', [40, 40, 40], { forecast: 30 }), ape, mw)).toHaveLength(1);
    expect(errorOverThreshold(hours('2026-06-01T00:00:00Z', [0.04, 0.04, 0.04], { forecast: 0.03 }), ape, mw)).toEqual([]);
  });

  it('lets a missing actual end a run', () => {
    expect(errorOverThreshold(hours('2026-06-01T00:00:00Z', [100, null, 100, 100], { forecast: 80 }), ape, kW)).toEqual([]);
  });
});
