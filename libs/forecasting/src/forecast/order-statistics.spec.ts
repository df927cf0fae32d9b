import { describe, expect, it } from 'vitest';
import { mulberry32 } from '../core/random';
import { selectOrderStatistics } from './order-statistics';

/** Values as text, so −0 and +0 differ. */
const text = (values: ArrayLike<number>) => Array.from(values, (v) => (Object.is(v, -0) ? '-0' : String(v)));

describe('selectOrderStatistics', () => {
  const u = mulberry32(11);
  const patterns: Record<string, (n: number) => number[]> = {
    random: (n) => Array.from({ length: n }, () => u() * 10 - 5),
    ascending: (n) => Array.from({ length: n }, (_, i) => i),
    descending: (n) => Array.from({ length: n }, (_, i) => n - i),
    'organ pipe': (n) => Array.from({ length: n }, (_, i) => Math.min(i, n - i)),
    'all equal': (n) => Array.from({ length: n }, () => 2),
    'signed zeros and ties': (n) => Array.from({ length: n }, () => [-0, 0, -0, 0, 1, -1][Math.floor(u() * 6)]),
  };
  for (const [name, make] of Object.entries(patterns)) {
    it(`gives what a full sort puts at the ranks: ${name}`, () => {
      for (const n of [1, 2, 15, 16, 17, 100, 1001, 5000]) {
        const values = Float64Array.from(make(n));
        const sorted = Float64Array.from(values).sort();
        // The ends, a few random ranks, and every rank of short samples.
        const ranks =
          n <= 17
            ? Array.from({ length: n }, (_, i) => i)
            : [...new Set([0, n - 1, ...Array.from({ length: 6 }, () => Math.floor(u() * n))])].sort((a, b) => a - b);
        const found = selectOrderStatistics(Float64Array.from(values), ranks);
        expect(text(found), `${name}, n = ${n}`).toEqual(text(ranks.map((r) => sorted[r])));
      }
    });
  }

  it('only rearranges the sample', () => {
    const values = Float64Array.from(patterns.random(300));
    const copy = Float64Array.from(values);
    selectOrderStatistics(copy, [10, 150, 290]);
    expect(text(copy.sort())).toEqual(text(values.sort()));
  });
});
