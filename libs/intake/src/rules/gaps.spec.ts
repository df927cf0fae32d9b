import { describe, expect, it } from 'vitest';
import { findGaps } from './gaps';

describe('findGaps', () => {
  it('reports each run of missing grid indexes with its neighbours', () => {
    const grid = Float64Array.from([0, 1, 4, 5, 9]);
    expect(findGaps(grid, 5)).toEqual([
      { firstIndex: 2, count: 2, before: 1, after: 2, bounded: true },
      { firstIndex: 6, count: 3, before: 3, after: 4, bounded: true },
    ]);
  });

  it('lets stored readings split a gap, leaving the pieces unbounded', () => {
    const grid = Float64Array.from([0, 6]);
    expect(findGaps(grid, 2, new Set([3]))).toEqual([
      { firstIndex: 1, count: 2, before: 0, after: 1, bounded: false },
      { firstIndex: 4, count: 2, before: 0, after: 1, bounded: false },
    ]);
    expect(findGaps(grid, 2, new Set([1, 2, 3, 4, 5]))).toEqual([]);
  });
});
