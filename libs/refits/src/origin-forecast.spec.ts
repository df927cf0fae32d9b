import { fitLoadModel, forecastLoadModel, type LoadModelSpec, type LoadSeriesData } from '@loadwright/forecasting';
import { describe, expect, it } from 'vitest';
import { feederLoad, stationTemperatures } from '../../../bench/refit/synthetic-fleet';
import type { ModelDesign } from './model-plan';
import { originForecaster } from './origin-forecast';
import { extendModel, modelAtOrigin } from './reanchor';

const startMs = Date.UTC(2025, 0, 6);
const hours = 24 * 7 * 8;
const temperature = stationTemperatures(startMs, hours);
const data: LoadSeriesData = {
  timestamps: Float64Array.from({ length: hours }, (_, i) => startMs + i * 3_600_000),
  values: feederLoad(2, startMs, hours, temperature),
  temperature,
};
const base: ModelDesign = {
  seasonal: { kind: 'profile', period: 168, form: 'additive' },
  log: false,
  temperature: { heatingBase: 60, coolingBase: 72 },
  dayTypes: false,
  holidays: { country: 'US', extraDates: [] },
  timeZone: 'America/Chicago',
};

// The reference is the full forecast: the model carried to the origin and forecastLoadModel with the observed temperatures.
describe('originForecaster', () => {
  const designs: Array<[string, LoadModelSpec]> = [
    ['an additive hour-of-week profile with AR(3)', { ...base, method: 'cmle', p: 3, q: 0 }],
    [
      'a multiplicative hour-of-day profile with day types, on logs',
      { ...base, seasonal: { kind: 'profile', period: 24, form: 'multiplicative' }, dayTypes: true, log: true, method: 'cmle', p: 2, q: 0 },
    ],
    [
      'the weekly difference with a wide-lag AR',
      { ...base, seasonal: { kind: 'difference', lag: 168 }, method: 'yule-walker', p: 26, q: 0 },
    ],
    [
      'the daily difference with ARMA(1,1) and no regressors',
      { ...base, seasonal: { kind: 'difference', lag: 24 }, temperature: null, holidays: null, method: 'nls', p: 1, q: 1 },
    ],
  ];
  for (const [name, spec] of designs) {
    it(`forecasts ${name} from later origins as the model carried there does`, () => {
      const m = hours - 24 * 14;
      const fitted = fitLoadModel(spec, {
        timestamps: data.timestamps.subarray(0, m),
        values: data.values.subarray(0, m),
        temperature: data.temperature!.subarray(0, m),
      });
      const extended = extendModel(fitted, data);
      const forecastFrom = originForecaster(extended, 168);
      for (const [origin, ahead] of [
        [m, 168],
        [m + 24 * 5, 168],
        [hours - 30, 30],
      ] as const) {
        const quick = forecastFrom(origin, ahead);
        const full = forecastLoadModel(
          modelAtOrigin(extended, origin),
          { temperature: data.temperature!.subarray(origin, origin + ahead) },
          ahead,
          [],
        );
        expect(quick.mean).toHaveLength(ahead);
        for (let h = 0; h < ahead; h++) {
          expect(Math.abs(quick.mean[h] - full.modelScale.mean[h])).toBeLessThan(1e-9 * (1 + Math.abs(full.modelScale.mean[h])));
          expect(Math.abs(quick.se[h] - full.modelScale.se[h])).toBeLessThan(1e-12 * (1 + full.modelScale.se[h]));
        }
      }
    });
  }
});
