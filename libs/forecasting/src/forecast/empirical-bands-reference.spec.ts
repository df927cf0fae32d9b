import { describe, expect, it } from 'vitest';
import { mulberry32 } from '../core/random';
import { calibrateBandColumns, calibrateBands, MIN_CELL_SCORES, type BandCalibration, type BandScore } from './empirical-bands';

// The oracle: the calibration written out plainly — every pool (cell, horizon band, all) gathered and sorted
// whole, quantiles at the ⌊(n+1)α/2⌋-th and ⌈(n+1)(1−α/2)⌉-th smallest (Lei et al. 2018, Lemma 2). The
// calibration must give exactly its numbers, signed zeros included.
function referenceCalibration(scores: readonly BandScore[], levels: number[]): BandCalibration | null {
  const bandOf = (h: number) => (h <= 24 ? 0 : h <= 48 ? 1 : h <= 96 ? 2 : 3);
  const all: number[] = [];
  const byBand: number[][] = [[], [], [], []];
  const byCell: number[][][] = byBand.map(() => Array.from({ length: 6 }, () => []));
  for (const s of scores) {
    if (!Number.isFinite(s.z)) continue;
    all.push(s.z);
    byBand[bandOf(s.horizon)].push(s.z);
    byCell[bandOf(s.horizon)][Math.floor(s.hourOfDay / 4)].push(s.z);
  }
  const quantiles = (values: number[]) => {
    if (values.length < MIN_CELL_SCORES) return null;
    const sorted = Float64Array.from(values).sort();
    const n = sorted.length;
    const out = [];
    for (const level of levels) {
      const tail = (n + 1) * ((100 - level) / 200);
      const lo = Math.floor(tail + 1e-9);
      const hi = Math.ceil(n + 1 - tail - 1e-9);
      if (lo < 1 || hi > n) return null;
      out.push({ level, lower: sorted[lo - 1], upper: sorted[hi - 1] });
    }
    return out;
  };
  const overall = quantiles(all);
  if (!overall) return null;
  const cells = byCell.map((row, band) => {
    const bandQuantiles = quantiles(byBand[band]);
    return row.map((cell) => {
      const own = quantiles(cell);
      if (own) return { quantiles: own, scores: cell.length, pooled: 'cell' as const };
      if (bandQuantiles) return { quantiles: bandQuantiles, scores: byBand[band].length, pooled: 'band' as const };
      return { quantiles: overall, scores: all.length, pooled: 'all' as const };
    });
  });
  return { levels, cells, scores: all.length };
}

/** Every number of a calibration as text, so −0 and +0 differ. */
function flatten(calibration: BandCalibration | null): string[] {
  if (!calibration) return ['none'];
  const text = (v: number) => (Object.is(v, -0) ? '-0' : String(v));
  return calibration.cells.flatMap((row, band) =>
    row.flatMap((cell, block) =>
      cell.quantiles.map((q) => `${band}/${block} ${cell.pooled} n=${cell.scores} L${q.level} ${text(q.lower)} ${text(q.upper)}`),
    ),
  );
}

type Values = (uniform: () => number, i: number) => number;
const shapes: Record<string, Values> = {
  'near-normal': (u) => u() + u() + u() + u() - 2,
  'heavy right tail': (u) => Math.exp(3 * u()) - 2,
  'few values with ties and signed zeros': (u) => {
    const v = Math.floor(u() * 7) - 3;
    return v === 0 && u() < 0.5 ? -0 : v;
  },
  // The inner quantiles fall on zeros: −0 must come out below +0, as in the sorted order.
  'mostly signed zeros': (u) => {
    const r = u();
    return r < 0.05 ? -1 : r < 0.1 ? 1 : r < 0.55 ? -0 : 0;
  },
  'ascending within each cell': (_, i) => i / 1000,
  'descending within each cell': (_, i) => -i / 1000,
  'all equal': () => 1.5,
};

