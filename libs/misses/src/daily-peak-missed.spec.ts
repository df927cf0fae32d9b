import { describe, expect, it } from 'vitest';
import { dailyPeakMissed } from './daily-peak-missed';
import type { HourPoint } from './hour-point';
import { hours, rule } from './spec-points';

const chicago = { unit: 'kW' as const, timeZone: 'America/Chicago' };
const peak = rule('daily_peak_missed', { threshold: 5, peakHourTolerance: 2, floorKw: 50 });

/** A local day of `n` hours from `startUtc` with flat 500 kW, an actual peak and a forecast peak at given hour indexes. */
function day(startUtc: string, n: number, actualPeak: [number, number], forecastPeak: [number, number]): HourPoint[] {
  const points = hours(startUtc, Array(n).fill(500), { forecast: 500 });
  points[actualPeak[0]]!.actual = actualPeak[1];
  points[forecastPeak[0]]!.forecast = forecastPeak[1];
  return points;
}

// 2026-06-15 in Chicago (CDT, UTC−5) starts at 05:00Z; index 17 is 17:00 local.
const june = '2026-06-15T05:00:00Z';

describe('dailyPeakMissed', () => {
  it('does not fire at exactly the threshold and fires just above it', () => {
    // |1050 − 1000| / 1000 = 5 % exactly; |1051 − 1000| / 1000 = 5.1 %.
    expect(dailyPeakMissed(day(june, 24, [17, 1000], [17, 1050]), peak, chicago)).toEqual([]);
    const [hit] = dailyPeakMissed(day(june, 24, [17, 1000], [17, 1051]), peak, chicago);
    expect(hit!.start.toISOString()).toBe(june.replace('Z', '.000Z'));
    expect(hit!.end.toISOString()).toBe('2026-06-16T05:00:00.000Z');
    expect(hit!.measures['peakErrorPercent']).toBeCloseTo(5.1, 12);
    expect(hit!.summary).toBe('Daily peak of 2026-06-15 missed: peak 1,000.0 kW against 1,051.0 kW forecast (5.1 % off).');
  });

  it('fires when the peak hour is off by more than the tolerance, not at it', () => {
    expect(dailyPeakMissed(day(june, 24, [17, 1000], [19, 1000]), peak, chicago)).toEqual([]);
    const [hit] = dailyPeakMissed(day(june, 24, [17, 1000], [20, 1000]), peak, chicago);
    expect(hit!.summary).toBe('Daily peak of 2026-06-15 missed: peak at 17:00 against 20:00 forecast (3 hours off).');
  });

  it('does not judge a day with an hour missing', () => {
    const points = day(june, 24, [17, 1000], [17, 2000]);
    points[3]!.actual = null;
    expect(dailyPeakMissed(points, peak, chicago)).toEqual([]);
  });

  it('judges the 23-hour spring-forward day and counts elapsed hours across the gap', () => {
    // 2026-03-08 starts 06:00Z (00:00 CST). Index 1 = 01:00 CST (07:00Z); index 3 = 04:00 CDT (09:00Z):
    // three hours apart on the wall, two elapsed, so within the tolerance.
    const start = '2026-03-08T06:00:00Z';
    expect(dailyPeakMissed(day(start, 23, [1, 1000], [3, 1000]), peak, chicago)).toEqual([]);
    const [hit] = dailyPeakMissed(day(start, 23, [1, 1000], [1, 1100]), peak, chicago);
    expect(hit!.end.getTime() - hit!.start.getTime()).toBe(23 * 3_600_000);
    expect(dailyPeakMissed(day(start, 22, [1, 1000], [1, 1100]), peak, chicago)).toEqual([]);
  });

  it('needs all 25 hours of the fall-back day', () => {
    // 2026-11-01 starts 05:00Z (00:00 CDT) and ends 06:00Z on 11-02 (00:00 CST): 25 hours.
    const start = '2026-11-01T05:00:00Z';
    expect(dailyPeakMissed(day(start, 24, [18, 1000], [18, 1100]), peak, chicago)).toEqual([]);
    const [hit] = dailyPeakMissed(day(start, 25, [18, 1000], [18, 1100]), peak, chicago);
    expect(hit!.end.toISOString()).toBe('2026-11-02T06:00:00.000Z');
  });

  it('leaves days below the floor alone', () => {
    const small = hours(june, Array(24).fill(20), { forecast: 20 });
    small[17]!.actual = 40;
    expect(dailyPeakMissed(small, peak, chicago)).toEqual([]);
  });
});
