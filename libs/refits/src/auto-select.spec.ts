import type { LoadSeriesData } from '@loadwright/forecasting';
import { describe, expect, it } from 'vitest';
import { feederLoad, stationTemperatures } from '../../../bench/refit/synthetic-fleet';
import { autoSelect, yuleWalkerOrderByAic } from './auto-select';
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
  const choice = autoSelect(design, data);

  it('scores the whole fixed candidate set on the same 14 × 24 h backtest and chooses by the stated rule', () => {
    const { candidates, backtest } = choice.selection;
    expect(backtest).toEqual({ origins: 14, horizon: 24 });
    expect(candidates.map((c) => c.label)).toEqual([
      expect.stringMatching(/^hour-of-week profile \+ AR\(\d\) by least squares$/),
      'hour-of-week profile + ridge AR (lags 1–3, 24, 25, 168)',
      'hour-of-week profile + lasso AR (lags 1–48, 168)',
      expect.stringMatching(/^weekly difference \+ AR\(\d+\) by Yule-Walker$/),
      expect.stringMatching(/^weekly difference \+ AR\(\d+\) by least squares$/),
      expect.stringMatching(/^daily difference \+ AR\(\d+\) by Yule-Walker$/),
      expect.stringMatching(/^daily difference \+ AR\(\d+\) by least squares$/),
      'seasonal naive (same hour last week)',
    ]);
    const chosen = candidates.filter((c) => c.chosen);
    expect(chosen).toHaveLength(1);
    const naive = candidates.at(-1)!;
    const models = candidates.filter((c) => c.method !== 'seasonal-naive' && c.backtestMae !== null);
    expect(models).toHaveLength(7);
    const best = Math.min(...models.map((c) => c.backtestMae!));
    if (best >= naive.backtestMae!) {
      expect(chosen[0]).toBe(naive);
    } else {
      // The rule: near-equal (within 2 % of the best MAE), then Ljung-Box screen, then the smaller coverage gap.
      const near = models.filter((c) => c.backtestMae! <= best * 1.02);
      const bad = (c: (typeof near)[number]) => c.ljungBox!.pValue < 0.001 && c.ljungBox!.statistic > 4 * c.ljungBox!.df;
      const pool = near.some((c) => !bad(c)) ? near.filter((c) => !bad(c)) : near;
      const gap = (c: (typeof near)[number]) => Math.abs(c.coverage80! - 80) + Math.abs(c.coverage95! - 95);
      expect(pool).toContain(chosen[0]);
      expect(gap(chosen[0]!)).toBe(Math.min(...pool.map(gap)));
      expect(chosen[0]!.skill!).toBeGreaterThan(0);
    }
    for (const c of candidates) if (!c.chosen) expect(c.note).toMatch(/\w/);
    expect(choice.method).toBe(chosen[0]!.method);
  });

  it('hands back a model that forecasts from the last actual', () => {
    expect(choice.model.lastTimestamp).toBe(data.timestamps[data.timestamps.length - 1]);
  });

  it('makes the same choice under an artificially slow clock: no candidate depends on time', () => {
    let now = 0;
    // Every reading of this clock is 10 s after the last, as on a machine too busy to give the fit any time.
    const slow = autoSelect(design, data, { clock: () => (now += 10_000) });
    const strip = (selection: typeof slow.selection) => selection.candidates.map(({ fitMs: _fitMs, ...rest }) => rest);
    expect(strip(slow.selection)).toEqual(strip(choice.selection));
    expect(slow.selection.reason).toBe(choice.selection.reason);
    expect(slow.method).toBe(choice.method);
    expect(Array.from(slow.model.arma?.ar ?? [])).toEqual(Array.from(choice.model.arma?.ar ?? []));
  });

  it('chooses by AIC without a backtest when the window is too short for one', () => {
    const short = autoSelect(design, feeder(24 * 7 * 5));
    expect(short.selection.backtest.origins).toBe(0);
    const models = short.selection.candidates.filter((c) => c.aic !== null);
    const chosen = short.selection.candidates.find((c) => c.chosen)!;
    expect(chosen.aic).toBe(Math.min(...models.map((c) => c.aic!)));
    expect(short.selection.reason).toMatch(/too short for a backtest/);
  });
});

describe('yuleWalkerOrderByAic', () => {
  it("picks the order R's ar() picks on LakeHuron (AR(2), fixtures/reference/ref/LakeHuron.json yule_walker_aic_selection)", async () => {
    const { readFileSync } = await import('node:fs');
    const series = JSON.parse(readFileSync(new URL('../../../fixtures/reference/data/LakeHuron.json', import.meta.url), 'utf8')) as {
      values: number[];
    };
    const ref = JSON.parse(readFileSync(new URL('../../../fixtures/reference/ref/LakeHuron.json', import.meta.url), 'utf8')) as {
      yule_walker_aic_selection: { order_selected: number; order_max: number };
    };
    expect(yuleWalkerOrderByAic(series.values, ref.yule_walker_aic_selection.order_max)).toBe(ref.yule_walker_aic_selection.order_selected);
  });
});
