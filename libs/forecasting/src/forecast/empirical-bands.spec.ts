import { describe, expect, it } from 'vitest';
import { applyBands, calibrateBands, conformalQuantiles, horizonBand, MIN_CELL_SCORES, type BandScore } from './empirical-bands';

describe('conformalQuantiles', () => {
  it('takes the ⌊(n+1)α/2⌋-th and ⌈(n+1)(1−α/2)⌉-th smallest scores (Lei et al. 2018, Lemma 2; hand-worked)', () => {
    // n = 19, level 80: α/2 = 0.1, (n+1)·0.1 = 2 → 2nd smallest; (n+1)·0.9 = 18 → 18th smallest.
    const z = Array.from({ length: 19 }, (_, i) => 19 - i); // 19, 18, …, 1 (order must not matter)
    expect(conformalQuantiles(z, 80)).toEqual({ lower: 2, upper: 18 });
    // Level 95 needs n ≥ 2/0.05 − 1 = 39: (n+1)·0.025 = 0.5 → index 0 does not exist.
    expect(conformalQuantiles(z, 95)).toBeNull();
    // n = 39, level 95: ⌊40·0.025⌋ = 1 → smallest; ⌈40·0.975⌉ = 39 → largest.
    const wide = Array.from({ length: 39 }, (_, i) => i + 1);
    expect(conformalQuantiles(wide, 95)).toEqual({ lower: 1, upper: 39 });
  });
});

describe('calibrateBands and applyBands', () => {
  it('calibrates a cell on its own scores when it has enough, pools the band otherwise, and builds ŷ + q·s bounds', () => {
    const scores: BandScore[] = [];
    // Horizon band 1 (1–24 h), hours 0–3: 99 scores −49..49, so level 80 takes the 10th and 90th smallest: −40 and 40.
    for (let i = 0; i < 99; i++) scores.push({ horizon: 1 + (i % 24), hourOfDay: i % 4, z: i - 49 });
    // Hours 4–7 of band 1: a few scores with larger spread; too few for a cell of their own.
    for (let i = 0; i < 10; i++) scores.push({ horizon: 2, hourOfDay: 5, z: 10 * (i - 5) });
    const calibration = calibrateBands(scores, [80])!;
    expect(MIN_CELL_SCORES).toBeLessThanOrEqual(99);
    expect(calibration.cells[0][0]).toMatchObject({ pooled: 'cell', scores: 99, quantiles: [{ level: 80, lower: -40, upper: 40 }] });
    expect(calibration.cells[0][1].pooled).toBe('band');
    expect(calibration.cells[0][1].scores).toBe(109);
    // Bands with no scores at all take every score.
    expect(calibration.cells[3][0].pooled).toBe('all');
    const [band] = applyBands(calibration, [100], [0.5], [2]);
    expect(band.lower[0]).toBe(100 - 40 * 0.5);
    expect(band.upper[0]).toBe(100 + 40 * 0.5);
    // On logs the bounds are exp(ŷ + q·s).
    const [logBand] = applyBands(calibration, [Math.log(100)], [0.01], [2], Math.exp);
    expect(logBand.upper[0]).toBeCloseTo(100 * Math.exp(0.4), 10);
  });

  it('returns null when even all scores together are too few, so the caller keeps the Gaussian band', () => {
    expect(calibrateBands([{ horizon: 1, hourOfDay: 0, z: 0 }], [80, 95])).toBeNull();
  });

  it('puts hours 1–24 in the first horizon band and anything beyond 168 in the last', () => {
    expect([1, 24, 25, 48, 49, 96, 97, 168, 500].map(horizonBand)).toEqual([0, 0, 1, 1, 2, 2, 3, 3, 3]);
  });
});
