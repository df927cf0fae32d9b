import { fitLoadModel, forecastLoadModel, type LoadSeriesData } from '@loadwright/forecasting';
import { describe, expect, it } from 'vitest';
import { feederLoad, stationTemperatures } from '../../../bench/refit/synthetic-fleet';
import { autoSelect, backtestMean } from './auto-select';
import { extendModel, modelAtOrigin } from './reanchor';
import type { ModelDesign } from './model-plan';

const startMs = Date.UTC(2025, 0, 6);
const design: ModelDesign = {
  seasonal: { kind: 'profile', period: 168, form: 'additive' },
  log: false,
  temperature: { heatingBase: 60, coolingBase: 72 },
  dayTypes: false,
  holidays: null,
  timeZone: 'America/Chicago',
};

/** `hours` of a synthetic feeder with its station's temperatures. */
function feeder(hours: number, index = 2): LoadSeriesData {
  const temperature = stationTemperatures(startMs, hours);
  return {
    timestamps: Float64Array.from({ length: hours }, (_, i) => startMs + i * 3_600_000),
    values: feederLoad(index, startMs, hours, temperature),
    temperature,
  };
}

describe('autoSelect', () => {
  const data = feeder(24 * 7 * 12);
  const choice = autoSelect(design, data, { budgetMs: Infinity });

  it('scores every candidate on the same 3 × 24 h backtest and chooses by the stated rule', () => {
    const { candidates, backtest } = choice.selection;
    expect(backtest).toEqual({ origins: 3, horizon: 24 });
    expect(candidates.map((c) => c.label)).toEqual([
      expect.stringMatching(/^cmle AR\(\d\)$/),
      'ridge AR (lags 1–3, 24, 25, 168)',
      'NLS ARMA(2,1)',
      'lasso AR (lags 1–48, 168)',
      'seasonal naive',
    ]);
    const chosen = candidates.filter((c) => c.chosen);
    expect(chosen).toHaveLength(1);
    const naive = candidates.at(-1)!;
    const models = candidates.filter((c) => c.method !== 'seasonal-naive' && c.backtestMae !== null);
    const best = Math.min(...models.map((c) => c.backtestMae!));
    if (best >= naive.backtestMae!) {
      expect(chosen[0]).toBe(naive);
    } else {
      expect(chosen[0]!.backtestMae!).toBeLessThanOrEqual(best * 1.02);
      const tied = models.filter((c) => c.backtestMae! <= best * 1.02);
      expect(chosen[0]!.aic).toBe(Math.min(...tied.map((c) => c.aic!)));
      expect(chosen[0]!.skill!).toBeGreaterThan(0);
    }
    expect(choice.method).toBe(chosen[0]!.method);
    expect(choice.selection.reason).toContain(chosen[0]!.label === 'seasonal naive' ? 'seasonal naive' : chosen[0]!.label);
  });

  it('hands back a model that forecasts from the last actual', () => {
    expect(choice.model.lastTimestamp).toBe(data.timestamps[data.timestamps.length - 1]);
  });

  it('leaves the optional candidates out once the time budget is spent, and says so', () => {
    let now = 0;
    const limited = autoSelect(design, data, { budgetMs: 10, clock: () => (now += 100) });
    const optional = limited.selection.candidates.slice(1, 4);
    for (const candidate of optional) {
      expect(candidate.backtestMae).toBeNull();
      expect(candidate.error).toMatch(/time budget/);
      expect(candidate.chosen).toBe(false);
    }
  });

  it('chooses by AIC without a backtest when the window is too short for one', () => {
    const short = autoSelect(design, feeder(24 * 7 * 4), { budgetMs: Infinity });
    expect(short.selection.backtest.origins).toBe(0);
    const models = short.selection.candidates.filter((c) => c.aic !== null);
    const chosen = short.selection.candidates.find((c) => c.chosen)!;
    expect(chosen.aic).toBe(Math.min(...models.map((c) => c.aic!)));
    expect(short.selection.reason).toMatch(/too short for a backtest/);
  });
});

describe('backtestMean', () => {
  it('equals the full forecast of the model carried to the origin', () => {
    const data = feeder(24 * 7 * 8);
    const m = data.values.length - 72;
    const fitted = fitLoadModel(
      { ...design, holidays: { country: 'US', extraDates: [] }, method: 'cmle', p: 3, q: 0 },
      { timestamps: data.timestamps.subarray(0, m), values: data.values.subarray(0, m), temperature: data.temperature!.subarray(0, m) },
    );
    const extended = extendModel(fitted, data);
    for (const origin of [m, m + 24, m + 48]) {
      const quick = backtestMean(extended, origin, 24);
      const full = forecastLoadModel(
        modelAtOrigin(extended, origin),
        { temperature: data.temperature!.subarray(origin, origin + 24) },
        24,
        [],
      ).mean;
      for (let h = 0; h < 24; h++) expect(quick[h]).toBeCloseTo(full[h], 8);
    }
  });
});