/** Scores with `counts[band][block]` per cell, values of one shape, mixed in random order with a few non-finite ones. */
function scoresOf(counts: number[][], values: Values, seed: number): BandScore[] {
  const u = mulberry32(seed);
  const bandHours = [
    [1, 24],
    [25, 48],
    [49, 96],
    [97, 400],
  ];
  const scores: BandScore[] = [];
  let i = 0;
  counts.forEach((row, band) =>
    row.forEach((count, block) => {
      for (let k = 0; k < count; k++) {
        const [first, last] = bandHours[band];
        const horizon = first + Math.floor(u() * (last - first + 1));
        scores.push({ horizon, hourOfDay: block * 4 + Math.floor(u() * 4), z: values(u, i++) });
      }
    }),
  );
  for (const z of [Number.NaN, Number.POSITIVE_INFINITY, Number.NEGATIVE_INFINITY]) scores.push({ horizon: 5, hourOfDay: 1, z });
  // A random interleaving keeps cells apart in the input, as the rolling origins do.
  const order = scores.map((s) => ({ s, key: u() }));
  order.sort((a, b) => a.key - b.key);
  // Monotone shapes stay monotone inside a cell: they were numbered in the order they are scored.
  return values === shapes['ascending within each cell'] || values === shapes['descending within each cell']
    ? scores
    : order.map((o) => o.s);
}

// Cells pooled around cells with scores of their own (in both orders within a band), a band too small that
// takes every score, cells large enough for 80 % but not for 99 % (n < 199), and hours beyond a week.
const layouts: Array<{ name: string; counts: number[][]; levels: number[] }> = [
  {
    name: 'uneven cells at 80 and 95 %',
    counts: [
      [30, 200, 79, 80, 500, 0],
      [10, 10, 10, 10, 10, 10],
      [100, 20, 300, 1000, 81, 39],
      [0, 0, 0, 0, 0, 90],
    ],
    levels: [80, 95],
  },
  {
    name: 'cells too small for the 99 % level',
    counts: [
      [150, 198, 199, 400, 0, 2],
      [120, 130, 140, 150, 160, 170],
      [5, 5, 5, 5, 5, 5],
      [1200, 800, 0, 60, 250, 199],
    ],
    levels: [50, 80, 95, 99],
  },
];

describe('calibrateBands against a plain sort of every pool', () => {
  for (const layout of layouts) {
    for (const [shape, values] of Object.entries(shapes)) {
      it(`gives the same quantiles, pools and counts: ${layout.name}, ${shape}`, () => {
        const scores = scoresOf(layout.counts, values, 7);
        const expected = referenceCalibration(scores, layout.levels);
        expect(flatten(calibrateBands(scores, layout.levels))).toEqual(flatten(expected));
        // The layout must really exercise pooling both ways.
        const pooled = new Set(expected!.cells.flat().map((c) => c.pooled));
        expect([...pooled].sort()).toEqual(['all', 'band', 'cell']);
      });
    }
  }

  it('agrees on random layouts and random levels, through the column entry too', () => {
    const u = mulberry32(2024);
    for (let trial = 0; trial < 40; trial++) {
      const counts = Array.from({ length: 4 }, () => Array.from({ length: 6 }, () => Math.floor(u() ** 3 * 900)));
      const levels = [...new Set([50 + Math.floor(u() * 40), 80, 90 + Math.floor(u() * 9)])].sort((a, b) => a - b);
      const shape = Object.values(shapes)[trial % Object.keys(shapes).length];
      const scores = scoresOf(counts, shape, 100 + trial);
      const expected = flatten(referenceCalibration(scores, levels));
      expect(flatten(calibrateBands(scores, levels)), `trial ${trial}`).toEqual(expected);
      const columns = calibrateBandColumns(
        Float64Array.from(scores, (s) => s.z),
        Int32Array.from(scores, (s) => s.horizon),
        Uint8Array.from(scores, (s) => s.hourOfDay),
        levels,
      );
      expect(flatten(columns), `trial ${trial}, columns`).toEqual(expected);
    }
  });

  it('returns null exactly when the plain computation does: too few scores in all for the highest level', () => {
    const few = scoresOf(
      [
        [100, 0, 0, 0, 0, 0],
        [0, 0, 0, 0, 0, 0],
        [0, 0, 0, 0, 0, 0],
        [0, 0, 0, 0, 0, 0],
      ],
      shapes['near-normal'],
      3,
    );
    expect(referenceCalibration(few, [80, 99])).toBeNull();
    expect(calibrateBands(few, [80, 99])).toBeNull();
    expect(calibrateBands(few, [80, 95])).not.toBeNull();
  });

  it('refuses hours of day outside 0..23 and columns of different lengths', () => {
    expect(() => calibrateBands([{ horizon: 1, hourOfDay: 24, z: 0 }], [80])).toThrow(/hour of day must lie in 0..23/);
    expect(() => calibrateBandColumns([0, 1], [1], [0, 0], [80])).toThrow(/as many horizons and hours of day as scores/);
  });
});
