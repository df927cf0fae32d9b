import { describe, expect, it } from 'vitest';
import { ForecastingError } from '../core/errors';
import { fitLoadModel } from './fit-load-model';
import { forecastLoadModel } from './forecast-load-model';
import type { LoadModelSpec } from './load-model-spec';
import { hourlyTimestamps, syntheticLoad, syntheticTemperature } from './synthetic-load.testing';
import { temperatureScenario, temperatureTerms } from './temperature-scenario';

const timeZone = 'America/Chicago';
const n = 10 * 168;
const horizon = 168;
const all = hourlyTimestamps('2023-06-05T05:00:00Z', n + horizon);
const temperature = syntheticTemperature(all, timeZone, 11);
const { values } = syntheticLoad(all, temperature, timeZone, 12);
const data = { timestamps: all.slice(0, n), values: values.slice(0, n), temperature: temperature.slice(0, n) };
const future = temperature.slice(n);
const hotter = future.map((t) => t + 4);
const colder = future.map((t) => t - 6);

const design: LoadModelSpec = {
  method: 'cmle',
  p: 2,
  q: 0,
  seasonal: { kind: 'profile', period: 168, form: 'additive' },
  log: false,
  temperature: { heatingBase: 15.5, coolingBase: 22 },
  dayTypes: false,
  holidays: null,
  timeZone,
};

// Every way the refit combines the temperature terms with the seasonal step and the scale.
const designs: Array<[string, LoadModelSpec]> = [
  ['additive hour-of-week profile', design],
  ['multiplicative hour-of-day profile', { ...design, seasonal: { kind: 'profile', period: 24, form: 'multiplicative' }, dayTypes: true }],
  ['weekly seasonal differencing', { ...design, seasonal: { kind: 'difference', lag: 168 } }],
  ['log load with a multiplicative profile', { ...design, log: true, seasonal: { kind: 'profile', period: 168, form: 'multiplicative' } }],
];

describe('temperatureScenario', () => {
  for (const [name, spec] of designs) {
    it(`gives what re-running forecastLoadModel with the scenario temperatures gives (${name})`, () => {
      const model = fitLoadModel(spec, data);
      const terms = temperatureTerms(model)!;
      const base = forecastLoadModel(model, { temperature: future }, horizon, [80, 95]);
      for (const scenario of [hotter, colder]) {
        const rerun = forecastLoadModel(model, { temperature: scenario }, horizon, [80, 95]);
        const moved = (values: Float64Array) => temperatureScenario(terms, base.timestamps, future, scenario, values);
        const pairs: Array<[Float64Array, Float64Array]> = [
          [moved(base.mean), rerun.mean],
          [moved(base.median), rerun.median],
          ...base.intervals.flatMap((interval, i): Array<[Float64Array, Float64Array]> => [
            [moved(interval.lower), rerun.intervals[i].lower],
            [moved(interval.upper), rerun.intervals[i].upper],
          ]),
        ];
        for (const [ours, again] of pairs) for (let h = 0; h < horizon; h++) expect(ours[h]).toBeCloseTo(again[h], 8);
      }
    });
  }

  it('moves a summer week up when it runs hotter, by the cooling response', () => {
    const model = fitLoadModel(design, data);
    const terms = temperatureTerms(model)!;
    // The synthetic load responds with 2.5 per cooling degree-hour (TRUTH.cooling); the fit recovers it.
    expect(terms.cooling).toBeGreaterThan(2);
    const base = forecastLoadModel(model, { temperature: future }, horizon, [95]);
    const moved = temperatureScenario(terms, base.timestamps, future, hotter, base.mean);
    for (let h = 0; h < horizon; h++) expect(moved[h]).toBeGreaterThanOrEqual(base.mean[h] - 1e-9);
  });

  it('says no temperature terms for a model without temperature', () => {
    expect(temperatureTerms(fitLoadModel({ ...design, temperature: null }, { ...data, temperature: undefined }))).toBeNull();
  });

  it('refuses temperatures that do not match the hours', () => {
    const terms = temperatureTerms(fitLoadModel(design, data))!;
    expect(() => temperatureScenario(terms, [0, 3_600_000], [20, 21], [22], [100, 100])).toThrow(ForecastingError);
    expect(() => temperatureScenario(terms, [0], [Number.NaN], [22], [100])).toThrow(ForecastingError);
  });
});
