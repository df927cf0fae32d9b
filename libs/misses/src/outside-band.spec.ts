import { describe, expect, it } from 'vitest';
import { outsideBand } from './outside-band';
import { hours, rule } from './spec-points';

const kW = { unit: 'kW' as const, timeZone: 'America/Chicago' };
const band3 = rule('outside_band', { hours: 3, bandLevel: 95 });

describe('outsideBand', () => {
  it('stays quiet for k−1 hours outside the band', () => {
    expect(outsideBand(hours('2026-06-01T00:00:00Z', [100, 120, 125, 100]), band3, kW)).toEqual([]);
  });

  it('fires at exactly k consecutive hours, over the run from its first hour to the end of its last', () => {
    const [hit, ...rest] = outsideBand(hours('2026-06-01T00:00:00Z', [100, 120, 125, 111, 100]), band3, kW);
    expect(rest).toEqual([]);
    expect(hit!.start.toISOString()).toBe('2026-06-01T01:00:00.000Z');
    expect(hit!.end.toISOString()).toBe('2026-06-01T04:00:00.000Z');
    expect(hit!.evidence.map((h) => h.error)).toEqual([20, 25, 11]);
    // Furthest beyond the band: 125 − 110 = 15 kW.
    expect(hit!.measures['furthestBeyondBand']).toBe(15);
    expect(hit!.summary).toBe('Actual above the 95 % band for 3 hours in a row, at most 15.0 kW beyond it.');
  });

  it('counts an actual exactly on a bound as inside', () => {
    expect(outsideBand(hours('2026-06-01T00:00:00Z', [120, 110, 125]), band3, kW)).toEqual([]);
    expect(outsideBand(hours('2026-06-01T00:00:00Z', [80, 90, 85]), band3, kW)).toEqual([]);
  });

  it('lets a gap in the actuals end a run, whether the hour is null or absent', () => {
    expect(outsideBand(hours('2026-06-01T00:00:00Z', [120, 120, null, 120, 120]), band3, kW)).toEqual([]);
    const absent = hours('2026-06-01T00:00:00Z', [120, 120, 120, 120, 120]).filter((_, i) => i !== 2);
    expect(outsideBand(absent, band3, kW)).toEqual([]);
  });

  it('reads the 80 % band from its columns and other levels from mean ± z·se', () => {
    // 80 %: [93.5, 106.5]; 107 is outside it but inside the 95 % band.
    expect(outsideBand(hours('2026-06-01T00:00:00Z', [107]), rule('outside_band', { bandLevel: 80 }), kW)).toHaveLength(1);
    // 90 %: z = 1.644854 (Φ⁻¹(0.95)), se = 10/1.959964, so the upper bound is 100 + 8.3923 = 108.39.
    const ninety = rule('outside_band', { bandLevel: 90 });
    expect(outsideBand(hours('2026-06-01T00:00:00Z', [108.3]), ninety, kW)).toEqual([]);
    expect(outsideBand(hours('2026-06-01T00:00:00Z', [108.5]), ninety, kW)).toHaveLength(1);
  });

  it('runs across the spring-forward gap: 01:00 CST, 03:00 CDT and 04:00 CDT are consecutive hours', () => {
    // 2026-03-08 in Chicago: 07:00Z is 01:00 CST, 08:00Z is 03:00 CDT (02:00 never happens), 09:00Z is 04:00 CDT.
    const [hit] = outsideBand(hours('2026-03-08T07:00:00Z', [130, 130, 130]), band3, kW);
    expect(hit!.end.getTime() - hit!.start.getTime()).toBe(3 * 3_600_000);
  });

  it('counts both 01:00 hours of the fall-back day', () => {
    // 2026-11-01 in Chicago: 06:00Z is 01:00 CDT, 07:00Z is 01:00 CST; with 05:00Z (00:00 CDT) three hours.
    expect(outsideBand(hours('2026-11-01T05:00:00Z', [130, 130, 130]), band3, kW)).toHaveLength(1);
    expect(outsideBand(hours('2026-11-01T06:00:00Z', [130, 130]), band3, kW)).toEqual([]);
  });
});
