import { describe, expect, it } from 'vitest';
import { dailyPeaks, horizonPeak } from './daily-peaks';

const hourly = (startIso: string, values: number[]) =>
  values.map((value, i) => ({ ts: new Date(Date.parse(startIso) + i * 3_600_000), value }));

describe('daily peaks', () => {
  it('groups by local date, reports local time and offset, and knows a 25-hour day is complete', () => {
    // Local midnight 2026-11-01 CDT is 05:00Z; the day has 25 hours. Peak at the second 01:00 (07:00Z, CST).
    const values = hourly(
      '2026-11-01T05:00:00Z',
      Array.from({ length: 25 }, (_, i) => (i === 2 ? 50 : 10)),
    );
    const [peak] = dailyPeaks(values, 'America/Chicago', 60);
    expect(peak).toEqual({
      date: '2026-11-01',
      ts: '2026-11-01T07:00:00.000Z',
      localTime: '01:00',
      utcOffset: '-06:00',
      value: 50,
      intervals: 25,
      complete: true,
    });
  });

  it('marks a day with missing hours incomplete and splits days at local midnight', () => {
    const values = hourly('2026-11-02T04:00:00Z', [1, 2, 3, 4]); // 22:00 and 23:00 on the 1st, 00:00 and 01:00 on the 2nd (CST)
    const peaks = dailyPeaks(values, 'America/Chicago', 60);
    expect(peaks.map((p) => [p.date, p.localTime, p.value, p.complete])).toEqual([
      ['2026-11-01', '23:00', 2, false],
      ['2026-11-02', '01:00', 4, false],
    ]);
  });

  it('gives ties to the earlier interval', () => {
    const peaks = dailyPeaks(hourly('2026-12-01T06:00:00Z', [5, 7, 7, 3]), 'America/Chicago', 60);
    expect(peaks[0]!.localTime).toBe('01:00');
    expect(horizonPeak(hourly('2026-12-01T06:00:00Z', [5, 7, 7, 3]), 'America/Chicago')?.ts).toBe('2026-12-01T07:00:00.000Z');
    expect(horizonPeak([], 'UTC')).toBeNull();
  });
});
