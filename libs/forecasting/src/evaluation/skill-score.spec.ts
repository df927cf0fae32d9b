/**
 * Skill score 1 − score/benchmark (Murphy 1988). USAccDeaths hold-out MAE from fixtures/reference/ref/USAccDeaths.json
 * (`forecast::accuracy` Test set rows): ARIMA 242.07143096318 against seasonal naive 259.5.
 */
import { describe, expect, it } from 'vitest';
import { skillScore } from './skill-score';
import { holdout } from './usaccdeaths.testing';

describe('skillScore', () => {
  it('scores the ARIMA hold-out forecast against seasonal naive', () => {
    const arima = holdout.arima.accuracy['Test set'].MAE;
    const snaive = holdout.snaive.accuracy['Test set'].MAE;
    // 1 − 242.07143096318/259.5 = 0.0671621…
    expect(skillScore(arima, snaive)).toBeCloseTo(1 - 242.07143096318 / 259.5, 12);
    expect(skillScore(snaive, snaive)).toBe(0);
    expect(skillScore(2 * snaive, snaive)).toBe(-1);
  });

  it('returns null for a perfect benchmark and refuses negative or non-finite scores', () => {
    expect(skillScore(1, 0)).toBeNull();
    expect(() => skillScore(-1, 1)).toThrowError(expect.objectContaining({ code: 'invalid-argument' }));
    expect(() => skillScore(Number.NaN, 1)).toThrowError(expect.objectContaining({ code: 'invalid-argument' }));
  });
});
