/**
 * Interval and quantile scores, hand-computed (arithmetic in the comments). Definitions: Winkler (1972), JASA
 * 67(337); Gneiting & Raftery (2007), JASA 102(477) §6.2; pinball: Koenker & Bassett (1978). Exact arithmetic on
 * small decimals, so 1e-12.
 */
import { describe, expect, it } from 'vitest';
import { coverage, pinball, winkler } from './interval-scores';
import { mae } from './metrics';
import { holdout } from './usaccdeaths.testing';

describe('coverage', () => {
  it('counts endpoints as inside', () => {
    // y = 5 in [4, 6] yes; y = 3 below 4 no; y = 6 on the upper end yes; y = 6.5 above 6 no → 2/4.
    expect(coverage([5, 3, 6, 6.5], [4, 4, 4, 4], [6, 6, 6, 6])).toBe(0.5);
  });

  it('rejects crossed bounds', () => {
    expect(() => coverage([1], [2], [1])).toThrowError(expect.objectContaining({ code: 'invalid-argument' }));
  });
});

describe('winkler', () => {
  it('adds (2/α)·miss to the width', () => {
    // 80 % interval: α = 0.2, 2/α = 10. Interval [4, 6], width 2.
    //   y = 5 inside:           2
    //   y = 3 below by 1:       2 + 10·1   = 12
    //   y = 6.5 above by 0.5:   2 + 10·0.5 = 7
    // mean = (2 + 12 + 7)/3 = 7
    expect(winkler([5, 3, 6.5], [4, 4, 4], [6, 6, 6], 80)).toBeCloseTo(7, 12);
    // 95 % interval: α = 0.05, 2/α = 40. [0, 8], y = 10 above by 2: 8 + 40·2 = 88.
    expect(winkler([10], [0], [8], 95)).toBeCloseTo(88, 12);
  });

  it('rejects levels outside (0, 100)', () => {
    expect(() => winkler([1], [0], [2], 0)).toThrowError(expect.objectContaining({ code: 'invalid-argument' }));
    expect(() => winkler([1], [0], [2], 100)).toThrowError(expect.objectContaining({ code: 'invalid-argument' }));
  });
});

describe('pinball', () => {
  it('weights under- and over-forecasts by τ and 1 − τ', () => {
    // τ = 0.9: y = 10, q = 8: y ≥ q, 0.9·(10 − 8) = 1.8; y = 7, q = 8: y < q, (1 − 0.9)·(8 − 7) = 0.1. Mean 0.95.
    expect(pinball([10, 7], [8, 8], 0.9)).toBeCloseTo(0.95, 12);
    // τ = 0.1 mirrors it: 0.1·2 = 0.2 and 0.9·1 = 0.9, mean 0.55.
    expect(pinball([10, 7], [8, 8], 0.1)).toBeCloseTo(0.55, 12);
  });

  it('equals MAE/2 at the median (τ = 0.5), on the USAccDeaths hold-out forecast', () => {
    expect(pinball(holdout.test, holdout.arima.mean, 0.5)).toBeCloseTo(mae(holdout.test, holdout.arima.mean) / 2, 9);
  });

  it('rejects τ outside (0, 1)', () => {
    expect(() => pinball([1], [1], 1)).toThrowError(expect.objectContaining({ code: 'invalid-argument' }));
  });
});
