import { describe, expect, it } from 'vitest';
import { flatLineLimit, flatRuns } from './flat-lines';

const indexes = (n: number) => Float64Array.from({ length: n }, (_, i) => i);

describe('flatRuns', () => {
  it('finds a 10-reading run over the hourly load limit of 6 and not a 6-reading one', () => {
    const values = Float64Array.from({ length: 40 }, (_, i) => i);
    values.fill(5, 5, 15); // 10 readings
    values.fill(30, 25, 31); // 6 readings: at the limit, not over it
    expect(flatRuns(values, indexes(40), 40, flatLineLimit('load', 60))).toEqual([{ start: 5, end: 14 }]);
  });

  it('breaks a run at a missing interval', () => {
    // Five readings, a missing interval, then four: only the first run is over the limit of 4.
    const values = new Float64Array(9).fill(3);
    const grid = Float64Array.from([0, 1, 2, 3, 4, 6, 7, 8, 9]);
    expect(flatRuns(values, grid, 9, 4)).toEqual([{ start: 0, end: 4 }]);
  });

  it('scales the limit with the interval and the kind', () => {
    expect(flatLineLimit('load', 15)).toBe(24);
    expect(flatLineLimit('temperature', 60)).toBe(12);
    expect(flatLineLimit('load', 1440)).toBe(3);
  });
});
