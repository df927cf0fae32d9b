import { describe, expect, it } from 'vitest';
import { compareVersions, energyDifference, percentDifference } from './version-comparison';

const at = (startIso: string, minutes: number, values: number[]) =>
  values.map((value, i) => ({ ts: new Date(Date.parse(startIso) + i * minutes * 60_000), value }));

describe('version comparison', () => {
  it('gives no percentage against a zero base', () => {
    expect(percentDifference(5, 0)).toBeNull();
    expect(percentDifference(90, 100)).toBe(-10);
    expect(percentDifference(-90, -100)).toBe(10);
  });

  it('counts energy over common intervals only, in unit-hours for 15-minute intervals', () => {
    const draft = at('2026-12-01T00:00:00Z', 15, [8, 8, 8, 8, 8]);
    const approved = at('2026-12-01T00:15:00Z', 15, [4, 4, 4, 4, 4]);
    // Four common quarter-hours: 4 × 8 MW × 0.25 h = 8 MWh against 4 MWh.
    expect(energyDifference(draft, approved, 15)).toEqual({ intervals: 4, draft: 8, approved: 4, difference: 4, differencePercent: 100 });
    expect(energyDifference(draft, [], 15)).toEqual({ intervals: 0, draft: 0, approved: 0, difference: 0, differencePercent: null });
  });

  it('compares per interval and per local day, with the peak moving later', () => {
    const draft = at('2026-12-01T06:00:00Z', 60, [1, 5, 2]);
    const approved = at('2026-12-01T06:00:00Z', 60, [4, 2, 2]);
    const comparison = compareVersions(draft, approved, 'America/Chicago', 60);
    expect(comparison.intervals.map((i) => i.difference)).toEqual([-3, 3, 0]);
    expect(comparison.dailyPeaks).toHaveLength(1);
    expect(comparison.dailyPeaks[0]).toMatchObject({ date: '2026-12-01', difference: 1, differencePercent: 25, peakShiftMinutes: 60 });
  });
});
