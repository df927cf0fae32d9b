import { describe, expect, it } from 'vitest';
import { explainMiss, reforecast, type TemperatureResponse } from './explain-miss';
import type { EvidenceHour } from './hour-point';

/** A cooling-driven MW system in °F: 0.5 MW per cooling degree-hour above 71.6 °F, 0.2 per heating degree-hour below 59.9 °F. */
const response: TemperatureResponse = {
  heatingCoefficient: 0.2,
  coolingCoefficient: 0.5,
  heatingBase: 59.9,
  coolingBase: 71.6,
  log: false,
  unit: 'degF',
};

const hour = (ts: string, actual: number, forecast: number, estimated = false): EvidenceHour => ({
  ts,
  actual,
  forecast,
  lower: null,
  upper: null,
  error: actual - forecast,
  percentError: null,
  estimated,
  versionId: 1,
});

describe('explainMiss on a constructed case', () => {
  // Two hot afternoon hours. Forecast temperatures 90 and 92 °F; observed 96 and 98 °F (6 °F too low both times).
  // Hand arithmetic, additive model, both temperatures above the cooling base (HDH stays 0):
  //   hour 1: CDH(96) − CDH(90) = 24.4 − 18.4 = 6 → re-forecast 100 + 0.5·6 = 103.0; error 104.0 − 100 = 4.0
  //   hour 2: CDH(98) − CDH(92) = 26.4 − 20.4 = 6 → re-forecast 110 + 3.0 = 113.0; error 114.0 − 110 = 4.0
  //   means: error 4.0, temperature part 3.0, model part 1.0, temperature error (used − observed) −6 °F.
  const hours = [hour('2026-07-20T21:00:00.000Z', 104, 100), hour('2026-07-20T22:00:00.000Z', 114, 110)];
  const temperatures = [
    { ts: '2026-07-20T21:00:00.000Z', forecast: 90, observed: 96 },
    { ts: '2026-07-20T22:00:00.000Z', forecast: 92, observed: 98 },
  ];
  const none = { holidaysMissing: [], bandTooNarrowAt: [] };

  it('splits 4.0 MW into 3.0 from the temperature forecast and 1.0 of model error, and says so', () => {
    const cause = explainMiss(hours, temperatures, response, none, 'MW');
    expect(cause.split!.meanError).toBeCloseTo(4, 12);
    expect(cause.split!.temperaturePart).toBeCloseTo(3, 12);
    expect(cause.split!.modelPart).toBeCloseTo(1, 12);
    expect(cause.split!.temperatureError).toBeCloseTo(-6, 12);
    expect(cause.words).toBe('3.0 of the 4.0 MW under-forecast came from a temperature forecast 6.0 °F too low; 1.0 MW is model error.');
  });

  it('crosses the balance point correctly: only the degrees beyond the base count', () => {
    // Used 70 °F (below the 71.6 cooling base, above the 59.9 heating base: no degree-hours); observed 75 °F:
    // CDH(75) = 3.4, so the re-forecast adds 0.5 · 3.4 = 1.7.
    expect(reforecast(100, 70, 75, response)).toBeCloseTo(101.7, 12);
    // On a log model the change multiplies: 100 · exp(1.7).
    expect(reforecast(100, 70, 75, { ...response, log: true })).toBeCloseTo(100 * Math.exp(1.7), 9);
  });

  it('says when observed temperatures have not arrived, and flags estimates, missing holidays and a narrow band', () => {
    const cause = explainMiss(
      [hour('2026-11-26T18:00:00.000Z', 80, 100, true)],
      [{ ts: '2026-11-26T18:00:00.000Z', forecast: 40, observed: null }],
      response,
      {
        holidaysMissing: [{ day: '2026-11-26', name: 'Thanksgiving Day' }],
        bandTooNarrowAt: [{ hour: '12:00', misses: 6, days: 28, level: 95 }],
      },
      'MW',
    );
    expect(cause.split).toBeNull();
    expect(cause.words).toBe(
      'Observed temperatures for these hours have not arrived yet; the split follows once they do. ' +
        "1 of the 1 missed hours hold a steward's estimate rather than a reading: check the actuals before the model. " +
        '2026-11-26 is Thanksgiving Day, a public holiday missing from the holiday calendar: the forecast treated it as a working day. ' +
        // 5 % of 28 days = 1.4 expected misses.
        'At 12:00 the 95 % band missed on 6 of the last 28 days (about 1.4 expected): the band is too narrow at that hour.',
    );
  });

  it('calls it model error when the temperature forecast pulled the other way', () => {
    // Temperature forecast too high by 4 °F (94 used, 90 observed): re-forecast 100 + 0.5·(18.4 − 22.4) = 98; actual 105.
    const cause = explainMiss(
      [hour('2026-07-20T21:00:00.000Z', 105, 100)],
      [{ ts: '2026-07-20T21:00:00.000Z', forecast: 94, observed: 90 }],
      response,
      { holidaysMissing: [], bandTooNarrowAt: [] },
      'MW',
    );
    expect(cause.split!.modelPart).toBeCloseTo(7, 12);
    expect(cause.words).toBe(
      'The forecast was 5.0 MW under on average and a temperature forecast 4.0 °F too high, which pulled the other way by 2.0 MW: the miss is model error (7.0 MW).',
    );
  });
});
