import { describe, expect, it } from 'vitest';
import { hampelOutliers } from './hampel-spikes';
import { shapeSpikes } from './shape-spikes';

/**
 * Three weeks of an hourly feeder whose every morning rises steeply out of a quiet night: 07:00 and
 * 08:00 read 3,011 and 2,988 kW beside 2,687 at 06:00 and 2,860 at 09:00 (the shape the issue reports),
 * with a day-to-day drift of a few kW.
 */
function morningPeakFeeder(days = 21): { values: Float64Array; grid: Float64Array } {
  const day = [
    2640, 2650, 2655, 2648, 2652, 2660, 2687, 3011, 2988, 2860, 2700, 2690, 2685, 2695, 2705, 2710, 2740, 2790, 2830, 2810, 2770, 2730,
    2690, 2660,
  ];
  const values = new Float64Array(days * 24);
  for (let d = 0; d < days; d++) for (let h = 0; h < 24; h++) values[d * 24 + h] = day[h]! + 3 * (d % 4) + ((h * 7 + d * 3) % 5);
  return { values, grid: Float64Array.from(values, (_, i) => i) };
}

describe('shapeSpikes', () => {
  it('leaves an ordinary steep morning peak alone, which the Hampel identifier alone flags', () => {
    const { values, grid } = morningPeakFeeder();
    // The Hampel window (13 readings) sees 07:00 as |3011 − 2687| = 324 > 6 · 1.4826 · 32 ≈ 285 on day 10.
    expect(hampelOutliers(values, values.length).length).toBeGreaterThan(0);
    expect(shapeSpikes(values, grid, values.length, 60)).toEqual([]);
  });

  it('flags a spike the shape does not explain', () => {
    const { values, grid } = morningPeakFeeder();
    const at = 10 * 24 + 14; // 14:00 on day 10: 2705 kW × 1.5
    values[at] = values[at]! * 1.5;
    expect(shapeSpikes(values, grid, values.length, 60)).toEqual([at]);
  });

  it('keeps the Hampel verdict when the batch is too short to show a shape (one day)', () => {
    const { values, grid } = morningPeakFeeder(1);
    const n = values.length;
    // 07:00, 08:00 and 09:00 of the only day stand out from their 13-hour window.
    expect(hampelOutliers(values, n)).toEqual([7, 8, 9]);
    expect(shapeSpikes(values, grid, n, 60)).toEqual([7, 8, 9]);
  });
});
