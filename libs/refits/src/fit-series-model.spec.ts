import type { ModelSettingsRequest } from '@loadwright/contracts';
import { describe, expect, it } from 'vitest';
import { feederLoad, stationTemperatures } from '../../../bench/refit/synthetic-fleet';
import { fitSeriesModel } from './fit-series-model';
import { defaultModelSettings } from './model-settings';
import type { RefitInputs } from './series-window';

const startMs = Date.UTC(2025, 0, 6);
const hours = 24 * 7 * 10;
const temperature = stationTemperatures(startMs, hours + 168);
const station = { id: 2, key: 'wx', name: 'Test station', unit: 'degF' };

/** Inputs of a synthetic feeder with `settings`, temperatures usable or not. */
function inputs(settings: ModelSettingsRequest, withTemperature: boolean): RefitInputs {
  return {
    series: { id: 1, key: 'feeder', name: 'Feeder', unit: 'kW', intervalMinutes: 60, timeZone: 'America/Chicago', temperatureSeriesId: 2 },
    settings,
    window: {
      timestamps: Float64Array.from({ length: hours }, (_, i) => startMs + i * 3_600_000),
      values: feederLoad(4, startMs, hours, temperature),
      bridgedHours: 3,
    },
    temperature: withTemperature
      ? { usable: true, station, training: temperature.slice(0, hours), future: temperature.slice(hours) }
      : { usable: false, station, reason: 'no temperature forecast covers the next 168 hours', fallback: true },
  };
}

describe('fitSeriesModel', () => {
  const fixed: Array<[string, Partial<ModelSettingsRequest>, string]> = [
    ['Yule-Walker with the order by AIC', { method: 'yule-walker', maxArOrder: 8 }, 'yule-walker'],
    ['conditional MLE of a fixed order', { method: 'cmle', arOrder: 3 }, 'cmle'],
    [
      'NLS ARMA with a daily profile and day types',
      { method: 'nls', arOrder: 2, maOrder: 1, seasonal: { kind: 'profile', slot: 'hour-of-day', form: 'additive' } },
      'nls',
    ],
    ['lasso over 1..24 and 168', { method: 'lasso', arOrder: 24, extraLags: [168] }, 'lasso'],
    [
      'ridge with weekly differencing and log',
      { method: 'ridge', arOrder: 3, seasonal: { kind: 'difference', lag: 168 }, log: true },
      'ridge',
    ],
    ['seasonal naive', { method: 'seasonal-naive', seasonal: { kind: 'none' } }, 'seasonal-naive'],
  ];
  for (const [name, change, method] of fixed) {
    it(`fits ${name} and forecasts a week with ordered bands`, () => {
      const outcome = fitSeriesModel(inputs({ ...defaultModelSettings, ...change }, true), null);
      expect(outcome.method).toBe(method);
      expect(outcome.selection).toBeNull();
      expect(outcome.forecast.mean).toHaveLength(168);
      const [i80, i95] = [80, 95].map((level) => outcome.forecast.intervals.find((i) => i.level === level)!);
      for (let h = 0; h < 168; h++) {
        expect(i95!.lower[h]).toBeLessThanOrEqual(i80!.lower[h]);
        expect(i80!.upper[h]).toBeLessThanOrEqual(i95!.upper[h]);
      }
      expect(outcome.diagnostics.residualAcf.length).toBeGreaterThan(0);
      expect(outcome.diagnostics.temperature.used).toBe(method !== 'seasonal-naive');
    });
  }

  it('says when it fell back to a model without temperature', () => {
    const outcome = fitSeriesModel(inputs({ ...defaultModelSettings, method: 'cmle', arOrder: 2 }, false), null);
    expect(outcome.model.regression.names).not.toContain('heating-degree-hours');
    expect(outcome.diagnostics.temperature).toEqual({ used: false, reason: 'no temperature forecast covers the next 168 hours' });
    expect(outcome.diagnostics.warnings.map((w) => w.code)).toEqual(['temperature-fallback', 'bridged-hours']);
  });

  it('uses degree-hours with the station forecast, and the balance points of the settings', () => {
    const outcome = fitSeriesModel(
      inputs(
        { ...defaultModelSettings, method: 'cmle', arOrder: 2, temperature: { enabled: true, heatingBase: 55, coolingBase: 75 } },
        true,
      ),
      null,
    );
    expect(outcome.model.spec.temperature).toEqual({ heatingBase: 55, coolingBase: 75 });
    expect(outcome.model.regression.names).toEqual(expect.arrayContaining(['heating-degree-hours', 'cooling-degree-hours']));
    expect(outcome.diagnostics.temperature.used).toBe(true);
    expect(outcome.diagnostics.ljungBox!.lags).toBe(48);
    expect(outcome.diagnostics.residualAcf).toHaveLength(48);
  });

  it('adds the 80 and 95 % levels to other requested levels', () => {
    const outcome = fitSeriesModel(inputs({ ...defaultModelSettings, method: 'cmle', arOrder: 2, levels: [50] }, true), null);
    expect(outcome.forecast.intervals.map((i) => i.level)).toEqual([50, 80, 95]);
  });
});
