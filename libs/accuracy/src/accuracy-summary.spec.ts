import { describe, expect, it } from 'vitest';
import { summariseAccuracy } from './accuracy-summary';
import type { ScoredHour } from './scored-hour';

/** An hour with its numbers; the rest are placeholders the summary does not read. */
function hour(
  actual: number,
  forecast: number,
  naive: number | null,
  scale: number | null,
  [lower95, lower80, upper80, upper95]: [number, number, number, number],
): ScoredHour {
  return {
    versionId: 1,
    ts: new Date('2026-11-02T00:00:00Z'),
    horizon: 1,
    localDate: '2026-11-02',
    localHour: 0,
    dayType: 'weekday',
    actual,
    forecast,
    naive,
    scale,
    lower80,
    upper80,
    lower95,
    upper95,
  };
}

// Four hours worked by hand below; errors e = y − f are 10, −10, 0, −20.
const hours = [
  hour(100, 90, 120, 10, [80, 85, 95, 100]), // above the 80 % band, on the 95 % upper bound (covered)
  hour(50, 60, 40, 10, [40, 55, 65, 80]), // below the 80 % band, inside the 95 % band
  hour(200, 200, 180, 20, [190, 195, 205, 210]), // inside both
  hour(80, 100, null, null, [85, 90, 110, 115]), // below both; no naive value, no scale
];

describe('summariseAccuracy', () => {
  const summary = summariseAccuracy(hours)!;

  it('MAE, RMSE and MAPE by Hyndman & Koehler (2006) §3', () => {
    expect(summary.hours).toBe(4);
    // MAE = (10 + 10 + 0 + 20) / 4 = 10.
    expect(summary.mae).toBeCloseTo(10, 12);
    // RMSE = √((100 + 100 + 0 + 400) / 4) = √150.
    expect(summary.rmse).toBeCloseTo(Math.sqrt(150), 12);
    // MAPE = 100 × (10/100 + 10/50 + 0/200 + 20/80) / 4 = 13.75 %.
    expect(summary.mape).toBeCloseTo(13.75, 12);
  });

  it('MASE: mean of |e| / Q of each hour’s version (Hyndman & Koehler 2006 §4), over the hours with a scale', () => {
    // (10/10 + 10/10 + 0/20) / 3 = 2/3.
    expect(summary.mase).toBeCloseTo(2 / 3, 12);
  });

  it('skill against seasonal naive, 1 − MAE/MAE_naive (Murphy 1988), over the hours with a naive value', () => {
    // Naive MAE = (|100 − 120| + |50 − 40| + |200 − 180|) / 3 = 50/3; model MAE on them = 20/3; skill = 1 − 0.4.
    expect(summary.naiveMae).toBeCloseTo(50 / 3, 12);
    expect(summary.skill).toBeCloseTo(0.6, 12);
  });

  it('coverage of the 80 % and 95 % bands, endpoints covered', () => {
    expect(summary.coverage80).toBe(0.25);
    expect(summary.coverage95).toBe(0.75);
  });

  it('interval (Winkler) scores, Gneiting & Raftery (2007) §6.2', () => {
    // 80 %, 2/α = 10: (10 + 10·5) + (10 + 10·5) + 10 + (20 + 10·10) = 250, mean 62.5.
    expect(summary.winkler80).toBeCloseTo(62.5, 12);
    // 95 %, 2/α = 40: 20 + 40 + 20 + (30 + 40·5) = 310, mean 77.5.
    expect(summary.winkler95).toBeCloseTo(77.5, 12);
  });

  it('pinball loss averaged over τ = 0.025, 0.1, 0.9, 0.975 (Gneiting & Raftery 2007 §6.1; Hong et al. 2016)', () => {
    // τ = 0.025 on the lower 95 % bound: (0.5 + 0.25 + 0.25 + 0.975·5) / 4 = 1.46875
    // τ = 0.1 on the lower 80 % bound:   (1.5 + 0.9·5 + 0.5 + 0.9·10) / 4 = 3.875
    // τ = 0.9 on the upper 80 % bound:   (0.9·5 + 0.1·15 + 0.1·5 + 0.1·30) / 4 = 2.375
    // τ = 0.975 on the upper 95 % bound: (0 + 0.025·30 + 0.025·10 + 0.025·35) / 4 = 0.46875
    // Mean of the four: 8.1875 / 4.
    expect(summary.pinball).toBeCloseTo(2.046875, 12);
  });

  it('leaves MAPE, MASE and skill null when they cannot be formed, and has no summary of nothing', () => {
    const zero = summariseAccuracy([hour(0, 5, null, null, [0, 1, 9, 10])])!;
    expect(zero.mape).toBeNull();
    expect(zero.mase).toBeNull();
    expect(zero.skill).toBeNull();
    expect(zero.naiveMae).toBeNull();
    expect(summariseAccuracy([])).toBeNull();
  });
});
