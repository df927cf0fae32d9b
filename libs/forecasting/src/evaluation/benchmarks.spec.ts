/**
 * Benchmarks. Seasonal naive against R: fixtures/reference/ref/USAccDeaths.json `seasonal.holdout.snaive`
 * (`forecast::snaive(train, h = 12, level = c(80, 95))`, R 4.2.2, forecast 8.20): means exactly, interval bounds
 * mean ± z·se with z = normalQuantile(0.9), normalQuantile(0.975) to 1e-12 relative (15 significant digits stored);
 * `interval_check.sigma_manual` for σ̂. Like-day: hand cases, and the identity like-day with one week = seasonal
 * naive at 7·24.
 */
import { describe, expect, it } from 'vitest';
import { normalQuantile } from '../core/normal';
import { likeDay, seasonalNaive } from './benchmarks';
import { holdout, period, training } from './usaccdeaths.testing';

describe('seasonalNaive', () => {
  it('matches forecast::snaive on USAccDeaths, means and 80 %/95 % bounds', () => {
    const snaive = holdout.snaive;
    const { mean, se } = seasonalNaive(training, 12, period);
    expect(Array.from(mean)).toEqual(snaive.mean);
    expect(Math.abs(se[0] / snaive.interval_check.sigma_manual - 1)).toBeLessThan(1e-12);
    const z80 = normalQuantile(0.9);
    const z95 = normalQuantile(0.975);
    mean.forEach((m, i) => {
      expect(Math.abs((m - z80 * se[i]) / snaive.lower80[i] - 1)).toBeLessThan(1e-12);
      expect(Math.abs((m + z95 * se[i]) / snaive.upper95[i] - 1)).toBeLessThan(1e-12);
    });
  });

  it('reuses the last season beyond one period and widens se by √(seasons back)', () => {
    // history 1..6 with period 3: steps 1..3 → 4, 5, 6; steps 4..6 → 4, 5, 6 again; σ̂ = √mean(3²) = 3.
    const { mean, se } = seasonalNaive([1, 2, 3, 4, 5, 6], 6, 3);
    expect(Array.from(mean)).toEqual([4, 5, 6, 4, 5, 6]);
    expect(se[0]).toBeCloseTo(3, 14);
    expect(se[3]).toBeCloseTo(3 * Math.SQRT2, 14);
  });

  it('needs more than one period of history', () => {
    expect(() => seasonalNaive([1, 2, 3], 1, 3)).toThrowError(expect.objectContaining({ code: 'too-few-observations' }));
  });
});

describe('likeDay', () => {
  it('averages the same period on the last k same weekdays (one value a day here)', () => {
    // Daily values 0..20 (periodsPerDay = 1, a week is 7), k = 2; the history ends at index 20.
    //   step 1 → target index 21: same weekday at 14 and 7 → (14 + 7)/2 = 10.5
    //   step 7 → target 27: 20 and 13 → 16.5
    //   step 8 → target 28: 21 is not yet observed, so 14 and 7 → 10.5
    const history = Array.from({ length: 21 }, (_, i) => i);
    const f = likeDay(history, 8, { periodsPerDay: 1, count: 2 });
    expect(f[0]).toBe(10.5);
    expect(f[6]).toBe(16.5);
    expect(f[7]).toBe(10.5);
  });

  it('with k = 1 equals seasonal naive at one week of hours', () => {
    const history = Array.from({ length: 400 }, (_, t) => 100 + 20 * Math.sin((2 * Math.PI * t) / 24) + (t % 7));
    const like = likeDay(history, 48, { count: 1 });
    expect(Array.from(like)).toEqual(Array.from(seasonalNaive(history, 48, 168).mean));
  });

  it('says how much history it needs', () => {
    expect(() => likeDay(new Array(500).fill(1), 24)).toThrowError(/at least 672 values/);
  });
});
