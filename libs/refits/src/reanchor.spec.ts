import { fitLoadModel, forecastLoadModel, type LoadModelSpec, type LoadSeriesData, type FittedLoadModel } from '@loadwright/forecasting';
import { describe, expect, it } from 'vitest';
import { feederLoad, stationTemperatures } from '../../../bench/refit/synthetic-fleet';
import { extendModel, modelAtOrigin } from './reanchor';

const startMs = Date.UTC(2025, 0, 6);
const hours = 24 * 7 * 10;
const temperature = stationTemperatures(startMs, hours + 48);
const data: LoadSeriesData = {
  timestamps: Float64Array.from({ length: hours }, (_, i) => startMs + i * 3_600_000),
  values: feederLoad(3, startMs, hours, temperature),
  temperature: temperature.subarray(0, hours),
};
const base: LoadModelSpec = {
  method: 'cmle',
  p: 3,
  q: 0,
  seasonal: { kind: 'profile', period: 168, form: 'additive' },
  log: false,
  temperature: { heatingBase: 60, coolingBase: 72 },
  dayTypes: false,
  holidays: { country: 'US', extraDates: [] },
  timeZone: 'America/Chicago',
};

/** The model as if its parameters had been estimated on the first m hours only (same numbers, cut arrays). */
function cut(model: FittedLoadModel, m: number): FittedLoadModel {
  const offset = model.transformed.length - model.remainder.length;
  return {
    ...model,
    lastTimestamp: data.timestamps[m - 1],
    transformed: model.transformed.slice(0, m),
    regressors: model.regressors.map((c) => c.slice(0, m)),
    remainder: model.remainder.slice(0, m - offset),
    residuals: model.residuals.slice(0, m - offset),
  };
}

describe('extendModel', () => {
  const specs: Array<[string, LoadModelSpec]> = [
    ['an additive weekly profile with degree-hours and holidays', base],
    [
      'a multiplicative daily profile with day types and log',
      { ...base, seasonal: { kind: 'profile', period: 24, form: 'multiplicative' }, dayTypes: true, log: true },
    ],
    ['weekly differencing', { ...base, seasonal: { kind: 'difference', lag: 168 }, holidays: null }],
  ];
  for (const [name, spec] of specs) {
    it(`rebuilds the remainder of later hours exactly for ${name}`, () => {
      const full = fitLoadModel(spec, data);
      const m = hours - 72;
      const extended = extendModel(cut(full, m), data);
      expect(extended.remainder.length).toBe(full.remainder.length);
      for (let t = 0; t < full.remainder.length; t++) expect(extended.remainder[t]).toBeCloseTo(full.remainder[t], 8);
      for (let j = 0; j < full.regressors.length; j++)
        for (let t = m; t < hours; t++) expect(extended.regressors[j][t]).toBe(full.regressors[j][t]);
    });
  }

  it('forecasts from the last hour exactly as the model itself does', () => {
    const model = fitLoadModel(base, data);
    const future = { temperature: temperature.subarray(hours, hours + 48) };
    const direct = forecastLoadModel(model, future, 48, [80, 95]);
    const again = forecastLoadModel(modelAtOrigin(extendModel(model, data), hours), future, 48, [80, 95]);
    for (let h = 0; h < 48; h++) {
      expect(again.mean[h]).toBeCloseTo(direct.mean[h], 8);
      expect(again.se[h]).toBeCloseTo(direct.se[h], 8);
    }
  });

  it('forecasts from an earlier origin from the actuals up to it', () => {
    const model = fitLoadModel(base, data);
    const origin = hours - 24;
    const atOrigin = modelAtOrigin(extendModel(model, data), origin);
    expect(atOrigin.lastTimestamp).toBe(data.timestamps[origin - 1]);
    const forecast = forecastLoadModel(atOrigin, { temperature: data.temperature!.subarray(origin) }, 24, []);
    // One hour ahead lands close to the actual (AR errors carry the latest deviation forward).
    const scale = data.values.reduce((a, b) => a + b, 0) / hours;
    expect(Math.abs(forecast.mean[0] - data.values[origin]) / scale).toBeLessThan(0.05);
  });
});
