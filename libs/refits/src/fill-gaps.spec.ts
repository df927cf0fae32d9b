import { describe, expect, it } from 'vitest';
import { countMissing, fillInteriorGaps } from './fill-gaps';

describe('fillInteriorGaps', () => {
  it('bridges interior gaps by straight lines and leaves the edges', () => {
    const values = Float64Array.from([NaN, 1, NaN, NaN, 4, 5, NaN]);
    expect(fillInteriorGaps(values, 10)).toBe(2);
    expect(Array.from(values.subarray(1, 6))).toEqual([1, 2, 3, 4, 5]);
    expect(Number.isNaN(values[0])).toBe(true);
    expect(Number.isNaN(values[6])).toBe(true);
    expect(countMissing(values)).toBe(2);
  });

  it('leaves gaps longer than the limit', () => {
    const values = Float64Array.from([0, NaN, NaN, NaN, 4, NaN, 6]);
    expect(fillInteriorGaps(values, 2)).toBe(1);
    expect(countMissing(values)).toBe(3);
    expect(values[5]).toBe(5);
  });
});
